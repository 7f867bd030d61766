/** The settings beside the drawing (crop, drum, rotor speed, clearance, vanes) and the unit choice. */
import { checkLayout } from '~/lib/domain/rules';
import { formatLength, mm } from '~/lib/domain/units';
import type { EditorDeps, EditorInit, EditorSliceCreator, LayoutSettingField, SettingsSlice } from './types';
import { countOf } from '~/lib/domain/words';

const FIELD_WORDS: Record<LayoutSettingField, string> = {
  crop: 'Crop',
  drum: 'Rotor drum',
  rotorRpm: 'Rotor speed',
  clearanceMm: 'Concave clearance',
  vaneControl: 'Vane control',
  vaneSetting: 'Vane setting',
};

export const createSettingsSlice =
  (init: EditorInit, deps: EditorDeps): EditorSliceCreator<SettingsSlice> =>
  (set, get) => ({
    units: init.units,
    stock: init.stock,

    setUnits(units) {
      if (units === get().units) return;
      set({ units });
      get().announce(units === 'metric' ? 'Lengths now in millimetres.' : 'Lengths now in inches.');
      void deps.api.saveUnits(units);
    },

    setSetting(field, value) {
      const s = get();
      if (!s.canEdit || s.layout[field] === value) return;
      const layout = { ...s.layout, [field]: value };
      const findings = checkLayout(s.family, s.catalog, layout);
      const shown =
        field === 'clearanceMm'
          ? formatLength(mm(value as number), s.units)
          : field === 'rotorRpm'
            ? `${value} rpm`
            : String(value).replace('-', ' ');
      set({
        layout,
        findings,
        activeFinding: null,
        highlightPlaces: [],
      });
      get().announce(`${FIELD_WORDS[field]} set to ${shown}. ${countOf(findings.length, 'finding')} in the layout.`);
    },
  });
