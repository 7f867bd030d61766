/** The outcome of a loss check: the verdict, each part of the loss, the basis and the advice. */
import type { LossCheckResult, LossFigure } from '~/lib/domain/field-check';
import type { UnitSystem } from '~/lib/domain/units';
import { formatMoney, isCurrencyCode } from '~/lib/domain/format';

const fixed = (n: number, d: number) => (Math.abs(n) < 10 ** -d / 2 ? 0 : n).toFixed(d);

/** Money per area: through the one money formatter when the currency is an ISO 4217 code, else as typed. */
export function money(value: number | null, currency: string): string {
  if (value === null) return '';
  if (isCurrencyCode(currency.toUpperCase())) return formatMoney(Math.round(value * 100), currency.toUpperCase());
  return `${currency}${currency && !/^[^A-Za-z]+$/.test(currency) ? ' ' : ''}${fixed(value, 2)}`;
}

const BASIS_WORDS: Record<LossCheckResult['basis']['kind'], string> = {
  published: 'Published count',
  'crop-weight': 'Weight rule with the crop’s usual kernel weight',
  'own-weight': 'Weight rule with your thousand-kernel weight',
  typed: 'Your own count',
};

const PARTS: { key: 'preHarvest' | 'header' | 'machine'; label: string; where: string }[] = [
  { key: 'preHarvest', label: 'Pre-harvest', where: 'on the ground before the header came' },
  { key: 'header', label: 'Header', where: 'dropped by the header' },
  { key: 'machine', label: 'Machine', where: 'thrown out by threshing, separating and cleaning' },
];

function Figure({ f, units, currency, big }: { f: LossFigure; units: UnitSystem; currency: string; big?: boolean }) {
  const primary = units === 'imperial' ? `${fixed(f.buPerAc, 2)} bu/ac` : `${fixed(f.kgPerHa, 0)} kg/ha`;
  const secondary = units === 'imperial' ? `${fixed(f.kgPerHa, 0)} kg/ha` : `${fixed(f.buPerAc, 2)} bu/ac`;
  const cash = units === 'imperial' ? f.moneyPerAc : f.moneyPerHa;
  return (
    <div>
      <span className={big ? 'text-3xl font-bold' : 'text-2xl font-semibold'}>{primary}</span>
      <span className="block text-sm text-ink-soft">
        {secondary} · {fixed(f.pctOfYield, 1)} % of yield
        {cash !== null && (
          <>
            {' '}
            · {money(cash, currency)} per {units === 'imperial' ? 'acre' : 'hectare'}
          </>
        )}
      </span>
    </div>
  );
}

export function LossResult({ result, units }: { result: LossCheckResult; units: UnitSystem }) {
  const currency = result.price?.currency ?? '';
  const over = result.verdict === 'over';
  const area = units === 'imperial' ? 'ft²' : 'm²';
  const perArea = (perFt2: number) => (units === 'imperial' ? perFt2 : perFt2 * 10.7639104);
  const frameIs = units === 'imperial' ? `${fixed(result.frameAreaFt2, 2)} ft²` : `${fixed(result.frameAreaM2, 3)} m²`;
  return (
    <div className="space-y-4" data-testid="loss-result">
      <div
        role="status"
        data-testid="loss-verdict"
        data-verdict={result.verdict}
        className={`rounded-lg border-l-8 p-4 ${over ? 'border-crop bg-crop-soft' : 'border-ok bg-ok-soft'}`}
      >
        <p className="flex items-center gap-2 text-xl font-bold">
          {over ? (
            <svg aria-hidden="true" width="26" height="24" viewBox="0 0 18 16">
              <path d="M9 1 17 15H1z" fill="none" stroke="currentColor" strokeWidth="2" strokeLinejoin="round" />
              <path d="M9 6v4" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
              <circle cx="9" cy="12.5" r="1" fill="currentColor" />
            </svg>
          ) : (
            <svg aria-hidden="true" width="24" height="24" viewBox="0 0 16 16">
              <circle cx="8" cy="8" r="7" fill="none" stroke="currentColor" strokeWidth="2" />
              <path d="m4.5 8 2.5 2.5 4.5-5" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
            </svg>
          )}
          {over ? 'Over your target' : 'Within your target'}
        </p>
        <p className="mt-1">
          Harvest loss (header and machine) is <strong>{fixed(result.harvest.pctOfYield, 1)} %</strong> of the expected yield; the target is{' '}
          {fixed(result.target.pct, 2).replace(/\.?0+$/, '')} %.
        </p>
        <p className="mt-1 text-sm text-ink-soft">
          Target: {result.target.isDefault ? `default — ${result.target.source}` : result.target.source}.
        </p>
      </div>

      <div className="card">
        <h3 className="text-lg font-semibold">Harvest loss</h3>
        <Figure f={result.harvest} units={units} currency={currency} big />
        <ul className="mt-3 divide-y divide-steel-100">
          {PARTS.map((p) => (
            <li key={p.key} className="py-2" data-testid={`loss-${p.key}`}>
              <p className="font-semibold">
                {p.label} <span className="text-sm font-normal text-ink-muted">— {p.where}</span>
              </p>
              <Figure f={result[p.key]} units={units} currency={currency} />
            </li>
          ))}
          <li className="py-2">
            <p className="font-semibold">Everything on the ground</p>
            <Figure f={result.total} units={units} currency={currency} />
          </li>
        </ul>
        {result.notes.includes('header-below-standing') && (
          <p className="mt-2 text-sm text-ink-soft">
            Fewer kernels behind the header than in the standing crop: header loss is shown as none. Count more frames if you can.
          </p>
        )}
        {result.notes.includes('machine-below-header') && (
          <p className="mt-2 text-sm text-ink-soft">
            Fewer kernels behind the machine than behind the header: machine loss is shown as none. Count more frames if you can.
          </p>
        )}
      </div>

      <div className="card text-sm" data-testid="loss-basis">
        <h3 className="text-base font-semibold">How it was worked out</h3>
        <p className="mt-1">
          <strong>{BASIS_WORDS[result.basis.kind]}:</strong> {fixed(perArea(result.basis.kernelsPerFt2PerBuAc), 1)} kernels per {area} ≈ 1
          bu/ac
          {result.basis.tkwG !== null && <> (thousand-kernel weight {fixed(result.basis.tkwG, 1)} g)</>}. Source: {result.basis.source}.
        </p>
        <p className="mt-1">
          In your {frameIs} frame, {fixed(result.kernelsPerFrameFor1BuAc.outsideSpread, 1)} kernels make 1 bu/ac in standing crop or behind
          the header, and {fixed(result.kernelsPerFrameFor1BuAc.inSpread, 1)} behind the machine.
        </p>
        <p className="mt-1">
          Spread correction: cut width ÷ spread width = {fixed(result.concentrationRatio, 2)}; the machine’s kernels behind it are divided
          by that (smallgrains.org procedure). Bushel: {result.lbPerBu} lb.
        </p>
      </div>

      <div className="card" data-testid="loss-advice">
        <h3 className="text-lg font-semibold">What to look at next</h3>
        <ul className="mt-2 space-y-2">
          {result.advice.map((a, i) => (
            <li key={i}>
              <p>
                <span className="mr-1 rounded bg-steel-100 px-1.5 py-0.5 text-xs font-semibold uppercase tracking-wide">{a.area}</span>
                {a.text}
              </p>
              <p className="text-xs text-ink-muted">{a.source}</p>
            </li>
          ))}
        </ul>
        <p className="mt-3 text-xs text-ink-muted">
          Advice from common practice unless a source is named. The machine’s operator’s manual comes first.
        </p>
      </div>
    </div>
  );
}
