// How scripts/bench.mjs judges a figure against its budget (kept apart so a unit test can read it).
/**
 * Judges a figure against its budget here, so a script cannot call a figure "ok" that is over:
 * '≤ 25 ms', '≥ 50 %', '< 3', '0' (exactly) are read and compared with the value; a row whose
 * script reported a failure stays failed. Budgets in parentheses ('(reference)') are not judged.
 */
export function verdict(row) {
  const budget = String(row.budget ?? '').trim();
  if (budget === '' || budget.startsWith('(')) return row.ok === false ? 'NO' : '—';
  const value = typeof row.value === 'number' ? row.value : Number(String(row.value).replace(/[, ]/g, ''));
  const m = budget.match(/^(≤|<=|<|≥|>=|>|=)?\s*([\d.,]+)/);
  // A value that is not a number (a count pair, 'page missing') is judged by the script alone.
  if (!Number.isFinite(value)) return row.ok === true ? 'yes' : 'NO';
  if (!m) return 'NO';
  const limit = Number(m[2].replace(/,/g, ''));
  const op = m[1] ?? '=';
  const within =
    op === '≤' || op === '<='
      ? value <= limit
      : op === '<'
        ? value < limit
        : op === '≥' || op === '>='
          ? value >= limit
          : op === '>'
            ? value > limit
            : value === limit;
  if (!within) return 'over';
  return row.ok === false ? 'NO' : 'yes';
}
