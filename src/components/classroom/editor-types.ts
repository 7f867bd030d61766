import type { CatalogPart, CropId, Layout, MachineFamily } from '../../lib/domain/schemas';
import type { UnitSystem } from '../../lib/domain/units';
import type { SlideSource } from './types';

export interface EditorSlide {
  id: string;
  position: number;
  title: string;
  notes: string;
  notesHtml: string;
  source: SlideSource;
  layout: Layout | null;
}

export interface LayoutChoice {
  layoutVersionId: string;
  layoutName: string;
  version: number;
  machineNickname: string;
  orgName: string;
  familyId: string;
  crop: CropId;
}

export interface ShareLinkRow {
  id: string;
  label: string;
  createdAt: string;
  expiresAt: string | null;
  revokedAt: string | null;
  createdByName?: string | null;
  status: 'active' | 'revoked' | 'expired';
}

export interface DeckEditorProps {
  deck: { id: string; title: string };
  slides: EditorSlide[];
  layoutChoices: LayoutChoice[];
  families: Record<string, MachineFamily>;
  catalogs: Record<string, CatalogPart[]>;
  crops: { id: CropId; name: string }[];
  units: UnitSystem;
  /** The reader's locale for dates (Accept-Language, see lib/server/locale.ts). */
  locale?: string;
  links: ShareLinkRow[];
}

/** What a slide shows: a saved layout version, or a suggested start for a crop on a family. */
export type SourceChoice = { layoutVersionId: string } | { starter: { familyId: string; crop: CropId } };
