/**
 * Small numerical helpers of the bench-curve fit (fit.ts): the covariance of a least-squares fit from
 * its Jacobian, the runs test on residual signs and linear interpolation. Pure functions.
 */

/**
 * Inverse of a small symmetric matrix by elimination with partial pivoting; null when
 * it is singular to working precision (a pivot below `tiny` after scaling to a unit diagonal).
 */
export function invertSymmetric(m: readonly (readonly number[])[], tiny = 1e-12): number[][] | null {
  const p = m.length;
  // scale to a unit diagonal (a correlation-like matrix) so the pivot test does not depend on units
  const d = m.map((row, i) => Math.sqrt(row[i]));
  if (d.some((v) => !(v > 0) || !Number.isFinite(v))) return null;
  const a = m.map((row, i) => [
    ...row.map((v, j) => v / (d[i] * d[j])),
    ...Array.from({ length: p }, (_, j) => (i === j ? 1 : 0)),
  ]);
  for (let col = 0; col < p; col++) {
    let pivot = col;
    for (let r = col + 1; r < p; r++) if (Math.abs(a[r][col]) > Math.abs(a[pivot][col])) pivot = r;
    if (!(Math.abs(a[pivot][col]) > tiny)) return null;
    [a[col], a[pivot]] = [a[pivot], a[col]];
    const div = a[col][col];
    for (let j = 0; j < 2 * p; j++) a[col][j] /= div;
    for (let r = 0; r < p; r++) {
      if (r === col) continue;
      const f = a[r][col];
      if (f === 0) continue;
      for (let j = 0; j < 2 * p; j++) a[r][j] -= f * a[col][j];
    }
  }
  return a.map((row, i) => row.slice(p).map((v, j) => v / (d[i] * d[j])));
}

/**
 * Covariance of least-squares parameters, σ²·(JᵀJ)⁻¹ with σ² = SSE/(N − p), from the Jacobian of the
 * model (N rows, p columns) and the residuals. Null when JᵀJ is singular (a parameter the data do
 * not move at all).
 */
export function leastSquaresCovariance(
  jacobian: readonly (readonly number[])[],
  residuals: readonly number[],
): number[][] | null {
  const n = jacobian.length;
  const p = jacobian[0]?.length ?? 0;
  if (p === 0 || n <= p) return null;
  const jtj = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (const row of jacobian) {
    for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) jtj[i][j] += row[i] * row[j];
  }
  const inv = invertSymmetric(jtj);
  if (inv === null) return null;
  const sse = residuals.reduce((s, r) => s + r * r, 0);
  const sigma2 = sse / (n - p);
  return inv.map((row) => row.map((v) => v * sigma2));
}

export interface RunsTest {
  /** runs of equal sign observed */
  runs: number;
  /** runs expected if the signs were in random order */
  expected: number;
  /** (runs − expected) / standard deviation; NaN when all signs agree or too few values */
  z: number;
}

/**
 * The runs test (a standard nonparametric test of randomness of a two-valued sequence): counts the
 * runs of equal sign in `values` (zeros skipped) against the number expected for the same count of
 * positive and negative values in random order: E = 2n₊n₋/n + 1,
 * Var = 2n₊n₋(2n₊n₋ − n) / (n²(n − 1)). Too few runs means the residuals are systematic.
 */
export function runsTest(values: readonly number[]): RunsTest {
  const signs = values.filter((v) => v !== 0).map((v) => v > 0);
  const n = signs.length;
  const pos = signs.filter(Boolean).length;
  const neg = n - pos;
  let runs = n > 0 ? 1 : 0;
  for (let i = 1; i < n; i++) if (signs[i] !== signs[i - 1]) runs++;
  const expected = n > 0 ? (2 * pos * neg) / n + 1 : 0;
  const variance = n > 1 ? (2 * pos * neg * (2 * pos * neg - n)) / (n * n * (n - 1)) : 0;
  return { runs, expected, z: variance > 0 ? (runs - expected) / Math.sqrt(variance) : NaN };
}

/** Points sorted by x, with the values at equal x averaged: a curve `interpolate` can read. */
export function sortedCurve(points: readonly { x: number; y: number }[]): { xs: number[]; ys: number[] } {
  const sorted = [...points].sort((a, b) => a.x - b.x);
  const xs: number[] = [];
  const ys: number[] = [];
  let count = 0;
  for (const { x, y } of sorted) {
    const last = xs.length - 1;
    if (last >= 0 && xs[last] === x) {
      count++;
      ys[last] += (y - ys[last]) / count;
    } else {
      xs.push(x);
      ys.push(y);
      count = 1;
    }
  }
  return { xs, ys };
}

/** Linear interpolation in a curve of strictly increasing x; null outside [x₀, x_last]. */
export function interpolate(xs: readonly number[], ys: readonly number[], at: number): number | null {
  const n = xs.length;
  if (n === 0 || !(at >= xs[0] && at <= xs[n - 1])) return null;
  const hi = xs.findIndex((x) => x >= at);
  if (xs[hi] === at) return ys[hi];
  const lo = hi - 1;
  const t = (at - xs[lo]) / (xs[hi] - xs[lo]);
  return ys[lo] + t * (ys[hi] - ys[lo]);
}
