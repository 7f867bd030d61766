/**
 * Add or edit a catalog part. Validated in the browser by the same domain schema the API uses
 * (catalogPartSchema), through react-hook-form's zod resolver; the server checks again and its
 * field errors land on the same inputs.
 */
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm, type FieldErrors, type FieldValues, type Resolver } from 'react-hook-form';
import { z } from 'zod';
import { barKindSchema, catalogPartSchema, elementRoleSchema, elementTypeSchema, slugSchema, type CatalogPart } from '~/lib/domain/schemas';
import { ApiError, sendJson } from '~/components/shared/api';
import { barKindName, elementTypeLabel } from '~/lib/domain/vocabulary';
import { capitalise } from '~/lib/domain/words';
import { DEFAULT_CURRENCY, formatMoney } from '~/lib/domain/format';

export interface FamilyOption {
  id: string;
  name: string;
  fitGroup: string;
  cageKind: 'modular' | 'split';
}

export interface PartFormProps {
  families: FamilyOption[];
  /** Present when editing. */
  existing?: { familyId: string; active: boolean; spec: CatalogPart };
  readOnly?: boolean;
}

/** The API's body; `noOpening` is the form's way of saying a blank plate has no opening. */
const partFormSchema = z.preprocess(
  (v: unknown) => {
    const f = v as { noOpening?: boolean; part?: Record<string, unknown> } & Record<string, unknown>;
    if (!f || typeof f !== 'object' || !f.part) return v;
    const { noOpening, ...rest } = f;
    if (f.part.kind === 'element' && noOpening) return { ...rest, part: { ...f.part, openingMm: null } };
    return rest;
  },
  z.object({ familyId: slugSchema, active: z.boolean(), part: catalogPartSchema }),
);

const ROLE_WORDS: Record<string, string> = {
  concave: 'Concave (front, split cage)',
  grate: 'Grate (rear, split cage)',
  either: 'Either (modular cage)',
};

const KINDS = [
  ['element', 'Cage element (concave or grate)'],
  ['cover-plate', 'Cover plate'],
  ['rotor-bar', 'Rotor bar'],
] as const;

function errorAt(errors: FieldErrors, path: string): string | undefined {
  let node: unknown = errors;
  for (const k of path.split('.')) node = (node as Record<string, unknown> | undefined)?.[k];
  const message = (node as { message?: unknown } | undefined)?.message;
  return typeof message === 'string' ? message : undefined;
}

function Field({
  label,
  path,
  errors,
  children,
  hint,
}: {
  label: string;
  path: string;
  errors: FieldErrors;
  children: React.ReactNode;
  hint?: string;
}) {
  const msg = errorAt(errors, path);
  const id = `f-${path.replace(/\./g, '-')}`;
  return (
    <div>
      <label className="field-label" htmlFor={id}>
        {label}
      </label>
      {children}
      {hint && <p className="mt-0.5 text-xs text-ink-muted">{hint}</p>}
      {msg && (
        <p className="field-error" id={`${id}-error`}>
          {path}: {msg}
        </p>
      )}
    </div>
  );
}

export default function PartForm({ families, existing, readOnly = false }: PartFormProps) {
  const first = families[0];
  const spec = existing?.spec;
  const defaults: FieldValues = {
    familyId: existing?.familyId ?? first?.id ?? '',
    active: existing?.active ?? true,
    noOpening: spec?.kind === 'element' ? spec.openingMm === null : false,
    part: spec ?? {
      kind: 'element',
      partNumber: '',
      name: '',
      fitGroup: first?.fitGroup ?? '',
      massKg: undefined,
      priceCents: undefined,
      elementType: 'fine-wire',
      role: first?.cageKind === 'split' ? 'concave' : 'either',
      hand: 'left',
      zones: ['threshing'],
      openingMm: { width: undefined, length: undefined },
      openArea: undefined,
    },
  };
  const {
    register,
    handleSubmit,
    watch,
    setValue,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<FieldValues>({
    resolver: zodResolver(partFormSchema as never) as unknown as Resolver<FieldValues>,
    defaultValues: defaults,
    shouldUnregister: true,
    mode: 'onTouched',
  });
  const [serverError, setServerError] = useState<string | null>(null);
  const kind = watch('part.kind');
  const noOpening = watch('noOpening');
  const price = watch('part.priceCents');
  const editing = !!existing;
  const num = { valueAsNumber: true } as const;

  const onSubmit = async (values: FieldValues) => {
    setServerError(null);
    const body = partFormSchema.parse(values);
    try {
      if (editing) await sendJson('PUT', `/api/catalog/parts/${encodeURIComponent(existing!.spec.partNumber)}`, body);
      else await sendJson('POST', '/api/catalog/parts', body);
      window.location.assign(`/admin/catalog?saved=${encodeURIComponent(body.part.partNumber)}`);
    } catch (e) {
      if (e instanceof ApiError && e.field && e.field !== 'body') setError(e.field, { message: e.message.replace(`${e.field}: `, '') });
      setServerError(e instanceof Error ? e.message : 'The part was not saved.');
    }
  };

  const errorCount = Object.keys(errors).length;
  return (
    <form
      onSubmit={handleSubmit(onSubmit)}
      noValidate
      className="space-y-4"
      data-testid="part-form"
      aria-describedby={serverError ? 'part-server-error' : undefined}
    >
      {(serverError || errorCount > 0) && (
        <p role="alert" id="part-server-error" className="rounded-md border border-fit-line bg-fit-soft p-2 text-sm font-semibold text-fit">
          {serverError ?? 'The part was not saved: check the marked fields.'}
        </p>
      )}
      <fieldset disabled={readOnly || isSubmitting} className="grid gap-4 disabled:opacity-80 sm:grid-cols-2">
        <Field label="Machine family" path="familyId" errors={errors}>
          <select
            id="f-familyId"
            className="field-input"
            {...register('familyId', {
              onChange: (e) => {
                const f = families.find((x) => x.id === e.target.value);
                if (f) setValue('part.fitGroup', f.fitGroup, { shouldValidate: true });
              },
            })}
          >
            {families.map((f) => (
              <option key={f.id} value={f.id}>
                {f.name}
              </option>
            ))}
          </select>
        </Field>
        <Field
          label="Fit group"
          path="part.fitGroup"
          errors={errors}
          hint="Follows the family; parts fit machines whose family has this group."
        >
          <input id="f-part-fitGroup" className="field-input bg-steel-50" readOnly {...register('part.fitGroup')} />
        </Field>
        <Field label="Kind" path="part.kind" errors={errors}>
          <select id="f-part-kind" className="field-input" {...register('part.kind')}>
            {KINDS.filter(([k]) => !editing || k === spec?.kind).map(([k, label]) => (
              <option key={k} value={k}>
                {label}
              </option>
            ))}
          </select>
        </Field>
        <Field label="Part number" path="part.partNumber" errors={errors} hint="Upper-case letters, digits and dashes, e.g. CW-FW-L-04.">
          <input id="f-part-partNumber" className="field-input font-mono" readOnly={editing} {...register('part.partNumber')} />
        </Field>
        <div className="sm:col-span-2">
          <Field label="Name" path="part.name" errors={errors}>
            <input id="f-part-name" className="field-input" {...register('part.name')} />
          </Field>
        </div>
        <Field label="Mass, kg" path="part.massKg" errors={errors}>
          <input id="f-part-massKg" className="field-input" type="number" step="0.1" {...register('part.massKg', num)} />
        </Field>
        <Field
          label="List price, cents (dealers may set their own)"
          path="part.priceCents"
          errors={errors}
          hint={Number.isFinite(price) ? `= ${formatMoney(Number(price), DEFAULT_CURRENCY)}` : 'Whole cents: 118500 is 1,185.00'}
        >
          <input id="f-part-priceCents" className="field-input" type="number" step="1" {...register('part.priceCents', num)} />
        </Field>
        <Field
          label="Bolt torque, N·m"
          path="part.boltTorqueNm"
          errors={errors}
          hint="For the plan's torque step; blank: the operator's manual's value."
        >
          <input
            id="f-part-boltTorqueNm"
            className="field-input"
            type="number"
            step="1"
            {...register('part.boltTorqueNm', {
              setValueAs: (v: unknown) => (v === '' || v === null || v === undefined ? undefined : Number(v)),
            })}
          />
        </Field>

        {kind === 'element' && (
          <>
            <Field label="Element type" path="part.elementType" errors={errors}>
              <select id="f-part-elementType" className="field-input" {...register('part.elementType')}>
                {elementTypeSchema.options.map((t) => (
                  <option key={t} value={t}>
                    {elementTypeLabel(t)}
                  </option>
                ))}
              </select>
            </Field>
            <Field label="Role" path="part.role" errors={errors}>
              <select id="f-part-role" className="field-input" {...register('part.role')}>
                {elementRoleSchema.options.map((r) => (
                  <option key={r} value={r}>
                    {ROLE_WORDS[r]}
                  </option>
                ))}
              </select>
            </Field>
            <fieldset>
              <legend className="field-label">Hand</legend>
              {(['left', 'right'] as const).map((h) => (
                <label key={h} className="mr-4 inline-flex items-center gap-1">
                  <input type="radio" value={h} {...register('part.hand')} /> {h === 'left' ? 'Left' : 'Right'}
                </label>
              ))}
              {errorAt(errors, 'part.hand') && <p className="field-error">part.hand: {errorAt(errors, 'part.hand')}</p>}
            </fieldset>
            <fieldset>
              <legend className="field-label">Zones it may sit in</legend>
              {(['threshing', 'separating'] as const).map((z) => (
                <label key={z} className="mr-4 inline-flex items-center gap-1">
                  <input type="checkbox" value={z} {...register('part.zones')} /> {z === 'threshing' ? 'Threshing' : 'Separating'}
                </label>
              ))}
              {errorAt(errors, 'part.zones') && <p className="field-error">part.zones: {errorAt(errors, 'part.zones')}</p>}
            </fieldset>
            <div className="sm:col-span-2">
              <label className="inline-flex items-center gap-2">
                <input type="checkbox" {...register('noOpening')} /> No opening (blank plate)
              </label>
            </div>
            {!noOpening && (
              <>
                <Field
                  label="Opening width, mm"
                  path="part.openingMm.width"
                  errors={errors}
                  hint="The narrow way across: between wires or bars, or a hole’s diameter."
                >
                  <input
                    id="f-part-openingMm-width"
                    className="field-input"
                    type="number"
                    step="0.1"
                    {...register('part.openingMm.width', num)}
                  />
                </Field>
                <Field
                  label="Opening length, mm"
                  path="part.openingMm.length"
                  errors={errors}
                  hint="Along the wires; the width again for a round hole."
                >
                  <input
                    id="f-part-openingMm-length"
                    className="field-input"
                    type="number"
                    step="0.1"
                    {...register('part.openingMm.length', num)}
                  />
                </Field>
              </>
            )}
            <Field label="Open area, share of the face (0–1)" path="part.openArea" errors={errors}>
              <input id="f-part-openArea" className="field-input" type="number" step="0.01" {...register('part.openArea', num)} />
            </Field>
          </>
        )}

        {kind === 'cover-plate' && (
          <>
            <fieldset>
              <legend className="field-label">Side</legend>
              {(['left', 'right'] as const).map((h) => (
                <label key={h} className="mr-4 inline-flex items-center gap-1">
                  <input type="radio" value={h} {...register('part.side')} /> {h === 'left' ? 'Left' : 'Right'}
                </label>
              ))}
              {errorAt(errors, 'part.side') && <p className="field-error">part.side: {errorAt(errors, 'part.side')}</p>}
            </fieldset>
            <label className="inline-flex items-center gap-2 self-end">
              <input type="checkbox" {...register('part.slotted')} /> Slotted for vane bolts
            </label>
          </>
        )}

        {kind === 'rotor-bar' && (
          <Field label="Bar kind" path="part.barKind" errors={errors}>
            <select id="f-part-barKind" className="field-input" {...register('part.barKind')}>
              {barKindSchema.options.map((b) => (
                <option key={b} value={b}>
                  {capitalise(barKindName(b))}
                </option>
              ))}
            </select>
          </Field>
        )}

        <label className="inline-flex items-center gap-2 sm:col-span-2">
          <input type="checkbox" {...register('active')} /> Active (offered in the editor’s palette)
        </label>
      </fieldset>
      {!readOnly && (
        <div className="flex gap-2">
          <button className="btn-primary" type="submit" disabled={isSubmitting}>
            {editing ? 'Save part' : 'Add part'}
          </button>
          <a className="btn" href="/admin/catalog">
            Cancel
          </a>
        </div>
      )}
    </form>
  );
}
