/**
 * Miller compensation of a two-stage amplifier: poles, zero, gain-bandwidth, exact and
 * estimated phase margin, nulling resistor, slew rate ([GHLM5] ch. 9, [SS7] ch. 10 and 13,
 * [AH3] ch. 6).
 *
 * ```
 *            stage 1                stage 2
 *   vin ──▶ gm1 ──┬── v1 ──▶ −gm2 ──┬── vout
 *                R1  C1   │         R2  C2
 *                 ┴   ┴   └─Rz─Cc──┘
 *
 *   A(s) = gm1·(gm2 − Y)/[(G1 + sC1)(G2 + sC2) + Y·(G1 + G2 + gm2 + s(C1 + C2))],
 *   Y = sCc/(1 + sCcRz)   (Rz = 0: A0(1 − s/ωz)/(1 + b1·s + b2·s²))
 * ```
 *
 * @module
 */
import { requireNonNegative, requirePositive } from "../_validate.ts";
import { atLeast, type CheckResult } from "../checks/check.ts";
import { loopMargins, phaseMarginEstimate } from "../cascade/loop.ts";
import type { Complex, TwoPort } from "../cascade/two_port.ts";
import { millerVoltageStage, transconductanceStage } from "./miller_voltage_stage.ts";

const TWO_PI = 2 * Math.PI;
const RAD = 180 / Math.PI;

/** Options for {@linkcode millerCompensation}. */
export interface MillerCompensationOptions {
  /** gm1 in S: transconductance of ONE input device (or its degenerated Gm), not the pair's sum. */
  firstTransconductance: number;
  /** R1 in Ω: resistance at the first stage's output node. */
  firstResistance: number;
  /** C1 in F: capacitance at the first stage's output node (without Cc). */
  firstCapacitance: number;
  /** gm2 in S: the second stage's transconductance. */
  secondTransconductance: number;
  /** R2 in Ω: resistance at the output node. */
  secondResistance: number;
  /** C2 in F: capacitance at the output node, the load included. */
  secondCapacitance: number;
  /** Cc in F: the compensation capacitor from output back to the second stage's input. */
  compensationCapacitance: number;
  /**
   * Nulling resistor Rz in Ω, in series with Cc.
   * @default {0}
   */
  nullingResistance?: number;
  /** First-stage tail current in A; gives the slew rate I_tail/Cc. */
  tailCurrent?: number;
  /**
   * Second-stage standing current in A (the current source that loads the gain device);
   * gives the other slew limit I₂/(Cc + C2).
   */
  secondStageCurrent?: number;
  /** Peak output amplitude in V; gives the full-power bandwidth SR/(2π·V̂). */
  outputAmplitude?: number;
  /**
   * Feedback factor β of the loop closed around the amplifier (1/closed-loop gain). Below 1
   * it also moves the right-half-plane-zero check from GBW to the loop crossover: the zero
   * must sit at least 10× above β·GBW (REFERENCE §4.3: "for feedback amplifiers, the test is
   * at the loop-gain crossover β·fu"; the 10× rule is [AH3] ch. 6).
   * @default {1}
   */
  feedbackFactor?: number;
  /**
   * Required phase margin in ° at the loop crossover (45° minimum, 60° the usual target:
   * [AH3] ch. 6, [GHLM5] ch. 9).
   * @default {45}
   */
  minimumPhaseMargin?: number;
  /** Required slew rate in V/s; adds a check (needs `tailCurrent`). */
  minimumSlewRate?: number;
}

/** Result of {@linkcode millerCompensation}. */
export interface MillerCompensation {
  /** A0 = gm1R1·gm2R2. */
  dcGain: number;
  /** A0 in dB. */
  dcGainDb: number;
  /** b1 = R1(C1 + Cc) + R2(C2 + Cc) + gm2R1R2Cc in s. */
  b1: number;
  /** b2 = R1R2[C1C2 + Cc(C1 + C2)] in s². */
  b2: number;
  /** Roots of 1 + b1·s + b2·s² in rad/s (Rz left out), dominant first. */
  poles: [Complex, Complex];
  /** True when the two poles form a complex pair (then both frequencies are |s|/2π). */
  polesAreComplex: boolean;
  /** Exact dominant pole in Hz, from the quadratic. */
  firstPoleFrequency: number;
  /** Exact second pole in Hz, from the quadratic. */
  secondPoleFrequency: number;
  /** Dominant-pole estimate 1/(2π·gm2·R1·R2·Cc) in Hz. */
  firstPoleEstimate: number;
  /** Second-pole estimate gm2·Cc/(2π[C1C2 + Cc(C1 + C2)]) in Hz. */
  secondPoleEstimate: number;
  /** Simplest second-pole estimate gm2/(2π·C2) in Hz (holds only when Cc ≫ C1). */
  secondPoleSimple: number;
  /** The two poles without Cc, 1/(2πR1C1) and 1/(2πR2C2) in Hz: what Cc splits apart. */
  uncompensatedPoleFrequencies: [number, number];
  /** Zero frequency |1/(2π·Cc·(1/gm2 − Rz))| in Hz (∞ when Rz = 1/gm2). */
  zeroFrequency: number;
  /** True while Rz < 1/gm2: the zero lags like a pole. */
  zeroInRightHalfPlane: boolean;
  /** Extra pole the nulling resistor adds, about 1/(2π·Rz·C1) in Hz (∞ without Rz). */
  nullingPoleFrequency: number;
  /** Rz = 1/gm2 in Ω: removes the zero. */
  nullingResistanceForNoZero: number;
  /** Rz = (1 + C2/Cc)/gm2 in Ω: puts the zero on the second pole. */
  nullingResistanceForPoleCancel: number;
  /** GBW = gm1/(2π·Cc) in Hz. */
  gainBandwidth: number;
  /** Exact unity-gain crossover |A(j2πf)| = 1 in Hz, from the full transfer function. */
  unityGainFrequency: number;
  /** Exact phase margin at unity gain in °, from the full transfer function. */
  phaseMargin: number;
  /** Estimated phase margin at GBW with the full second-pole estimate, in °. */
  phaseMarginEstimate: number;
  /** Estimated phase margin at GBW with p2 = gm2/C2, in °. */
  phaseMarginEstimateSimple: number;
  /** Feedback factor β used for the loop figures. */
  feedbackFactor: number;
  /** Loop-gain crossover estimate β·GBW in Hz (valid for 1/β ≫ 1). */
  loopCrossoverEstimate: number;
  /** Exact loop-gain crossover |β·A| = 1 in Hz. */
  loopCrossoverFrequency: number;
  /** Exact phase margin of the loop β·A in °. */
  loopPhaseMargin: number;
  /** Exact gain margin of the loop β·A in dB (∞ when its phase never reaches −180°). */
  loopGainMargin: number;
  /** I_tail/Cc in V/s, when the tail current was given. */
  inputStageSlewRate?: number;
  /**
   * I₂/(Cc + C2) in V/s, when the second-stage current was given: the slew limit of the edge
   * on which the gain device turns off and the standing current I₂ alone must charge both
   * Cc (its far end is held by the first stage, so it acts as a capacitor to ground) and the
   * output capacitance C2 ([SS7] ch. 13, [GHLM5] ch. 9, from memory). For an NPN
   * common-emitter VAS with a current-source load to the positive rail this is the rising
   * edge; for a PMOS common-source stage with a current-sink load (the two-stage CMOS op amp)
   * the falling edge. On the other edge the gain device can pull far more than I₂.
   */
  secondStageSlewRate?: number;
  /** The smaller of the slew limits given, in V/s. */
  slewRate?: number;
  /** SR/(2π·V̂) in Hz, when the slew rate and the amplitude were given. */
  fullPowerBandwidth?: number;
  /** A(j2πf), the full transfer function (Rz included), for sweeps and loops. */
  at(frequency: number): Complex;
  /**
   * The first stage as a two-port: −gm1 into R1 ‖ C1 (see {@linkcode transconductanceStage}).
   * Cascaded with `voltageStageTwoPort` (and an open load) it reproduces `at()` exactly.
   */
  inputStageTwoPort: TwoPort;
  /**
   * The compensated voltage stage as a two-port with the Miller feedback kept exact (see
   * {@linkcode millerVoltageStage}): R2 and C2 are inside it, so leave the cascade's load open.
   */
  voltageStageTwoPort: TwoPort;
  /** Phase margin, slew rate, Cc against C2, and zero placement checks. */
  checks: CheckResult[];
}

/**
 * Analyses a Miller-compensated two-stage amplifier.
 *
 * The exact figures come from the full transfer function; the estimates from the
 * dominant-pole formulas. The estimate can be several degrees off (in the E4.4 example,
 * 58.75° estimated against 61.10° exact), so say which one a test checks.
 *
 * @param options gm, R and C of both stages, Cc, optional Rz, currents and β.
 * @returns Poles, zero, GBW, margins, slew rate, the transfer function and checks.
 * @throws {RangeError} If a transconductance, resistance, C2 or Cc is not above 0, C1 or Rz
 * is negative, β is outside (0, 1], or `minimumSlewRate` is given without `tailCurrent`.
 *
 * @example 1 mS / 1 MΩ / 1 pF into 10 mS / 100 kΩ / 10 pF with Cc = 3 pF
 * ```ts
 * import { millerCompensation } from "./miller_compensation.ts";
 * import { ok } from "node:assert/strict";
 * const amp = millerCompensation({
 *   firstTransconductance: 1e-3, firstResistance: 1e6, firstCapacitance: 1e-12,
 *   secondTransconductance: 10e-3, secondResistance: 100e3, secondCapacitance: 10e-12,
 *   compensationCapacitance: 3e-12,
 * });
 * ok(Math.abs(amp.gainBandwidth - 53.05e6) < 0.01e6);
 * ok(Math.abs(amp.phaseMargin - 61.10) < 0.01);
 * ```
 */
export function millerCompensation(options: MillerCompensationOptions): MillerCompensation {
  const gm1 = options.firstTransconductance;
  const r1 = options.firstResistance;
  const c1 = options.firstCapacitance;
  const gm2 = options.secondTransconductance;
  const r2 = options.secondResistance;
  const c2 = options.secondCapacitance;
  const cc = options.compensationCapacitance;
  const rz = options.nullingResistance ?? 0;
  const beta = options.feedbackFactor ?? 1;
  const minimumPhaseMargin = options.minimumPhaseMargin ?? 45;
  requirePositive("firstTransconductance", gm1, "S");
  requirePositive("firstResistance", r1, "Ω");
  requireNonNegative("firstCapacitance", c1, "F");
  requirePositive("secondTransconductance", gm2, "S");
  requirePositive("secondResistance", r2, "Ω");
  requirePositive("secondCapacitance", c2, "F");
  requirePositive("compensationCapacitance", cc, "F");
  requireNonNegative("nullingResistance", rz, "Ω");
  requirePositive("feedbackFactor", beta);
  if (beta > 1) {
    throw new RangeError(`Expected feedbackFactor to be at most 1, but found ${beta}`);
  }

  const dcGain = gm1 * r1 * gm2 * r2;
  const b1 = r1 * (c1 + cc) + r2 * (c2 + cc) + gm2 * r1 * r2 * cc;
  const b2 = r1 * r2 * (c1 * c2 + cc * (c1 + c2));
  const disc = b1 * b1 - 4 * b2;
  let poles: [Complex, Complex];
  let firstPoleFrequency: number;
  let secondPoleFrequency: number;
  if (disc >= 0) {
    // Stable root pair: q = −(b1 + √D)/2, roots q/b2 (far) and 1/q (near).
    const q = -(b1 + Math.sqrt(disc)) / 2;
    const near = 1 / q;
    const far = q / b2;
    poles = [{ re: near, im: 0 }, { re: far, im: 0 }];
    firstPoleFrequency = -near / TWO_PI;
    secondPoleFrequency = -far / TWO_PI;
  } else {
    const re = -b1 / (2 * b2);
    const im = Math.sqrt(-disc) / (2 * b2);
    poles = [{ re, im: -im }, { re, im }];
    firstPoleFrequency = secondPoleFrequency = 1 / (TWO_PI * Math.sqrt(b2));
  }
  const zeroTime = cc * (1 / gm2 - rz);
  const zeroFrequency = zeroTime === 0 ? Infinity : 1 / (TWO_PI * Math.abs(zeroTime));
  const zeroInRightHalfPlane = zeroTime > 0;
  const nullingPoleFrequency = rz === 0 || c1 === 0 ? Infinity : 1 / (TWO_PI * rz * c1);
  const gainBandwidth = gainBandwidthProduct(gm1, cc);
  const secondPoleEstimate = (gm2 * cc) / (TWO_PI * (c1 * c2 + cc * (c1 + c2)));
  const secondPoleSimple = gm2 / (TWO_PI * c2);

  const g1 = 1 / r1;
  const g2 = 1 / r2;
  const at = (frequency: number): Complex => {
    const w = TWO_PI * frequency;
    const x = w * cc * rz;
    const yd = 1 + x * x;
    const yr = (w * cc * x) / yd;
    const yi = (w * cc) / yd;
    const pr = g1 * g2 - w * w * c1 * c2;
    const pi = w * (c1 * g2 + c2 * g1);
    const qr = g1 + g2 + gm2;
    const qi = w * (c1 + c2);
    const dr = pr + yr * qr - yi * qi;
    const di = pi + yr * qi + yi * qr;
    const nr = gm1 * (gm2 - yr);
    const ni = -gm1 * yi;
    const dd = dr * dr + di * di;
    return { re: (nr * dr + ni * di) / dd, im: (ni * dr - nr * di) / dd };
  };

  // The search spans from well below the dominant pole to well above every other corner.
  const corners = [gainBandwidth, secondPoleFrequency, zeroFrequency, nullingPoleFrequency]
    .filter(Number.isFinite);
  const range = {
    minimumFrequency: firstPoleFrequency / 1e3,
    maximumFrequency: Math.max(...corners) * 1e3,
  };
  const unity = loopMargins(at, range);
  const loop = beta === 1 ? unity : loopMargins((f) => {
    const a = at(f);
    return { re: beta * a.re, im: beta * a.im };
  }, range);

  const estimate = (p2: number) => {
    let pm = 90 - Math.atan(gainBandwidth / p2) * RAD;
    if (Number.isFinite(zeroFrequency)) {
      pm += (zeroInRightHalfPlane ? -1 : 1) * Math.atan(gainBandwidth / zeroFrequency) * RAD;
    }
    if (Number.isFinite(nullingPoleFrequency)) {
      pm -= Math.atan(gainBandwidth / nullingPoleFrequency) * RAD;
    }
    return pm;
  };

  const result: MillerCompensation = {
    dcGain,
    dcGainDb: 20 * Math.log10(dcGain),
    b1,
    b2,
    poles,
    polesAreComplex: disc < 0,
    firstPoleFrequency,
    secondPoleFrequency,
    firstPoleEstimate: 1 / (TWO_PI * gm2 * r1 * r2 * cc),
    secondPoleEstimate,
    secondPoleSimple,
    uncompensatedPoleFrequencies: [
      c1 === 0 ? Infinity : 1 / (TWO_PI * r1 * c1),
      1 / (TWO_PI * r2 * c2),
    ],
    zeroFrequency,
    zeroInRightHalfPlane,
    nullingPoleFrequency,
    nullingResistanceForNoZero: 1 / gm2,
    nullingResistanceForPoleCancel: (1 + c2 / cc) / gm2,
    gainBandwidth,
    unityGainFrequency: unity.crossoverFrequency,
    phaseMargin: unity.phaseMargin,
    phaseMarginEstimate: estimate(secondPoleEstimate),
    phaseMarginEstimateSimple: estimate(secondPoleSimple),
    feedbackFactor: beta,
    loopCrossoverEstimate: beta * gainBandwidth,
    loopCrossoverFrequency: loop.crossoverFrequency,
    loopPhaseMargin: loop.phaseMargin,
    loopGainMargin: loop.gainMargin,
    at,
    inputStageTwoPort: transconductanceStage({
      transconductance: gm1,
      outputResistance: r1,
      outputCapacitance: c1,
    }),
    voltageStageTwoPort: millerVoltageStage({
      transconductance: gm2,
      outputResistance: r2,
      outputCapacitance: c2,
      compensationCapacitance: cc,
      nullingResistance: rz,
      drivingResistance: r1,
      drivingCapacitance: c1,
    }),
    checks: [],
  };

  if (options.tailCurrent !== undefined) {
    requirePositive("tailCurrent", options.tailCurrent, "A");
    result.inputStageSlewRate = options.tailCurrent / cc;
  }
  if (options.secondStageCurrent !== undefined) {
    requirePositive("secondStageCurrent", options.secondStageCurrent, "A");
    // The standing current charges Cc and C2 together on the edge where the device is off.
    result.secondStageSlewRate = options.secondStageCurrent / (cc + c2);
  }
  const limits = [result.inputStageSlewRate, result.secondStageSlewRate]
    .filter((x): x is number => x !== undefined);
  if (limits.length > 0) result.slewRate = Math.min(...limits);
  if (options.outputAmplitude !== undefined) {
    requirePositive("outputAmplitude", options.outputAmplitude, "V");
    if (result.slewRate !== undefined) {
      result.fullPowerBandwidth = result.slewRate / (TWO_PI * options.outputAmplitude);
    }
  }

  const checks: CheckResult[] = [
    atLeast(
      beta === 1 ? "phase margin" : "loop phase margin",
      loop.phaseMargin,
      minimumPhaseMargin,
      { unit: "°" },
    ),
    // [AH3] ch. 6: with gm2 ≈ 10·gm1, 60° needs p2 ≥ 2.2·GBW, i.e. Cc ≥ 0.22·CL.
    atLeast("compensation capacitor (Cc ≥ 0.22·C2, [AH3] ch. 6)", cc, 0.22 * c2, { unit: "F" }),
  ];
  if (zeroInRightHalfPlane) {
    // [AH3] ch. 6: keep the RHP zero above about 10× the crossover it erodes. With feedback
    // (β < 1) that crossover is the loop's, β·GBW, not GBW: REFERENCE §4.3, "for feedback
    // amplifiers, the test is at the loop-gain crossover β·fu".
    checks.push(
      beta === 1
        ? atLeast("right-half-plane zero / GBW", zeroFrequency / gainBandwidth, 10)
        : atLeast(
          "right-half-plane zero / loop crossover β·GBW",
          zeroFrequency / (beta * gainBandwidth),
          10,
        ),
    );
  }
  if (options.minimumSlewRate !== undefined) {
    requirePositive("minimumSlewRate", options.minimumSlewRate, "V/s");
    if (result.slewRate === undefined) {
      throw new RangeError(
        "Expected tailCurrent to be given with minimumSlewRate, but found undefined",
      );
    }
    checks.push(
      atLeast("slew rate", result.slewRate, options.minimumSlewRate, {
        unit: "V/s",
        displayUnit: "V/µs",
      }),
    );
  }
  result.checks = checks;
  return result;
}

/** Options for {@linkcode requiredSecondPoleRatio}. */
export interface SecondPoleRatioOptions {
  /**
   * RHP zero over the unity-gain frequency, ωz/ωu (= gm2/gm1 for a Miller stage).
   * @default {Infinity}
   */
  zeroRatio?: number;
}

/**
 * How far above the unity-gain frequency the second pole must sit for a phase margin:
 * ωp2/ωu = 1/tan(90° − PM − atan(ωu/ωz)) (dominant-pole estimate; [AH3] ch. 6, [Bode45]).
 *
 * @param phaseMargin Wanted phase margin in °.
 * @param options The RHP zero's position.
 * @returns ωp2/ωu.
 * @throws {RangeError} If no second-pole position can give `phaseMargin` (the zero alone
 * already costs too much, or PM is outside (0°, 90°)).
 *
 * @example 60° with no zero needs √3
 * ```ts
 * import { requiredSecondPoleRatio } from "./miller_compensation.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(requiredSecondPoleRatio(60) - Math.sqrt(3)) < 1e-12);
 * ```
 */
export function requiredSecondPoleRatio(
  phaseMargin: number,
  options: SecondPoleRatioOptions = {},
): number {
  if (!(phaseMargin > 0 && phaseMargin < 90)) {
    throw new RangeError(`Expected phaseMargin to be between 0 and 90 °, but found ${phaseMargin}`);
  }
  const zeroRatio = options.zeroRatio ?? Infinity;
  if (!(zeroRatio > 0)) {
    throw new RangeError(`Expected zeroRatio to be greater than 0, but found ${zeroRatio}`);
  }
  const left = 90 - phaseMargin - Math.atan(1 / zeroRatio) * RAD;
  if (!(left > 0)) {
    throw new RangeError(
      `Expected zeroRatio to leave room for a ${phaseMargin}° margin, but found ${zeroRatio}`,
    );
  }
  return 1 / Math.tan(left / RAD);
}

/** Options for {@linkcode minimumCompensationCapacitance}. */
export interface MinimumCompensationOptions {
  /** Load capacitance CL (C2) in F. */
  loadCapacitance: number;
  /**
   * gm2/gm1, which also sets the RHP zero at ωz/ωu = gm2/gm1.
   * @default {10}
   */
  transconductanceRatio?: number;
  /**
   * Wanted phase margin in °.
   * @default {60}
   */
  phaseMargin?: number;
}

/**
 * Smallest Cc for a phase margin with p2 = gm2/CL: Cc ≥ (ωp2/ωu)·(gm1/gm2)·CL. With the
 * defaults (60°, gm2 = 10·gm1) this is the "Cc ≥ 0.22·CL" rule of [AH3] ch. 6.
 *
 * @param options Load, gm ratio and margin.
 * @returns The minimum Cc in F.
 * @throws {RangeError} If the load is not above 0 F, or the ratio and margin are impossible.
 *
 * @example 10 pF load: 2.216 pF
 * ```ts
 * import { minimumCompensationCapacitance } from "./miller_compensation.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(minimumCompensationCapacitance({ loadCapacitance: 10e-12 }) - 2.216e-12) < 1e-15);
 * ```
 */
export function minimumCompensationCapacitance(options: MinimumCompensationOptions): number {
  requirePositive("loadCapacitance", options.loadCapacitance, "F");
  const ratio = options.transconductanceRatio ?? 10;
  requirePositive("transconductanceRatio", ratio);
  const ratioP2 = requiredSecondPoleRatio(options.phaseMargin ?? 60, { zeroRatio: ratio });
  return (ratioP2 / ratio) * options.loadCapacitance;
}

/**
 * Gain-bandwidth of a Miller-compensated amplifier, GBW = gm1/(2π·Cc). Use gm of ONE input
 * device (or its degenerated Gm), not the pair's combined gm.
 *
 * @param firstTransconductance gm1 in S.
 * @param compensationCapacitance Cc in F.
 * @returns GBW in Hz.
 * @throws {RangeError} If either value is not above 0.
 *
 * @example 1 mS with 3 pF: 53.05 MHz
 * ```ts
 * import { gainBandwidthProduct } from "./miller_compensation.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(gainBandwidthProduct(1e-3, 3e-12) - 53.052e6) < 1e3);
 * ```
 */
export function gainBandwidthProduct(
  firstTransconductance: number,
  compensationCapacitance: number,
): number {
  requirePositive("firstTransconductance", firstTransconductance, "S");
  requirePositive("compensationCapacitance", compensationCapacitance, "F");
  return firstTransconductance / (TWO_PI * compensationCapacitance);
}

/** Options for {@linkcode dominantPoleLoopEstimate}. */
export interface DominantPoleLoopOptions {
  /** gm1 in S (one input device, or its degenerated Gm). */
  firstTransconductance: number;
  /** Cc in F. */
  compensationCapacitance: number;
  /** β = 1/closed-loop gain. */
  feedbackFactor: number;
  /** Further poles in Hz (output stage, second stage). */
  extraPoleFrequencies?: number[];
  /** Right-half-plane zeros in Hz. */
  rightHalfPlaneZeroFrequencies?: number[];
}

/** Result of {@linkcode dominantPoleLoopEstimate}. */
export interface DominantPoleLoopEstimate {
  /** GBW = gm1/(2π·Cc) in Hz. */
  gainBandwidth: number;
  /** Loop-gain crossover β·GBW in Hz. */
  loopCrossoverEstimate: number;
  /** 90° − Σ atan(fc/fp) − Σ atan(fc/fz) at that crossover, in °. */
  phaseMarginEstimate: number;
}

/**
 * Quick loop estimate for a feedback amplifier with a Miller-compensated VAS: the loop-gain
 * crossover sits near β·GBW (for 1/β ≫ 1), and the margin follows from the extra poles there
 * ([SS7] ch. 11; [GHLM5] ch. 9). Test the second pole at β·GBW, not at GBW.
 *
 * @param options gm1, Cc, β and the extra poles and zeros.
 * @returns GBW, crossover estimate and phase-margin estimate.
 * @throws {RangeError} If gm1, Cc or β is not above 0, β is above 1, or a pole or zero
 * frequency is not above 0 Hz.
 *
 * @example Gain of 21, output-stage pole at 3 MHz
 * ```ts
 * import { dominantPoleLoopEstimate } from "./miller_compensation.ts";
 * import { ok } from "node:assert/strict";
 * const loop = dominantPoleLoopEstimate({
 *   firstTransconductance: 6.592e-3, compensationCapacitance: 100e-12,
 *   feedbackFactor: 1 / 21, extraPoleFrequencies: [3e6],
 * });
 * ok(Math.abs(loop.loopCrossoverEstimate - 499.6e3) < 100);
 * ```
 */
export function dominantPoleLoopEstimate(
  options: DominantPoleLoopOptions,
): DominantPoleLoopEstimate {
  const gainBandwidth = gainBandwidthProduct(
    options.firstTransconductance,
    options.compensationCapacitance,
  );
  requirePositive("feedbackFactor", options.feedbackFactor);
  if (options.feedbackFactor > 1) {
    throw new RangeError(
      `Expected feedbackFactor to be at most 1, but found ${options.feedbackFactor}`,
    );
  }
  const fc = options.feedbackFactor * gainBandwidth;
  return {
    gainBandwidth,
    loopCrossoverEstimate: fc,
    phaseMarginEstimate: phaseMarginEstimate(fc, {
      poleFrequencies: options.extraPoleFrequencies,
      rightHalfPlaneZeroFrequencies: options.rightHalfPlaneZeroFrequencies,
    }),
  };
}
