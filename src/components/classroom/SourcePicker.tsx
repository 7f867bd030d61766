/**
 * Chooses what a slide shows: a layout saved on one of the machines the user looks after, or a
 * suggested start for a crop on a machine family (a sample made for teaching).
 */
import { useId } from 'react';
import type { CropId, MachineFamily } from '~/lib/domain/schemas';
import type { LayoutChoice, SourceChoice } from './editor-types';

export interface SourceDraft {
  kind: 'version' | 'starter';
  layoutVersionId: string;
  familyId: string;
  crop: CropId;
}

export function initialDraft(choices: LayoutChoice[], families: Record<string, MachineFamily>): SourceDraft {
  return {
    kind: choices.length ? 'version' : 'starter',
    layoutVersionId: choices[0]?.layoutVersionId ?? '',
    familyId: Object.keys(families)[0] ?? '',
    crop: 'wheat',
  };
}

export function draftToSource(d: SourceDraft): SourceChoice {
  return d.kind === 'version' ? { layoutVersionId: d.layoutVersionId } : { starter: { familyId: d.familyId, crop: d.crop } };
}

interface Props {
  draft: SourceDraft;
  onChange: (d: SourceDraft) => void;
  choices: LayoutChoice[];
  families: Record<string, MachineFamily>;
  crops: { id: CropId; name: string }[];
}

export function SourcePicker({ draft, onChange, choices, families, crops }: Props) {
  const id = useId();
  const byOrg = new Map<string, LayoutChoice[]>();
  for (const c of choices) byOrg.set(c.orgName, [...(byOrg.get(c.orgName) ?? []), c]);
  const cropName = (c: CropId) => crops.find((x) => x.id === c)?.name ?? c;
  return (
    <fieldset className="space-y-2">
      <legend className="field-label">The layout on the slide</legend>
      <div className="flex flex-wrap gap-4">
        <label className="inline-flex items-center gap-2">
          <input
            type="radio"
            name={`${id}-kind`}
            checked={draft.kind === 'version'}
            onChange={() => onChange({ ...draft, kind: 'version' })}
            disabled={!choices.length}
          />
          A layout on a machine
        </label>
        <label className="inline-flex items-center gap-2">
          <input
            type="radio"
            name={`${id}-kind`}
            checked={draft.kind === 'starter'}
            onChange={() => onChange({ ...draft, kind: 'starter' })}
          />
          A suggested start for a crop (sample)
        </label>
      </div>
      {draft.kind === 'version' ? (
        <div>
          <label htmlFor={`${id}-version`} className="sr-only">
            Layout
          </label>
          <select
            id={`${id}-version`}
            className="field-input"
            value={draft.layoutVersionId}
            onChange={(e) => onChange({ ...draft, layoutVersionId: e.target.value })}
            data-testid="source-version"
          >
            {[...byOrg].map(([org, list]) => (
              <optgroup key={org} label={org}>
                {list.map((c) => (
                  <option key={c.layoutVersionId} value={c.layoutVersionId}>
                    {c.machineNickname} · {c.layoutName} (version {c.version}, {cropName(c.crop).toLowerCase()})
                  </option>
                ))}
              </optgroup>
            ))}
          </select>
        </div>
      ) : (
        <div className="grid gap-2 sm:grid-cols-2">
          <div>
            <label htmlFor={`${id}-family`} className="field-label">
              Machine family
            </label>
            <select
              id={`${id}-family`}
              className="field-input"
              value={draft.familyId}
              onChange={(e) => onChange({ ...draft, familyId: e.target.value })}
              data-testid="source-family"
            >
              {Object.values(families).map((f) => (
                <option key={f.id} value={f.id}>
                  {f.name} ({f.cageKind} cage, {f.positions.length} positions)
                </option>
              ))}
            </select>
          </div>
          <div>
            <label htmlFor={`${id}-crop`} className="field-label">
              Crop
            </label>
            <select
              id={`${id}-crop`}
              className="field-input"
              value={draft.crop}
              onChange={(e) => onChange({ ...draft, crop: e.target.value as CropId })}
              data-testid="source-crop"
            >
              {crops.map((c) => (
                <option key={c.id} value={c.id}>
                  {c.name}
                </option>
              ))}
            </select>
          </div>
        </div>
      )}
    </fieldset>
  );
}
