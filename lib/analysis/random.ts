/**
 * A small, fast, seeded random generator and the part-tolerance distributions built on it.
 *
 * The generator is xoshiro128** by David Blackman and Sebastiano Vigna ("Scrambled linear
 * pseudorandom number generators", ACM Transactions on Mathematical Software 47(4), 2021),
 * implemented here from its published description: 128 bits of state, 32-bit output, period
 * 2^128 − 1. It is not for cryptography; it is for repeatable Monte Carlo runs, where the same
 * seed must give the same numbers on every machine.
 *
 * A "1 %" tolerance is not a σ (REFERENCE §9.6): uniform ±1 %, Gaussian with 3σ = 1 % and
 * binned parts give different statistics, so the distribution is always an input here, and the
 * default (Gaussian, tolerance = 3σ) is stated wherever it applies.
 *
 * @module
 */
import { requireFinite, requireNonNegative } from "../_validate.ts";

/** A seeded stream of random numbers. */
export interface Random {
  /** The seed the stream started from. */
  readonly seed: number;
  /** The next raw 32-bit output, an integer in [0, 2^32). */
  uint32(): number;
  /** The next uniform number in [0, 1), with 53 random bits. */
  uniform(): number;
  /**
   * The next normally distributed number (Marsaglia's polar method).
   * @param mean Mean. @default {0}
   * @param sd Standard deviation, ≥ 0. @default {1}
   */
  normal(mean?: number, sd?: number): number;
}

const GOLDEN = 0x9e3779b9; // 2^32/φ, the usual odd constant for spreading seeds apart

// The 32-bit finaliser of MurmurHash3 (Austin Appleby): a bijection on 32-bit words that mixes
// every input bit into every output bit, so nearby seeds give unrelated states.
function mix32(value: number): number {
  let h = value >>> 0;
  h = Math.imul(h ^ (h >>> 16), 0x85ebca6b);
  h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35);
  return (h ^ (h >>> 16)) >>> 0;
}

/**
 * Creates a seeded generator (xoshiro128**).
 *
 * The 128-bit state is filled from the seed through a 32-bit mixing function, so seeds 1, 2, 3
 * start unrelated streams. The mixer is a bijection and the four state words come from four
 * different inputs, so at most one word can be zero and the forbidden all-zero state cannot
 * occur.
 *
 * @param seed Any safe integer (negative and > 2^32 allowed; both 32-bit halves are used).
 * @returns A generator with `uniform()`, `normal()` and `uint32()`.
 * @throws {RangeError} If `seed` is not a safe integer.
 *
 * @example The same seed gives the same numbers
 * ```ts
 * import { createRandom } from "./random.ts";
 * import { deepEqual, ok } from "node:assert/strict";
 * const a = createRandom(42);
 * const b = createRandom(42);
 * const first = [a.uniform(), a.uniform(), a.normal(0, 1)];
 * deepEqual([b.uniform(), b.uniform(), b.normal(0, 1)], first);
 * ok(first[0] >= 0 && first[0] < 1);
 * ```
 */
export function createRandom(seed: number): Random {
  requireFinite("seed", seed);
  if (!Number.isSafeInteger(seed)) {
    throw new RangeError(`Expected seed to be a whole number, but found ${seed}`);
  }
  const low = seed >>> 0;
  const high = Math.floor(seed / 2 ** 32) >>> 0;
  const base = (low ^ mix32(high)) >>> 0;
  let s0 = mix32(base);
  let s1 = mix32(base + GOLDEN);
  let s2 = mix32(base + 2 * GOLDEN);
  let s3 = mix32(base + 3 * GOLDEN);

  function uint32(): number {
    // xoshiro128**: output scrambler rotl(s1·5, 7)·9, then the xorshift state update.
    const product = Math.imul(s1, 5);
    const result = Math.imul((product << 7) | (product >>> 25), 9) >>> 0;
    const t = s1 << 9;
    s2 ^= s0;
    s3 ^= s1;
    s1 ^= s2;
    s0 ^= s3;
    s2 ^= t;
    s3 = (s3 << 11) | (s3 >>> 21);
    return result;
  }

  function uniform(): number {
    // 27 + 26 bits make a 53-bit fraction, the full resolution of a double in [0, 1).
    const upper = uint32() >>> 5;
    const lower = uint32() >>> 6;
    return (upper * 67108864 + lower) / 9007199254740992;
  }

  // Marsaglia's polar method makes normals in pairs without trigonometry; keep the second
  // for the next call. A point in the unit disc needs 4/π ≈ 1.27 tries on average, and
  // 32-bit coordinates are ample for a normal deviate.
  let spare = 0;
  let hasSpare = false;
  function normal(mean = 0, sd = 1): number {
    if (sd < 0 || !Number.isFinite(sd)) {
      throw new RangeError(`Expected sd to be at least 0, but found ${sd}`);
    }
    if (hasSpare) {
      hasSpare = false;
      return mean + sd * spare;
    }
    let u: number;
    let v: number;
    let s: number;
    do {
      u = uint32() * 4.656612873077393e-10 - 1; // 2/2³²: u in [−1, 1)
      v = uint32() * 4.656612873077393e-10 - 1;
      s = u * u + v * v;
    } while (s >= 1 || s === 0);
    const scale = Math.sqrt((-2 * Math.log(s)) / s);
    spare = v * scale;
    hasSpare = true;
    return mean + sd * u * scale;
  }

  return { seed, uint32, uniform, normal };
}

/**
 * How a part's value spreads inside its marked tolerance.
 *
 * - `"gaussian3sigma"`: normal, with the tolerance taken as 3σ (about 0.27 % of parts fall
 *   outside it unless `truncate` is set). The default.
 * - `"uniform"`: flat over ±tolerance.
 * - `"corners"`: exactly +tolerance or −tolerance, each with probability ½ (a random
 *   worst-case corner; see `worstCaseCorners` for the exhaustive enumeration).
 * - `"binned"`: Gaussian (3σ = tolerance, truncated at ±tolerance) with the tighter parts,
 *   |δ| < `innerTolerance`, sorted out and sold as a better grade: a bimodal spread.
 */
export type ToleranceDistribution = "gaussian3sigma" | "uniform" | "corners" | "binned";

/** The list of tolerance distributions, for menus and validation. */
export const TOLERANCE_DISTRIBUTIONS: readonly ToleranceDistribution[] = [
  "gaussian3sigma",
  "uniform",
  "corners",
  "binned",
];

/** A part value with its marked tolerance, e.g. 10 kΩ ±1 %. */
export interface ToleranceValue {
  /** Nominal value, in SI base units. */
  nominal: number;
  /** Relative tolerance as a fraction (0.01 = ±1 %), ≥ 0. */
  tolerance: number;
}

/** Options for {@linkcode toleranceDeviation} and {@linkcode sampleTolerance}. */
export interface ToleranceOptions {
  /**
   * How values spread inside the tolerance.
   * @default {"gaussian3sigma"}
   */
  distribution?: ToleranceDistribution;
  /**
   * For `"gaussian3sigma"`: redraw values outside ±tolerance (parts screened at test).
   * @default {false}
   */
  truncate?: boolean;
  /**
   * For `"binned"`: the tighter grade sorted out, as a fraction (e.g. 0.005 when the ±0.5 %
   * parts were removed from a ±1 % batch); 0 ≤ innerTolerance < tolerance. Required there.
   */
  innerTolerance?: number;
}

/** The default tolerance distribution: Gaussian with the tolerance taken as 3σ. */
export const DEFAULT_TOLERANCE_DISTRIBUTION: ToleranceDistribution = "gaussian3sigma";

/**
 * Draws one relative deviation δ for a part of tolerance ±`tolerance`, so that its value is
 * nominal·(1 + δ).
 *
 * @param random The generator.
 * @param tolerance Relative tolerance as a fraction (0.01 = ±1 %), ≥ 0.
 * @param options Distribution, truncation and binning.
 * @returns δ, a fraction.
 * @throws {RangeError} If `tolerance` is negative, the distribution is unknown, or a binned
 *   draw lacks a valid `innerTolerance`.
 *
 * @example Uniform deviations stay inside the tolerance
 * ```ts
 * import { createRandom, toleranceDeviation } from "./random.ts";
 * import { ok } from "node:assert/strict";
 * const random = createRandom(7);
 * for (let i = 0; i < 1000; i++) {
 *   const delta = toleranceDeviation(random, 0.01, { distribution: "uniform" });
 *   ok(Math.abs(delta) <= 0.01);
 * }
 * ```
 */
export function toleranceDeviation(
  random: Random,
  tolerance: number,
  options: ToleranceOptions = {},
): number {
  requireNonNegative("tolerance", tolerance);
  const distribution = options.distribution ?? DEFAULT_TOLERANCE_DISTRIBUTION;
  switch (distribution) {
    case "gaussian3sigma": {
      if (!options.truncate || tolerance === 0) return random.normal(0, tolerance / 3);
      for (;;) {
        const delta = random.normal(0, tolerance / 3);
        if (Math.abs(delta) <= tolerance) return delta;
      }
    }
    case "uniform":
      return tolerance * (2 * random.uniform() - 1);
    case "corners":
      return random.uniform() < 0.5 ? -tolerance : tolerance;
    case "binned": {
      const inner = options.innerTolerance;
      if (inner === undefined) {
        throw new RangeError(
          `Expected innerTolerance for the "binned" distribution (the grade sorted out, e.g. 0.005), but found undefined`,
        );
      }
      requireNonNegative("innerTolerance", inner);
      if (!(inner < tolerance)) {
        throw new RangeError(
          `Expected innerTolerance to be below tolerance (${tolerance}), but found ${inner}`,
        );
      }
      // Rejection keeps the Gaussian shape of what is left; at inner = 0.9·tolerance about
      // 1 draw in 30 is kept, still cheap.
      for (;;) {
        const delta = random.normal(0, tolerance / 3);
        const size = Math.abs(delta);
        if (size <= tolerance && size >= inner) return delta;
      }
    }
    default:
      throw new RangeError(
        `Expected distribution to be one of ${
          TOLERANCE_DISTRIBUTIONS.map((d) => `"${d}"`).join(", ")
        }, but found ${JSON.stringify(distribution)}`,
      );
  }
}

/**
 * Draws one value of a part with a marked tolerance: nominal·(1 + δ).
 *
 * @param random The generator.
 * @param part Nominal value and relative tolerance.
 * @param options Distribution (default `"gaussian3sigma"`: tolerance = 3σ).
 * @returns A value in the part's unit.
 * @throws {RangeError} As {@linkcode toleranceDeviation}; also if `nominal` is not finite.
 *
 * @example 10 kΩ ±1 %, Gaussian with 3σ = 1 %: the spread of many draws is about 33.3 Ω
 * ```ts
 * import { createRandom, sampleTolerance } from "./random.ts";
 * import { ok } from "node:assert/strict";
 * const random = createRandom(1);
 * const values = Array.from({ length: 20000 }, () =>
 *   sampleTolerance(random, { nominal: 10e3, tolerance: 0.01 }));
 * const mean = values.reduce((a, b) => a + b) / values.length;
 * const sd = Math.sqrt(values.reduce((a, v) => a + (v - mean) ** 2, 0) / (values.length - 1));
 * ok(Math.abs(sd - 100 / 3) < 1); // ±4 standard errors of σ at N = 20000 is ±0.67 Ω
 * ```
 */
export function sampleTolerance(
  random: Random,
  part: ToleranceValue,
  options: ToleranceOptions = {},
): number {
  requireFinite("nominal", part.nominal);
  return part.nominal * (1 + toleranceDeviation(random, part.tolerance, options));
}
