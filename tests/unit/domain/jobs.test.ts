import { describe, expect, it } from 'vitest';
import { cropIds, demoCatalog, type CropId } from '~/lib/domain';
import { planCropChange, type PlanOk } from '~/lib/domain/planner';
import {
  CHECKLIST_IDS,
  DEFAULT_FLAT_RATES,
  estimateJob,
  flatRatesWith,
  jobFromInspection,
  jobFromLayout,
  JOB_CAUTIONS,
  minutesWords,
  missingItems,
  moveProblems,
  NEXT_STATUS,
  signOffChecklist,
  type JobStatus,
  type MoveFacts,
} from '~/lib/domain/jobs';
import { catalog, modular, split, start } from './helpers';

describe('job estimate (flat-rate minutes per kind of step)', () => {
  it('sums the dealer’s minutes over the defaults, and a step’s own minutes over both (hand-computed)', () => {
    const rates = flatRatesWith({ remove: 12 });
    // install: default 25; remove: the dealer's 12; check: typed 7 → 25 + 12 + 7 = 44.
    const e = estimateJob(
      [
        { kind: 'install', done: true },
        { kind: 'remove', minutes: null },
        { kind: 'check', minutes: 7 },
      ],
      rates,
    );
    expect(e.perStep).toEqual([DEFAULT_FLAT_RATES.install, 12, 7]);
    expect(e.totalMinutes).toBe(25 + 12 + 7);
    // The install step is done: 12 + 7 remain.
    expect(e.remainingMinutes).toBe(19);
    expect(minutesWords(e.totalMinutes)).toBe('44 min');
    expect(minutesWords(155)).toBe('2 h 35 min');
    expect(minutesWords(120)).toBe('2 h');
  });

  it('keeps the defaults for kinds the dealer has not set, and ignores unknown kinds and bad values', () => {
    const rates = flatRatesWith({ swap: 60, bogus: 1, move: -5, set: Number.NaN });
    expect(rates.swap).toBe(60);
    expect(rates.move).toBe(DEFAULT_FLAT_RATES.move);
    expect(rates.set).toBe(DEFAULT_FLAT_RATES.set);
    expect('bogus' in rates).toBe(false);
    expect(estimateJob([], rates).totalMinutes).toBe(0);
  });
});

describe('job status rules', () => {
  const facts = (status: JobStatus, more: Partial<MoveFacts> = {}): MoveFacts => ({
    status,
    assigned: true,
    openSteps: [],
    hoursGiven: true,
    missingChecklist: [],
    ...more,
  });
  const all: JobStatus[] = ['planned', 'in_progress', 'done', 'signed_off'];

  it('moves one step forward only: planned → in progress → done → signed off', () => {
    for (const from of all)
      for (const to of all) {
        const ok = moveProblems(facts(from), to).length === 0;
        expect(ok, `${from} → ${to}`).toBe(NEXT_STATUS[from] === to);
      }
    expect(NEXT_STATUS.signed_off).toBeNull();
    expect(moveProblems(facts('signed_off'), 'planned')[0]!.message).toMatch(/does not move/);
  });

  it('names what each move needs', () => {
    expect(moveProblems(facts('planned', { assigned: false }), 'in_progress')).toEqual([
      { field: 'assignedTo', message: 'assign a technician first' },
    ]);
    const done = moveProblems(
      facts('in_progress', {
        openSteps: [
          { n: 2, text: 'x' },
          { n: 5, text: 'y' },
        ],
        hoursGiven: false,
      }),
      'done',
    );
    expect(done.map((p) => p.field)).toEqual(['steps', 'hours']);
    expect(done[0]!.message).toContain('step 2, step 5');
    const sign = moveProblems(facts('done', { missingChecklist: ['Test run', 'Guards back on'] }), 'signed_off');
    expect(sign).toHaveLength(1);
    expect(sign[0]!.message).toContain('Test run; Guards back on');
  });
});

describe('sign-off checklist', () => {
  it('has the seven items and refuses every one not answered', () => {
    const items = signOffChecklist([], 'metric');
    expect(items.map((i) => i.id)).toEqual([...CHECKLIST_IDS]);
    expect(missingItems({}, items).map((i) => i.id)).toEqual([...CHECKLIST_IDS]);
    const nearly = {
      concaveZeroed: true,
      clearanceSet: true,
      boltsTorqued: true,
      rotorTurned: true,
      guardsOn: true,
      testRun: false,
      lossCheck: 'no' as const,
    };
    expect(missingItems(nearly, items).map((i) => i.id)).toEqual(['testRun', 'lossCheck']);
    for (const lossCheck of ['done', 'booked'] as const) expect(missingItems({ ...nearly, testRun: true, lossCheck }, items)).toEqual([]);
  });

  it('names the catalog’s torque for the parts fitted, in the reader’s units, else the manual’s', () => {
    // 68 N·m ÷ 1.3558179483 N·m per lbf·ft = 50.15 lbf·ft, shown whole (hand-computed from the definition of the pound-force foot).
    const fitted = [{ name: 'rasp bar', boltTorqueNm: 68 }, { name: 'fine-wire element' }];
    const metric = signOffChecklist(fitted, 'metric').find((i) => i.id === 'boltsTorqued')!;
    expect(metric.hint).toContain('rasp bars to 68 N·m (50 lbf·ft)');
    expect(metric.hint).toContain('the others to the torque in the operator’s manual');
    const imperial = signOffChecklist(fitted, 'imperial').find((i) => i.id === 'boltsTorqued')!;
    expect(imperial.hint).toContain('rasp bars to 50 lbf·ft (68 N·m)');
    expect(signOffChecklist([{ name: 'grate' }], 'metric').find((i) => i.id === 'boltsTorqued')!.hint).toMatch(/operator’s manual\.$/);
  });

  it('cautions lock the rotor and defer to the operator’s manual', () => {
    expect(JOB_CAUTIONS.join(' ')).toMatch(/key out/);
    expect(JOB_CAUTIONS.join(' ')).toMatch(/[Ll]ock the rotor/);
    expect(JOB_CAUTIONS.join(' ')).toMatch(/lifting aid/);
    expect(JOB_CAUTIONS.join(' ')).toMatch(/operator’s manual/);
  });
});

describe('job from a plan: the planner’s own steps to a fixed layout version', () => {
  const cases: { family: typeof modular; from: CropId; to: CropId }[] = [];
  for (const family of [modular, split]) for (const to of cropIds) cases.push({ family, from: 'wheat', to });

  it('gives the very steps the planner gave for its accepted plan, from the same machine and shelf', () => {
    let compared = 0;
    for (const { family, from, to } of cases) {
      const installed = start(from, family);
      const plan = planCropChange({ family, catalog, installed, shelf: {}, crop: to });
      if (!plan.ok || plan.steps.length === 0) continue;
      const job = jobFromLayout({
        family,
        catalog: demoCatalog,
        installed,
        target: (plan as PlanOk).layout,
        shelf: {},
        vaneControl: installed.vaneControl,
        units: 'metric',
      });
      // The same steps word for word, but for why a part comes off: the planner gives the crop
      // program's reason, the job the version's ("puts … here instead").
      const words = (t: string) => t.replace(/put it on the shelf: [^.]*\./, 'put it on the shelf.');
      expect(
        job.steps.map((s) => words(s.text)),
        `${family.id} ${from} → ${to}`,
      ).toEqual(plan.steps.map((s) => words(s.text)));
      expect(job.steps.map((s) => s.kind)).toEqual(plan.steps.map((s) => s.kind));
      // Every purchase is a part line to order (no dealer stock given), as many as the plan buys.
      const bought = job.parts.reduce((n, p) => n + p.quantity, 0);
      expect(bought).toBe(plan.counts.purchases);
      expect(job.parts.every((p) => p.source === 'on_order')).toBe(true);
      compared++;
    }
    expect(compared).toBeGreaterThan(4);
  });

  it('takes spares from the farm’s shelf and marks purchases on the dealer’s shelf as dealer stock', () => {
    const installed = start('wheat', modular);
    const plan = planCropChange({ family: modular, catalog, installed, shelf: {}, crop: 'field-peas' }) as PlanOk;
    expect(plan.ok).toBe(true);
    const [first, second] = plan.purchases;
    expect(first).toBeDefined();
    const shelf = { [first!.partNumber]: first!.quantity };
    const job = jobFromLayout({
      family: modular,
      catalog,
      installed,
      target: plan.layout,
      shelf,
      availability: second ? { [second.partNumber]: { at: 'dealer-shelf' } } : {},
      vaneControl: installed.vaneControl,
      units: 'metric',
    });
    expect(job.parts).toContainEqual({ partNumber: first!.partNumber, quantity: first!.quantity, source: 'farm_shelf' });
    if (second) expect(job.parts).toContainEqual({ partNumber: second.partNumber, quantity: second.quantity, source: 'dealer_stock' });
    expect(job.steps[0]!.kind).toBe('fetch');
  });

  it('nothing to fit when the target is what is installed: only set and verify', () => {
    const installed = start('wheat', modular);
    const job = jobFromLayout({
      family: modular,
      catalog,
      installed,
      target: installed,
      shelf: {},
      vaneControl: installed.vaneControl,
      units: 'metric',
    });
    expect(job.parts).toEqual([]);
    expect(job.steps.every((s) => s.kind === 'set' || s.kind === 'check')).toBe(true);
    expect(job.fitted).toEqual([]);
  });
});

describe('job from an inspection', () => {
  it('makes one step per line marked replace or watch, and a part line per replacement', () => {
    const job = jobFromInspection([
      { label: 'Position 1, left', partNumber: 'CW-FW-L-04', severity: 'replace', findings: ['Bent bars'], note: 'stone damage' },
      { label: 'Position 2, left', partNumber: 'CW-FW-L-04', severity: 'ok', findings: [], note: '' },
      { label: 'Rotor row 1', partNumber: null, severity: 'watch', findings: ['Worn leading edge'], note: '' },
      { label: 'Position 1, right', partNumber: 'CW-FW-L-04', severity: 'replace', findings: [], note: '' },
    ]);
    expect(job.steps.map((s) => s.kind)).toEqual(['replace', 'look', 'replace']);
    expect(job.steps[0]!.text).toBe('Replace CW-FW-L-04 at Position 1, left (found: bent bars). Note: stone damage');
    expect(job.steps[1]!.text).toMatch(/^Look again at Rotor row 1 \(found: worn leading edge\)/);
    expect(job.parts).toEqual([{ partNumber: 'CW-FW-L-04', quantity: 2, source: 'on_order' }]);
  });
});
