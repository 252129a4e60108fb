/**
 * The static transfer curve of a complementary emitter-follower pair computed from the
 * exponential device law, and its crossover distortion.
 *
 * Model (REFERENCE §5.4, after Oliver): an ideal voltage source drives both bases through a
 * fixed bias that sets quiescent current Iq; matched NPN and PNP with infinite β; each has
 * an emitter resistor RE to the output; RL to ground.
 *
 * ```
 *          ┌── NPN ── RE ──┐        In = Iq·exp[(vin − vout − (In − Iq)·RE)/VT]
 *   vin ───┤               ├── vout  Ip = Iq·exp[(vout − vin − (Ip − Iq)·RE)/VT]
 *          └── PNP ── RE ──┘   │     vout = (In − Ip)·RL
 *                              RL
 *                              ⏚
 * ```
 *
 * How it is solved: with a = ln(In/Iq) and b = ln(Ip/Iq), adding the two device equations
 * removes vin:  VT·(a + b) + Iq·RE·(e^a + e^b − 2) = 0, so b is a decreasing function of a
 * alone, found by a monotone Newton iteration. Then vin(a) = VT·a + Iq·RE·(e^a − 1) +
 * Iq·RL·(e^a − e^b) rises with a, and Newton on a, kept inside a bracket (bisecting when a
 * step leaves it), solves vin(a) = vin to about 1e-12 V, well inside the 1e-9 V the
 * smallest THD figures need. The curve is odd, so only vin ≥ 0 is solved.
 *
 * @module
 */
import {
  requireFinite,
  requireInRange,
  requireNonNegative,
  requirePositive,
} from "../_validate.ts";
import { type Harmonics, harmonics } from "../analysis/harmonics.ts";
import { DEFAULT_TEMPERATURE } from "../physics/constants.ts";
import { thermalVoltage } from "../physics/thermal_voltage.ts";

/** Options for {@linkcode crossoverTransferCurve}. */
export interface CrossoverTransferCurveOptions {
  /** Emitter resistor of each half, RE, in Ω (0 allowed). */
  emitterResistance: number;
  /** Load RL in Ω. */
  loadResistance: number;
  /**
   * Quiescent current Iq in A.
   * @default {VT/RE, the gain-matched bias (requires RE > 0)}
   */
  quiescentCurrent?: number;
  /**
   * Junction temperature in K.
   * @default {300}
   */
  temperature?: number;
  /**
   * The sampled curve spans −inputSpan … +inputSpan, in V.
   * @default {1}
   */
  inputSpan?: number;
  /**
   * Number of points in the sampled curve.
   * @default {201}
   */
  points?: number;
}

/** Options for {@linkcode CrossoverTransferCurve.distortion}. */
export interface CrossoverDistortionOptions {
  /**
   * Samples over one period of the drive sine (a power of two).
   * @default {2048}
   */
  points?: number;
  /**
   * Highest harmonic counted.
   * @default {points / 2 (all harmonics the record holds)}
   */
  maxOrder?: number;
}

/** Currents in the two output devices at one input voltage. */
export interface FollowerCurrents {
  /** Emitter current of the NPN (sourcing) device in A. */
  npn: number;
  /** Emitter current of the PNP (sinking) device in A. */
  pnp: number;
}

/** The computed transfer curve and what follows from it. */
export interface CrossoverTransferCurve {
  /** The quiescent current used, in A. */
  quiescentCurrent: number;
  /** Thermal voltage at the temperature used, in V. */
  thermalVoltage: number;
  /** Output voltage for an input voltage (both in V). */
  transfer: (vin: number) => number;
  /** Device currents for an input voltage. */
  currents: (vin: number) => FollowerCurrents;
  /** Incremental gain dvout/dvin at an input voltage, from the implicit derivative. */
  incrementalGain: (vin: number) => number;
  /** The curve sampled evenly over ±`inputSpan`. */
  curve: { input: number[]; output: number[] };
  /** Harmonics and THD of the output for a sine input of peak `amplitude` (V). */
  distortion: (amplitude: number, options?: CrossoverDistortionOptions) => Harmonics;
}

interface Solution {
  a: number;
  b: number;
}

/**
 * Computes the transfer curve of a class-AB emitter-follower pair from the device equations
 * (no straight-line approximation), with incremental gain and crossover distortion.
 *
 * @param options Emitter resistor, load, quiescent current, temperature, sampling.
 * @returns The curve as a function, sampled, differentiated, and analysed for harmonics.
 * @throws {RangeError} If a value is out of range.
 *
 * @example Gain at crossover equals RL/(RL + RE) at the gain-matched bias (REFERENCE §5.4)
 * ```ts
 * import { crossoverTransferCurve } from "./transfer_curve.ts";
 * import { ok } from "node:assert/strict";
 * const stage = crossoverTransferCurve({ emitterResistance: 0.22, loadResistance: 8 });
 * ok(Math.abs(stage.incrementalGain(0) - 8 / 8.22) < 1e-6);
 * ok(Math.abs(stage.transfer(-1) + stage.transfer(1)) < 1e-12);
 * const thd = stage.distortion(10).thd;
 * ok(Math.abs(thd - 0.000276) < 0.000001);
 * ```
 */
export function crossoverTransferCurve(
  options: CrossoverTransferCurveOptions,
): CrossoverTransferCurve {
  const re = options.emitterResistance;
  requireNonNegative("emitterResistance", re, "Ω");
  const rl = options.loadResistance;
  requirePositive("loadResistance", rl, "Ω");
  const vt = thermalVoltage(options.temperature ?? DEFAULT_TEMPERATURE);
  let iq = options.quiescentCurrent;
  if (iq === undefined) {
    requirePositive("emitterResistance (for the gain-matched default Iq)", re, "Ω");
    iq = vt / re;
  }
  requirePositive("quiescentCurrent", iq, "A");
  const span = options.inputSpan ?? 1;
  requirePositive("inputSpan", span, "V");
  const points = options.points ?? 201;
  if (!Number.isInteger(points) || points < 2) {
    throw new RangeError(`Expected points to be an integer of at least 2, but found ${points}`);
  }
  const k = iq * re; // volts across RE at Iq
  const m = iq * rl; // volts across RL per unit of (In − Ip)/Iq
  const quiescent = iq;

  // b(a) from VT·b + k·e^b = c: increasing and convex in b, so Newton converges from any
  // start (from the left it lands right of the root, then walks down without overshoot).
  function pnpLog(a: number, guess: number): number {
    const c = -vt * a - k * (Math.exp(a) - 2);
    if (k === 0) return c / vt;
    let b = guess;
    if (!Number.isFinite(b)) {
      b = c / vt;
      if (c > 0) b = Math.min(b, Math.max(Math.log(c / k), 0));
    }
    for (let i = 0; i < 100; i++) {
      const e = k * Math.exp(b);
      const step = (vt * b + e - c) / (vt + e);
      b -= step;
      if (!(Math.abs(step) > 1e-15 * Math.max(1, Math.abs(b)))) break;
    }
    return b;
  }

  // The last solution warm-starts the next: a sine record moves in small steps.
  let lastTarget = 0;
  let lastA = 0;
  let lastB = 0;
  let lastSlope = vt + k + 2 * m;

  // Solves vin(a) = target for target ≥ 0.
  function solvePositive(target: number): Solution {
    if (target === 0) return { a: 0, b: 0 };
    // vin(a) ≥ (k + m)(e^a − 1) and vin(a) ≥ VT·a for a ≥ 0 (there b ≤ 0), so this brackets.
    let lo = 0;
    let hi = Math.min(target / vt, Math.log1p(target / (k + m)));
    let a = lastA + (target - lastTarget) / lastSlope;
    if (!(a > lo && a < hi)) a = Math.asinh(target / (rl + re) / quiescent / 2);
    a = Math.min(hi, Math.max(lo, a));
    let b = lastB;
    let slope = lastSlope;
    const tolerance = 1e-13 * Math.max(1, target);
    for (let i = 0; i < 200; i++) {
      b = pnpLog(a, b);
      const ea = Math.exp(a);
      const eb = Math.exp(b);
      const f = vt * a + k * (ea - 1) + m * (ea - eb) - target;
      if (Math.abs(f) <= tolerance) break;
      if (f > 0) hi = a;
      else lo = a;
      const dbda = -(vt + k * ea) / (vt + k * eb);
      slope = vt + k * ea + m * (ea - eb * dbda);
      let next = a - f / slope;
      if (!(next > lo && next < hi)) next = (lo + hi) / 2;
      if (next === a || hi - lo <= 1e-15 * Math.max(1, hi)) break;
      a = next;
    }
    lastTarget = target;
    lastA = a;
    lastB = b;
    lastSlope = slope;
    return { a, b };
  }

  function solve(vin: number): Solution {
    requireFinite("vin", vin);
    if (vin >= 0) return solvePositive(vin);
    const { a, b } = solvePositive(-vin);
    return { a: b, b: a }; // the mirror image swaps the devices
  }

  const transfer = (vin: number): number => {
    const { a, b } = solve(vin);
    return m * (Math.exp(a) - Math.exp(b));
  };
  const currents = (vin: number): FollowerCurrents => {
    const { a, b } = solve(vin);
    return { npn: quiescent * Math.exp(a), pnp: quiescent * Math.exp(b) };
  };
  const incrementalGain = (vin: number): number => {
    const { a, b } = solve(vin);
    const ea = Math.exp(a);
    const eb = Math.exp(b);
    const dbda = -(vt + k * ea) / (vt + k * eb);
    const dvout = m * (ea - eb * dbda);
    return dvout / (vt + k * ea + dvout);
  };
  const input: number[] = [];
  const output: number[] = [];
  for (let i = 0; i < points; i++) {
    const vin = -span + (2 * span * i) / (points - 1);
    input.push(vin);
    output.push(transfer(vin));
  }
  const distortion = (amplitude: number, opts: CrossoverDistortionOptions = {}): Harmonics => {
    const n = opts.points ?? 2048;
    if (opts.maxOrder !== undefined) requireInRange("maxOrder", opts.maxOrder, 1, n / 2);
    return harmonics(transfer, amplitude, { points: n, maxOrder: opts.maxOrder ?? n / 2 });
  };
  return {
    quiescentCurrent: quiescent,
    thermalVoltage: vt,
    transfer,
    currents,
    incrementalGain,
    curve: { input, output },
    distortion,
  };
}
