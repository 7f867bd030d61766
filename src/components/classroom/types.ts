/** What the classroom islands receive from their pages (plain JSON). */
import type { Settings } from '~/lib/domain/compute';
import type { CatalogPart, Finding, Layout, MachineFamily } from '~/lib/domain/schemas';
import type { UnitSystem } from '~/lib/domain/units';
import type { SlideSource } from '~/lib/responses';

export type { SlideSource };

export interface ShowSlide {
  id: string;
  position: number;
  title: string;
  notesHtml: string;
  source: SlideSource;
  layout: Layout | null;
  familyId: string | null;
  findings: Finding[];
  settings: Settings | null;
}

export interface ShowProps {
  deckId: string;
  deckTitle: string;
  slides: ShowSlide[];
  families: Record<string, MachineFamily>;
  catalogs: Record<string, CatalogPart[]>;
  units: UnitSystem;
}

/** "North Quarter · Larkspur Farms · wheat setup, version 1" or "Sample layout · Tamarack M4". */
export function sourceWords(slide: ShowSlide, families: Record<string, MachineFamily>): string {
  const s = slide.source;
  if (s.kind === 'version') return `${s.machineNickname} · ${s.orgName} · ${s.layoutName}, version ${s.version}`;
  if (s.kind === 'sample') {
    const family = slide.familyId ? families[slide.familyId] : undefined;
    return `Sample layout for teaching${family ? ` · ${family.name}` : ''}`;
  }
  return 'The layout of this slide is no longer available';
}
