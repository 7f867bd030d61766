import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Papa from 'papaparse';
import { toCsv } from '~/lib/server/csv';

// OWASP, "CSV Injection" (https://owasp.org/www-community/attacks/CSV_Injection): cells beginning
// with =, +, -, @, tab (0x09) or carriage return (0x0D) are prefixed with a single quote and the
// cell is quoted, so a spreadsheet shows them as text.
describe('CSV files cannot carry formulas', () => {
  // Read back as the comma-separated file it is (papaparse would otherwise guess the delimiter from the text).
  const parse = (csv: string) => Papa.parse<string[]>(csv, { delimiter: ',' }).data;

  it('neutralises each dangerous first character and leaves ordinary cells alone', () => {
    const cells = [
      '=HYPERLINK("http://example.invalid","x")',
      '+1+1',
      '-2+3',
      '@SUM(A1)',
      '\t=1',
      '\r=1',
      '=1\n+2',
      'Wide-wire element',
      'CW-EL-1',
      '12.50',
    ];
    const csv = toCsv(
      ['Cell'],
      cells.map((c) => [c]),
    );
    const back = parse(csv)
      .slice(1)
      .map((r) => r[0]);
    expect(back).toEqual([
      `'=HYPERLINK("http://example.invalid","x")`,
      "'+1+1",
      "'-2+3",
      "'@SUM(A1)",
      "'\t=1",
      "'\r=1",
      "'=1\n+2", // papaparse's own escapeFormulae: true misses this one (its pattern stops at the line break)
      'Wide-wire element',
      'CW-EL-1',
      '12.50',
    ]);
    // Every neutralised cell is quoted in the file itself.
    expect(csv).toContain(`"'=HYPERLINK(""http://example.invalid"",""x"")"`);
    expect(csv).toContain(`"'+1+1"`);
  });

  it('keeps numbers as numbers (a negative quantity is no formula)', () => {
    expect(toCsv(['n'], [[-3], [4]])).toBe('n\r\n-3\r\n4');
  });

  it('never leaves a text cell that begins with a formula character, whatever the text', () => {
    fc.assert(
      fc.property(fc.array(fc.string({ maxLength: 12 }), { minLength: 1, maxLength: 6 }), (row) => {
        const back = parse(
          toCsv(
            row.map((_, i) => `c${i}`),
            [row],
          ),
        )[1]!;
        for (let i = 0; i < row.length; i++) {
          expect(/^[=+\-@\t\r]/.test(back[i]!)).toBe(false);
          expect(back[i]).toBe(/^[=+\-@\t\r]/.test(row[i]!) ? `'${row[i]}` : row[i]);
        }
      }),
      { numRuns: 300 },
    );
  });
});
