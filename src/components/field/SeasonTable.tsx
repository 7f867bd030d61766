/**
 * A machine's loss checks of one season as a sortable table (TanStack Table). The rows come from
 * the page, so the server renders the whole table and it reads without JavaScript; sorting needs
 * the script.
 */
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import { useCallback, useMemo, useState } from 'react';
import type { UnitSystem } from '~/lib/domain/units';
import { SortableHead } from '~/components/shared/SortableHead';
import { formatDateTime } from '~/lib/domain/format';
import { formatNumber } from '~/lib/domain/format';
import { formatLength, mm } from '~/lib/domain/units';

export interface SeasonRow {
  id: string;
  checkedAt: string;
  fieldName: string;
  crop: string;
  moisturePct: number | null;
  layoutVersion: number | null;
  rotorRpm: number;
  clearanceMm: number;
  vaneSetting: string;
  fanRpm: number | null;
  upperSieveMm: number | null;
  lowerSieveMm: number | null;
  basis: string;
  harvestBuPerAc: number;
  harvestKgPerHa: number;
  machineBuPerAc: number;
  machineKgPerHa: number;
  harvestPct: number;
  targetPct: number;
  verdict: 'within' | 'over';
}

const col = createColumnHelper<SeasonRow>();
const when = (iso: string) => formatDateTime(iso, { year: false, timeZone: 'UTC' });

export default function SeasonTable({ rows, units }: { rows: SeasonRow[]; units: UnitSystem }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: 'checkedAt', desc: false }]);
  const imperial = units === 'imperial';
  const len = useCallback((v: number | null) => (v === null ? '—' : formatLength(mm(v), units, imperial ? 2 : 1)), [units, imperial]);
  const rate = useCallback(
    (bu: number, kg: number) => (imperial ? `${formatNumber(bu, { digits: 2 })} bu/ac` : `${formatNumber(kg)} kg/ha`),
    [imperial],
  );
  const columns = useMemo(
    () => [
      col.accessor('checkedAt', { header: 'When (UTC)', cell: (c) => when(c.getValue()) }),
      col.accessor('fieldName', { header: 'Field' }),
      col.accessor('crop', { header: 'Crop' }),
      col.accessor('harvestPct', {
        header: 'Harvest loss',
        cell: (c) => (
          <span>
            <strong>{c.getValue().toFixed(1)} %</strong>{' '}
            <span className="text-ink-muted">{rate(c.row.original.harvestBuPerAc, c.row.original.harvestKgPerHa)}</span>
          </span>
        ),
      }),
      col.accessor('machineBuPerAc', { header: 'Machine part', cell: (c) => rate(c.getValue(), c.row.original.machineKgPerHa) }),
      col.accessor('verdict', {
        header: 'Verdict',
        cell: (c) =>
          c.getValue() === 'over' ? (
            <span className="font-semibold text-crop">▲ over {c.row.original.targetPct} %</span>
          ) : (
            <span className="text-ok">✓ within {c.row.original.targetPct} %</span>
          ),
      }),
      col.accessor('rotorRpm', { header: 'Rotor rpm' }),
      col.accessor('clearanceMm', { header: 'Clearance', cell: (c) => len(c.getValue()) }),
      col.accessor('vaneSetting', { header: 'Vanes', cell: (c) => c.getValue().replace('-', ' ') }),
      col.accessor('fanRpm', { header: 'Fan rpm', cell: (c) => c.getValue() ?? '—' }),
      col.accessor((r) => `${len(r.upperSieveMm)} / ${len(r.lowerSieveMm)}`, {
        id: 'sieves',
        header: 'Sieves upper / lower',
        enableSorting: false,
      }),
      col.accessor('moisturePct', { header: 'Moisture', cell: (c) => (c.getValue() === null ? '—' : `${c.getValue()!.toFixed(1)} %`) }),
      col.accessor('layoutVersion', { header: 'Layout version', cell: (c) => (c.getValue() === null ? '—' : `v${c.getValue()}`) }),
      col.accessor('basis', { header: 'Basis', enableSorting: false }),
    ],
    [len, rate],
  );
  const table = useReactTable({
    data: rows,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  return (
    <div className="relative overflow-x-auto" tabIndex={0} role="region" aria-label="Loss checks of the season, scrolls sideways">
      <table className="w-full min-w-[900px] text-sm" data-testid="season-table">
        <caption className="sr-only">Loss checks of the season</caption>
        <SortableHead table={table} />
        <tbody>
          {table.getRowModel().rows.map((r) => (
            <tr key={r.id} className="border-b border-steel-100 align-top" data-verdict={r.original.verdict}>
              {r.getVisibleCells().map((c) => (
                <td key={c.id} className="px-3 py-2">
                  {flexRender(c.column.columnDef.cell, c.getContext())}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
