import type { CatalogPart, CropId, MachineFamily } from '~/lib/domain/schemas';
import type { UnitSystem } from '~/lib/domain/units';
import type { Json, SlideRecord } from '~/lib/responses';
import type { listDeckShares } from '~/lib/server/services/decks';

export interface LayoutChoice {
  layoutVersionId: string;
  layoutName: string;
  version: number;
  machineNickname: string;
  orgName: string;
  familyId: string;
  crop: CropId;
}

/** One link of a deck as `GET /api/decks/:id/share` answers it. */
export type ShareLinkRow = Json<Awaited<ReturnType<typeof listDeckShares>>['links'][number]>;

export interface DeckEditorProps {
  deck: { id: string; title: string };
  slides: SlideRecord[];
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
