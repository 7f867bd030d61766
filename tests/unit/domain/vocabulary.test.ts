import { describe, expect, it } from 'vitest';
import { createEditorStore } from '~/components/editor/store/create-editor-store';
import { demoCatalog, tamarackM4 } from '~/lib/domain/demo-catalog';
import { buildChecklist } from '~/lib/domain/inspection';
import { withPartAt } from '~/lib/domain/layout-edits';
import { elementPlace, placeKey } from '~/lib/domain/places';
import { planCropChange } from '~/lib/domain/planner';
import { checkLayout } from '~/lib/domain/rules';
import { barKindSchema, elementTypeSchema, type CatalogPart, type Place } from '~/lib/domain/schemas';
import { starterLayout } from '~/lib/domain/starter';
import { BAR_KIND_VALUES, ELEMENT_TYPE_VALUES } from '~/lib/domain/values';
import {
  BAR_KINDS,
  ELEMENT_TYPES,
  barKindLabel,
  barKindName,
  elementTypeLabel,
  elementTypeName,
  partName,
  placeLabel,
  placeWords,
} from '~/lib/domain/vocabulary';
import { VersionedMemory, wheatInit } from '../editor/fixtures';

// One vocabulary: the same slot reads the same wherever the product speaks of it. The phrasing
// itself is our own choice (no outside source); the checks are that it is one.

const catalog = demoCatalog.filter((p) => p.fitGroup === tamarackM4.fitGroup);
const byNumber = new Map(catalog.map((p) => [p.partNumber, p] as const));
const wheat = starterLayout(tamarackM4, 'wheat', demoCatalog);
const otherHand = (pn: string): CatalogPart => {
  const p = byNumber.get(pn)!;
  if (p.kind !== 'element') throw new Error('an element');
  return catalog.find((q) => q.kind === 'element' && q.elementType === p.elementType && q.hand !== p.hand && q.role === p.role)!;
};
/** Any other phrasing a slot once had somewhere in the product. */
const OLD_PHRASINGS = [
  /position \d+, (left|right) half\b/i,
  /\b(left|right), position \d/i,
  /\bcage top (left|right)/i,
  /\brotor bar row\b/i,
  /\bRotor bar, row\b/,
];

describe('one phrasing for a slot everywhere', () => {
  for (const e of wheat.elements) {
    const place = elementPlace(e.position, e.side);
    const words = placeWords(place);
    it(`${placeKey(place)} reads "${words}" in the editor, the findings, the plan and the inspection`, () => {
      expect(words).toBe(`position ${e.position}, ${e.side}`);

      // Editor announcement: put the other hand's element there.
      const init = wheatInit();
      const store = createEditorStore(init, { api: new VersionedMemory(init.layout) });
      const wrong = otherHand(e.partNumber);
      expect(store.getState().placePart(wrong.partNumber, place)).toBe(true);
      const said = store.getState().announcement.text;
      expect(said).toContain(`at ${words}.`);

      // Finding: the hand finding pinned to that slot names it.
      const finding = store
        .getState()
        .findings.find((f) => f.code === 'FIT_HAND_MISMATCH' && f.places.some((p) => placeKey(p) === placeKey(place)))!;
      expect(finding.explanation).toContain(` at ${words}.`);
      // An emptied slot names it in the title.
      const emptied = checkLayout(tamarackM4, catalog, withPartAt(wheat, place, null)).find((f) => f.code === 'FIT_EMPTY_POSITION')!;
      expect(emptied.title).toBe(`Nothing at ${words}`);

      // Plan step: going from the mismatched layout back to wheat takes that part off this slot.
      const plan = planCropChange({ family: tamarackM4, catalog, installed: store.getState().layout, shelf: {}, crop: 'wheat' });
      expect(plan.ok).toBe(true);
      if (!plan.ok) return;
      const step = plan.steps.find((s) => s.text.includes(wrong.partNumber))!;
      expect(step.text).toContain(words);

      // Inspection line: the checklist line of the slot.
      const line = buildChecklist(tamarackM4, wheat, catalog).find((l) => l.placeKey === placeKey(place))!;
      expect(line.label.startsWith(`${placeLabel(place)}: `)).toBe(true);

      for (const text of [said, finding.title, finding.explanation, emptied.title, step.text, line.label])
        for (const old of OLD_PHRASINGS) expect(text).not.toMatch(old);
    });
  }

  it('cover slots and rotor places have one phrasing too', () => {
    const cover: Place = { kind: 'cover', section: 2, side: 'right' };
    const bar: Place = { kind: 'bar', row: 1, position: 4 };
    expect(placeWords(cover)).toBe('cage-top section 2, right');
    expect(placeWords(bar)).toBe('rotor row 1, position 4');
    const withPlate = { ...wheat, coverPlates: [{ section: 2, side: 'right' as const, partNumber: 'CW-CP-R-04' }] };
    expect(buildChecklist(tamarackM4, withPlate, catalog).find((l) => l.placeKey === 'cover:2:right')!.label).toMatch(
      /^Cage-top section 2, right: /,
    );
    // A foreign part at a cover slot: the finding names the slot the same way.
    const foreign = demoCatalog.find((p) => p.kind === 'cover-plate' && p.side === 'right' && p.fitGroup !== tamarackM4.fitGroup)!;
    const f = checkLayout(tamarackM4, demoCatalog, {
      ...wheat,
      coverPlates: [{ section: 2, side: 'right', partNumber: foreign.partNumber }],
    }).find((x) => x.code === 'FIT_GROUP_FOREIGN')!;
    expect(f.explanation).toContain(' at cage-top section 2, right ');
  });
});

describe('one name per kind of part', () => {
  it('the element types are the list the schema is built from, not a copy', () => {
    expect(ELEMENT_TYPES).toBe(ELEMENT_TYPE_VALUES);
    expect(BAR_KINDS).toBe(BAR_KIND_VALUES);
    expect(elementTypeSchema.options).toEqual([...ELEMENT_TYPE_VALUES]);
    expect(barKindSchema.options).toEqual([...BAR_KIND_VALUES]);
  });
  it('label and sentence name of each kind are the same words', () => {
    for (const t of ELEMENT_TYPES) expect(elementTypeLabel(t).toLowerCase()).toBe(elementTypeName(t));
    for (const k of BAR_KINDS) expect(barKindName(k).toLowerCase().startsWith(barKindLabel(k).toLowerCase())).toBe(true);
    expect(elementTypeName('perforated')).toBe('perforated plate');
    expect(elementTypeLabel('perforated')).toBe('Perforated plate');
    expect(elementTypeName('blank')).toBe('blank plate');
  });
  it('a part is named from its kind wherever it is named', () => {
    const perforated = catalog.find((p) => p.kind === 'element' && p.elementType === 'perforated')!;
    expect(partName(perforated)).toBe('perforated plate element');
    const layout = withPartAt(wheat, elementPlace(1, perforated.kind === 'element' ? perforated.hand : 'left'), perforated.partNumber);
    for (const f of checkLayout(tamarackM4, catalog, layout)) {
      expect(`${f.title} ${f.explanation} ${f.fix}`).not.toMatch(/perforated-plate|Perforated(?! plate)/);
    }
  });
});
