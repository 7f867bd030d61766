/** The inspection as the checklist island receives it (dates as ISO strings). */
import type { ChecklistKind, ClearanceSurvey, ConditionId, InspectionSeverity, ReplacementLine } from '~/lib/domain/inspection';
import type { MachineFamily } from '~/lib/domain/schemas';

export interface PhotoView {
  id: string;
  url: string;
  thumbUrl: string;
  contentType: string;
  bytes: number;
}

export interface LineView {
  id: string;
  placeKey: string;
  kind: ChecklistKind;
  partNumber: string | null;
  label: string;
  conditions: ConditionId[];
  severity: InspectionSeverity;
  measurements: Record<string, number>;
  note: string;
  suggested: InspectionSeverity;
  photos: PhotoView[];
}

export interface InspectionView {
  id: string;
  title: string;
  status: 'open' | 'finished';
  startedAt: string;
  finishedAt: string | null;
  startedByName: string | null;
  machine: { id: string; nickname: string; serial: string; familyName: string; orgName: string };
  family: MachineFamily;
  items: LineView[];
  survey: ClearanceSurvey | null;
  counts: { ok: number; watch: number; replace: number; total: number };
  photoCount: number;
  partsRequest: { id: string; status: string; lines: ReplacementLine[]; added: ReplacementLine[] } | null;
  /** ISO 4217 code of the replacement prices (the dealer's). */
  currency?: string;
}
