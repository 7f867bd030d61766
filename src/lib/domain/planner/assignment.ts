/**
 * Minimum-cost assignment of n rows to m ≥ n columns (every row gets its own column; columns
 * may stay unused): the Hungarian method with row and column potentials, O(n²·m). Costs may be
 * Infinity for a forbidden pair; the caller makes sure every row has at least one column that
 * no other row needs (the planner gives each slot a private "buy" or "leave empty" column), so
 * a finite perfect matching always exists.
 *
 * Costs are plain numbers. The planner packs its lexicographic objective (purchases, then moves,
 * then how well a part suits, then price) into one integer per pair with weights chosen so that
 * no sum of a lower tier can outweigh one unit of a higher one; it keeps every total below 2^53,
 * so the arithmetic here is exact.
 */

export interface Assignment {
  /** colOfRow[i] is the column given to row i. */
  colOfRow: Int32Array;
  /** The sum of the chosen costs. */
  total: number;
}

/**
 * cost(i, j) for rows 0..n-1 and columns 0..m-1. The matrix is read once into a flat array,
 * so the callback may be slow.
 */
export function solveAssignment(n: number, m: number, cost: (row: number, col: number) => number): Assignment {
  if (n > m) throw new RangeError(`assignment: ${n} rows need at least as many columns, got ${m}`);
  const colOfRow = new Int32Array(n);
  if (n === 0) return { colOfRow, total: 0 };

  const a = new Float64Array(n * m);
  for (let i = 0; i < n; i++) for (let j = 0; j < m; j++) a[i * m + j] = cost(i, j);

  // 1-based potentials and matching, column 0 is the virtual start of each augmenting path.
  const u = new Float64Array(n + 1);
  const v = new Float64Array(m + 1);
  const rowOfCol = new Int32Array(m + 1); // 0 = free
  const way = new Int32Array(m + 1);
  const minv = new Float64Array(m + 1);
  const used = new Uint8Array(m + 1);

  for (let i = 1; i <= n; i++) {
    rowOfCol[0] = i;
    let j0 = 0;
    minv.fill(Infinity);
    used.fill(0);
    do {
      used[j0] = 1;
      const i0 = rowOfCol[j0]!;
      const base = (i0 - 1) * m;
      let delta = Infinity;
      let j1 = -1;
      for (let j = 1; j <= m; j++) {
        if (used[j]) continue;
        const cur = a[base + j - 1]! - u[i0]! - v[j]!;
        if (cur < minv[j]!) {
          minv[j] = cur;
          way[j] = j0;
        }
        if (minv[j]! < delta) {
          delta = minv[j]!;
          j1 = j;
        }
      }
      if (j1 < 0 || delta === Infinity) throw new RangeError(`assignment: row ${i - 1} has no column it may take`);
      for (let j = 0; j <= m; j++) {
        if (used[j]) {
          u[rowOfCol[j]!] += delta;
          v[j] -= delta;
        } else {
          minv[j] -= delta;
        }
      }
      j0 = j1;
    } while (rowOfCol[j0] !== 0);
    // Walk the augmenting path back to the start, flipping the matching along it.
    do {
      const j1 = way[j0]!;
      rowOfCol[j0] = rowOfCol[j1]!;
      j0 = j1;
    } while (j0 !== 0);
  }

  let total = 0;
  for (let j = 1; j <= m; j++) {
    const i = rowOfCol[j]!;
    if (i > 0) {
      colOfRow[i - 1] = j - 1;
      total += a[(i - 1) * m + j - 1]!;
    }
  }
  return { colOfRow, total };
}
