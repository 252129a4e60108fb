/**
 * Harmonic amplitudes and total harmonic distortion (THD) of a transfer function driven by a
 * sine, or of any coherent record, by FFT (the `fft.js` package; no home-grown transform).
 *
 * ```
 *   x(t) = offset + amplitude·sin(2πt/T)        y = transfer(x)
 *        ┌───────────┐    N samples over one period    ┌─────┐
 *   ────▶│ transfer  │──────────────────────────────▶  │ FFT │──▶ |DC|, A1, A2, … A_maxOrder
 *        └───────────┘                                 └─────┘
 * ```
 *
 * Both THD figures leave DC out of numerator and denominator:
 *
 * - `thd` is THD_F, referred to the fundamental: √(Σ_{n≥2} Vn²) / V1 (IEC 61000-4-7,
 *   IEEE 1459, from memory).
 * - `thdTotal` is THD_R, referred to the total RMS of the AC part: √(Σ_{n≥2} Vn²) /
 *   √(Σ_{n≥1} Vn²) = THD_F / √(1 + THD_F²), the older audio "distortion factor".
 *
 * A sampled waveform with infinitely many harmonics aliases: the DFT of a sampled square wave
 * gives √(N²sin²(π/N)/8 − 1), not √(π²/8 − 1). Compare with the discrete closed form or
 * band-limit the signal. The harmonic count (`maxOrder`) is always returned because a shorter
 * count gives a smaller THD.
 *
 * @module
 */
import FFT from "fft.js";
import { requireFinite, requirePositive } from "../_validate.ts";

/** Harmonic content of a periodic signal. Amplitudes are peak values in the signal's unit. */
export interface Harmonics {
  /**
   * Peak amplitude of harmonic n at index n, for n = 1 … `maxOrder`; index 0 holds |DC|,
   * the magnitude of the mean. When `maxOrder` reaches the Nyquist bin, that entry is
   * |X[N/2]|/N (see {@linkcode spectrum}).
   */
  amplitudes: number[];
  /** Peak amplitude of the fundamental, `amplitudes[1]`. */
  fundamental: number;
  /**
   * THD_F, referred to the fundamental, as a fraction (0.01 = 1 %): √(Σ_{n≥2} Vn²)/V1 over
   * n ≤ `maxOrder`. Infinity when the fundamental is zero but harmonics are not; NaN when
   * the signal has no AC content at all.
   */
  thd: number;
  /** THD_R, referred to the total RMS of harmonics 1 … `maxOrder` (DC excluded), as a fraction. */
  thdTotal: number;
  /** The highest harmonic counted in `amplitudes`, `thd` and `thdTotal`. */
  maxOrder: number;
}

/** Options for {@linkcode harmonics}. */
export interface HarmonicsOptions {
  /**
   * Samples over the one period of the drive sine; a power of two, at least 4.
   * @default {2048}
   */
  points?: number;
  /**
   * Highest harmonic to count, 1 … points/2. Harmonic points/2 is the Nyquist bin.
   * @default {points / 2 - 1}
   */
  maxOrder?: number;
  /**
   * DC level the sine rides on, in the transfer function's input unit.
   * @default {0}
   */
  offset?: number;
}

/** Options for {@linkcode spectrum}. */
export interface SpectrumOptions {
  /**
   * Whole periods of the fundamental in the record; the fundamental sits in bin `cycles`.
   * Make it coprime to the record length (any odd number) if the spectrum must not repeat.
   * @default {1}
   */
  cycles?: number;
  /**
   * Highest harmonic to count, up to ⌊N/(2·cycles)⌋.
   * @default {the largest order whose bin lies below the Nyquist bin N/2}
   */
  maxOrder?: number;
}

/** Default record length for {@linkcode harmonics}. */
export const DEFAULT_HARMONIC_POINTS = 2048;

// Building an FFT's twiddle table costs O(N); sweeps call us thousands of times at one size.
const transforms = new Map<number, FFT>();

function transformOf(size: number): FFT {
  let transform = transforms.get(size);
  if (transform === undefined) {
    transform = new FFT(size);
    transforms.set(size, transform);
  }
  return transform;
}

function isPowerOfTwo(n: number): boolean {
  return Number.isInteger(n) && n >= 1 && (n & (n - 1)) === 0 && n <= 2 ** 30;
}

function requireRecordLength(name: string, length: number): void {
  if (!isPowerOfTwo(length) || length < 4) {
    throw new RangeError(
      `Expected ${name} to be a power of two of at least 4 (e.g. 1024 or 2048), but found ${length}; ` +
        `take a power-of-two number of samples over a whole number of periods`,
    );
  }
}

function requireWholeNumber(name: string, value: unknown, min: number, max: number): number {
  requireFinite(name, value);
  if (!Number.isInteger(value) || value < min || value > max) {
    throw new RangeError(
      `Expected ${name} to be a whole number from ${min} to ${max}, but found ${value}`,
    );
  }
  return value;
}

/**
 * Harmonic amplitudes and THD of `transfer` driven by `offset + amplitude·sin(θ)`.
 *
 * Samples the output at θ = 2πn/N, n = 0 … N−1 (one coherent period, no window needed) and
 * reads the harmonics from an FFT of the record. A transfer function with a kink (clipping,
 * crossover) has harmonics beyond N/2 that fold back onto lower bins; raise `points` until
 * the THD you need stops moving.
 *
 * @param transfer The stage's static transfer curve, output as a function of input.
 * @param amplitude Peak amplitude of the drive sine, in the input's unit (> 0).
 * @param options Record length, harmonic count and DC offset.
 * @returns Amplitudes per harmonic, fundamental, THD_F, THD_R and the harmonic count used.
 * @throws {RangeError} If `amplitude` is not positive, `points` is not a power of two of at
 *   least 4, or `maxOrder` is not a whole number from 1 to points/2.
 * @throws {TypeError} If `transfer` returns a value that is not a finite number.
 *
 * @example A cubic term sets the third harmonic: x − 0.04x³ at 1 V peak
 * ```ts
 * import { harmonics } from "./harmonics.ts";
 * import { ok } from "node:assert/strict";
 * const result = harmonics((x) => x - 0.04 * x ** 3, 1);
 * // sin³ = (3 sin θ − sin 3θ)/4: A1 = 1 − 0.03 = 0.97, A3 = 0.01
 * ok(Math.abs(result.fundamental - 0.97) < 1e-12);
 * ok(Math.abs(result.amplitudes[3] - 0.01) < 1e-12);
 * ok(Math.abs(result.thd - 0.01 / 0.97) < 1e-12);
 * ok(result.maxOrder === 1023);
 * ```
 */
export function harmonics(
  transfer: (x: number) => number,
  amplitude: number,
  options: HarmonicsOptions = {},
): Harmonics {
  if (typeof transfer !== "function") {
    throw new TypeError(`Expected transfer to be a function, but found ${typeof transfer}`);
  }
  requirePositive("amplitude", amplitude);
  const offset = options.offset ?? 0;
  requireFinite("offset", offset);
  const points = options.points ?? DEFAULT_HARMONIC_POINTS;
  requireRecordLength("points", points);
  const samples = new Float64Array(points);
  for (let n = 0; n < points; n++) {
    const x = offset + amplitude * Math.sin((2 * Math.PI * n) / points);
    const y = transfer(x);
    if (typeof y !== "number" || !Number.isFinite(y)) {
      throw new TypeError(
        `Expected transfer(x) to return a finite number at sample ${n} (x = ${x}), but found ${y}`,
      );
    }
    samples[n] = y;
  }
  return analyse(samples, 1, options.maxOrder);
}

/**
 * Harmonic amplitudes and THD of a coherent record: `samples.length` (a power of two) samples
 * spanning exactly `cycles` periods of the fundamental.
 *
 * Harmonic h is read from bin h·cycles: A_h = (2/N)·|X[h·cycles]| below the Nyquist bin,
 * |DC| = |X[0]|/N. Bins between harmonics (noise, leakage, sub-harmonics) are ignored.
 *
 * The Nyquist bin N/2 holds only a cosine (a sine at that rate is sampled at its zeros), so
 * its phase and true amplitude cannot be recovered. It is left out by default. If you ask for
 * it (`maxOrder` with maxOrder·cycles = N/2), its amplitude is |X[N/2]|/N and it enters the
 * THD sums with the mean square it has in the record (amplitude², not amplitude²/2), so that
 * with `cycles: 1` and `maxOrder: N/2` the THD accounts for every bin (Parseval).
 *
 * @param samples The record; a power of two of at least 4 samples.
 * @param options Cycles in the record and harmonic count.
 * @returns Amplitudes per harmonic, fundamental, THD_F, THD_R and the harmonic count used.
 * @throws {RangeError} If the length is not a power of two of at least 4, `cycles` is not a
 *   whole number below N/2, or `maxOrder` is out of range.
 * @throws {TypeError} If a sample is not a finite number (the message names its index).
 *
 * @example 3 cycles of a sine with 2 % second harmonic and a DC offset
 * ```ts
 * import { spectrum } from "./harmonics.ts";
 * import { ok } from "node:assert/strict";
 * const N = 1024;
 * const record = Array.from({ length: N }, (_, n) => {
 *   const theta = (2 * Math.PI * 3 * n) / N;
 *   return 0.5 + 2 * Math.sin(theta) + 0.04 * Math.cos(2 * theta);
 * });
 * const result = spectrum(record, { cycles: 3 });
 * ok(Math.abs(result.amplitudes[0] - 0.5) < 1e-12);
 * ok(Math.abs(result.fundamental - 2) < 1e-12);
 * ok(Math.abs(result.thd - 0.02) < 1e-12);
 * ok(result.maxOrder === 170); // 170·3 = 510 < 512
 * ```
 */
export function spectrum(samples: ArrayLike<number>, options: SpectrumOptions = {}): Harmonics {
  if (samples === null || typeof samples !== "object" || typeof samples.length !== "number") {
    throw new TypeError(`Expected samples to be an array of numbers, but found ${samples}`);
  }
  const size = samples.length;
  requireRecordLength("samples.length", size);
  const cycles = requireWholeNumber("cycles", options.cycles ?? 1, 1, size / 2 - 1);
  const record = new Float64Array(size);
  for (let n = 0; n < size; n++) {
    const value = samples[n];
    if (typeof value !== "number" || !Number.isFinite(value)) {
      throw new TypeError(`Expected samples[${n}] to be a finite number, but found ${value}`);
    }
    record[n] = value;
  }
  return analyse(record, cycles, options.maxOrder);
}

/**
 * THD (a fraction) in decibels: 20·log10(thd), so 1 % is −40 dB and 0.1 % is −60 dB.
 *
 * @param thd THD as a fraction (THD_F or THD_R), ≥ 0.
 * @returns The same in dB (−Infinity for zero).
 * @throws {RangeError} If `thd` is negative.
 *
 * @example 1 % and 0.1 %
 * ```ts
 * import { thdDb } from "./harmonics.ts";
 * import { equal } from "node:assert/strict";
 * equal(thdDb(0.01), -40);
 * equal(thdDb(0.001), -60);
 * ```
 */
export function thdDb(thd: number): number {
  requireFinite("thd", thd);
  if (thd < 0) throw new RangeError(`Expected thd to be at least 0, but found ${thd}`);
  return 20 * Math.log10(thd);
}

function analyse(
  record: Float64Array,
  cycles: number,
  requestedOrder: number | undefined,
): Harmonics {
  const size = record.length;
  const half = size / 2;
  const highest = Math.floor(half / cycles);
  const maxOrder = requestedOrder === undefined
    ? Math.floor((half - 1) / cycles)
    : requireWholeNumber("maxOrder", requestedOrder, 1, highest);

  const transform = transformOf(size);
  const out: number[] = transform.createComplexArray();
  // realTransform fills bins 0 … N/2, all we read.
  transform.realTransform(out, record);

  const magnitude = (bin: number) => Math.hypot(out[2 * bin], out[2 * bin + 1]);
  const amplitudes = new Array<number>(maxOrder + 1);
  amplitudes[0] = magnitude(0) / size;
  let harmonicPower = 0; // mean square of harmonics 2 … maxOrder
  for (let order = 1; order <= maxOrder; order++) {
    const bin = order * cycles;
    const atNyquist = bin === half;
    const value = magnitude(bin) * (atNyquist ? 1 : 2) / size;
    amplitudes[order] = value;
    if (order >= 2) harmonicPower += atNyquist ? value * value : (value * value) / 2;
  }
  const fundamental = amplitudes[1];
  // cycles < N/2, so the fundamental never sits in the Nyquist bin.
  const fundamentalPower = (fundamental * fundamental) / 2;
  const distortion = Math.sqrt(harmonicPower);
  return {
    amplitudes,
    fundamental,
    thd: distortion / Math.sqrt(fundamentalPower),
    thdTotal: distortion / Math.sqrt(fundamentalPower + harmonicPower),
    maxOrder,
  };
}
