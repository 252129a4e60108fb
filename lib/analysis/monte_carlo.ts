/**
 * Monte Carlo runs, percentiles, yields, summary statistics with their standard errors,
 * worst-case corners and parameter sweeps.
 *
 * Every statistic estimated from N trials is itself uncertain; the helpers here return that
 * uncertainty beside the estimate so a test or a design check can allow for it (REFERENCE
 * §9.5: assert within about 4 standard errors, with a seeded generator).
 *
 * @module
 */
import { requireFinite, requireInRange, requirePositive } from "../_validate.ts";
import { createRandom, type Random } from "./random.ts";

/** Options for {@linkcode monteCarlo}. */
export interface MonteCarloOptions {
  /**
   * Seed of the generator; the same seed repeats the run exactly.
   * @default {1}
   */
  seed?: number;
}

/** The seed {@linkcode monteCarlo} uses when none is given. */
export const DEFAULT_MONTE_CARLO_SEED = 1;

function requireCount(name: string, value: unknown, min = 1): number {
  requireFinite(name, value);
  if (!Number.isInteger(value) || value < min) {
    throw new RangeError(
      `Expected ${name} to be a whole number of at least ${min}, but found ${value}`,
    );
  }
  return value;
}

/**
 * Runs `sample` `trials` times with one seeded generator and collects the results.
 *
 * @param trials Number of trials, a whole number ≥ 1.
 * @param sample Draws one trial from the generator; `index` counts from 0.
 * @param options The seed.
 * @returns The trial results, in order.
 * @throws {RangeError} If `trials` is not a whole number ≥ 1 or the seed is not a whole number.
 *
 * @example The spread of a 10 kΩ ±1 % resistor (tolerance = 3σ)
 * ```ts
 * import { monteCarlo, summaryStatistics } from "./monte_carlo.ts";
 * import { sampleTolerance } from "./random.ts";
 * import { ok } from "node:assert/strict";
 * const values = monteCarlo(
 *   10000,
 *   (random) => sampleTolerance(random, { nominal: 10e3, tolerance: 0.01 }),
 *   { seed: 3 },
 * );
 * const stats = summaryStatistics(values);
 * ok(Math.abs(stats.sd - 100 / 3) < 4 * stats.sdStandardError);
 * ```
 */
export function monteCarlo<T>(
  trials: number,
  sample: (random: Random, index: number) => T,
  options: MonteCarloOptions = {},
): T[] {
  requireCount("trials", trials);
  if (typeof sample !== "function") {
    throw new TypeError(`Expected sample to be a function, but found ${typeof sample}`);
  }
  const random = createRandom(options.seed ?? DEFAULT_MONTE_CARLO_SEED);
  const results = new Array<T>(trials);
  for (let i = 0; i < trials; i++) results[i] = sample(random, i);
  return results;
}

function finiteCopy(values: ArrayLike<number>, name: string): Float64Array {
  if (values === null || typeof values !== "object" || typeof values.length !== "number") {
    throw new TypeError(`Expected ${name} to be an array of numbers, but found ${values}`);
  }
  if (values.length === 0) {
    throw new RangeError(`Expected ${name} to hold at least one value, but found none`);
  }
  const copy = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) {
    const value = values[i];
    if (typeof value !== "number" || Number.isNaN(value)) {
      throw new TypeError(`Expected ${name}[${i}] to be a number, but found ${value}`);
    }
    copy[i] = value;
  }
  return copy;
}

function interpolate(sorted: Float64Array, p: number): number {
  // Linear interpolation between order statistics at rank p·(N − 1): the minimum at p = 0,
  // the maximum at p = 1, and the usual median for odd and even N.
  const rank = p * (sorted.length - 1);
  const below = Math.floor(rank);
  const above = Math.min(below + 1, sorted.length - 1);
  const fraction = rank - below;
  if (fraction === 0) return sorted[below];
  return sorted[below] + fraction * (sorted[above] - sorted[below]);
}

/**
 * The p-quantile of `values`, interpolating linearly between order statistics at rank
 * p·(N − 1). Infinite values are allowed (a perfectly matched trial has infinite CMRR).
 *
 * @param values The sample; not changed.
 * @param p Fraction from 0 (minimum) to 1 (maximum); 0.05 is the 5th percentile.
 * @returns The percentile.
 * @throws {RangeError} If `values` is empty or `p` lies outside [0, 1].
 * @throws {TypeError} If a value is NaN (the message names its index).
 *
 * @example Median and quartiles
 * ```ts
 * import { percentile } from "./monte_carlo.ts";
 * import { equal } from "node:assert/strict";
 * equal(percentile([5, 1, 4, 2, 3], 0.5), 3);
 * equal(percentile([1, 2, 3, 4], 0.5), 2.5);
 * equal(percentile([1, 2, 3, 4, 5], 0.25), 2);
 * ```
 */
export function percentile(values: ArrayLike<number>, p: number): number {
  requireInRange("p", p, 0, 1);
  return selectPercentiles(finiteCopy(values, "values"), [p])[0];
}

/**
 * Percentiles by selection instead of a full sort: each needed order statistic is placed by
 * a quickselect (Hoare partition, median-of-three pivot), working left to right so every
 * search starts where the previous one ended. Same values as sorting, in O(N) for a few p.
 */
function selectPercentiles(work: Float64Array, ps: readonly number[]): number[] {
  const n = work.length;
  const last = n - 1;
  const needed = new Set<number>();
  for (const p of ps) {
    const below = Math.floor(p * last);
    needed.add(below);
    needed.add(Math.min(below + 1, last));
  }
  let lo = 0;
  for (const k of [...needed].sort((x, y) => x - y)) {
    selectInPlace(work, k, lo, last);
    lo = k + 1;
  }
  // The selected positions now hold the order statistics `interpolate` reads.
  return ps.map((p) => interpolate(work, p));
}

function selectInPlace(a: Float64Array, k: number, lo: number, hi: number): void {
  while (hi > lo) {
    if (hi - lo < 12) {
      for (let i = lo + 1; i <= hi; i++) {
        const x = a[i];
        let j = i - 1;
        while (j >= lo && a[j] > x) {
          a[j + 1] = a[j];
          j--;
        }
        a[j + 1] = x;
      }
      return;
    }
    const mid = (lo + hi) >>> 1;
    const x = a[lo], y = a[mid], z = a[hi];
    const pivot = x < y ? (y < z ? y : x < z ? z : x) : (x < z ? x : y < z ? z : y);
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        const t = a[i];
        a[i] = a[j];
        a[j] = t;
        i++;
        j--;
      }
    }
    // Now a[lo..j] ≤ pivot ≤ a[i..hi], and everything strictly between equals the pivot.
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return;
  }
}

/**
 * Several percentiles of one sample, found by selection (no full sort).
 *
 * @param values The sample; not changed.
 * @param ps Fractions from 0 to 1.
 * @returns One percentile per entry of `ps`, in the same order.
 * @throws {RangeError} If `values` is empty or a p lies outside [0, 1].
 * @throws {TypeError} If a value is NaN.
 *
 * @example 5th, 50th and 95th percentiles
 * ```ts
 * import { percentiles } from "./monte_carlo.ts";
 * import { deepEqual } from "node:assert/strict";
 * const values = Array.from({ length: 101 }, (_, i) => i);
 * deepEqual(percentiles(values, [0.05, 0.5, 0.95]), [5, 50, 95]);
 * ```
 */
export function percentiles(values: ArrayLike<number>, ps: readonly number[]): number[] {
  ps.forEach((p, i) => requireInRange(`ps[${i}]`, p, 0, 1));
  return selectPercentiles(finiteCopy(values, "values"), ps);
}

/** A yield estimate from a Monte Carlo run. */
export interface YieldEstimate {
  /** Fraction of trials that passed, p̂. */
  fraction: number;
  /** Standard error of p̂: √(p̂(1 − p̂)/N). Zero when every trial passed or every one failed. */
  standardError: number;
  /** Trials that passed. */
  passed: number;
  /** Trials in all, N. */
  trials: number;
}

/**
 * The fraction of trials that pass a test, with its standard error √(p̂(1 − p̂)/N).
 *
 * When all or none pass, the standard error is 0 and says nothing; a rough 95 % upper bound on
 * the failure rate is then 3/N ("rule of three", common practice, no source).
 *
 * @param results The trial results.
 * @param pass The test each trial must pass.
 * @returns Fraction passing, its standard error, and the counts.
 * @throws {RangeError} If `results` is empty.
 *
 * @example 950 of 1000 pass: 95 % ± 0.689 %
 * ```ts
 * import { estimateYield } from "./monte_carlo.ts";
 * import { equal, ok } from "node:assert/strict";
 * const results = Array.from({ length: 1000 }, (_, i) => i);
 * const estimate = estimateYield(results, (i) => i < 950);
 * equal(estimate.fraction, 0.95);
 * ok(Math.abs(estimate.standardError - 0.006892) < 1e-6);
 * ```
 */
export function estimateYield<T>(
  results: ArrayLike<T>,
  pass: (result: T, index: number) => boolean,
): YieldEstimate {
  if (results.length === 0) {
    throw new RangeError("Expected results to hold at least one trial, but found none");
  }
  let passed = 0;
  for (let i = 0; i < results.length; i++) if (pass(results[i], i)) passed++;
  const trials = results.length;
  const fraction = passed / trials;
  return { fraction, standardError: yieldStandardError(fraction, trials), passed, trials };
}

/**
 * Standard error of a yield estimated from N trials: √(p(1 − p)/N).
 *
 * @param fraction The yield p, from 0 to 1.
 * @param trials N, a whole number ≥ 1.
 * @returns The standard error, as a fraction.
 * @throws {RangeError} If `fraction` is outside [0, 1] or `trials` is not a whole number ≥ 1.
 *
 * @example p = 0.95, N = 1000
 * ```ts
 * import { yieldStandardError } from "./monte_carlo.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(yieldStandardError(0.95, 1000) - 0.0068920) < 1e-7);
 * ```
 */
export function yieldStandardError(fraction: number, trials: number): number {
  requireInRange("fraction", fraction, 0, 1);
  requireCount("trials", trials);
  return Math.sqrt((fraction * (1 - fraction)) / trials);
}

/**
 * Standard error of a standard deviation estimated from N normally distributed samples:
 * about σ/√(2(N − 1)).
 *
 * @param sd The estimated σ, ≥ 0.
 * @param count N, a whole number ≥ 2.
 * @returns The standard error, in σ's unit.
 * @throws {RangeError} If `sd` is negative or `count` is below 2.
 *
 * @example N = 1000 gives 2.24 % of σ
 * ```ts
 * import { sdStandardError } from "./monte_carlo.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(sdStandardError(1, 1000) - 0.022372) < 1e-6);
 * ```
 */
export function sdStandardError(sd: number, count: number): number {
  requireFinite("sd", sd);
  if (sd < 0) throw new RangeError(`Expected sd to be at least 0, but found ${sd}`);
  requireCount("count", count, 2);
  return sd / Math.sqrt(2 * (count - 1));
}

/** Summary statistics of a sample, each estimate with its standard error. */
export interface SummaryStatistics {
  /** Number of values N. */
  count: number;
  /** Arithmetic mean. */
  mean: number;
  /** Sample standard deviation (divisor N − 1); 0 for a single value. */
  sd: number;
  /** Standard error of the mean, sd/√N. */
  meanStandardError: number;
  /** Standard error of `sd`, sd/√(2(N − 1)) (normal data); NaN for a single value. */
  sdStandardError: number;
  /** Smallest value. */
  min: number;
  /** Largest value. */
  max: number;
}

/**
 * Mean, standard deviation, their standard errors, minimum and maximum of a sample.
 *
 * Averages in dB are biased (a mean of dB values is not the dB of a mean): summarise the
 * linear quantity, or report percentiles (REFERENCE §9.6).
 *
 * @param values The sample, finite numbers.
 * @returns The statistics.
 * @throws {RangeError} If `values` is empty.
 * @throws {TypeError} If a value is not a finite number (the message names its index).
 *
 * @example
 * ```ts
 * import { summaryStatistics } from "./monte_carlo.ts";
 * import { equal, ok } from "node:assert/strict";
 * const stats = summaryStatistics([2, 4, 4, 4, 5, 5, 7, 9]);
 * equal(stats.mean, 5);
 * ok(Math.abs(stats.sd - Math.sqrt(32 / 7)) < 1e-12);
 * equal(stats.min, 2);
 * equal(stats.max, 9);
 * ```
 */
export function summaryStatistics(values: ArrayLike<number>): SummaryStatistics {
  const data = finiteCopy(values, "values");
  const count = data.length;
  // Welford's update: one pass, no cancellation when the mean is large against the spread.
  let mean = 0;
  let sumSquares = 0;
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < count; i++) {
    const value = data[i];
    if (!Number.isFinite(value)) {
      throw new TypeError(`Expected values[${i}] to be a finite number, but found ${value}`);
    }
    const step = value - mean;
    mean += step / (i + 1);
    sumSquares += step * (value - mean);
    if (value < min) min = value;
    if (value > max) max = value;
  }
  const sd = count > 1 ? Math.sqrt(sumSquares / (count - 1)) : 0;
  return {
    count,
    mean,
    sd,
    meanStandardError: sd / Math.sqrt(count),
    sdStandardError: count > 1 ? sd / Math.sqrt(2 * (count - 1)) : Number.NaN,
    min,
    max,
  };
}

/** One parameter of a corner analysis: its nominal value and relative tolerance. */
export interface CornerParameter {
  /** Name, for the report (e.g. `"R1"`). */
  name?: string;
  /** Nominal value. */
  nominal: number;
  /** Relative tolerance as a fraction (0.01 = ±1 %), ≥ 0. */
  tolerance: number;
}

/** One corner: every parameter at +tolerance or −tolerance. */
export interface Corner<T> {
  /** +1 or −1 per parameter, in the order given. */
  signs: number[];
  /** The parameter values at this corner, nominal·(1 ± tolerance). */
  values: number[];
  /** What `evaluate` returned here. */
  result: T;
}

/** Options for {@linkcode worstCaseCorners}. */
export interface CornerOptions<T> {
  /**
   * Largest number of parameters accepted; the corner count is 2^n.
   * @default {16}
   */
  maxParameters?: number;
  /**
   * Turns a result into the number that ranks corners (e.g. CMRR in dB). Needed when
   * `evaluate` does not return a number.
   * @default {the result itself}
   */
  measure?: (result: T) => number;
}

/** All corners of a tolerance box, with the lowest and highest by `measure`. */
export interface CornerAnalysis<T> {
  /** Every corner, 2^n of them; the i-th has parameter k at + when bit k of i is 1. */
  corners: Corner<T>[];
  /** The corner with the smallest measure. */
  lowest: Corner<T>;
  /** The corner with the largest measure. */
  highest: Corner<T>;
}

/** The default cap on corner-analysis parameters: 2^16 = 65,536 corners. */
export const DEFAULT_MAX_CORNER_PARAMETERS = 16;

/**
 * Evaluates a design at every corner of its tolerance box: all 2^n sign combinations of n
 * parameters at nominal·(1 ± tolerance).
 *
 * The extremes of a function that is monotonic in each parameter lie at corners, so this is
 * the exact worst case for such designs (most resistor networks). It can be pessimistic by
 * 14–19 dB against the median (REFERENCE §9.6); use `monteCarlo` for the typical spread.
 *
 * @param parameters The toleranced parameters.
 * @param evaluate The design as a function of the parameter values (same order).
 * @param options Parameter cap and ranking measure.
 * @returns Every corner and the two extremes.
 * @throws {RangeError} If there are no parameters or more than `maxParameters`, or a
 *   tolerance is negative, or a measure is NaN.
 *
 * @example A divider 10 kΩ / 10 kΩ, both ±1 %: the ratio spans 0.495 … 0.505
 * ```ts
 * import { worstCaseCorners } from "./monte_carlo.ts";
 * import { ok } from "node:assert/strict";
 * const result = worstCaseCorners(
 *   [{ name: "top", nominal: 10e3, tolerance: 0.01 }, { name: "bottom", nominal: 10e3, tolerance: 0.01 }],
 *   ([top, bottom]) => bottom / (top + bottom),
 * );
 * ok(result.corners.length === 4);
 * ok(Math.abs(result.lowest.result - 0.99 / 2) < 1e-12);
 * ok(result.lowest.signs[0] === 1 && result.lowest.signs[1] === -1);
 * ```
 */
export function worstCaseCorners<T = number>(
  parameters: readonly CornerParameter[],
  evaluate: (values: number[], signs: number[]) => T,
  options: CornerOptions<T> = {},
): CornerAnalysis<T> {
  const cap = requireCount("maxParameters", options.maxParameters ?? DEFAULT_MAX_CORNER_PARAMETERS);
  const n = parameters.length;
  if (n === 0) {
    throw new RangeError("Expected parameters to hold at least one parameter, but found none");
  }
  if (n > cap) {
    throw new RangeError(
      `Expected at most ${cap} parameters for a corner analysis, but found ${n} ` +
        `(${
          2 ** n
        } corners); tolerance the few that matter, raise maxParameters, or use monteCarlo()`,
    );
  }
  parameters.forEach((parameter, k) => {
    const label = parameter.name ?? `parameters[${k}]`;
    requireFinite(`${label}.nominal`, parameter.nominal);
    requireFinite(`${label}.tolerance`, parameter.tolerance);
    if (parameter.tolerance < 0) {
      throw new RangeError(
        `Expected ${label}.tolerance to be at least 0, but found ${parameter.tolerance}`,
      );
    }
  });
  const measure = options.measure ?? ((result: T) => result as unknown as number);
  const corners: Corner<T>[] = [];
  let lowest: Corner<T> | undefined;
  let highest: Corner<T> | undefined;
  let lowestMeasure = Infinity;
  let highestMeasure = -Infinity;
  for (let index = 0; index < 2 ** n; index++) {
    const signs = parameters.map((_, k) => (Math.floor(index / 2 ** k) % 2 === 1 ? 1 : -1));
    const values = parameters.map((p, k) => p.nominal * (1 + signs[k] * p.tolerance));
    const corner = { signs, values, result: evaluate(values, signs) };
    const score = measure(corner.result);
    if (typeof score !== "number" || Number.isNaN(score)) {
      throw new RangeError(
        `Expected the measure at corner [${signs.join(", ")}] to be a number, but found ${score}`,
      );
    }
    if (lowest === undefined || score < lowestMeasure) [lowest, lowestMeasure] = [corner, score];
    if (highest === undefined || score > highestMeasure) {
      [highest, highestMeasure] = [corner, score];
    }
    corners.push(corner);
  }
  return { corners, lowest: lowest!, highest: highest! };
}

/** Evenly spaced parameter values, on a linear or a logarithmic scale. */
export interface SweepRange {
  /** First value. */
  start: number;
  /** Last value (included). */
  stop: number;
  /** Number of values, ≥ 2 (1 gives just `start`). */
  points: number;
  /**
   * `"linear"` for equal steps, `"log"` for equal ratios (start and stop > 0).
   * @default {"linear"}
   */
  spacing?: "linear" | "log";
}

/** One row of a sweep. */
export interface SweepRow<T> {
  /** The swept parameter's value. */
  parameter: number;
  /** What the function returned there. */
  value: T;
}

/**
 * The values of a sweep range, first and last included exactly.
 *
 * @param range Start, stop, number of points and spacing.
 * @returns The values.
 * @throws {RangeError} If `points` is not a whole number ≥ 1, or a log range does not lie
 *   entirely above zero.
 *
 * @example A decade in 3 log steps, and 5 linear steps
 * ```ts
 * import { sweepValues } from "./monte_carlo.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(sweepValues({ start: 0, stop: 1, points: 5 }), [0, 0.25, 0.5, 0.75, 1]);
 * deepEqual(sweepValues({ start: 10, stop: 1000, points: 3, spacing: "log" }), [10, 100, 1000]);
 * ```
 */
export function sweepValues(range: SweepRange): number[] {
  const { start, stop } = range;
  requireFinite("start", start);
  requireFinite("stop", stop);
  const points = requireCount("points", range.points);
  const spacing = range.spacing ?? "linear";
  if (points === 1) return [start];
  if (spacing === "linear") {
    return Array.from(
      { length: points },
      (_, i) => i === points - 1 ? stop : start + ((stop - start) * i) / (points - 1),
    );
  }
  if (spacing === "log") {
    requirePositive("start", start);
    requirePositive("stop", stop);
    const ratio = stop / start;
    return Array.from(
      { length: points },
      (_, i) => i === points - 1 ? stop : start * ratio ** (i / (points - 1)),
    );
  }
  throw new RangeError(
    `Expected spacing to be "linear" or "log", but found ${JSON.stringify(spacing)}`,
  );
}

/**
 * Evaluates `evaluate` at each parameter value and returns one row per value, ready for a
 * table or a chart.
 *
 * @param parameters A list of values, or a linear or logarithmic range.
 * @param evaluate The quantity as a function of the parameter.
 * @returns Rows `{ parameter, value }`, in order.
 * @throws {RangeError} As {@linkcode sweepValues}.
 * @throws {TypeError} If a listed parameter is not a finite number.
 *
 * @example Gain of a divider over a log sweep of its bottom resistor
 * ```ts
 * import { sweep } from "./monte_carlo.ts";
 * import { ok } from "node:assert/strict";
 * const rows = sweep({ start: 100, stop: 10e3, points: 3, spacing: "log" }, (r) => r / (1e3 + r));
 * ok(rows.length === 3 && rows[1].parameter === 1000 && rows[1].value === 0.5);
 * ```
 */
export function sweep<T>(
  parameters: readonly number[] | SweepRange,
  evaluate: (parameter: number, index: number) => T,
): SweepRow<T>[] {
  const values = Array.isArray(parameters)
    ? (parameters as readonly number[])
    : sweepValues(parameters as SweepRange);
  values.forEach((value, i) => requireFinite(`parameters[${i}]`, value));
  return values.map((parameter, i) => ({ parameter, value: evaluate(parameter, i) }));
}
