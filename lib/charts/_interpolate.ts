/**
 * Linear interpolation along sampled curves, optionally in log x (frequency sweeps).
 *
 * @module
 */

/** Where `ys` first crosses `level` going along `xs`, or `undefined` if it never does. */
export function firstCrossing(
  xs: ArrayLike<number>,
  ys: ArrayLike<number>,
  level: number,
  logX = false,
): number | undefined {
  for (let i = 1; i < xs.length; i++) {
    const a = ys[i - 1] - level;
    const b = ys[i] - level;
    if (a === 0) return xs[i - 1];
    if (a * b < 0 || b === 0) {
      const t = a / (a - b);
      if (!logX) return xs[i - 1] + t * (xs[i] - xs[i - 1]);
      return Math.exp(Math.log(xs[i - 1]) + t * (Math.log(xs[i]) - Math.log(xs[i - 1])));
    }
  }
  return undefined;
}

/** `ys` at `x` by linear interpolation (log x if asked); clamps outside the samples. */
export function interpolateAt(
  xs: ArrayLike<number>,
  ys: ArrayLike<number>,
  x: number,
  logX = false,
): number {
  const n = xs.length;
  if (x <= xs[0]) return ys[0];
  if (x >= xs[n - 1]) return ys[n - 1];
  let i = 1;
  while (xs[i] < x) i++;
  const f = logX ? Math.log : (v: number) => v;
  const t = (f(x) - f(xs[i - 1])) / (f(xs[i]) - f(xs[i - 1]));
  return ys[i - 1] + t * (ys[i] - ys[i - 1]);
}

/** Throws a `TypeError` unless `points` is an array of at least `min` items. */
export function requirePoints(name: string, points: unknown, min = 2): void {
  if (!Array.isArray(points) || points.length < min) {
    const found = Array.isArray(points) ? `${points.length} points` : String(points);
    throw new TypeError(`Expected ${name} to hold at least ${min} points, but found ${found}`);
  }
}
