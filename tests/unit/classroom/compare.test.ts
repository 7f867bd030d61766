import { describe, expect, it } from 'vitest';
import { compareLayouts, settingValueWords } from '~/lib/classroom/compare';
import { demoCatalog, tamarackM4 } from '~/lib/domain/demo-catalog';
import { starterLayout } from '~/lib/domain/starter';
import { placeKey } from '~/lib/domain/places';

const side = (layout: ReturnType<typeof starterLayout>) => ({ family: tamarackM4, catalog: demoCatalog, layout });
const wheat = starterLayout(tamarackM4, 'wheat', demoCatalog);
const peas = starterLayout(tamarackM4, 'field-peas', demoCatalog);

describe('compareLayouts', () => {
  it('lists every difference in the domain’s order with words for each side', () => {
    const c = compareLayouts(side(wheat), side(peas));
    expect(c.rows.map((r) => r.n)).toEqual(c.rows.map((_, i) => i + 1));
    expect(c.rows.length).toBe(c.diff.differences.length);
    const crop = c.rows.find((r) => r.difference.kind === 'setting' && r.difference.field === 'crop')!;
    expect([crop.kindWords, crop.before, crop.after]).toEqual(['Setting', 'Wheat', 'Field peas']);
    const p1 = c.rows.find((r) => placeKey(r.difference.place) === 'element:1:left')!;
    expect(p1.kindWords).toBe('Element');
    expect(p1.where).toBe('Position 1, left');
    expect(p1.before).toContain('CW-FW-L-04');
    expect(p1.after).toContain('CW-RB-L-04');
  });

  it('says what the rules find at a changed place on each side', () => {
    // The wheat cage left in for peas: fine-wire in front is flagged, the pea start is clean there.
    const wrong = { ...wheat, crop: 'field-peas' as const };
    const c = compareLayouts(side(wrong), side(peas));
    const p1 = c.rows.find((r) => placeKey(r.difference.place) === 'element:1:left')!;
    expect(p1.rulesA.length).toBeGreaterThan(0);
    expect(p1.rulesA.every((f) => f.places.some((p) => placeKey(p) === 'element:1:left'))).toBe(true);
    expect(p1.rulesB).toEqual([]);
    expect(c.findings.onlyA.length).toBeGreaterThan(0);
    expect(c.findings.onlyB).toEqual([]);
  });

  it('finds nothing to list between a layout and itself', () => {
    const c = compareLayouts(side(wheat), side(structuredClone(wheat)));
    expect(c.rows).toEqual([]);
    expect(c.findings.onlyA).toEqual([]);
    expect(c.findings.onlyB).toEqual([]);
    expect(c.findings.both.length).toBe(c.a.findings.length);
    expect(c.metrics.every((m) => !m.differs)).toBe(true);
  });

  it('puts the computed figures side by side and marks those that differ', () => {
    const c = compareLayouts(side(wheat), side(peas));
    const aggr = c.metrics.find((m) => m.label === 'Threshing aggressiveness index')!;
    expect(aggr.differs).toBe(true);
    expect(Number(aggr.a)).toBeGreaterThan(Number(aggr.b)); // fine-wire rubs harder than round-bar
  });

  it('writes settings as people say them, in the chosen units', () => {
    expect(settingValueWords('clearanceMm', 25.4, tamarackM4, 'imperial')).toBe('1.00 in');
    expect(settingValueWords('clearanceMm', 10, tamarackM4)).toBe('10.0 mm');
    expect(settingValueWords('drum', 'slim', tamarackM4)).toBe('Slim drum');
    expect(settingValueWords('vaneSetting', 'very-slow', tamarackM4)).toBe('very slow');
  });
});

describe('comparing across machine families', () => {
  it('counts a part as changed only when it is of another kind', async () => {
    const { sedgeS6 } = await import('~/lib/domain/demo-catalog');
    const a = starterLayout(tamarackM4, 'wheat', demoCatalog);
    const b = starterLayout(sedgeS6, 'wheat', demoCatalog);
    const c = compareLayouts(side(a), { family: sedgeS6, catalog: demoCatalog, layout: b });
    expect(c.diff.familyChanged).toBe(true);
    // Position 1 is fine-wire on both: not a difference, though the part numbers differ.
    expect(c.places.map(placeKey)).not.toContain('element:1:left');
    // Bars differ in kind only where one family has in-line mounts (spike rasp bars, common
    // practice) and the other plain rasp bars.
    const inLine = (f: typeof tamarackM4, row: number, position: number) =>
      f.rotorBarPlaces.some((p) => p.row === row && p.position === position && p.inLine);
    for (const r of c.rows) {
      if (r.difference.kind !== 'bar' || r.difference.change !== 'changed') continue;
      const pl = r.difference.place;
      expect(pl.kind === 'bar' && inLine(tamarackM4, pl.row, pl.position) !== inLine(sedgeS6, pl.row, pl.position)).toBe(true);
    }
    // Positions 5 and 6 exist only on the split cage: they are added.
    expect(c.places.map(placeKey)).toEqual(expect.arrayContaining(['element:5:left', 'element:6:right']));
    expect(c.counts.elements).toBe(c.rows.filter((r) => r.difference.kind === 'element').length);
  });
});
