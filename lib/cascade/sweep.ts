/**
 * Frequency sweeps: log-spaced frequency points, and a response evaluated over them with
 * its magnitude in dB and its phase unwrapped (continuous) along the sweep.
 *
 * @module
 */
import { requireFinite, requirePositive } from "../_validate.ts";
import type { Complex } from "./two_port.ts";

/** A gain (or impedance) as a function of frequency in Hz. */
export type FrequencyResponse = (frequency: number) => Complex;

/** Options for {@linkcode logFrequencies}. */
export interface LogFrequenciesOptions {
  /**
   * Number of points, both ends included. Ignored when `pointsPerDecade` is given.
   * @default {100}
   */
  points?: number;
  /** Points per decade; the count then follows from the span (ends included). */
  pointsPerDecade?: number;
}

/**
 * Log-spaced frequencies from `start` to `stop`, both included.
 *
 * @param start First frequency in Hz.
 * @param stop Last frequency in Hz (above `start`).
 * @param options Point count.
 * @returns The frequencies in Hz.
 * @throws {RangeError} If `start` or `stop` is not above 0 Hz, `stop` is not above
 * `start`, or the point count is below 2.
 *
 * @example Three points over two decades
 * ```ts
 * import { logFrequencies } from "./sweep.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(Array.from(logFrequencies(10, 1000, { points: 3 })), [10, 100, 1000]);
 * ```
 */
export function logFrequencies(
  start: number,
  stop: number,
  options: LogFrequenciesOptions = {},
): Float64Array {
  requirePositive("start", start, "Hz");
  requirePositive("stop", stop, "Hz");
  if (!(stop > start)) {
    throw new RangeError(`Expected stop to be above start (${start} Hz), but found ${stop}`);
  }
  let points = options.points ?? 100;
  if (options.pointsPerDecade !== undefined) {
    requirePositive("pointsPerDecade", options.pointsPerDecade);
    points = Math.ceil(Math.log10(stop / start) * options.pointsPerDecade) + 1;
  }
  if (!Number.isInteger(points) || points < 2) {
    throw new RangeError(`Expected points to be an integer of at least 2, but found ${points}`);
  }
  const out = new Float64Array(points);
  const logStart = Math.log10(start);
  const step = (Math.log10(stop) - logStart) / (points - 1);
  for (let i = 0; i < points; i++) out[i] = 10 ** (logStart + i * step);
  // Exact ends, so a sweep's first and last labels read as the designer typed them.
  out[0] = start;
  out[points - 1] = stop;
  return out;
}

/** A response over a list of frequencies. */
export interface FrequencySweep {
  /** The frequencies in Hz. */
  frequencies: Float64Array;
  /** Real parts. */
  re: Float64Array;
  /** Imaginary parts. */
  im: Float64Array;
  /** Magnitudes in dB, 20·log10|H|. */
  magnitudeDb: Float64Array;
  /**
   * Phases in degrees, unwrapped along the sweep: the first point lies in (−180°, 180°],
   * later points move by less than 180° from their neighbour, so three poles read −270°.
   */
  phaseDegrees: Float64Array;
}

/**
 * Evaluates `response` at each frequency.
 *
 * @param response The gain as a function of frequency.
 * @param frequencies Frequencies in Hz, ascending.
 * @returns Real and imaginary parts, magnitude in dB and unwrapped phase in degrees.
 * @throws {TypeError} If a frequency is not a finite number.
 *
 * @example Two real poles at 1 kHz reach −180° well above them
 * ```ts
 * import { logFrequencies, sweepResponse } from "./sweep.ts";
 * import { ok } from "node:assert/strict";
 * const pole = (f: number) => {
 *   const x = f / 1e3; // 1 / (1 + jx)²
 *   const re = 1 - x * x, im = 2 * x, d = re * re + im * im;
 *   return { re: re / d, im: -im / d };
 * };
 * const sweep = sweepResponse(pole, logFrequencies(10, 1e6, { points: 61 }));
 * ok(Math.abs(sweep.phaseDegrees[60] + 180) < 0.5);
 * ok(Math.abs(sweep.magnitudeDb[0]) < 1e-3);
 * ```
 */
export function sweepResponse(
  response: FrequencyResponse,
  frequencies: ArrayLike<number>,
): FrequencySweep {
  const n = frequencies.length;
  const sweep = emptySweep(frequencies);
  for (let i = 0; i < n; i++) {
    const f = frequencies[i];
    requireFinite("frequency", f);
    const h = response(f);
    sweep.re[i] = h.re;
    sweep.im[i] = h.im;
  }
  finishSweep(sweep);
  return sweep;
}

/**
 * Allocates the arrays of a sweep over `frequencies` (internal helper for fast sweeps).
 *
 * @param frequencies Frequencies in Hz.
 * @returns A sweep whose values are still zero; fill `re` and `im`, then call
 * {@linkcode finishSweep}.
 *
 * @example
 * ```ts
 * import { emptySweep, finishSweep } from "./sweep.ts";
 * import { equal } from "node:assert/strict";
 * const sweep = emptySweep([1, 10]);
 * sweep.re.fill(-1);
 * finishSweep(sweep);
 * equal(sweep.phaseDegrees[1], 180);
 * ```
 */
export function emptySweep(frequencies: ArrayLike<number>): FrequencySweep {
  const n = frequencies.length;
  return {
    frequencies: Float64Array.from(frequencies),
    re: new Float64Array(n),
    im: new Float64Array(n),
    magnitudeDb: new Float64Array(n),
    phaseDegrees: new Float64Array(n),
  };
}

/**
 * Fills `magnitudeDb` and the unwrapped `phaseDegrees` of a sweep from its `re` and `im`.
 *
 * @param sweep A sweep whose `re` and `im` are filled.
 *
 * @example Phase stays continuous through −180°
 * ```ts
 * import { emptySweep, finishSweep } from "./sweep.ts";
 * import { complexFromPolar } from "./complex.ts";
 * import { ok } from "node:assert/strict";
 * const sweep = emptySweep([1, 2, 3]);
 * [-170, -185, -200].forEach((deg, i) => {
 *   const z = complexFromPolar(1, deg, { angleUnit: "deg" });
 *   sweep.re[i] = z.re;
 *   sweep.im[i] = z.im;
 * });
 * finishSweep(sweep);
 * ok(Math.abs(sweep.phaseDegrees[2] + 200) < 1e-9);
 * ```
 */
export function finishSweep(sweep: FrequencySweep): void {
  const { re, im, magnitudeDb, phaseDegrees } = sweep;
  let previous = 0;
  let unwrapped = 0;
  for (let i = 0; i < re.length; i++) {
    magnitudeDb[i] = 10 * Math.log10(re[i] * re[i] + im[i] * im[i]);
    const wrapped = Math.atan2(im[i], re[i]) * (180 / Math.PI);
    if (i === 0) {
      unwrapped = wrapped;
    } else {
      let step = wrapped - previous;
      step -= 360 * Math.round(step / 360);
      unwrapped += step;
    }
    previous = wrapped;
    phaseDegrees[i] = unwrapped;
  }
}
