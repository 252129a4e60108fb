/**
 * Small numeric solvers for the input pair: a dense linear solve for the nodal equations and a
 * safeguarded Newton iteration for monotone large-signal equations.
 *
 * @module
 */

/**
 * Solves `A·X = B` in place by Gaussian elimination with partial pivoting.
 *
 * `a` is n×n row-major; `b` is n×k row-major (k right-hand sides). On return `b` holds X.
 * Returns false when the matrix is singular to working precision.
 */
export function _solveLinear(a: Float64Array, b: Float64Array, n: number, k: number): boolean {
  for (let col = 0; col < n; col++) {
    let pivot = col;
    let best = Math.abs(a[col * n + col]);
    for (let row = col + 1; row < n; row++) {
      const size = Math.abs(a[row * n + col]);
      if (size > best) [best, pivot] = [size, row];
    }
    if (!(best > 0)) return false;
    if (pivot !== col) {
      for (let j = 0; j < n; j++) {
        const t = a[col * n + j];
        a[col * n + j] = a[pivot * n + j];
        a[pivot * n + j] = t;
      }
      for (let j = 0; j < k; j++) {
        const t = b[col * k + j];
        b[col * k + j] = b[pivot * k + j];
        b[pivot * k + j] = t;
      }
    }
    const diagonal = a[col * n + col];
    for (let row = col + 1; row < n; row++) {
      const factor = a[row * n + col] / diagonal;
      if (factor === 0) continue;
      for (let j = col; j < n; j++) a[row * n + j] -= factor * a[col * n + j];
      for (let j = 0; j < k; j++) b[row * k + j] -= factor * b[col * k + j];
    }
  }
  for (let row = n - 1; row >= 0; row--) {
    for (let j = 0; j < k; j++) {
      let sum = b[row * k + j];
      for (let c = row + 1; c < n; c++) sum -= a[row * n + c] * b[c * k + j];
      b[row * k + j] = sum / a[row * n + row];
    }
  }
  return true;
}

/**
 * Finds x in [lo, hi] with f(x) = target for an increasing f, by Newton steps that fall back
 * to bisection whenever a step would leave the bracket (so it always converges).
 *
 * `f` returns [value, slope]. The bracket must satisfy f(lo) ≤ target ≤ f(hi).
 */
export function _solveIncreasing(
  f: (x: number) => readonly [number, number],
  target: number,
  lo: number,
  hi: number,
): number {
  let x = 0.5 * (lo + hi);
  for (let i = 0; i < 200; i++) {
    const [value, slope] = f(x);
    const error = value - target;
    if (error === 0) return x;
    if (error > 0) hi = x;
    else lo = x;
    let next = x - error / slope;
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    if (Math.abs(next - x) <= 1e-15 * Math.max(1, Math.abs(x)) || hi - lo <= 1e-300) {
      return next;
    }
    x = next;
  }
  return x;
}
