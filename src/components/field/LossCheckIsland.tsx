/**
 * The loss check on a phone: kernels counted in frames at three places, the widths, the basis,
 * yield and price; the result is worked out as the numbers go in (the same pure domain function
 * the server runs) and saved to the season log with the settings of the moment.
 */
import { useState } from 'react';
import { computeLossCheck, LOSS_SIGN_LABEL, lossCheckInputSchema, type LossCheckResult, type LossSign } from '~/lib/domain/field-check';
import { cropPrograms } from '~/lib/domain/crops';
import type { CropId, VaneSetting } from '~/lib/domain/schemas';
import type { UnitSystem } from '~/lib/domain/units';
import { ApiError, sendJson } from '~/components/shared/api';
import { EMPTY_HOURS, HoursFields, hoursFromDraft, type HoursDraft } from '~/components/wear/HoursFields';
import { LossResult } from './LossResult';
import { DEFAULT_CURRENCY } from '~/lib/domain/format';

export interface StartValues {
  fanRpm: number | null;
  upperSieveMm: number | null;
  lowerSieveMm: number | null;
}

export interface LossCheckProps {
  machine: { id: string; nickname: string };
  units: UnitSystem;
  canRecord: boolean;
  defaults: { crop: CropId; rotorRpm: number | null; clearanceMm: number | null; vaneSetting: VaneSetting | null };
  /** The dealer's starting values by crop, to prefill the rest-of-machine settings. */
  starting: Partial<Record<CropId, StartValues>>;
  /** The dealer's currency (ISO 4217), the price field's starting currency. */
  currency?: string;
}

type Place = 'preHarvest' | 'header' | 'behindMachine';
const PLACES: { key: Place; title: string; hint: string }[] = [
  { key: 'preHarvest', title: 'In front of the header', hint: 'In standing crop: what fell before harvest.' },
  { key: 'header', title: 'Behind the header', hint: 'Where the cut crop was taken but the machine’s spread has not landed.' },
  { key: 'behindMachine', title: 'Behind the machine', hint: 'In the spread of straw and chaff.' },
];
const VANES: VaneSetting[] = ['very-slow', 'slow', 'medium', 'fast'];
const SIGNS: LossSign[] = ['unthreshed', 'in-straw', 'in-chaff'];

const num = (s: string) => (s.trim() === '' ? NaN : Number(s.replace(',', '.')));
const opt = (s: string) => (s.trim() === '' ? null : num(s));
const lenIn = (units: UnitSystem, mm: number | null) =>
  mm === null ? '' : units === 'imperial' ? String(Math.round((mm / 25.4) * 100) / 100) : String(mm);
const lenOut = (units: UnitSystem, s: string) => {
  const v = opt(s);
  return v === null ? null : units === 'imperial' ? Math.round(v * 25.4 * 100) / 100 : v;
};
const nowLocal = () => {
  const d = new Date();
  d.setMinutes(d.getMinutes() - d.getTimezoneOffset());
  return d.toISOString().slice(0, 16);
};

const input = 'field-input min-h-[56px] text-xl';
const big = 'btn min-h-[56px] px-4 text-base';

export default function LossCheckIsland(props: LossCheckProps) {
  const { units } = props;
  const imperial = units === 'imperial';
  const [crop, setCrop] = useState<CropId>(props.defaults.crop);
  const [frameBy, setFrameBy] = useState<'area' | 'sides'>('area');
  const [frameArea, setFrameArea] = useState(imperial ? '1' : '0.25');
  const [side1, setSide1] = useState(imperial ? '12' : '50');
  const [side2, setSide2] = useState(imperial ? '12' : '50');
  const [counts, setCounts] = useState<Record<Place, string[]>>({ preHarvest: [''], header: [''], behindMachine: [''] });
  const [cutWidth, setCutWidth] = useState(imperial ? '35' : '10.7');
  const [spreadWidth, setSpreadWidth] = useState(imperial ? '35' : '10.7');
  const [basis, setBasis] = useState<'default' | 'own-weight' | 'typed'>('default');
  const [tkw, setTkw] = useState('');
  const [typed, setTyped] = useState('');
  const [yieldValue, setYieldValue] = useState('');
  const [price, setPrice] = useState('');
  const [currency, setCurrency] = useState(props.currency ?? DEFAULT_CURRENCY);
  const [target, setTarget] = useState('');
  const [signs, setSigns] = useState<LossSign[]>([]);
  const [fieldName, setFieldName] = useState('');
  const [when, setWhen] = useState(nowLocal);
  const [moisture, setMoisture] = useState('');
  const [rpm, setRpm] = useState(props.defaults.rotorRpm?.toString() ?? '');
  const [clearance, setClearance] = useState(lenIn(units, props.defaults.clearanceMm));
  const [vanes, setVanes] = useState<VaneSetting | ''>(props.defaults.vaneSetting ?? '');
  const start = props.starting[crop];
  const [fan, setFan] = useState(start?.fanRpm?.toString() ?? '');
  const [upper, setUpper] = useState(lenIn(units, start?.upperSieveMm ?? null));
  const [lower, setLower] = useState(lenIn(units, start?.lowerSieveMm ?? null));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [saving, setSaving] = useState(false);
  const [saved, setSaved] = useState<{ id: string; result: LossCheckResult } | null>(null);
  const [serverError, setServerError] = useState('');
  const [hours, setHours] = useState<HoursDraft>(EMPTY_HOURS);

  const changeCrop = (c: CropId) => {
    setCrop(c);
    const s = props.starting[c];
    setFan(s?.fanRpm?.toString() ?? '');
    setUpper(lenIn(units, s?.upperSieveMm ?? null));
    setLower(lenIn(units, s?.lowerSieveMm ?? null));
  };

  const checkInput = {
    crop,
    frame:
      frameBy === 'area'
        ? { by: 'area' as const, area: num(frameArea), unit: imperial ? ('ft2' as const) : ('m2' as const) }
        : { by: 'sides' as const, length: num(side1), width: num(side2), unit: imperial ? ('in' as const) : ('cm' as const) },
    counts: { preHarvest: counts.preHarvest.map(num), header: counts.header.map(num), behindMachine: counts.behindMachine.map(num) },
    cutWidth: num(cutWidth),
    spreadWidth: num(spreadWidth),
    widthUnit: imperial ? ('ft' as const) : ('m' as const),
    basis:
      basis === 'default'
        ? { kind: 'default' as const }
        : basis === 'own-weight'
          ? { kind: 'own-weight' as const, tkwG: num(tkw) }
          : { kind: 'typed' as const, kernels: num(typed), per: imperial ? ('ft2' as const) : ('m2' as const) },
    expectedYield: { value: num(yieldValue), unit: imperial ? ('bu/ac' as const) : ('kg/ha' as const) },
    price: price.trim() === '' ? null : { value: num(price), per: imperial ? ('bu' as const) : ('t' as const), currency },
    targetPct: opt(target),
    signs,
  };
  const parsed = lossCheckInputSchema.safeParse(checkInput);
  const liveErrors: Record<string, string> = {};
  if (!parsed.success) for (const i of parsed.error.issues) liveErrors[i.path.join('.')] ??= i.message;
  const preview = parsed.success ? computeLossCheck(checkInput) : null;
  const err = (field: string) => errors[field];

  async function save(e: { preventDefault(): void }) {
    e.preventDefault();
    setServerError('');
    const local: Record<string, string> = { ...liveErrors };
    if (!fieldName.trim()) local.fieldName = 'give the field name';
    if (Object.keys(local).length) {
      setErrors(local);
      const first = Object.keys(local)[0]!;
      setServerError(`Check ${first}: ${local[first]}`);
      return;
    }
    setErrors({});
    setSaving(true);
    try {
      const body = {
        ...checkInput,
        fieldName,
        checkedAt: when ? new Date(when).toISOString() : undefined,
        moisturePct: opt(moisture),
        settings: {
          ...(rpm ? { rotorRpm: num(rpm) } : {}),
          ...(clearance ? { clearanceMm: lenOut(units, clearance) } : {}),
          ...(vanes ? { vaneSetting: vanes } : {}),
          fanRpm: opt(fan),
          upperSieveMm: lenOut(units, upper),
          lowerSieveMm: lenOut(units, lower),
        },
        ...(hoursFromDraft(hours) ? { hours: hoursFromDraft(hours) } : {}),
      };
      const r = await sendJson<{ id: string; result: LossCheckResult }>('POST', `/api/machines/${props.machine.id}/loss-checks`, body);
      setSaved({ id: r.id, result: r.result });
    } catch (error) {
      if (error instanceof ApiError) {
        if (error.field) setErrors({ [error.field]: error.message });
        setServerError(error.message);
      } else setServerError('The check could not be sent. Your numbers are still here; try again when you have signal.');
    } finally {
      setSaving(false);
    }
  }

  const label = (id: string, text: string, unit?: string) => (
    <label htmlFor={id} className="block font-semibold">
      {text}
      {unit && <span className="font-normal text-ink-muted"> ({unit})</span>}
    </label>
  );
  const fieldErr = (key: string) => {
    const m = err(key);
    return m ? (
      <p className="field-error" id={`${key}-err`}>
        {m}
      </p>
    ) : null;
  };
  const aria = (key: string) => (err(key) ? { 'aria-invalid': true, 'aria-describedby': `${key}-err` } : {});

  return (
    <form onSubmit={save} noValidate className="space-y-5" data-testid="loss-check-form">
      <fieldset className="card space-y-3">
        <legend className="px-1 text-lg font-semibold">Field and crop</legend>
        <div>
          {label('lc-field', 'Field')}
          <input
            id="lc-field"
            className={input}
            value={fieldName}
            onChange={(e) => setFieldName(e.target.value)}
            autoComplete="off"
            {...aria('fieldName')}
          />
          {fieldErr('fieldName')}
        </div>
        <div className="grid grid-cols-2 gap-3">
          <div>
            {label('lc-crop', 'Crop')}
            <select id="lc-crop" className={input} value={crop} onChange={(e) => changeCrop(e.target.value as CropId)}>
              {Object.values(cropPrograms).map((c) => (
                <option key={c.id} value={c.id}>
                  {c.name}
                </option>
              ))}
            </select>
          </div>
          <div>
            {label('lc-moisture', 'Moisture', '%, if known')}
            <input
              id="lc-moisture"
              className={input}
              inputMode="decimal"
              value={moisture}
              onChange={(e) => setMoisture(e.target.value)}
              {...aria('moisturePct')}
            />
            {fieldErr('moisturePct')}
          </div>
        </div>
        <div>
          {label('lc-when', 'When')}
          <input
            id="lc-when"
            type="datetime-local"
            className={input}
            value={when}
            onChange={(e) => setWhen(e.target.value)}
            {...aria('checkedAt')}
          />
          {fieldErr('checkedAt')}
        </div>
      </fieldset>

      <fieldset className="card space-y-3">
        <legend className="px-1 text-lg font-semibold">Frame</legend>
        <div className="flex gap-2" role="group" aria-label="Give the frame by">
          <button
            type="button"
            className={`${big} ${frameBy === 'area' ? 'border-iris-700 bg-iris-50' : ''}`}
            aria-pressed={frameBy === 'area'}
            onClick={() => setFrameBy('area')}
          >
            By area
          </button>
          <button
            type="button"
            className={`${big} ${frameBy === 'sides' ? 'border-iris-700 bg-iris-50' : ''}`}
            aria-pressed={frameBy === 'sides'}
            onClick={() => setFrameBy('sides')}
          >
            By its sides
          </button>
        </div>
        {frameBy === 'area' ? (
          <div>
            {label('lc-frame-area', 'Frame area', imperial ? 'ft²' : 'm²')}
            <input
              id="lc-frame-area"
              className={input}
              inputMode="decimal"
              value={frameArea}
              onChange={(e) => setFrameArea(e.target.value)}
              {...aria('frame.area')}
            />
            {fieldErr('frame.area')}
          </div>
        ) : (
          <div className="grid grid-cols-2 gap-3">
            <div>
              {label('lc-side1', 'Length', imperial ? 'in' : 'cm')}
              <input
                id="lc-side1"
                className={input}
                inputMode="decimal"
                value={side1}
                onChange={(e) => setSide1(e.target.value)}
                {...aria('frame.length')}
              />
              {fieldErr('frame.length')}
            </div>
            <div>
              {label('lc-side2', 'Width', imperial ? 'in' : 'cm')}
              <input
                id="lc-side2"
                className={input}
                inputMode="decimal"
                value={side2}
                onChange={(e) => setSide2(e.target.value)}
                {...aria('frame.width')}
              />
              {fieldErr('frame.width')}
            </div>
          </div>
        )}
      </fieldset>

      {PLACES.map((p) => (
        <fieldset key={p.key} className="card space-y-2" data-testid={`counts-${p.key}`}>
          <legend className="px-1 text-lg font-semibold">{p.title}</legend>
          <p className="text-sm text-ink-muted">{p.hint} Kernels in each frame; frames are averaged.</p>
          <div className="grid grid-cols-3 gap-2">
            {counts[p.key].map((c, i) => (
              <div key={i}>
                <label htmlFor={`lc-${p.key}-${i}`} className="block text-sm font-semibold">
                  Frame {i + 1}
                </label>
                <input
                  id={`lc-${p.key}-${i}`}
                  className={input}
                  inputMode="numeric"
                  value={c}
                  onChange={(e) => setCounts({ ...counts, [p.key]: counts[p.key].map((x, j) => (j === i ? e.target.value : x)) })}
                  {...aria(`counts.${p.key}.${i}`)}
                />
                {fieldErr(`counts.${p.key}.${i}`)}
              </div>
            ))}
          </div>
          <div className="flex gap-2">
            <button
              type="button"
              className={big}
              onClick={() => setCounts({ ...counts, [p.key]: [...counts[p.key], ''] })}
              disabled={counts[p.key].length >= 30}
            >
              + Frame
            </button>
            {counts[p.key].length > 1 && (
              <button type="button" className={big} onClick={() => setCounts({ ...counts, [p.key]: counts[p.key].slice(0, -1) })}>
                − Last frame
              </button>
            )}
          </div>
          {fieldErr(`counts.${p.key}`)}
        </fieldset>
      ))}

      <fieldset className="card space-y-3">
        <legend className="px-1 text-lg font-semibold">Widths</legend>
        <div className="grid grid-cols-2 gap-3">
          <div>
            {label('lc-cut', 'Cut width', imperial ? 'ft' : 'm')}
            <input
              id="lc-cut"
              className={input}
              inputMode="decimal"
              value={cutWidth}
              onChange={(e) => setCutWidth(e.target.value)}
              {...aria('cutWidth')}
            />
            {fieldErr('cutWidth')}
          </div>
          <div>
            {label('lc-spread', 'Spread width', imperial ? 'ft' : 'm')}
            <input
              id="lc-spread"
              className={input}
              inputMode="decimal"
              value={spreadWidth}
              onChange={(e) => setSpreadWidth(e.target.value)}
              {...aria('spreadWidth')}
            />
            {fieldErr('spreadWidth')}
          </div>
        </div>
        <p className="text-sm text-ink-muted">The width the straw and chaff land over (a windrow’s width when windrowing).</p>
      </fieldset>

      <fieldset className="card space-y-3">
        <legend className="px-1 text-lg font-semibold">Kernels for 1 bu/ac</legend>
        <div className="space-y-2">
          {(
            [
              [
                'default',
                cropPrograms[crop].publishedLossCount
                  ? `Published count for ${cropPrograms[crop].name.toLowerCase()}`
                  : `The crop’s usual kernel weight (no published count for ${cropPrograms[crop].name.toLowerCase()})`,
              ],
              ['own-weight', 'My thousand-kernel weight'],
              ['typed', 'A count I type'],
            ] as const
          ).map(([k, text]) => (
            <label key={k} className="flex min-h-[48px] items-center gap-3 text-base">
              <input type="radio" name="basis" className="h-6 w-6" checked={basis === k} onChange={() => setBasis(k)} />
              {text}
            </label>
          ))}
        </div>
        {basis === 'own-weight' && (
          <div>
            {label('lc-tkw', 'Thousand-kernel weight', 'g')}
            <input
              id="lc-tkw"
              className={input}
              inputMode="decimal"
              value={tkw}
              onChange={(e) => setTkw(e.target.value)}
              {...aria('basis.tkwG')}
            />
            {fieldErr('basis.tkwG')}
          </div>
        )}
        {basis === 'typed' && (
          <div>
            {label('lc-typed', 'Kernels for 1 bu/ac', imperial ? 'per ft²' : 'per m²')}
            <input
              id="lc-typed"
              className={input}
              inputMode="decimal"
              value={typed}
              onChange={(e) => setTyped(e.target.value)}
              {...aria('basis.kernels')}
            />
            {fieldErr('basis.kernels')}
          </div>
        )}
      </fieldset>

      <fieldset className="card space-y-3">
        <legend className="px-1 text-lg font-semibold">Yield, price and target</legend>
        <div>
          {label('lc-yield', 'Expected yield', imperial ? 'bu/ac' : 'kg/ha')}
          <input
            id="lc-yield"
            className={input}
            inputMode="decimal"
            value={yieldValue}
            onChange={(e) => setYieldValue(e.target.value)}
            {...aria('expectedYield.value')}
          />
          {fieldErr('expectedYield.value')}
        </div>
        <div className="grid grid-cols-[1fr_5rem] gap-3">
          <div>
            {label('lc-price', 'Price, optional', imperial ? 'per bushel' : 'per tonne')}
            <input
              id="lc-price"
              className={input}
              inputMode="decimal"
              value={price}
              onChange={(e) => setPrice(e.target.value)}
              {...aria('price.value')}
            />
            {fieldErr('price.value')}
          </div>
          <div>
            {label('lc-currency', 'Money')}
            <input
              id="lc-currency"
              className={input}
              value={currency}
              maxLength={8}
              onChange={(e) => setCurrency(e.target.value)}
              {...aria('price.currency')}
            />
          </div>
        </div>
        <div>
          {label('lc-target', 'My target', '% of yield; empty for the default')}
          <input
            id="lc-target"
            className={input}
            inputMode="decimal"
            value={target}
            onChange={(e) => setTarget(e.target.value)}
            {...aria('targetPct')}
          />
          {fieldErr('targetPct')}
        </div>
      </fieldset>

      <fieldset className="card space-y-2">
        <legend className="px-1 text-lg font-semibold">What you saw behind the machine</legend>
        {SIGNS.map((s) => (
          <label key={s} className="flex min-h-[48px] items-center gap-3 text-base">
            <input
              type="checkbox"
              className="h-6 w-6"
              checked={signs.includes(s)}
              onChange={(e) => setSigns(e.target.checked ? [...signs, s] : signs.filter((x) => x !== s))}
            />
            {LOSS_SIGN_LABEL[s]}
          </label>
        ))}
      </fieldset>

      <fieldset className="card space-y-3">
        <legend className="px-1 text-lg font-semibold">Settings right now</legend>
        <p className="text-sm text-ink-muted">
          Filled in from what is installed and the dealer’s starting values; change what differs in the cab.
        </p>
        <div className="grid grid-cols-2 gap-3">
          <div>
            {label('lc-rpm', 'Rotor speed', 'rpm')}
            <input
              id="lc-rpm"
              className={input}
              inputMode="numeric"
              value={rpm}
              onChange={(e) => setRpm(e.target.value)}
              {...aria('settings.rotorRpm')}
            />
            {fieldErr('settings.rotorRpm')}
          </div>
          <div>
            {label('lc-clearance', 'Clearance', imperial ? 'in' : 'mm')}
            <input
              id="lc-clearance"
              className={input}
              inputMode="decimal"
              value={clearance}
              onChange={(e) => setClearance(e.target.value)}
              {...aria('settings.clearanceMm')}
            />
            {fieldErr('settings.clearanceMm')}
          </div>
          <div>
            {label('lc-vanes', 'Vanes')}
            <select id="lc-vanes" className={input} value={vanes} onChange={(e) => setVanes(e.target.value as VaneSetting)}>
              <option value="">—</option>
              {VANES.map((v) => (
                <option key={v} value={v}>
                  {v.replace('-', ' ')}
                </option>
              ))}
            </select>
          </div>
          <div>
            {label('lc-fan', 'Cleaning fan', 'rpm')}
            <input
              id="lc-fan"
              className={input}
              inputMode="numeric"
              value={fan}
              onChange={(e) => setFan(e.target.value)}
              {...aria('settings.fanRpm')}
            />
            {fieldErr('settings.fanRpm')}
          </div>
          <div>
            {label('lc-upper', 'Upper sieve', imperial ? 'in' : 'mm')}
            <input
              id="lc-upper"
              className={input}
              inputMode="decimal"
              value={upper}
              onChange={(e) => setUpper(e.target.value)}
              {...aria('settings.upperSieveMm')}
            />
            {fieldErr('settings.upperSieveMm')}
          </div>
          <div>
            {label('lc-lower', 'Lower sieve', imperial ? 'in' : 'mm')}
            <input
              id="lc-lower"
              className={input}
              inputMode="decimal"
              value={lower}
              onChange={(e) => setLower(e.target.value)}
              {...aria('settings.lowerSieveMm')}
            />
            {fieldErr('settings.lowerSieveMm')}
          </div>
        </div>
      </fieldset>

      <section aria-labelledby="lc-result-h" aria-live="polite">
        <h2 id="lc-result-h" className="text-xl font-semibold">
          {saved ? 'Saved to the season log' : 'Result'}
        </h2>
        {saved ? (
          <div className="mt-2 space-y-3">
            <LossResult result={saved.result} units={units} />
            <div className="flex flex-wrap gap-2">
              <a className={`${big} no-underline`} href={`/machines/${props.machine.id}/season`} data-testid="open-season">
                Season log and charts
              </a>
              <button type="button" className={big} onClick={() => setSaved(null)}>
                Another check
              </button>
            </div>
          </div>
        ) : preview ? (
          <div className="mt-2">
            <LossResult result={preview} units={units} />
          </div>
        ) : (
          <p className="mt-2 text-ink-muted">Enter the counts, the widths and the expected yield to see the loss.</p>
        )}
      </section>

      {props.canRecord && !saved && (
        <HoursFields
          value={hours}
          onChange={setHours}
          disabled={saving}
          error={{ field: Object.keys(errors).find((k) => k.startsWith('hours.')) ?? null, message: '' }}
        />
      )}
      {serverError && (
        <p role="alert" className="rounded-md border border-fit bg-fit-soft p-3 font-semibold text-fit" data-testid="loss-error">
          {serverError}
        </p>
      )}
      {!saved &&
        (props.canRecord ? (
          <button
            type="submit"
            className="btn-primary min-h-[60px] w-full justify-center text-lg"
            disabled={saving}
            data-testid="save-check"
          >
            {saving ? 'Saving…' : 'Save to the season log'}
          </button>
        ) : (
          <p className="text-sm text-ink-muted">
            Your role may work out a check here but not save it; the machine’s operator or a technician records checks.
          </p>
        ))}
    </form>
  );
}
