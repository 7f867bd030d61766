import type { Table } from '@tanstack/react-table';

/** Previous / Next for a TanStack table, disabled at either end. */
export function PagerButtons<T>({ table }: { table: Table<T> }) {
  return (
    <>
      <button type="button" className="btn" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()}>
        Previous
      </button>
      <button type="button" className="btn" onClick={() => table.nextPage()} disabled={!table.getCanNextPage()}>
        Next
      </button>
    </>
  );
}
