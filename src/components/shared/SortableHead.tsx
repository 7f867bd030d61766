import { flexRender, type Table } from '@tanstack/react-table';

/**
 * The header rows of a TanStack table: a sortable column's title is a button that names and
 * shows its order (▲ ▼, ↕ when unsorted) and sets aria-sort on its cell.
 */
export function SortableHead<T>({ table }: { table: Table<T> }) {
  return (
    <thead className="bg-steel-100 text-left">
      {table.getHeaderGroups().map((hg) => (
        <tr key={hg.id}>
          {hg.headers.map((h) => {
            const dir = h.column.getIsSorted();
            return (
              <th
                key={h.id}
                scope="col"
                className="px-3 py-2 font-semibold"
                aria-sort={dir === 'asc' ? 'ascending' : dir === 'desc' ? 'descending' : undefined}
              >
                {h.column.getCanSort() ? (
                  <button
                    type="button"
                    className="inline-flex items-center gap-1 font-semibold hover:underline"
                    onClick={h.column.getToggleSortingHandler()}
                  >
                    {flexRender(h.column.columnDef.header, h.getContext())}
                    <span aria-hidden="true" className="text-xs text-ink-muted">
                      {dir === 'asc' ? '▲' : dir === 'desc' ? '▼' : '↕'}
                    </span>
                    <span className="sr-only">{dir ? `, sorted ${dir === 'asc' ? 'ascending' : 'descending'}` : ', sort'}</span>
                  </button>
                ) : (
                  flexRender(h.column.columnDef.header, h.getContext())
                )}
              </th>
            );
          })}
        </tr>
      ))}
    </thead>
  );
}
