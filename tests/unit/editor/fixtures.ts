import { demoCatalog, sedgeS6, tamarackM4 } from '~/lib/domain/demo-catalog';
import { starterLayout } from '~/lib/domain/starter';
import type { CatalogPart, Layout, MachineFamily } from '~/lib/domain/schemas';
import type { EditorApi, SavedVersion } from '~/components/editor/store/api';
import type { EditorInit } from '~/components/editor/store/types';

export const catalogFor = (f: MachineFamily): CatalogPart[] => demoCatalog.filter((p) => p.fitGroup === f.fitGroup);

/** A modular four-position cage set up for wheat (the rules pass it: advice at most). */
export function wheatInit(over: Partial<EditorInit> = {}): EditorInit {
  return {
    family: tamarackM4,
    catalog: catalogFor(tamarackM4),
    layout: starterLayout(tamarackM4, 'wheat', demoCatalog),
    layoutId: '00000000-0000-4000-8000-000000000001',
    layoutName: 'wheat setup',
    machineId: '00000000-0000-4000-8000-000000000002',
    machineName: 'North Quarter',
    baseVersion: 1,
    units: 'metric',
    canEdit: true,
    stock: {},
    ...over,
  };
}

export function splitInit(): EditorInit {
  return { ...wheatInit(), family: sedgeS6, catalog: catalogFor(sedgeS6), layout: starterLayout(sedgeS6, 'corn', demoCatalog) };
}

/**
 * An in-memory layout store with the server's version rule (a save names the version it started
 * from; another one is a conflict carrying the newer version), for the store's save paths.
 */
export class VersionedMemory implements EditorApi {
  versions: SavedVersion[];
  copies: { name: string; body: Layout; note: string }[] = [];
  units: string[] = [];
  constructor(first: Layout) {
    this.versions = [{ id: 'v1', version: 1, body: first, note: '', createdAt: new Date(0).toISOString() }];
  }
  get current() {
    return this.versions[this.versions.length - 1]!;
  }
  /** Someone else saves. */
  saveElsewhere(body: Layout, note = 'elsewhere') {
    this.versions.push({
      id: `v${this.versions.length + 1}`,
      version: this.current.version + 1,
      body,
      note,
      createdAt: new Date().toISOString(),
      createdByName: 'Someone Else',
    });
  }
  async saveVersion(_id: string, input: { baseVersion: number; body: Layout; note: string }) {
    if (input.baseVersion !== this.current.version) return { ok: false as const, conflict: this.current };
    this.versions.push({
      id: `v${this.current.version + 1}`,
      version: this.current.version + 1,
      body: input.body,
      note: input.note,
      createdAt: new Date().toISOString(),
    });
    return { ok: true as const, version: this.current };
  }
  async createLayout(_machineId: string, input: { name: string; body: Layout; note: string }) {
    this.copies.push(input);
    return { ok: true as const, layoutId: `copy-${this.copies.length}` };
  }
  async saveUnits(u: string) {
    this.units.push(u);
    return true;
  }
}
