/** Prices are whole cents of the catalog currency; shown with two decimals and grouped thousands. */
export function formatMoney(cents: number): string {
  return (cents / 100).toLocaleString('en-US', { minimumFractionDigits: 2, maximumFractionDigits: 2 });
}
