/**
 * Set and verify: the steps after the parts are on, in the order they are done. Settings come
 * from the plan's layout; the vanes are set the way the machine's vane control is changed
 * (bolts in the shop, at the linkage, or from the cab, as vanes.ts describes them); bolts are checked to the torque the
 * catalog gives for the parts handled, else to the torque in the operator's manual.
 */
import type { CatalogPart, Layout, VaneControl } from '~/lib/domain/schemas';
import { formatLength, mm, type UnitSystem } from '~/lib/domain/units';
import { formatNumber } from '~/lib/domain/format';
import { VANE_SETTING_WORDS } from '~/lib/domain/vanes';
import { partName } from '~/lib/domain/vocabulary';
import { listWords, plural } from '~/lib/domain/words';
import type { PlanStep } from './steps';

export const FIELD_CHECK_PATH = '/field-check';

/** N·m to lbf·ft (1 lbf·ft = 1.3558179483 N·m, by the definitions of the pound-force and the foot). */
export const NM_PER_LBF_FT = 1.3558179483;

export interface FinishInput {
  layout: Layout;
  installed: Layout | null;
  vaneControl: VaneControl;
  /** Parts taken off and fitted or moved in the work (their bolts are checked). */
  fitted: readonly CatalogPart[];
  units: UnitSystem;
}

type Draft = Omit<PlanStep, 'n'>;

export function torqueWords(nm: number, units: UnitSystem): string {
  const lbf = formatNumber(nm / NM_PER_LBF_FT);
  const n = formatNumber(nm);
  return units === 'imperial' ? `${lbf} lbf·ft (${n} N·m)` : `${n} N·m (${lbf} lbf·ft)`;
}

function vaneWords(control: VaneControl, setting: string): string {
  switch (control) {
    case 'fixed':
      return `Set the vanes to ${setting}: bolt-set vanes, so move the vane bolts to the ${setting} holes by hand (engine off, rotor stopped).`;
    case 'manual':
      return `Set the vanes to ${setting} at the linkage on the machine (engine off).`;
    case 'powered':
      return `Set the vanes to ${setting} from the cab (key on, engine off, everyone clear of the cage), and check the indicator shows ${setting}.`;
  }
}

export function finishSteps(input: FinishInput): Draft[] {
  const { layout, installed, vaneControl, fitted, units } = input;
  const step = (kind: 'set' | 'check', text: string, link?: string): Draft => ({
    kind,
    phase: 'verify',
    text,
    partNumbers: [],
    places: [],
    ops: [],
    massKg: null,
    heavy: false,
    ...(link ? { link } : {}),
  });
  const out: Draft[] = [];
  const length = (v: number) => formatLength(mm(v), units);

  out.push(
    installed && installed.rotorRpm !== layout.rotorRpm
      ? step('set', `Set the rotor speed to ${layout.rotorRpm} rpm (now ${installed.rotorRpm} rpm).`)
      : step('check', `Check the rotor speed is set to ${layout.rotorRpm} rpm.`),
  );
  out.push(
    step(
      'set',
      'Zero and level the concave: close it until it meets the rotor, check it touches evenly front and rear, left and right, and set the clearance indicator to zero there, as the operator’s manual describes.',
    ),
  );
  out.push(
    installed && installed.clearanceMm !== layout.clearanceMm
      ? step('set', `Set the concave clearance to ${length(layout.clearanceMm)} from that zero (now ${length(installed.clearanceMm)}).`)
      : step('check', `Check the concave clearance is ${length(layout.clearanceMm)} from that zero.`),
  );
  const setting = VANE_SETTING_WORDS[layout.vaneSetting];
  out.push(
    installed && installed.vaneSetting === layout.vaneSetting
      ? step('check', `Check the vanes are at ${setting}.`)
      : step('set', vaneWords(vaneControl, setting)),
  );
  out.push(
    step(
      'check',
      'Turn the rotor by hand at least one full turn (engine off, key out): nothing may rub, knock or catch, and no tool or loose part is left in the cage.',
    ),
  );

  // Bolts: by the torque each part's catalog entry gives, else the manual's.
  const byTorque = new Map<number, Set<string>>();
  let unknown = false;
  for (const p of fitted) {
    if (p.boltTorqueNm === undefined) unknown = true;
    else byTorque.set(p.boltTorqueNm, (byTorque.get(p.boltTorqueNm) ?? new Set()).add(plural(2, partName(p))));
  }
  const known = [...byTorque].sort((a, b) => a[0] - b[0]).map(([nm, kinds]) => `${listWords([...kinds])} to ${torqueWords(nm, units)}`);
  const manual = 'the torque in the operator’s manual';
  if (!fitted.length) out.push(step('check', `Check the cage bolts are tight, to ${manual}.`));
  else if (!known.length) out.push(step('check', `Check the bolts of every part fitted or moved to ${manual}.`));
  else
    out.push(
      step(
        'check',
        `Check the bolts of every part fitted or moved with a torque wrench: ${known.join('; ')}${unknown ? `; the others to ${manual}` : ''}.`,
      ),
    );
  out.push(step('check', 'Put every guard and shield back and close every access cover before the engine is started.'));
  out.push(
    step(
      'check',
      'Test-run: everyone clear of the machine, start the engine, engage the threshing drive at low idle, then bring it up to speed; stop at once on any rubbing, knocking or vibration.',
    ),
  );
  out.push(
    step(
      'check',
      'Check the losses in the first field: count the kernels behind the machine with the field check, and adjust from there.',
      FIELD_CHECK_PATH,
    ),
  );
  return out;
}
