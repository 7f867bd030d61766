/** The editor's calls to the API: save a version, save as a new layout, store the unit choice. */
import type { Layout } from '../../../lib/domain/schemas';
import type { UnitSystem } from '../../../lib/domain/units';

export interface SavedVersion {
  id: string;
  version: number;
  body: Layout;
  note: string;
  createdAt: string;
  createdByName?: string | null;
}

export type SaveResult =
  | { ok: true; version: SavedVersion }
  | { ok: false; conflict: SavedVersion }
  | { ok: false; error: string };

export interface EditorApi {
  saveVersion(layoutId: string, body: { baseVersion: number; body: Layout; note: string }): Promise<SaveResult>;
  createLayout(machineId: string, body: { name: string; body: Layout; note: string }): Promise<{ ok: true; layoutId: string } | { ok: false; error: string }>;
  saveUnits(units: UnitSystem): Promise<boolean>;
}

async function errorMessage(res: Response): Promise<string> {
  try {
    const data = (await res.json()) as { error?: { message?: string } };
    return data.error?.message ?? `The server answered ${res.status}.`;
  } catch {
    return `The server answered ${res.status}.`;
  }
}

const JSON_HEADERS = { 'content-type': 'application/json', accept: 'application/json' };

/** The real API over fetch (same origin, session cookie). */
export const fetchApi: EditorApi = {
  async saveVersion(layoutId, body) {
    try {
      const res = await fetch(`/api/layouts/${layoutId}`, { method: 'PUT', headers: JSON_HEADERS, body: JSON.stringify(body) });
      if (res.status === 201) return { ok: true, version: ((await res.json()) as { version: SavedVersion }).version };
      if (res.status === 409) {
        const data = (await res.json()) as { error: { current: SavedVersion } };
        return { ok: false, conflict: data.error.current };
      }
      return { ok: false, error: await errorMessage(res) };
    } catch {
      return { ok: false, error: 'Could not reach the server. Your changes are still here; try again.' };
    }
  },
  async createLayout(machineId, body) {
    try {
      const res = await fetch(`/api/machines/${machineId}/layouts`, { method: 'POST', headers: JSON_HEADERS, body: JSON.stringify(body) });
      if (res.status === 201) return { ok: true, layoutId: ((await res.json()) as { layout: { id: string } }).layout.id };
      return { ok: false, error: await errorMessage(res) };
    } catch {
      return { ok: false, error: 'Could not reach the server. Your changes are still here; try again.' };
    }
  },
  async saveUnits(units) {
    try {
      const res = await fetch('/api/me', { method: 'PUT', headers: JSON_HEADERS, body: JSON.stringify({ unitSystem: units }) });
      return res.ok;
    } catch {
      return false;
    }
  },
};
