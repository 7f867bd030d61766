/**
 * The fleet table: server-side sorting, filtering and pagination through GET /api/machines,
 * fetched with TanStack Query and laid out with TanStack Table. The query lives in the URL, so
 * a reload or the back button keeps the view.
 */
import { keepPreviousData, useQuery } from '@tanstack/react-query';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  useReactTable,
  type PaginationState,
  type SortingState,
} from '@tanstack/react-table';
import { useEffect, useMemo, useState } from 'react';
import { getJson } from '~/components/shared/api';
import { PagerButtons } from '~/components/shared/PagerButtons';
import { QueryIsland } from '~/components/shared/QueryIsland';
import { SortableHead } from '~/components/shared/SortableHead';
import { formatDate } from '~/lib/domain/format';

export interface MachineListItem {
  id: string;
  nickname: string;
  serial: string;
  drum: 'full' | 'slim';
  vaneControl: 'fixed' | 'manual' | 'powered';
  familyId: string;
  familyName: string;
  orgId: string;
  orgName: string;
  updatedAt: string;
}

interface MachinePage {
  items: MachineListItem[];
  total: number;
  page: number;
  pageSize: number;
  /** Keyset cursors of the page's last and first rows (null where the list is paged by number). */
  next?: string | null;
  prev?: string | null;
}

export interface MachinesTableProps {
  initial: { page: number; pageSize: number; sort: string; q: string; orgId: string; familyId: string };
  orgs: { id: string; name: string }[];
  families: { id: string; name: string }[];
}

const DRUM: Record<string, string> = { full: 'Full', slim: 'Slim' };
const VANES: Record<string, string> = { fixed: 'Fixed', manual: 'Manual', powered: 'Powered' };
const col = createColumnHelper<MachineListItem>();
// A stable empty array while loading, so the table does not see new data on every render.
const NO_ROWS: MachineListItem[] = [];

const dateFmt = { format: (d: Date | string | number) => formatDate(d) };

function useDebounced<T>(value: T, ms: number): T {
  const [v, setV] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setV(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return v;
}

function Table({ initial, orgs, families }: MachinesTableProps) {
  const [sorting, setSorting] = useState<SortingState>(() => {
    const desc = initial.sort.startsWith('-');
    return [{ id: initial.sort.replace(/^-/, ''), desc }];
  });
  const [pagination, setPagination] = useState<PaginationState>({ pageIndex: initial.page - 1, pageSize: initial.pageSize });
  const [q, setQ] = useState(initial.q);
  const [orgId, setOrgId] = useState(initial.orgId);
  const [familyId, setFamilyId] = useState(initial.familyId);
  const debouncedQ = useDebounced(q.trim(), 300);

  const params = useMemo(() => {
    const s = sorting[0];
    const p = new URLSearchParams({
      page: String(pagination.pageIndex + 1),
      pageSize: String(pagination.pageSize),
      sort: s ? `${s.desc ? '-' : ''}${s.id}` : '-updatedAt',
    });
    if (debouncedQ) p.set('q', debouncedQ);
    if (orgId) p.set('orgId', orgId);
    if (familyId) p.set('familyId', familyId);
    return p.toString();
  }, [sorting, pagination, debouncedQ, orgId, familyId]);

  // Next and Previous read the neighbouring page from the index at the current page's last or
  // first row (keyset); any other move (a new sort, filter, page size) starts from page 1. The URL
  // keeps the page number only, so a reload reads that page by number.
  const [cursor, setCursor] = useState<{ after?: string; before?: string }>({});
  const fetchParams = useMemo(() => {
    const p = new URLSearchParams(params);
    if (cursor.after) p.set('after', cursor.after);
    if (cursor.before) p.set('before', cursor.before);
    return p.toString();
  }, [params, cursor]);

  useEffect(() => {
    window.history.replaceState(null, '', `${window.location.pathname}?${params}`);
  }, [params]);

  const { data, isFetching, isPlaceholderData, error } = useQuery({
    queryKey: ['machines', fetchParams],
    queryFn: ({ signal }) => getJson<MachinePage>(`/api/machines?${fetchParams}`, signal),
    placeholderData: keepPreviousData,
  });

  const columns = useMemo(
    () => [
      col.accessor('nickname', {
        header: 'Machine',
        cell: (c) => (
          <a href={`/machines/${c.row.original.id}`} className="font-semibold">
            {c.getValue()}
          </a>
        ),
      }),
      col.accessor('serial', { header: 'Serial', cell: (c) => <span className="font-mono text-xs">{c.getValue()}</span> }),
      col.accessor('familyName', { id: 'family', header: 'Family' }),
      col.accessor('orgName', { id: 'org', header: 'Farm' }),
      col.accessor('drum', { header: 'Drum', enableSorting: false, cell: (c) => DRUM[c.getValue()] }),
      col.accessor('vaneControl', { header: 'Vanes', enableSorting: false, cell: (c) => VANES[c.getValue()] }),
      col.accessor('updatedAt', { header: 'Last change', cell: (c) => dateFmt.format(new Date(c.getValue())) }),
    ],
    [],
  );

  const total = data?.total ?? 0;
  const table = useReactTable({
    data: data?.items ?? NO_ROWS,
    columns,
    state: { sorting, pagination },
    onSortingChange: (updater) => {
      setSorting(updater);
      resetPage();
    },
    onPaginationChange: (updater) => turnPage(typeof updater === 'function' ? updater(pagination) : updater),
    manualSorting: true,
    manualPagination: true,
    manualFiltering: true,
    enableSortingRemoval: false,
    rowCount: total,
    getCoreRowModel: getCoreRowModel(),
  });

  /** One page on or back from the page shown goes by its cursor; any other move by number. */
  function turnPage(next: PaginationState) {
    const shown = data && !isPlaceholderData && data.page === pagination.pageIndex + 1 && next.pageSize === pagination.pageSize;
    const step = next.pageIndex - pagination.pageIndex;
    setCursor(shown && step === 1 && data.next ? { after: data.next } : shown && step === -1 && data.prev ? { before: data.prev } : {});
    setPagination(next);
  }
  const resetPage = () => {
    setCursor({});
    setPagination((p) => ({ ...p, pageIndex: 0 }));
  };
  const pageCount = Math.max(1, Math.ceil(total / pagination.pageSize));

  return (
    <div>
      <div className="flex flex-wrap items-end gap-3" role="search" aria-label="Filter machines">
        <label className="min-w-[14rem] flex-1">
          <span className="field-label">Search</span>
          <input
            className="field-input"
            type="search"
            value={q}
            maxLength={100}
            placeholder="Name, serial, notes, family or farm"
            onChange={(e) => {
              setQ(e.target.value);
              resetPage();
            }}
          />
        </label>
        {orgs.length > 1 && (
          <label>
            <span className="field-label">Farm</span>
            <select
              className="field-input"
              value={orgId}
              onChange={(e) => {
                setOrgId(e.target.value);
                resetPage();
              }}
            >
              <option value="">All farms</option>
              {orgs.map((o) => (
                <option key={o.id} value={o.id}>
                  {o.name}
                </option>
              ))}
            </select>
          </label>
        )}
        <label>
          <span className="field-label">Family</span>
          <select
            className="field-input"
            value={familyId}
            onChange={(e) => {
              setFamilyId(e.target.value);
              resetPage();
            }}
          >
            <option value="">All families</option>
            {families.map((f) => (
              <option key={f.id} value={f.id}>
                {f.name}
              </option>
            ))}
          </select>
        </label>
      </div>

      {error && (
        <p role="alert" className="mt-3 rounded-md border border-fit-line bg-fit-soft p-2 font-semibold text-fit">
          Could not load the machines: {(error as Error).message}
        </p>
      )}

      <div className="relative mt-3 overflow-x-auto rounded-lg border border-steel-200 bg-white">
        <table className="w-full text-sm" aria-busy={isFetching} data-testid="machines-table">
          <caption className="sr-only">Machines, sortable by the column headers</caption>
          <SortableHead table={table} />
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <tr key={row.id} className="border-t border-steel-100 hover:bg-steel-50">
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-2">
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {data && data.items.length === 0 && (
              <tr>
                <td colSpan={columns.length} className="px-3 py-6 text-center text-ink-muted">
                  No machines match.
                </td>
              </tr>
            )}
            {!data && !error && (
              <tr>
                <td colSpan={columns.length} className="px-3 py-6 text-center text-ink-muted">
                  Loading machines…
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>

      <nav className="mt-3 flex flex-wrap items-center justify-between gap-3 text-sm" aria-label="Pages of machines">
        <p aria-live="polite" data-testid="machines-count">
          {total === 1 ? '1 machine' : `${total} machines`}
          {total > 0 && ` · page ${pagination.pageIndex + 1} of ${pageCount}`}
        </p>
        <div className="flex items-center gap-2">
          <label className="flex items-center gap-1">
            <span>Rows</span>
            <select
              className="rounded-md border-steel-300 py-1 text-sm"
              value={pagination.pageSize}
              onChange={(e) => turnPage({ pageIndex: 0, pageSize: Number(e.target.value) })}
            >
              {[10, 20, 50, 100].map((n) => (
                <option key={n} value={n}>
                  {n}
                </option>
              ))}
            </select>
          </label>
          <PagerButtons table={table} />
        </div>
      </nav>
    </div>
  );
}

export default function MachinesTable(props: MachinesTableProps) {
  return (
    <QueryIsland staleTime={10_000}>
      <Table {...props} />
    </QueryIsland>
  );
}
