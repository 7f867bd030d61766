/** Parts requests: the request as a spreadsheet file. */
import { toCsv } from '~/lib/server/csv';
import { moneyAmount } from '~/lib/domain/format';
import type { PartsRequestView } from './views';

/** The request as a CSV file (papaparse, formulas neutralised): one row per line and a total row. */
export function partsRequestCsv(view: Pick<PartsRequestView, 'lines' | 'totalCents' | 'totalQuantity' | 'currency'>): string {
  const plain = moneyAmount;
  return toCsv(
    ['Part number', 'Description', 'Hand', 'Quantity', 'Unit price', 'Line total', 'Currency'],
    [
      ...view.lines.map((l) => [
        l.partNumber,
        l.description,
        l.hand ?? '',
        l.quantity,
        plain(l.unitPriceCents),
        plain(l.lineTotalCents),
        view.currency,
      ]),
      ['', 'Total', '', view.totalQuantity, '', plain(view.totalCents), view.currency],
    ],
  );
}

export function csvFileName(view: Pick<PartsRequestView, 'number'>) {
  return `${view.number.toLowerCase()}.csv`;
}
