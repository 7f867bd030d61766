/**
 * Compare views: settings that differ, marked on the drawing itself (not only in the table
 * beside it). A vane difference outlines both cage-top bands, where the vanes are drawn; a drum
 * difference outlines the rotor strip. The words ("Δ vanes fast", "Δ slim drum") are
 * the frame's own labels, marked in the same colour (CageDiagram's Frame).
 */
import { memo } from 'react';
import type { SettingField } from '~/lib/domain/schemas';
import type { DiagramGeometry } from './geometry';
import { CHANGED_COLOUR } from './palette';

interface Props {
  geo: DiagramGeometry;
  changed: ReadonlySet<SettingField>;
}

/** Memoised: an edit that changes no setting difference does not redraw it. */
export const SettingMarks = memo(function SettingMarks({ geo, changed }: Props) {
  const vanes = changed.has('vaneSetting') || changed.has('vaneControl');
  const drum = changed.has('drum');
  if (!vanes && !drum) return null;
  const { labelW, drawingRight } = geo;
  const outline = { fill: 'none', stroke: CHANGED_COLOUR, strokeWidth: 2.5, strokeDasharray: '8 4' } as const;
  const firstRow = geo.rotorRow(1);
  const lastRow = geo.rotorRow(geo.rotorRows);
  return (
    <g aria-hidden="true" pointerEvents="none" data-testid="setting-marks">
      {vanes &&
        (['left', 'right'] as const).map((side) => {
          const band = geo.coverTop[side];
          return (
            <rect
              key={side}
              data-mark="vanes"
              x={labelW - 3}
              y={band.y - 3}
              width={drawingRight - labelW + 6}
              height={band.h + 6}
              rx={6}
              {...outline}
            />
          );
        })}
      {drum && geo.rotorRows > 0 && (
        <rect
          data-mark="drum"
          x={labelW - 3}
          y={firstRow.y - 3}
          width={drawingRight - labelW + 6}
          height={lastRow.y + lastRow.h - firstRow.y + 6}
          rx={6}
          {...outline}
        />
      )}
    </g>
  );
});
