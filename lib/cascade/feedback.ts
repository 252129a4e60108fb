/**
 * Negative feedback at one frequency (mid-band): closed-loop gain, loop gain, desensitivity,
 * and what the loop does to output and input impedance, bandwidth and distortion.
 *
 * ```
 *   vin ──(+)──▶[ A ]──┬──▶ vout        Af = A / (1 + Aβ)
 *          ▲−          │                 T  = Aβ  (loop gain)
 *          └───[ β ]◀──┘
 * ```
 *
 * @module
 */
import { requireFinite, requireNonNegative, requirePositive } from "../_validate.ts";

/** Options for {@linkcode negativeFeedback}. */
export interface NegativeFeedbackOptions {
  /** Open-loop gain A, with the loading of source, feedback network and load included. */
  openLoopGain: number;
  /** Feedback factor β (same sign as A for negative feedback). */
  feedbackFactor: number;
  /** Open-loop output resistance in Ω (voltage sampling); gives `outputResistance`. */
  openLoopOutputResistance?: number;
  /** Open-loop input resistance in Ω (series mixing); gives `inputResistance`. */
  openLoopInputResistance?: number;
  /** Open-loop −3 dB frequency in Hz of a single-pole A; gives `bandwidth`. */
  openLoopBandwidth?: number;
  /** Open-loop harmonic distortion as a fraction (0.01 = 1 %); gives `distortion`. */
  openLoopDistortion?: number;
}

/** The result of {@linkcode negativeFeedback}. */
export interface NegativeFeedbackResult {
  /** Closed-loop gain Af = A/(1 + Aβ). */
  closedLoopGain: number;
  /** |Af| in dB. */
  closedLoopGainDb: number;
  /** The gain an infinite A would give, 1/β. */
  idealGain: number;
  /** Loop gain T = Aβ. */
  loopGain: number;
  /** |T| in dB. */
  loopGainDb: number;
  /** Amount of feedback 1 + Aβ (the factor every "÷(1 + Aβ)" rule uses). */
  feedbackAmount: number;
  /** Desensitivity 1/(1 + Aβ): dAf/Af = desensitivity · dA/A. */
  desensitivity: number;
  /** Closed-loop output resistance Zout/(1 + Aβ) in Ω, when the open-loop one was given. */
  outputResistance?: number;
  /** Closed-loop input resistance Zin·(1 + Aβ) in Ω, when the open-loop one was given. */
  inputResistance?: number;
  /** Closed-loop −3 dB frequency f_H·(1 + A0β) in Hz, when the open-loop one was given. */
  bandwidth?: number;
  /** Gain-bandwidth product A0·f_H in Hz (unchanged by feedback), when f_H was given. */
  gainBandwidth?: number;
  /** Closed-loop distortion at the same output level, first order: HD/(1 + Aβ). */
  distortion?: number;
}

/**
 * Closes a negative-feedback loop around a gain A with feedback factor β, at one frequency.
 *
 * The ÷(1 + Aβ) rules need the loop gain at the frequency of interest: at 20 kHz an audio
 * amplifier may have only 30–40 dB of loop gain, not its mid-band figure.
 *
 * @param options A, β and the open-loop quantities to transform.
 * @returns Closed-loop gain, loop gain, desensitivity and transformed quantities.
 * @throws {RangeError} If A is zero, Aβ ≤ −1 (the loop would latch rather than amplify),
 * or an open-loop quantity is out of range.
 *
 * @example A = 10⁵ with β = 0.05
 * ```ts
 * import { negativeFeedback } from "./feedback.ts";
 * import { ok, equal } from "node:assert/strict";
 * const loop = negativeFeedback({ openLoopGain: 1e5, feedbackFactor: 0.05 });
 * equal(loop.loopGain, 5000);
 * ok(Math.abs(loop.closedLoopGain - 19.996) < 1e-3);
 * ```
 */
export function negativeFeedback(options: NegativeFeedbackOptions): NegativeFeedbackResult {
  const a = options.openLoopGain;
  const beta = options.feedbackFactor;
  requireFinite("openLoopGain", a);
  requireFinite("feedbackFactor", beta);
  if (a === 0) throw new RangeError("Expected openLoopGain to be non-zero, but found 0");
  const loopGain = a * beta;
  if (!(loopGain > -1)) {
    throw new RangeError(
      `Expected openLoopGain·feedbackFactor to be above -1 (negative feedback), but found ${loopGain}`,
    );
  }
  const amount = 1 + loopGain;
  const closedLoopGain = a / amount;
  const result: NegativeFeedbackResult = {
    closedLoopGain,
    closedLoopGainDb: 20 * Math.log10(Math.abs(closedLoopGain)),
    idealGain: 1 / beta,
    loopGain,
    loopGainDb: 20 * Math.log10(Math.abs(loopGain)),
    feedbackAmount: amount,
    desensitivity: 1 / amount,
  };
  if (options.openLoopOutputResistance !== undefined) {
    requireNonNegative("openLoopOutputResistance", options.openLoopOutputResistance, "Ω");
    result.outputResistance = options.openLoopOutputResistance / amount;
  }
  if (options.openLoopInputResistance !== undefined) {
    requirePositive("openLoopInputResistance", options.openLoopInputResistance, "Ω");
    result.inputResistance = options.openLoopInputResistance * amount;
  }
  if (options.openLoopBandwidth !== undefined) {
    requirePositive("openLoopBandwidth", options.openLoopBandwidth, "Hz");
    result.bandwidth = options.openLoopBandwidth * amount;
    result.gainBandwidth = Math.abs(a) * options.openLoopBandwidth;
  }
  if (options.openLoopDistortion !== undefined) {
    requireNonNegative("openLoopDistortion", options.openLoopDistortion);
    result.distortion = options.openLoopDistortion / amount;
  }
  return result;
}

/** Options for {@linkcode dampingFactor}. */
export interface DampingFactorOptions {
  /** Load (loudspeaker) resistance in Ω. */
  loadResistance: number;
  /** Amplifier output impedance in Ω (closed loop). */
  outputResistance: number;
  /**
   * Resistance in series with the output: wiring, output coil, connectors, in Ω.
   * @default {0}
   */
  seriesResistance?: number;
  /**
   * Largest damping factor worth reporting (common practice, no source: about 8 mΩ of
   * wiring against an 8 Ω load).
   * @default {1000}
   */
  maximum?: number;
}

/** The result of {@linkcode dampingFactor}. */
export interface DampingFactorResult {
  /** RL/Zout: the amplifier's own figure, often absurdly large. */
  theoretical: number;
  /** RL/(Zout + series), capped at `maximum`: the figure worth printing. */
  reported: number;
  /** True when `reported` was capped. */
  capped: boolean;
  /** Total source resistance the load sees, Zout + series, in Ω. */
  totalResistance: number;
}

/**
 * Damping factor RL/Zout, with the series resistance of the wiring and a cap, because a
 * 0.1 mΩ output impedance is meaningless once milliohms of wiring, coil and connectors sit in
 * series (report Zout, or a capped figure).
 *
 * @param options Load, output resistance, wiring and cap.
 * @returns The theoretical figure and the one worth reporting.
 * @throws {RangeError} If `loadResistance` or `maximum` is not above 0, or a resistance is
 * negative.
 *
 * @example 115.8 µΩ into 8 Ω
 * ```ts
 * import { dampingFactor } from "./feedback.ts";
 * import { ok, equal } from "node:assert/strict";
 * const df = dampingFactor({ loadResistance: 8, outputResistance: 115.8e-6 });
 * ok(df.theoretical > 69000);
 * equal(df.reported, 1000);
 * equal(df.capped, true);
 * ```
 */
export function dampingFactor(options: DampingFactorOptions): DampingFactorResult {
  requirePositive("loadResistance", options.loadResistance, "Ω");
  requireNonNegative("outputResistance", options.outputResistance, "Ω");
  const series = options.seriesResistance ?? 0;
  requireNonNegative("seriesResistance", series, "Ω");
  const maximum = options.maximum ?? 1000;
  requirePositive("maximum", maximum);
  const totalResistance = options.outputResistance + series;
  const theoretical = options.loadResistance / options.outputResistance;
  const plain = options.loadResistance / totalResistance;
  return {
    theoretical,
    reported: Math.min(plain, maximum),
    capped: plain > maximum,
    totalResistance,
  };
}
