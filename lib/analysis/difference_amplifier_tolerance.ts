/**
 * CMRR of the four-resistor difference amplifier under resistor tolerance: exact, first-order,
 * worst-case corners, closed-form percentiles and Monte Carlo percentiles.
 *
 * ```
 *   v1 ──R1──┬──R2──┐          ideal op amp, nominal R2/R1 = R4/R3 = K
 *            │      │
 *            └──(−) │          out = K·(v2 − v1) when the ratios match;
 *               op ─┴── out    any ratio error lets the common-mode
 *            ┌──(+)            voltage through.
 *   v2 ──R3──┤
 *            R4
 *            │
 *           0 V
 * ```
 *
 * With a = R2/R1 and b = R4/R3, and v1 = vcm − vid/2, v2 = vcm + vid/2:
 * Ad = (a + b + 2ab)/(2(1 + b)), Acm = (b − a)/(1 + b), CMRR = |Ad/Acm| (closed form).
 * Resistor i at Ri·(1 + δi) gives, to first order, Acm ≈ [K/(1 + K)]·(δ1 − δ2 − δ3 + δ4) and
 * CMRR ≈ (1 + K)/|δ1 − δ2 − δ3 + δ4|; at every resistor ±ε the worst case is about
 * (1 + K)/(4ε) ([SS7] ch. 2, [Franco4] ch. 2, from memory).
 *
 * @module
 */
import { requireFinite, requireInRange, requirePositive } from "../_validate.ts";
import { monteCarlo, percentiles, worstCaseCorners } from "./monte_carlo.ts";
import { toleranceDeviation, type ToleranceDistribution } from "./random.ts";
import { standardNormalQuantile } from "./normal_distribution.ts";

/** The four resistors of a difference amplifier, in Ω (see the module sketch). */
export interface DifferenceAmplifierResistors {
  /** Input resistor from v1 to the inverting input. */
  r1: number;
  /** Feedback resistor from the output to the inverting input. */
  r2: number;
  /** Input resistor from v2 to the non-inverting input. */
  r3: number;
  /** Resistor from the non-inverting input to 0 V. */
  r4: number;
}

/** Gains and CMRR of a difference amplifier with an ideal op amp. */
export interface DifferenceAmplifierGains {
  /** Differential gain Ad = vout/vid, with vid = v2 − v1. */
  differentialGain: number;
  /** Common-mode gain Acm = vout/vcm (signed). */
  commonModeGain: number;
  /** CMRR = |Ad/Acm| as a ratio; Infinity when the ratios match exactly. */
  cmrr: number;
  /** CMRR in dB, 20·log10(cmrr). */
  cmrrDb: number;
}

function db(ratio: number): number {
  return 20 * Math.log10(ratio);
}

/**
 * Exact differential gain, common-mode gain and CMRR of a difference amplifier with an ideal
 * op amp (only the resistor ratios matter).
 *
 * @param resistors R1 … R4 in Ω.
 * @returns Ad, Acm, CMRR and CMRR in dB.
 * @throws {RangeError} If a resistance is not above 0 Ω.
 *
 * @example R1 = R3 = 2 kΩ, R2 = R4 = 200 kΩ, with R2 high by 1 %
 * ```ts
 * import { differenceAmplifierGains } from "./difference_amplifier_tolerance.ts";
 * import { ok } from "node:assert/strict";
 * const gains = differenceAmplifierGains({ r1: 2e3, r2: 202e3, r3: 2e3, r4: 200e3 });
 * // a = 101, b = 100: Acm = (b − a)/(1 + b) = −1/101
 * ok(Math.abs(gains.commonModeGain + 1 / 101) < 1e-12);
 * // Ad = (a + b + 2ab)/(2(1 + b)) = 20401/202
 * ok(Math.abs(gains.differentialGain - 20401 / 202) < 1e-9);
 * ```
 */
export function differenceAmplifierGains(
  resistors: DifferenceAmplifierResistors,
): DifferenceAmplifierGains {
  const { r1, r2, r3, r4 } = resistors;
  requirePositive("r1", r1, "Ω");
  requirePositive("r2", r2, "Ω");
  requirePositive("r3", r3, "Ω");
  requirePositive("r4", r4, "Ω");
  return gainsOfRatios(r2 / r1, r4 / r3);
}

function gainsOfRatios(a: number, b: number): DifferenceAmplifierGains {
  const differentialGain = (a + b + 2 * a * b) / (2 * (1 + b));
  const commonModeGain = (b - a) / (1 + b);
  const cmrr = Math.abs(differentialGain / commonModeGain);
  return { differentialGain, commonModeGain, cmrr, cmrrDb: db(cmrr) };
}

/** Options for {@linkcode differenceAmplifierWorstCaseCmrr}. */
export interface DifferenceAmplifierToleranceOptions {
  /** Nominal gain K = R2/R1 = R4/R3, > 0. */
  gain: number;
  /** Relative tolerance ε of every resistor as a fraction (0.01 = ±1 %), > 0 and < 1. */
  tolerance: number;
}

/** Worst-case CMRR of a difference amplifier. */
export interface DifferenceAmplifierWorstCase {
  /** Lowest CMRR over all 16 corners, exact, as a ratio. */
  cmrr: number;
  /** The same in dB. */
  cmrrDb: number;
  /** The textbook approximation (1 + K)/(4ε), as a ratio. */
  approximateCmrr: number;
  /** The approximation in dB. */
  approximateCmrrDb: number;
  /** Signs of δ1 … δ4 at the worst corner (+1 = high). */
  signs: number[];
}

/**
 * Worst-case CMRR of a difference amplifier whose four resistors each sit anywhere within ±ε:
 * the exact minimum over all 16 corners, beside the approximation (1 + K)/(4ε).
 *
 * @param options Nominal gain K and tolerance ε.
 * @returns The exact worst case, the approximation, and the worst corner.
 * @throws {RangeError} If `gain` is not positive or `tolerance` is not in (0, 1).
 *
 * @example Unity gain, 1 % resistors: 50 (34 dB)
 * ```ts
 * import { differenceAmplifierWorstCaseCmrr } from "./difference_amplifier_tolerance.ts";
 * import { deepEqual, ok } from "node:assert/strict";
 * const worst = differenceAmplifierWorstCaseCmrr({ gain: 1, tolerance: 0.01 });
 * ok(Math.abs(worst.cmrr - 50) < 1e-9);
 * ok(Math.abs(worst.approximateCmrr - 50) < 1e-12);
 * deepEqual(worst.signs, [-1, 1, 1, -1]);
 * ```
 */
export function differenceAmplifierWorstCaseCmrr(
  options: DifferenceAmplifierToleranceOptions,
): DifferenceAmplifierWorstCase {
  const { gain, tolerance } = options;
  requirePositive("gain", gain);
  requireTolerance(tolerance);
  const parts = [1, gain, 1, gain].map((nominal, i) => ({
    name: `R${i + 1}`,
    nominal,
    tolerance,
  }));
  const { lowest } = worstCaseCorners(
    parts,
    ([r1, r2, r3, r4]) => gainsOfRatios(r2 / r1, r4 / r3),
    {
      measure: (gains) => gains.cmrr,
    },
  );
  const approximateCmrr = (1 + gain) / (4 * tolerance);
  return {
    cmrr: lowest.result.cmrr,
    cmrrDb: lowest.result.cmrrDb,
    approximateCmrr,
    approximateCmrrDb: db(approximateCmrr),
    signs: lowest.signs,
  };
}

function requireTolerance(tolerance: number): void {
  requireFinite("tolerance", tolerance);
  if (!(tolerance > 0 && tolerance < 1)) {
    throw new RangeError(
      `Expected tolerance to be a fraction between 0 and 1 (0.01 = 1 %), but found ${tolerance}`,
    );
  }
}

/**
 * First-order CMRR of a difference amplifier from the four resistors' relative errors:
 * (1 + K)/|δ1 − δ2 − δ3 + δ4|. Good while every |δ| ≪ 1; it shows which combination of errors
 * matters (errors that keep both ratios equal cancel).
 *
 * @param gain Nominal gain K = R2/R1 = R4/R3, > 0.
 * @param deviations δ1 … δ4, each resistor's relative error (0.01 = 1 % high).
 * @returns CMRR as a ratio (Infinity when the errors cancel).
 * @throws {RangeError} If `gain` is not positive or there are not four finite deviations.
 *
 * @example R1 high and R2 low by 1 % (the ratio a is off by about 2 %), K = 1
 * ```ts
 * import { differenceAmplifierFirstOrderCmrr } from "./difference_amplifier_tolerance.ts";
 * import { equal } from "node:assert/strict";
 * equal(differenceAmplifierFirstOrderCmrr(1, [0.01, -0.01, 0, 0]), 100);
 * ```
 */
export function differenceAmplifierFirstOrderCmrr(
  gain: number,
  deviations: readonly [number, number, number, number] | readonly number[],
): number {
  requirePositive("gain", gain);
  if (deviations.length !== 4) {
    throw new RangeError(
      `Expected deviations to hold 4 values (δ1 … δ4), but found ${deviations.length}`,
    );
  }
  deviations.forEach((d, i) => requireFinite(`deviations[${i}]`, d));
  const [d1, d2, d3, d4] = deviations;
  return (1 + gain) / Math.abs(d1 - d2 - d3 + d4);
}

/** Options for {@linkcode differenceAmplifierStatisticalCmrr}. */
export interface StatisticalCmrrOptions {
  /** Nominal gain K = R2/R1 = R4/R3, > 0. */
  gain: number;
  /**
   * Relative tolerance ε of every resistor, taken as 3σ of a Gaussian (σ = ε/3). Give either
   * this or `sigma`.
   */
  tolerance?: number;
  /** Relative standard deviation σ of every resistor; overrides `tolerance`. */
  sigma?: number;
  /**
   * Probability that a built amplifier is worse than the returned CMRR: 0.5 is the median,
   * 0.05 the 5th percentile.
   * @default {0.5}
   */
  probabilityWorse?: number;
}

/** A closed-form CMRR percentile. */
export interface StatisticalCmrr {
  /** CMRR as a ratio, exceeded by a fraction 1 − p of amplifiers. */
  cmrr: number;
  /** The same in dB. */
  cmrrDb: number;
  /** The z value used, z_{1−p/2}. */
  z: number;
  /** σ of the error sum S = δ1 − δ2 − δ3 + δ4, which is 2σ. */
  sumSigma: number;
}

/**
 * CMRR percentile of a difference amplifier with independent Gaussian resistor errors, in
 * closed form (first order): S = δ1 − δ2 − δ3 + δ4 has σ_S = 2σ, and the CMRR that a
 * fraction p of amplifiers fall below is (1 + K)/(z_{1−p/2}·2σ).
 *
 * @param options Gain, spread (tolerance as 3σ, or σ) and the fraction worse.
 * @returns CMRR, in dB, with the z value and σ_S used.
 * @throws {RangeError} If neither `tolerance` nor `sigma` is given, or a value is out of range.
 *
 * @example Median and 5th percentile at K = 1 with 1 % resistors (3σ): 52.96 dB and 43.70 dB
 * ```ts
 * import { differenceAmplifierStatisticalCmrr } from "./difference_amplifier_tolerance.ts";
 * import { ok } from "node:assert/strict";
 * const median = differenceAmplifierStatisticalCmrr({ gain: 1, tolerance: 0.01 });
 * const fifth = differenceAmplifierStatisticalCmrr({
 *   gain: 1,
 *   tolerance: 0.01,
 *   probabilityWorse: 0.05,
 * });
 * ok(Math.abs(median.cmrrDb - 52.96) < 0.01);
 * ok(Math.abs(fifth.cmrrDb - 43.70) < 0.01);
 * ```
 */
export function differenceAmplifierStatisticalCmrr(
  options: StatisticalCmrrOptions,
): StatisticalCmrr {
  const { gain } = options;
  requirePositive("gain", gain);
  let sigma: number;
  if (options.sigma !== undefined) {
    requirePositive("sigma", options.sigma);
    sigma = options.sigma;
  } else if (options.tolerance !== undefined) {
    requireTolerance(options.tolerance);
    sigma = options.tolerance / 3;
  } else {
    throw new RangeError(
      "Expected tolerance (taken as 3σ) or sigma for the resistor spread, but found neither",
    );
  }
  const p = options.probabilityWorse ?? 0.5;
  requireFinite("probabilityWorse", p);
  if (!(p > 0 && p < 1)) {
    throw new RangeError(
      `Expected probabilityWorse to be between 0 and 1 (exclusive), but found ${p}`,
    );
  }
  // |S| exceeds z_{1−p/2}·σ_S with probability p, and a larger |S| means a worse CMRR.
  const z = standardNormalQuantile(1 - p / 2);
  const sumSigma = 2 * sigma;
  const cmrr = (1 + gain) / (z * sumSigma);
  return { cmrr, cmrrDb: db(cmrr), z, sumSigma };
}

/** Options for {@linkcode differenceAmplifierCmrrMonteCarlo}. */
export interface CmrrMonteCarloOptions {
  /** Nominal gain K = R2/R1 = R4/R3, > 0. */
  gain: number;
  /** Relative tolerance ε of every resistor as a fraction, in (0, 1). */
  tolerance: number;
  /**
   * How each resistor spreads inside its tolerance.
   * @default {"gaussian3sigma"}
   */
  distribution?: ToleranceDistribution;
  /**
   * For the `"binned"` distribution: the tighter grade sorted out.
   */
  innerTolerance?: number;
  /**
   * Number of amplifiers built; REFERENCE §0.2 asks for at least 2·10⁵ in tests.
   * @default {200000}
   */
  trials?: number;
  /**
   * Seed of the generator.
   * @default {1}
   */
  seed?: number;
  /**
   * Fractions worse to report: 0.5 is the median, 0.05 the 5th percentile.
   * @default {[0.5, 0.05, 0.01]}
   */
  probabilitiesWorse?: readonly number[];
}

/** One Monte Carlo CMRR percentile. */
export interface CmrrPercentile {
  /** Fraction of amplifiers worse than `cmrr`. */
  probabilityWorse: number;
  /** CMRR ratio at that fraction. */
  cmrr: number;
  /** The same in dB. */
  cmrrDb: number;
}

/** Result of {@linkcode differenceAmplifierCmrrMonteCarlo}. */
export interface CmrrMonteCarlo {
  /** Amplifiers built. */
  trials: number;
  /** The percentiles asked for, in the order asked. */
  percentiles: CmrrPercentile[];
  /** Every trial's exact CMRR (ratio), in trial order. */
  cmrr: Float64Array;
}

/**
 * CMRR percentiles of a difference amplifier by Monte Carlo: builds `trials` amplifiers with
 * every resistor drawn from `distribution`, computes each one's exact CMRR, and reports the
 * percentiles (of the ratio, then converted to dB: percentiles commute with the monotonic dB
 * scale, means do not).
 *
 * @param options Gain, tolerance, distribution, trial count, seed and fractions.
 * @returns Percentiles and every trial's CMRR.
 * @throws {RangeError} If a value is out of range.
 *
 * @example Uniform ±1 % resistors at unity gain: median near 47.9 dB
 * ```ts
 * import { differenceAmplifierCmrrMonteCarlo } from "./difference_amplifier_tolerance.ts";
 * import { ok } from "node:assert/strict";
 * const run = differenceAmplifierCmrrMonteCarlo({
 *   gain: 1,
 *   tolerance: 0.01,
 *   distribution: "uniform",
 *   trials: 20000,
 *   probabilitiesWorse: [0.5],
 * });
 * ok(Math.abs(run.percentiles[0].cmrrDb - 47.90) < 0.5);
 * ```
 */
export function differenceAmplifierCmrrMonteCarlo(options: CmrrMonteCarloOptions): CmrrMonteCarlo {
  const { gain, tolerance } = options;
  requirePositive("gain", gain);
  requireTolerance(tolerance);
  const trials = options.trials ?? 200_000;
  const fractions = options.probabilitiesWorse ?? [0.5, 0.05, 0.01];
  fractions.forEach((p, i) => requireInRange(`probabilitiesWorse[${i}]`, p, 0, 1));
  const draw = { distribution: options.distribution, innerTolerance: options.innerTolerance };
  const cmrr = new Float64Array(
    monteCarlo(trials, (random) => {
      const d1 = toleranceDeviation(random, tolerance, draw);
      const d2 = toleranceDeviation(random, tolerance, draw);
      const d3 = toleranceDeviation(random, tolerance, draw);
      const d4 = toleranceDeviation(random, tolerance, draw);
      return gainsOfRatios((gain * (1 + d2)) / (1 + d1), (gain * (1 + d4)) / (1 + d3)).cmrr;
    }, { seed: options.seed }),
  );
  const values = percentiles(cmrr, fractions);
  return {
    trials,
    percentiles: fractions.map((probabilityWorse, i) => ({
      probabilityWorse,
      cmrr: values[i],
      cmrrDb: db(values[i]),
    })),
    cmrr,
  };
}
