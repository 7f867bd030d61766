/** The drawing's content: family, catalog, layout and its findings, and the edits on them. */
import { checkLayout } from '~/lib/domain/rules';
import { indexCatalog } from '~/lib/domain/catalog';
import type { Layout, Place } from '~/lib/domain/schemas';

const NO_PLACES: Place[] = [];
import { partAtPlaceWords, partName as nameOfPart, placeWords } from '~/lib/domain/vocabulary';
import { findingsHereWords } from './announce';
import { accepts, movedLayout, partNumberAt, withPartAt } from '~/lib/domain/layout-edits';
import type { DiagramSlice, EditorInit, EditorSliceCreator } from './types';
import { countOf } from '~/lib/domain/words';

export const createDiagramSlice =
  (init: EditorInit): EditorSliceCreator<DiagramSlice> =>
  (set, get) => {
    const catalog = indexCatalog(init.catalog);
    let seq = 0;
    const announcement = (text: string) => ({ text, seq: ++seq });
    /** Every edit passes here: the rules run at once, so findings always match the layout. */
    const commit = (
      layout: Layout,
      said: string | ((findings: ReturnType<typeof checkLayout>) => string),
      select?: Place,
      focus = false,
    ) => {
      const findings = checkLayout(get().family, catalog, layout);
      const text = typeof said === 'string' ? said : said(findings);
      // A finding chosen before the edit may no longer exist; drop the choice. One set() per
      // edit: one undo step, one round of subscribers.
      set({
        layout,
        findings,
        announcement: announcement(text),
        activeFinding: null,
        highlightPlaces: NO_PLACES,
        ...(select ? { selectedPlace: select } : {}),
        ...(select && focus ? { focusSeq: get().focusSeq + 1 } : {}),
      });
    };
    const partName = (pn: string | undefined) => {
      const p = pn ? catalog.byPartNumber.get(pn) : undefined;
      return p ? nameOfPart(p) : pn ? `part ${pn}` : 'nothing';
    };

    return {
      family: init.family,
      catalog,
      layout: init.layout,
      findings: checkLayout(init.family, catalog, init.layout),
      announcement: { text: '', seq: 0 },

      placePart(partNumber, place, opts) {
        const part = catalog.byPartNumber.get(partNumber);
        if (!get().canEdit || !part) return false;
        if (!accepts(part, place)) {
          get().announce(`A ${nameOfPart(part)} does not go at ${placeWords(place)}.`);
          return false;
        }
        const before = partNumberAt(get().layout, place);
        if (before === partNumber) {
          get().announce(`${partAtPlaceWords(part, place)} is already there.`);
          return false;
        }
        commit(
          withPartAt(get().layout, place, partNumber),
          (f) => {
            const replaced = before ? ` It replaces the ${partName(before)}.` : '';
            return `Placed ${partAtPlaceWords(part, place)}.${replaced} ${findingsHereWords(f, place)}`;
          },
          place,
          !!opts?.focus,
        );
        return true;
      },

      movePart(from, to, opts) {
        if (!get().canEdit) return false;
        const layout = get().layout;
        const moving = partNumberAt(layout, from);
        const next = movedLayout(layout, from, to);
        if (!next || !moving) return false;
        if (next === layout) return false;
        const there = partNumberAt(layout, to);
        commit(
          next,
          (f) =>
            there
              ? `Swapped: ${partName(moving)} now at ${placeWords(to)}; ${partName(there)} now at ${placeWords(from)}. ${findingsHereWords(f, to)}`
              : `Moved ${partName(moving)} from ${placeWords(from)} to ${placeWords(to)}. ${findingsHereWords(f, to)}`,
          to,
          !!opts?.focus,
        );
        return true;
      },

      removePart(place) {
        if (!get().canEdit) return false;
        const pn = partNumberAt(get().layout, place);
        if (!pn) return false;
        commit(
          withPartAt(get().layout, place, null),
          (f) => `Removed ${partName(pn)} from ${placeWords(place)}. ${findingsHereWords(f, place)}`,
        );
        return true;
      },

      replaceLayout(layout, why) {
        commit(layout, (f) => `${why} ${countOf(f.length, 'finding')} in the layout.`);
      },

      announce(text) {
        set({ announcement: announcement(text) });
      },
    };
  };
