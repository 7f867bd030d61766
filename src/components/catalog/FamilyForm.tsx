/**
 * Add or edit a machine family: its cage (positions and zones), drum options, vane controls,
 * cage-top sections with their cover-plate seats, and the rotor's bar rows and places. The form
 * holds friendlier shapes (a grid for bar places, "2, 3" for a section's positions); it turns
 * them into the family document and validates that with the domain's machineFamilySchema, the
 * schema the API checks again.
 */
import { useState } from 'react';
import { useFieldArray, useForm, type FieldErrors, type Resolver } from 'react-hook-form';
import { machineFamilySchema, type MachineFamily } from '~/lib/domain/schemas';
import { ApiError, sendJson } from '~/components/shared/api';

type BarCell = 'none' | 'place' | 'inline';

interface FormValues {
  id: string;
  name: string;
  fitGroup: string;
  cageKind: 'modular' | 'split';
  positions: { zone: 'threshing' | 'separating' }[];
  drumOptions: { id: 'full' | 'slim'; label: string; diameterMm: number }[];
  vaneControls: string[];
  cageTopSections: { positions: string; coverLeft: boolean; coverRight: boolean }[];
  rotorBarRows: { angleDeg: number }[];
  /** The rotor's mass in kg as typed (blank: the balance check assumes a typical rotor). */
  rotorMassKg: string;
  /** bars[row][position] */
  bars: BarCell[][];
}

export interface FamilyFormProps {
  existing?: MachineFamily;
  readOnly?: boolean;
}

export function toForm(f: MachineFamily): FormValues {
  const bars: BarCell[][] = f.rotorBarRows.map((r) =>
    f.positions.map((p) => {
      const place = f.rotorBarPlaces.find((b) => b.row === r.index && b.position === p.index);
      return place ? (place.inLine ? 'inline' : 'place') : 'none';
    }),
  );
  return {
    id: f.id,
    name: f.name,
    fitGroup: f.fitGroup,
    cageKind: f.cageKind,
    positions: f.positions.map((p) => ({ zone: p.zone })),
    drumOptions: f.drumOptions.map((d) => ({ ...d })),
    vaneControls: [...f.vaneControls],
    cageTopSections: f.cageTopSections.map((s) => ({
      positions: s.positions.join(', '),
      coverLeft: s.coverPlateSides.includes('left'),
      coverRight: s.coverPlateSides.includes('right'),
    })),
    rotorBarRows: f.rotorBarRows.map((r) => ({ angleDeg: r.angleDeg })),
    rotorMassKg: f.rotorMassKg === undefined ? '' : String(f.rotorMassKg),
    bars,
  };
}

const BLANK: FormValues = {
  id: '',
  name: '',
  fitGroup: '',
  cageKind: 'modular',
  positions: [{ zone: 'threshing' }, { zone: 'threshing' }, { zone: 'separating' }, { zone: 'separating' }],
  drumOptions: [{ id: 'full', label: 'Full drum', diameterMm: 762 }],
  vaneControls: ['fixed'],
  cageTopSections: [
    { positions: '1', coverLeft: false, coverRight: false },
    { positions: '2, 3', coverLeft: true, coverRight: true },
    { positions: '4', coverLeft: false, coverRight: false },
  ],
  rotorBarRows: [{ angleDeg: 0 }, { angleDeg: 90 }, { angleDeg: 180 }, { angleDeg: 270 }],
  rotorMassKg: '',
  bars: [0, 1, 2, 3].map(() => ['place', 'place', 'place', 'place']),
};

/** The family document the form describes. */
export function toSpec(v: FormValues): unknown {
  const n = v.positions.length;
  return {
    id: v.id.trim(),
    name: v.name.trim(),
    fitGroup: v.fitGroup.trim(),
    cageKind: v.cageKind,
    positions: v.positions.map((p, i) => ({ index: i + 1, zone: p.zone })),
    drumOptions: v.drumOptions.map((d) => ({ id: d.id, label: d.label.trim(), diameterMm: d.diameterMm })),
    vaneControls: Array.isArray(v.vaneControls) ? v.vaneControls : v.vaneControls ? [v.vaneControls] : [],
    cageTopSections: v.cageTopSections.map((s, i) => ({
      index: i + 1,
      positions: String(s.positions)
        .split(/[\s,]+/)
        .filter(Boolean)
        .map((x) => (/^\d+$/.test(x) ? Number(x) : NaN)),
      coverPlateSides: [...(s.coverLeft ? ['left'] : []), ...(s.coverRight ? ['right'] : [])],
    })),
    rotorBarRows: v.rotorBarRows.map((r, i) => ({ index: i + 1, angleDeg: r.angleDeg })),
    ...(String(v.rotorMassKg ?? '').trim() === '' ? {} : { rotorMassKg: Number(v.rotorMassKg) }),
    rotorBarPlaces: v.rotorBarRows.flatMap((_, ri) =>
      Array.from({ length: n }, (_, pi) => v.bars?.[ri]?.[pi] ?? 'none').flatMap((cell, pi) =>
        cell === 'none' ? [] : [{ row: ri + 1, position: pi + 1, inLine: cell === 'inline' }],
      ),
    ),
    rearPosition: n,
  };
}

/** Where on the form an error of the family document belongs. */
export function formPath(path: readonly PropertyKey[]): string {
  const [head, i, field] = path;
  if (head === 'cageTopSections' && field === 'coverPlateSides') return `cageTopSections.${String(i)}.coverLeft`;
  if (head === 'cageTopSections' && field !== undefined) return `cageTopSections.${String(i)}.positions`;
  if (head === 'rotorBarPlaces') return 'bars';
  if (head === 'rearPosition') return 'positions';
  if (head === 'rotorBarRows' && field === 'index') return `rotorBarRows.${String(i)}.angleDeg`;
  return path.map(String).join('.');
}

function setPath(target: Record<string, unknown>, path: string, message: string) {
  const keys = path.split('.');
  let node = target;
  keys.slice(0, -1).forEach((k) => {
    node[k] ??= {};
    node = node[k] as Record<string, unknown>;
  });
  const last = keys[keys.length - 1]!;
  if (!node[last]) node[last] = { type: 'schema', message };
}

const resolver: Resolver<FormValues> = async (values) => {
  const parsed = machineFamilySchema.safeParse(toSpec(values));
  if (parsed.success) return { values, errors: {} };
  const errors: Record<string, unknown> = {};
  for (const issue of parsed.error.issues) setPath(errors, formPath(issue.path), issue.message);
  return { values: {}, errors: errors as FieldErrors<FormValues> };
};

function errorAt(errors: FieldErrors, path: string): string | undefined {
  let node: unknown = errors;
  for (const k of path.split('.')) node = (node as Record<string, unknown> | undefined)?.[k];
  const m = (node as { message?: unknown } | undefined)?.message;
  return typeof m === 'string' ? m : undefined;
}

function Err({ errors, path }: { errors: FieldErrors; path: string }) {
  const m = errorAt(errors, path);
  return m ? (
    <p className="field-error">
      {path}: {m}
    </p>
  ) : null;
}

const BAR_WORDS: Record<string, string> = { none: '—', place: 'bar', inline: 'in line' };

export default function FamilyForm({ existing, readOnly = false }: FamilyFormProps) {
  const editing = !!existing;
  const {
    register,
    control,
    handleSubmit,
    watch,
    setError,
    getValues,
    setValue,
    formState: { errors, isSubmitting },
  } = useForm<FormValues>({
    resolver,
    defaultValues: existing ? toForm(existing) : BLANK,
    mode: 'onSubmit',
  });
  const positions = useFieldArray({ control, name: 'positions' });
  const drums = useFieldArray({ control, name: 'drumOptions' });
  const sections = useFieldArray({ control, name: 'cageTopSections' });
  const rows = useFieldArray({ control, name: 'rotorBarRows' });
  const [serverError, setServerError] = useState<string | null>(null);
  const positionCount = watch('positions').length;

  const onSubmit = async (values: FormValues) => {
    setServerError(null);
    const spec = toSpec(values) as MachineFamily;
    try {
      if (editing) await sendJson('PUT', `/api/catalog/families/${encodeURIComponent(existing!.id)}`, spec);
      else await sendJson('POST', '/api/catalog/families', spec);
      window.location.assign(`/admin/catalog?savedFamily=${encodeURIComponent(spec.id)}`);
    } catch (e) {
      if (e instanceof ApiError && e.field)
        setError(formPath(e.field.split('.')) as never, { message: e.message.replace(`${e.field}: `, '') });
      setServerError(e instanceof Error ? e.message : 'The family was not saved.');
    }
  };

  const hasErrors = Object.keys(errors).length > 0;
  return (
    <form onSubmit={handleSubmit(onSubmit)} noValidate className="space-y-5" data-testid="family-form">
      {(serverError || hasErrors) && (
        <p role="alert" className="rounded-md border border-fit-line bg-fit-soft p-2 text-sm font-semibold text-fit">
          {serverError ?? 'The family was not saved: check the marked fields.'}
        </p>
      )}
      <fieldset disabled={readOnly || isSubmitting} className="space-y-5 disabled:opacity-80">
        <div className="grid gap-4 sm:grid-cols-2">
          <label>
            <span className="field-label">Id (lower-case, dashes)</span>
            <input className="field-input font-mono" readOnly={editing} {...register('id')} aria-invalid={!!errors.id} />
            <Err errors={errors} path="id" />
          </label>
          <label>
            <span className="field-label">Name</span>
            <input className="field-input" {...register('name')} aria-invalid={!!errors.name} />
            <Err errors={errors} path="name" />
          </label>
          <label>
            <span className="field-label">Fit group</span>
            <input className="field-input font-mono" {...register('fitGroup')} aria-invalid={!!errors.fitGroup} />
            <span className="mt-0.5 block text-xs text-ink-muted">Parts fit every family with the same group.</span>
            <Err errors={errors} path="fitGroup" />
          </label>
          <fieldset>
            <legend className="field-label">Cage kind</legend>
            <label className="mr-4 inline-flex items-center gap-1">
              <input type="radio" value="modular" {...register('cageKind')} /> Modular (any element anywhere)
            </label>
            <label className="inline-flex items-center gap-1">
              <input type="radio" value="split" {...register('cageKind')} /> Split (concaves front, grates rear)
            </label>
          </fieldset>
        </div>

        <fieldset className="rounded-md border border-steel-200 p-3">
          <legend className="px-1 font-semibold">Positions, front to rear</legend>
          <ol className="flex flex-wrap gap-3">
            {positions.fields.map((f, i) => (
              <li key={f.id} className="rounded border border-steel-200 p-2">
                <label className="text-sm font-semibold">
                  Position {i + 1}
                  <select className="field-input py-1" {...register(`positions.${i}.zone`)}>
                    <option value="threshing">Threshing</option>
                    <option value="separating">Separating</option>
                  </select>
                </label>
                <Err errors={errors} path={`positions.${i}.zone`} />
              </li>
            ))}
          </ol>
          <Err errors={errors} path="positions" />
          <div className="mt-2 flex gap-2">
            <button type="button" className="btn" onClick={() => positions.append({ zone: 'separating' })} disabled={positionCount >= 16}>
              Add a position
            </button>
            <button type="button" className="btn" onClick={() => positions.remove(positionCount - 1)} disabled={positionCount <= 1}>
              Remove the last
            </button>
          </div>
        </fieldset>

        <div className="grid gap-4 md:grid-cols-2">
          <fieldset className="rounded-md border border-steel-200 p-3">
            <legend className="px-1 font-semibold">Rotor drums</legend>
            {drums.fields.map((f, i) => (
              <div key={f.id} className="mb-2 grid grid-cols-[7rem_1fr_7rem_auto] items-end gap-2">
                <label className="text-sm">
                  Kind
                  <select className="field-input py-1" {...register(`drumOptions.${i}.id`)}>
                    <option value="full">Full</option>
                    <option value="slim">Slim</option>
                  </select>
                </label>
                <label className="text-sm">
                  Label
                  <input className="field-input py-1" {...register(`drumOptions.${i}.label`)} />
                </label>
                <label className="text-sm">
                  Ø mm
                  <input className="field-input py-1" type="number" {...register(`drumOptions.${i}.diameterMm`, { valueAsNumber: true })} />
                </label>
                <button
                  type="button"
                  className="btn"
                  onClick={() => drums.remove(i)}
                  disabled={drums.fields.length <= 1}
                  aria-label={`Remove drum option ${i + 1}`}
                >
                  ✕
                </button>
                <div className="col-span-4">
                  <Err errors={errors} path={`drumOptions.${i}.id`} />
                  <Err errors={errors} path={`drumOptions.${i}.label`} />
                  <Err errors={errors} path={`drumOptions.${i}.diameterMm`} />
                </div>
              </div>
            ))}
            <Err errors={errors} path="drumOptions" />
            <label className="mt-2 block text-sm" htmlFor="f-family-rotorMassKg">
              <span className="font-semibold">Rotor mass, kg</span>{' '}
              <span className="text-ink-muted">(for the balance check; blank: a typical 450 kg rotor)</span>
              <input id="f-family-rotorMassKg" className="field-input mt-1 block w-32" inputMode="decimal" {...register('rotorMassKg')} />
            </label>
            <Err errors={errors} path="rotorMassKg" />
            <button
              type="button"
              className="btn"
              onClick={() => drums.append({ id: 'slim', label: 'Slim drum', diameterMm: 762 })}
              disabled={drums.fields.length >= 2}
            >
              Add a drum option
            </button>
          </fieldset>
          <fieldset className="rounded-md border border-steel-200 p-3">
            <legend className="px-1 font-semibold">Vane controls this family comes with</legend>
            {(['fixed', 'manual', 'powered'] as const).map((c) => (
              <label key={c} className="mr-4 inline-flex items-center gap-1">
                <input type="checkbox" value={c} {...register('vaneControls')} />{' '}
                {c === 'fixed' ? 'Fixed' : c === 'manual' ? 'Manually adjusted' : 'Powered'}
              </label>
            ))}
            <Err errors={errors} path="vaneControls" />
          </fieldset>
        </div>

        <fieldset className="rounded-md border border-steel-200 p-3">
          <legend className="px-1 font-semibold">Cage-top sections</legend>
          {sections.fields.map((f, i) => (
            <div key={f.id} className="mb-2 flex flex-wrap items-end gap-3">
              <span className="w-20 text-sm font-semibold">Section {i + 1}</span>
              <label className="text-sm">
                Over positions
                <input className="field-input py-1" {...register(`cageTopSections.${i}.positions`)} placeholder="2, 3" />
              </label>
              <span className="text-sm">Cover-plate seat:</span>
              <label className="inline-flex items-center gap-1 text-sm">
                <input type="checkbox" {...register(`cageTopSections.${i}.coverLeft`)} /> left
              </label>
              <label className="inline-flex items-center gap-1 text-sm">
                <input type="checkbox" {...register(`cageTopSections.${i}.coverRight`)} /> right
              </label>
              <button type="button" className="btn" onClick={() => sections.remove(i)} aria-label={`Remove section ${i + 1}`}>
                ✕
              </button>
              <div className="w-full">
                <Err errors={errors} path={`cageTopSections.${i}.positions`} />
                <Err errors={errors} path={`cageTopSections.${i}.coverLeft`} />
              </div>
            </div>
          ))}
          <button type="button" className="btn" onClick={() => sections.append({ positions: '', coverLeft: false, coverRight: false })}>
            Add a section
          </button>
        </fieldset>

        <fieldset className="rounded-md border border-steel-200 p-3">
          <legend className="px-1 font-semibold">Rotor bar rows and places</legend>
          <p className="text-xs text-ink-muted">
            For each row and position: no place, a bar place, or a place where two rasp bars stand in line (a straight bar can bolt across).
          </p>
          {/* Read only, the grid is words in a table that fits a phone; editable, it scrolls in its own box. */}
          <div className={readOnly ? 'mt-2' : 'mt-2 overflow-x-auto'} tabIndex={readOnly ? undefined : 0}>
            <table className={readOnly ? 'w-full table-fixed text-sm' : 'text-sm'}>
              <thead>
                <tr>
                  <th scope="col" className="pr-2 text-left">
                    Row
                  </th>
                  <th scope="col" className="pr-2 text-left">
                    Angle °
                  </th>
                  {Array.from({ length: positionCount }, (_, p) => (
                    <th key={p} scope="col" className="px-1">
                      P{p + 1}
                    </th>
                  ))}
                  <th />
                </tr>
              </thead>
              <tbody>
                {rows.fields.map((f, ri) => (
                  <tr key={f.id}>
                    <th scope="row" className="pr-2 text-left">
                      {ri + 1}
                    </th>
                    <td className="pr-2">
                      {readOnly ? (
                        <span>{getValues(`rotorBarRows.${ri}.angleDeg`)}</span>
                      ) : (
                        <>
                          <input
                            className="field-input w-20 py-1"
                            type="number"
                            aria-label={`Row ${ri + 1} angle in degrees`}
                            {...register(`rotorBarRows.${ri}.angleDeg`, { valueAsNumber: true })}
                          />
                          <Err errors={errors} path={`rotorBarRows.${ri}.angleDeg`} />
                        </>
                      )}
                    </td>
                    {Array.from({ length: positionCount }, (_, p) => (
                      <td key={p} className="px-1">
                        {readOnly ? (
                          <span className="text-xs">{BAR_WORDS[String(getValues(`bars.${ri}.${p}` as const) ?? 'place')] ?? '—'}</span>
                        ) : (
                          <select
                            className="rounded border-steel-300 py-0.5 text-xs"
                            aria-label={`Row ${ri + 1}, position ${p + 1}`}
                            {...register(`bars.${ri}.${p}` as const)}
                            defaultValue="place"
                          >
                            <option value="none">—</option>
                            <option value="place">bar</option>
                            <option value="inline">in line</option>
                          </select>
                        )}
                      </td>
                    ))}
                    <td>
                      {!readOnly && (
                        <button
                          type="button"
                          className="btn py-0.5"
                          onClick={() => {
                            const grid = getValues('bars') ?? [];
                            rows.remove(ri);
                            setValue(
                              'bars',
                              grid.filter((_, i) => i !== ri),
                            );
                          }}
                          aria-label={`Remove row ${ri + 1}`}
                        >
                          ✕
                        </button>
                      )}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <Err errors={errors} path="bars" />
          <button type="button" className="btn mt-2" onClick={() => rows.append({ angleDeg: 0 })} disabled={rows.fields.length >= 16}>
            Add a row
          </button>
        </fieldset>
      </fieldset>
      {!readOnly && (
        <div className="flex gap-2">
          <button className="btn-primary" type="submit" disabled={isSubmitting}>
            {editing ? 'Save family' : 'Add family'}
          </button>
          <a className="btn" href="/admin/catalog">
            Cancel
          </a>
        </div>
      )}
    </form>
  );
}
