/**
 * The parts catalog as a table: fetched from GET /api/catalog/parts with TanStack Query, then
 * sorted, filtered and paged in the browser with TanStack Table (a catalog is a few hundred
 * rows at most).
 */
import { DEFAULT_CURRENCY, formatMoney } from '~/components/parts/money';
import { useQuery } from '@tanstack/react-query';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getPaginationRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnFiltersState,
  type SortingState,
} from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import type { CatalogPart } from '~/lib/domain/schemas';
import { getJson } from '~/components/shared/api';
import { PagerButtons } from '~/components/shared/PagerButtons';
import { QueryIsland } from '~/components/shared/QueryIsland';
import { SortableHead } from '~/components/shared/SortableHead';

interface PartRow {
  partNumber: string;
  familyId: string;
  kind: CatalogPart['kind'];
  spec: CatalogPart;
  active: boolean;
}

export interface PartsTableProps {
  families: { id: string; name: string }[];
  canEdit: boolean;
}

const KIND_WORDS: Record<string, string> = { element: 'Element', 'cover-plate': 'Cover plate', 'rotor-bar': 'Rotor bar' };
const col = createColumnHelper<PartRow>();
// One empty array for every render while loading: a fresh `[]` each time makes the table reset
// its page on every render, and that reset schedules another render, without end.
const NO_ROWS: PartRow[] = [];
// One money formatter for every screen.
const money = (cents: number) => formatMoney(cents, DEFAULT_CURRENCY);

function detail(p: CatalogPart): string {
  if (p.kind === 'element') {
    const opening = p.openingMm ? `${p.openingMm.width} × ${p.openingMm.length} mm` : 'no opening';
    return `${p.elementType}, ${p.role}, ${p.hand} hand, ${opening}, open ${Math.round(p.openArea * 100)} %`;
  }
  if (p.kind === 'cover-plate') return `${p.side} side${p.slotted ? ', slotted' : ''}`;
  return p.barKind;
}

function Table({ families, canEdit }: PartsTableProps) {
  const familyName = useMemo(() => new Map(families.map((f) => [f.id, f.name])), [families]);
  const { data, error, isLoading } = useQuery({
    queryKey: ['catalog-parts'],
    queryFn: ({ signal }) => getJson<{ parts: PartRow[] }>('/api/catalog/parts?status=all', signal),
  });
  const [sorting, setSorting] = useState<SortingState>([{ id: 'partNumber', desc: false }]);
  const [filters, setFilters] = useState<ColumnFiltersState>([{ id: 'active', value: 'active' }]);
  const [search, setSearch] = useState('');

  const columns = useMemo(
    () => [
      col.accessor('partNumber', {
        header: 'Part number',
        cell: (c) => (
          <a className="font-mono text-xs font-semibold" href={`/admin/catalog/parts/${encodeURIComponent(c.getValue())}`}>
            {c.getValue()}
          </a>
        ),
      }),
      col.accessor((r) => r.spec.name, { id: 'name', header: 'Name' }),
      col.accessor('familyId', { header: 'Family', cell: (c) => familyName.get(c.getValue()) ?? c.getValue(), filterFn: 'equals' }),
      col.accessor('kind', { header: 'Kind', cell: (c) => KIND_WORDS[c.getValue()], filterFn: 'equals' }),
      col.accessor((r) => detail(r.spec), { id: 'detail', header: 'Details', enableSorting: false }),
      col.accessor((r) => r.spec.massKg, { id: 'mass', header: 'Mass, kg', cell: (c) => c.getValue().toFixed(1) }),
      col.accessor((r) => r.spec.priceCents, { id: 'price', header: 'List price', cell: (c) => money(c.getValue()) }),
      col.accessor('active', {
        header: 'Status',
        cell: (c) => (c.getValue() ? 'Active' : 'Retired'),
        filterFn: (row, _id, value) => value === 'all' || (value === 'active') === row.original.active,
      }),
    ],
    [familyName],
  );

  const table = useReactTable({
    data: data?.parts ?? NO_ROWS,
    columns,
    state: { sorting, columnFilters: filters, globalFilter: search },
    onSortingChange: setSorting,
    onColumnFiltersChange: setFilters,
    onGlobalFilterChange: setSearch,
    globalFilterFn: (row, _id, value: string) => {
      const q = value.trim().toLowerCase();
      return !q || row.original.partNumber.toLowerCase().includes(q) || row.original.spec.name.toLowerCase().includes(q);
    },
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
    initialState: { pagination: { pageIndex: 0, pageSize: 25 } },
  });

  const filterValue = (id: string) => (filters.find((f) => f.id === id)?.value as string | undefined) ?? '';
  const setFilter = (id: string, value: string) =>
    setFilters((fs) => [...fs.filter((f) => f.id !== id), ...(value ? [{ id, value }] : [])]);
  const shown = table.getFilteredRowModel().rows.length;

  return (
    <div>
      <div className="flex flex-wrap items-end gap-3" role="search" aria-label="Filter parts">
        <label className="min-w-[12rem] flex-1">
          <span className="field-label">Search</span>
          <input
            className="field-input"
            type="search"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
            placeholder="Part number or name"
          />
        </label>
        <label>
          <span className="field-label">Family</span>
          <select className="field-input" value={filterValue('familyId')} onChange={(e) => setFilter('familyId', e.target.value)}>
            <option value="">All families</option>
            {families.map((f) => (
              <option key={f.id} value={f.id}>
                {f.name}
              </option>
            ))}
          </select>
        </label>
        <label>
          <span className="field-label">Kind</span>
          <select className="field-input" value={filterValue('kind')} onChange={(e) => setFilter('kind', e.target.value)}>
            <option value="">All kinds</option>
            {Object.entries(KIND_WORDS).map(([k, w]) => (
              <option key={k} value={k}>
                {w}
              </option>
            ))}
          </select>
        </label>
        <label>
          <span className="field-label">Status</span>
          <select className="field-input" value={filterValue('active') || 'all'} onChange={(e) => setFilter('active', e.target.value)}>
            <option value="active">Active</option>
            <option value="retired">Retired</option>
            <option value="all">All</option>
          </select>
        </label>
      </div>
      {error && (
        <p role="alert" className="mt-3 font-semibold text-fit">
          Could not load the parts: {(error as Error).message}
        </p>
      )}
      <div className="relative mt-3 overflow-x-auto rounded-lg border border-steel-200 bg-white">
        <table className="w-full text-sm" data-testid="parts-table">
          <caption className="sr-only">Catalog parts, sortable by the column headers</caption>
          <SortableHead table={table} />
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <tr key={row.id} className={`border-t border-steel-100 ${row.original.active ? '' : 'text-ink-muted'}`}>
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-1.5 align-top">
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {isLoading && (
              <tr>
                <td colSpan={columns.length} className="px-3 py-6 text-center text-ink-muted">
                  Loading parts…
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <nav className="mt-3 flex flex-wrap items-center justify-between gap-3 text-sm" aria-label="Pages of parts">
        <p aria-live="polite" data-testid="parts-count">
          {shown === 1 ? '1 part' : `${shown} parts`} · page {table.getState().pagination.pageIndex + 1} of{' '}
          {Math.max(1, table.getPageCount())}
          {canEdit ? '' : ' · read only'}
        </p>
        <div className="flex gap-2">
          <PagerButtons table={table} />
        </div>
      </nav>
    </div>
  );
}

export default function PartsTable(props: PartsTableProps) {
  return (
    <QueryIsland staleTime={30_000}>
      <Table {...props} />
    </QueryIsland>
  );
}
