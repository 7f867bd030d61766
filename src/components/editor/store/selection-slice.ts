/** What the user has in hand: a selected place, a chosen finding and its highlighted places. */
import type { EditorSliceCreator, SelectionSlice } from './types';

export const createSelectionSlice: EditorSliceCreator<SelectionSlice> = (set, get) => ({
  selectedPlace: null,
  activeFinding: null,
  highlightPlaces: [],
  focusSeq: 0,

  select(place, opts) {
    set({ selectedPlace: place, ...(opts?.focus ? { focusSeq: get().focusSeq + 1 } : {}) });
  },

  chooseFinding(index) {
    const finding = index === null ? undefined : get().findings[index];
    if (!finding) {
      set({ activeFinding: null, highlightPlaces: [] });
      return;
    }
    // Selecting a finding focuses its first place (a slot, or a setting beside the drawing).
    set({
      activeFinding: index,
      highlightPlaces: finding.places,
      selectedPlace: finding.places[0] ?? get().selectedPlace,
      focusSeq: get().focusSeq + 1,
    });
  },
});
