/**
 * The complementary emitter follower in the small-signal view: compound current gain, output
 * resistance, gain, and the gain-matching (Oliver) bias condition.
 *
 * ```
 *        Rs                     one device conducting:  Rout = RE + re + Rs/(β+1)
 *  vs ──/\/\──┬── NPN ─ RE ─┐
 *             │             ├── out ── RL       both conducting at Iq:
 *           Vbias           │                    Rout = (RE + VT/Iq)/2 + Rs/(β+1)
 *             │             │
 *             └── PNP ─ RE ─┘
 * ```
 *
 * @module
 */
import { requireFinite, requireNonNegative, requirePositive } from "../_validate.ts";
import { DEFAULT_TEMPERATURE } from "../physics/constants.ts";
import { thermalVoltage } from "../physics/thermal_voltage.ts";
import { complementaryPairBeta, darlingtonBeta } from "../devices/compound_pair.ts";

/** How each half of the output stage is built. */
export type OutputDeviceKind = "single" | "darlington" | "feedbackPair";

/** Options for {@linkcode compoundCurrentGain}. */
export interface CompoundCurrentGainOptions {
  /** Current gain of the output (power) device. */
  outputBeta: number;
  /**
   * Current gain of the driver; ignored for `"single"`.
   * @default {100}
   */
  driverBeta?: number;
}

/**
 * Current gain of one half of the output stage.
 *
 * Darlington: β1β2 + β1 + β2. Complementary feedback pair: β1(1 + β2), the driver's base
 * current controlling the output device's emitter current through the driver's collector.
 *
 * @param kind Single device, Darlington, or complementary feedback pair.
 * @param options The device current gains.
 * @returns The compound current gain β.
 * @throws {RangeError} If a gain is not positive.
 *
 * @example Darlington and feedback pair with β1 = 100, β2 = 50 (REFERENCE E5.14)
 * ```ts
 * import { compoundCurrentGain } from "./follower.ts";
 * import { equal } from "node:assert/strict";
 * equal(compoundCurrentGain("darlington", { driverBeta: 100, outputBeta: 50 }), 5150);
 * equal(compoundCurrentGain("feedbackPair", { driverBeta: 100, outputBeta: 50 }), 5100);
 * ```
 */
export function compoundCurrentGain(
  kind: OutputDeviceKind,
  options: CompoundCurrentGainOptions,
): number {
  requirePositive("outputBeta", options.outputBeta);
  const b2 = options.outputBeta;
  if (kind === "single") return b2;
  const b1 = options.driverBeta ?? 100;
  requirePositive("driverBeta", b1);
  if (kind === "darlington") return darlingtonBeta(b1, b2);
  if (kind === "feedbackPair") return complementaryPairBeta(b1, b2);
  throw new TypeError(
    `Expected kind to be "single", "darlington" or "feedbackPair", but found ${String(kind)}`,
  );
}

/** Options for {@linkcode followerOutputResistance} and {@linkcode followerGain}. */
export interface FollowerOptions {
  /** External emitter resistor RE in Ω. */
  emitterResistance: number;
  /** Emitter current of the conducting device in A (sets re = VT/IE). */
  emitterCurrent: number;
  /**
   * Resistance driving the bases, Rs, in Ω.
   * @default {0}
   */
  sourceResistance?: number;
  /**
   * Compound current gain β (only used with a source resistance).
   * @default {Infinity}
   */
  currentGain?: number;
  /**
   * Junction temperature in K.
   * @default {300}
   */
  temperature?: number;
}

/** Output resistance and its parts for one conducting device. */
export interface FollowerResistance {
  /** Intrinsic emitter resistance re = VT/IE in Ω. */
  intrinsicEmitterResistance: number;
  /** Source resistance seen through the base, Rs/(β+1), in Ω. */
  reflectedSourceResistance: number;
  /** RE + re + Rs/(β+1) in Ω. */
  outputResistance: number;
}

/**
 * Output resistance of a conducting emitter follower: RE + re + Rs/(β+1).
 *
 * @param options Emitter resistor, current, source resistance, gain, temperature.
 * @returns The output resistance and its three parts.
 * @throws {RangeError} If a value is out of range.
 *
 * @example REFERENCE E5.8
 * ```ts
 * import { followerOutputResistance } from "./follower.ts";
 * import { ok } from "node:assert/strict";
 * const r = followerOutputResistance({
 *   emitterResistance: 0.22, emitterCurrent: 1, sourceResistance: 1000, currentGain: 3000,
 * });
 * ok(Math.abs(r.outputResistance - 0.57907) < 1e-5);
 * ```
 */
export function followerOutputResistance(options: FollowerOptions): FollowerResistance {
  requireNonNegative("emitterResistance", options.emitterResistance, "Ω");
  requirePositive("emitterCurrent", options.emitterCurrent, "A");
  const rs = options.sourceResistance ?? 0;
  requireNonNegative("sourceResistance", rs, "Ω");
  const beta = options.currentGain ?? Infinity;
  if (beta !== Infinity) requirePositive("currentGain", beta);
  const vt = thermalVoltage(options.temperature ?? DEFAULT_TEMPERATURE);
  const intrinsicEmitterResistance = vt / options.emitterCurrent;
  const reflectedSourceResistance = rs === 0 ? 0 : rs / (beta + 1);
  return {
    intrinsicEmitterResistance,
    reflectedSourceResistance,
    outputResistance: options.emitterResistance + intrinsicEmitterResistance +
      reflectedSourceResistance,
  };
}

/**
 * Voltage gain of a conducting follower into a load: RL/(RL + RE + re + Rs/(β+1)).
 *
 * @param loadResistance Load RL in Ω.
 * @param options Emitter resistor, current, source resistance, gain, temperature.
 * @returns The gain vout/vs (below 1).
 * @throws {RangeError} If a value is out of range.
 *
 * @example REFERENCE E5.8
 * ```ts
 * import { followerGain } from "./follower.ts";
 * import { ok } from "node:assert/strict";
 * const gain = followerGain(8, {
 *   emitterResistance: 0.22, emitterCurrent: 1, sourceResistance: 1000, currentGain: 3000,
 * });
 * ok(Math.abs(gain - 0.93250) < 1e-5);
 * ```
 */
export function followerGain(loadResistance: number, options: FollowerOptions): number {
  requirePositive("loadResistance", loadResistance, "Ω");
  const { outputResistance } = followerOutputResistance(options);
  return loadResistance / (loadResistance + outputResistance);
}

/** Options for {@linkcode gainMatchedBias}. */
export interface GainMatchedBiasOptions {
  /** Load RL in Ω. */
  loadResistance: number;
  /**
   * Quiescent current to assess in A.
   * @default {the gain-matched current}
   */
  quiescentCurrent?: number;
  /**
   * Resistance in series with EACH half, referred to its emitter (e.g. a base stopper
   * Rb/(β+1)), in Ω. Oliver's "RE" is the whole series resistance of each half, so this
   * adds to the emitter resistor and lowers the matched current.
   * @default {0}
   */
  perHalfSeriesResistance?: number;
  /**
   * Resistance SHARED by both halves, referred to the emitters (a common driving resistance
   * Rs/(β+1)), in Ω. Both bases draw their currents through it, so it adds the same amount
   * at crossover and at large current and does not move the matched current.
   * @default {0}
   */
  sharedSeriesResistance?: number;
  /**
   * Junction temperature in K.
   * @default {300}
   */
  temperature?: number;
}

/** The gain-matching (Oliver) bias assessment. */
export interface GainMatchedBias {
  /**
   * Quiescent current that matches the gains, VT/(RE + per-half series resistance), in A;
   * Infinity when there is no series resistance at all (the gains cannot match).
   */
  matchedQuiescentCurrent: number;
  /** The quiescent current assessed in A. */
  quiescentCurrent: number;
  /** Iq·(RE + per-half series resistance)/VT: 1 at the gain-matched bias. */
  biasRatio: number;
  /** Incremental gain at crossover, both devices conducting. */
  crossoverGain: number;
  /** Gain at large current (one device, re → 0). */
  largeSignalGain: number;
  /** crossoverGain/largeSignalGain − 1: negative is under-biased, positive over-biased. */
  gainMismatch: number;
}

/**
 * The gain-matching bias criterion for minimum crossover error: Iq·RE = VT, where the
 * incremental gain at crossover, RL/(RL + (RE + VT/Iq)/2), equals the large-current gain
 * RL/(RL + RE). Under-biasing drops the gain around crossover, over-biasing ("gm
 * doubling") lifts it; both wobble the gain and make distortion.
 *
 * The output current draws the same total base current, iL/(β+1), whether one or both
 * devices conduct, so a driving resistance shared by both bases adds Rs/(β+1) on both sides
 * and drops out of the matching; a resistance in each half (base stoppers, a driver's own
 * emitter resistance) is halved at crossover like RE and counts in Oliver's "RE".
 *
 * The criterion is gain matching, not "minimum THD": the THD minimum over Iq moves with
 * amplitude (REFERENCE §5.4).
 *
 * @param emitterResistance External emitter resistor RE of each half in Ω.
 * @param options Load, quiescent current to assess, series resistances, temperature.
 * @returns The matched current and the gains on both sides of crossover.
 * @throws {RangeError} If a value is out of range, or no Iq is given and there is no
 *   series resistance to match against.
 *
 * @example RE = 0.22 Ω into 8 Ω at 300 K (REFERENCE E5.9, E5.10)
 * ```ts
 * import { gainMatchedBias } from "./follower.ts";
 * import { ok } from "node:assert/strict";
 * const bias = gainMatchedBias(0.22, { loadResistance: 8 });
 * ok(Math.abs(bias.matchedQuiescentCurrent - 0.1175) < 1e-4);
 * ok(Math.abs(bias.crossoverGain - 0.973236) < 1e-6);
 * ok(Math.abs(bias.gainMismatch) < 1e-12);
 * ```
 */
export function gainMatchedBias(
  emitterResistance: number,
  options: GainMatchedBiasOptions,
): GainMatchedBias {
  requirePositive("loadResistance", options.loadResistance, "Ω");
  requireNonNegative("emitterResistance", emitterResistance, "Ω");
  const perHalf = options.perHalfSeriesResistance ?? 0;
  requireNonNegative("perHalfSeriesResistance", perHalf, "Ω");
  const shared = options.sharedSeriesResistance ?? 0;
  requireNonNegative("sharedSeriesResistance", shared, "Ω");
  const series = emitterResistance + perHalf;
  const vt = thermalVoltage(options.temperature ?? DEFAULT_TEMPERATURE);
  const matchedQuiescentCurrent = series > 0 ? vt / series : Infinity;
  if (options.quiescentCurrent === undefined) {
    requirePositive("emitterResistance + perHalfSeriesResistance", series, "Ω");
  }
  const iq = options.quiescentCurrent ?? matchedQuiescentCurrent;
  requirePositive("quiescentCurrent", iq, "A");
  const rl = options.loadResistance;
  const crossoverResistance = (series + vt / iq) / 2 + shared;
  const crossoverGain = rl / (rl + crossoverResistance);
  const largeSignalGain = rl / (rl + series + shared);
  return {
    matchedQuiescentCurrent,
    quiescentCurrent: iq,
    biasRatio: (iq * series) / vt,
    crossoverGain,
    largeSignalGain,
    gainMismatch: crossoverGain / largeSignalGain - 1,
  };
}

/** Options for {@linkcode followerPairBiasVoltage}. */
export interface FollowerPairBiasVoltageOptions {
  /** Emitter resistor of each half in Ω. */
  emitterResistance: number;
  /** Saturation current Is of each (matched) device in A. */
  saturationCurrent: number;
  /**
   * Junction temperature in K.
   * @default {300}
   */
  temperature?: number;
}

/**
 * Bias voltage between the bases of a single complementary follower pair for quiescent
 * current Iq: VBE,n(Iq) + |VBE,p(Iq)| + 2·Iq·RE, with matched devices.
 *
 * @param quiescentCurrent Iq in A.
 * @param options Emitter resistor, saturation current, temperature.
 * @returns The bias voltage in V.
 * @throws {RangeError} If a value is out of range.
 *
 * @example Is = 1 pA at the gain-matched current for 0.22 Ω (REFERENCE E5.11)
 * ```ts
 * import { followerPairBiasVoltage } from "./follower.ts";
 * import { ok } from "node:assert/strict";
 * const v = followerPairBiasVoltage(0.025852 / 0.22, {
 *   emitterResistance: 0.22, saturationCurrent: 1e-12,
 * });
 * ok(Math.abs(v - 1.3696) < 1e-4);
 * ```
 */
export function followerPairBiasVoltage(
  quiescentCurrent: number,
  options: FollowerPairBiasVoltageOptions,
): number {
  requirePositive("quiescentCurrent", quiescentCurrent, "A");
  requireNonNegative("emitterResistance", options.emitterResistance, "Ω");
  requirePositive("saturationCurrent", options.saturationCurrent, "A");
  const vt = thermalVoltage(options.temperature ?? DEFAULT_TEMPERATURE);
  const vbe = vt * Math.log(quiescentCurrent / options.saturationCurrent);
  return 2 * vbe + 2 * quiescentCurrent * options.emitterResistance;
}

/**
 * Inverse of {@linkcode followerPairBiasVoltage}: the quiescent current a given bias
 * voltage sets in a single follower pair.
 *
 * @param biasVoltage Voltage between the bases in V.
 * @param options Emitter resistor, saturation current, temperature.
 * @returns Iq in A.
 * @throws {RangeError} If a value is out of range.
 *
 * @example Round trip
 * ```ts
 * import { followerPairBiasVoltage, followerPairQuiescentCurrent } from "./follower.ts";
 * import { ok } from "node:assert/strict";
 * const options = { emitterResistance: 0.22, saturationCurrent: 1e-12 };
 * const v = followerPairBiasVoltage(0.1, options);
 * ok(Math.abs(followerPairQuiescentCurrent(v, options) - 0.1) < 1e-12);
 * ```
 */
export function followerPairQuiescentCurrent(
  biasVoltage: number,
  options: FollowerPairBiasVoltageOptions,
): number {
  requireFinite("biasVoltage", biasVoltage);
  requireNonNegative("emitterResistance", options.emitterResistance, "Ω");
  requirePositive("saturationCurrent", options.saturationCurrent, "A");
  const vt = thermalVoltage(options.temperature ?? DEFAULT_TEMPERATURE);
  const re = options.emitterResistance;
  const is = options.saturationCurrent;
  // Solve g(x) = VT·x + Is·e^x·RE − V/2 = 0 for x = ln(I/Is): increasing and convex, so
  // Newton from the right of the root converges monotonically.
  const half = biasVoltage / 2;
  let x = half / vt;
  // Start no further right than where the resistor alone drops V/2, so e^x cannot overflow.
  if (re > 0 && half > 0) x = Math.min(x, Math.max(Math.log(half / (re * is)), 0));
  for (let i = 0; i < 200; i++) {
    const e = is * Math.exp(x);
    const g = vt * x + e * re - half;
    const step = g / (vt + e * re);
    x -= step;
    if (Math.abs(step) < 1e-15 * Math.max(1, Math.abs(x))) break;
  }
  return is * Math.exp(x);
}
