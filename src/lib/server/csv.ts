import Papa from 'papaparse';

/**
 * Every CSV the product writes goes through here. A spreadsheet runs a cell that begins with
 * `=`, `+`, `-` or `@` (or a tab or carriage return before one) as a formula, so such a cell is
 * written as text: prefixed with a single quote and quoted, as OWASP's CSV-injection guidance
 * advises (https://owasp.org/www-community/attacks/CSV_Injection). papaparse's own
 * `escapeFormulae: true` tests the whole cell with `.` and so misses a cell whose text runs over
 * two lines; the pattern here looks at the first character only.
 */
export const FORMULA_START = /^[=+\-@\t\r]/;

/** A CSV file: a header row, then one row per entry (numbers stay numbers; text is neutralised). */
export function toCsv(fields: readonly string[], rows: readonly (readonly unknown[])[]): string {
  return Papa.unparse({ fields: [...fields], data: rows.map((r) => [...r]) }, { escapeFormulae: FORMULA_START });
}
