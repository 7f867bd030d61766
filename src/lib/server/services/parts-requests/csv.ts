/** Parts requests: the request as a spreadsheet file. */
import { toCsv } from '../../csv';
import type { PartsRequestView } from './views';

export const money = (cents: number) => (cents / 100).toLocaleString('en-US', { minimumFractionDigits: 2, maximumFractionDigits: 2 });

/** The request as a CSV file (papaparse, formulas neutralised): one row per line and a total row. */
export function partsRequestCsv(view: Pick<PartsRequestView, 'lines' | 'totalCents' | 'totalQuantity'>): string {
  const plain = (cents: number) => (cents / 100).toFixed(2);
  return toCsv(
    ['Part number', 'Description', 'Hand', 'Quantity', 'Unit price', 'Line total'],
    [
      ...view.lines.map((l) => [l.partNumber, l.description, l.hand ?? '', l.quantity, plain(l.unitPriceCents), plain(l.lineTotalCents)]),
      ['', 'Total', '', view.totalQuantity, '', plain(view.totalCents)],
    ],
  );
}

export function csvFileName(view: Pick<PartsRequestView, 'number'>) {
  return `${view.number.toLowerCase()}.csv`;
}
