/**
 * The BJT long-tailed (differential) pair: operating point per device, gains, CMRR, input
 * resistance, offset, input common-mode range, large-signal transfer, noise, slew rate,
 * distortion, the two-port view and the design checks.
 *
 * ```
 *        +VCC ──┬─────────────┬──            load: RC1, RC2, or a PNP mirror Q3 (diode) / Q4
 *              RC1           RC2
 *               ├─ c1   c2 ───┤
 *   v1 ──┤ Q1                   Q2 ├── v2
 *               RE            RE            (optional degeneration)
 *               └──────┬──────┘
 *                      I, REE               tail: source, mirror or resistor
 *        −VEE ─────────┴──────
 * ```
 *
 * @module
 */
import { requireFinite, requireNonNegative, requirePositive } from "../_validate.ts";
import { atLeast, type CheckResult } from "../checks/check.ts";
import { parallelUnchecked } from "../cascade/_fast.ts";
import type { TwoPort } from "../cascade/two_port.ts";
import { BOLTZMANN, DEFAULT_TEMPERATURE } from "../physics/constants.ts";
import { shotNoiseDensity } from "../physics/noise.ts";
import { thermalVoltage } from "../physics/thermal_voltage.ts";
import {
  _alpha,
  type _BjtCore,
  _bjtCurrents,
  _bjtExactOffset,
  _bjtNetwork,
  _bjtOperatingPoint,
  type _BjtParts,
  _bjtSplit,
  _bjtTailCurrent,
} from "./_bjt_core.ts";
import { _bjtOutputResistance } from "./_devices.ts";
import { _solvePair } from "./_network.ts";
import {
  _cmrr,
  _linearRange,
  _mismatch,
  _normalizeTail,
  _pairGain,
  _pairNoise,
  _pairOffset,
  _pairOutput,
  _pairPorts,
  type _PairWords,
  _rails,
  _requireBiasRoom,
  _requirementChecks,
  _requireOptionsObject,
  _requirePositiveOrInfinite,
  _slew,
  _tailHeadroom,
  _thirdHarmonic,
  _unknownLoadKind,
} from "./_pair_common.ts";
import type {
  PairCmrr,
  PairGain,
  PairInputCommonModeRange,
  PairInputResistance,
  PairNoise,
  PairOffset,
  PairOutput,
  PairOutputResistance,
  PairRequirements,
  PairSlew,
  PairTail,
  PairThirdHarmonic,
} from "./pair_types.ts";

/** How far the relaxed convention lets the collector-base junction be forward biased, V. */
export const RELAXED_BASE_COLLECTOR_VOLTAGE = 0.4;

/** The load of a BJT pair. */
export type BjtPairLoad =
  | {
    kind: "resistors";
    /** Collector resistor RC of each side (nominal), Ω. */
    resistance: number;
  }
  | {
    kind: "mirror";
    /** Early voltage VA of the PNP mirror devices, V (finite: it sets the gain). */
    earlyVoltage: number;
    /**
     * Current gain βp of the PNP mirror devices (sets the systematic offset 2VT/βp).
     * @default {100}
     */
    beta?: number;
    /**
     * Fixed emitter-base voltage of the mirror devices, V; computed from
     * `saturationCurrent` when omitted.
     */
    baseEmitterVoltage?: number;
    /**
     * Saturation current of each mirror device, A.
     * @default {1e-14}
     */
    saturationCurrent?: number;
    /**
     * DC voltage of the output node (set by the next stage), V. The default balances the
     * mirror (output at the diode's voltage), so the Early effect adds no systematic offset.
     * @default {positiveRail − VEB}
     */
    outputVoltage?: number;
  };

/** Device and resistor mismatch, each split evenly: device 1 = X·(1 + δ/2), device 2 = X·(1 − δ/2). */
export interface BjtPairMismatch {
  /** ΔRC/RC = (RC1 − RC2)/RC. @default {0} */
  loadResistance?: number;
  /** ΔIs/Is = (Is1 − Is2)/Is (area or VBE mismatch). @default {0} */
  saturationCurrent?: number;
  /** Δβ/β = (β1 − β2)/β. @default {0} */
  beta?: number;
}

/** Options for {@linkcode bjtPair}. */
export interface BjtPairOptions {
  /** The tail: current source, mirror or resistor. */
  tail: PairTail;
  /** Collector resistors or a PNP current-mirror (active) load. */
  load: BjtPairLoad;
  /** Positive rail VCC, V. */
  positiveRail: number;
  /** Negative rail, V (signed, e.g. −15); must lie below `positiveRail`. */
  negativeRail: number;
  /**
   * Input common-mode voltage at which the operating point is computed, V.
   * @default {(positiveRail + negativeRail)/2}
   */
  inputCommonMode?: number;
  /**
   * Temperature, K.
   * @default {300}
   */
  temperature?: number;
  /**
   * Current gain β of the input devices; `Infinity` for α = 1.
   * @default {100}
   */
  beta?: number;
  /**
   * Early voltage VA of the input devices, V (ro = VA/Ic).
   * @default {Infinity}
   */
  earlyVoltage?: number;
  /**
   * Saturation current Is of each input device, A.
   * @default {1e-14}
   */
  saturationCurrent?: number;
  /**
   * Fixed VBE of the input devices at the operating point, V (e.g. 0.7); when given, Is is
   * derived from it and `saturationCurrent` is ignored.
   */
  baseEmitterVoltage?: number;
  /**
   * Emitter degeneration resistor RE in each emitter, Ω.
   * @default {0}
   */
  degeneration?: number;
  /**
   * Ohmic base resistance rb of each input device, for noise, Ω.
   * @default {0}
   */
  baseResistance?: number;
  /** Device and resistor mismatch. */
  mismatch?: BjtPairMismatch;
  /** Miller compensation capacitor the pair drives, F; adds `slew`. */
  compensationCapacitance?: number;
  /**
   * Output used by the two-port view and the CMRR requirement. A mirror load has only the
   * single-ended output.
   * @default {"singleEnded"}
   */
  output?: PairOutput;
  /** Design requirements; each one given adds a check. */
  requirements?: PairRequirements;
  /**
   * Label for the two-port view and tables.
   * @default {"BJT input pair"}
   */
  name?: string;
}

/** One input device at the operating point (vid = 0). */
export interface BjtPairDevice {
  /** Collector current Ic, A. */
  collectorCurrent: number;
  /** Emitter current IE, A. */
  emitterCurrent: number;
  /** Base current IB = IE/(β + 1), A. */
  baseCurrent: number;
  /** Base-emitter voltage, V. */
  baseEmitterVoltage: number;
  /** Collector voltage, V. */
  collectorVoltage: number;
  /** Vce, V. */
  collectorEmitterVoltage: number;
  /** Vbc = vicm − Vc, V (≤ 0 in the strict active region). */
  baseCollectorVoltage: number;
  /** Headroom to the strict active-region limit, −Vbc, V (negative: saturating). */
  headroom: number;
  /** gm = Ic/VT, S. */
  transconductance: number;
  /** rπ = β/gm, Ω. */
  inputResistance: number;
  /** ro = VA/Ic, Ω. */
  outputResistance: number;
}

/** Textbook closed forms, beside the exact small-signal values, for comparison. */
export interface BjtPairEstimates {
  /** αRC/(re + RE), differential output (resistive loads; NaN for a mirror load). */
  differentialGain: number;
  /** −αRC/(re + RE + 2REE), single-ended (resistive loads; NaN for a mirror load). */
  commonModeGain: number;
  /** (re + RE + 2REE)/(2(re + RE)), the matched single-ended CMRR (resistive loads). */
  cmrrSingleEnded: number;
  /** Gm·(ro2 ‖ ro4) for a mirror load (NaN for resistors); Gm = α/(re + RE). */
  activeLoadGain: number;
  /** Systematic offset 2VT/βp of a mirror load (first order), V; 0 for resistors. */
  systematicOffset: number;
}

/** Result of {@linkcode bjtPair}. */
export interface BjtPairResult {
  /** Which kind of pair. */
  kind: "bjt";
  /** Temperature, K. */
  temperature: number;
  /** VT = kT/q, V. */
  thermalVoltage: number;
  /** Tail current I at the operating point, A. */
  tailCurrent: number;
  /** Small-signal tail resistance REE, Ω. */
  tailResistance: number;
  /** Common-emitter (tail) node voltage, V. */
  tailVoltage: number;
  /** Voltage across the tail source beyond its compliance, V (NaN for a resistor tail). */
  tailHeadroom: number;
  /** The two input devices at vid = 0. */
  devices: [BjtPairDevice, BjtPairDevice];
  /**
   * Mirror devices (mirror load only): diode and output currents (A), VEB (V) and the output
   * device's ro4 = VA/Ic4 (Ω).
   */
  mirror?: {
    diodeCurrent: number;
    outputCurrent: number;
    emitterBaseVoltage: number;
    outputResistance: number;
  };
  /** gm of one device (average of the two), S. Not I/VT (REFERENCE §3.8). */
  transconductance: number;
  /** re = VT/IE of one device, 2VT/I when matched, Ω. */
  emitterResistance: number;
  /** Degenerated transconductance Gm = α/(re + RE) of one device, S. */
  effectiveTransconductance: number;
  /** Small-signal gains (exact nodal solution, all mismatch included). */
  gain: PairGain;
  /** CMRR by each definition. */
  cmrr: PairCmrr;
  /** Closed-form estimates for comparison. */
  estimates: BjtPairEstimates;
  /** Input resistances. */
  inputResistance: PairInputResistance;
  /** Output resistances. */
  outputResistance: PairOutputResistance;
  /** Input offset voltage, sources `loadResistance`, `saturationCurrent`, `beta`, `systematic`. */
  offset: PairOffset;
  /** Input bias current, the average of the two base currents, A. */
  inputBiasCurrent: number;
  /** Input offset current, first order IB·|Δβ/β|, A. */
  inputOffsetCurrent: number;
  /** Input common-mode range at which both devices stay active and the tail works. */
  inputCommonModeRange: PairInputCommonModeRange;
  /** |vid| at 1 % compression of the chord gain, V. */
  linearInputRange: number;
  /**
   * Large-signal difference current iC1 − iC2 at a differential input vid (V), A: αI·tanh(vid/(2VT))
   * for a matched pair without RE; degeneration and mismatch solved numerically.
   */
  differenceCurrent: (vid: number) => number;
  /** The vid (V) that gives a difference current (A) strictly between −α2·I and α1·I. */
  inputForDifferenceCurrent: (current: number) => number;
  /** Input-referred noise densities. */
  noise: PairNoise;
  /** Slew rate and unity-gain frequency, when `compensationCapacitance` is given. */
  slew: PairSlew | undefined;
  /** HD3 of the difference current for a sine vid of peak `amplitude` (V). */
  thirdHarmonic: (amplitude: number) => PairThirdHarmonic;
  /** The voltage-amplifier two-port view of the selected output. */
  twoPort: TwoPort;
  /** Design checks. */
  checks: CheckResult[];
}

const DEFAULT_BETA = 100;
const DEFAULT_SATURATION_CURRENT = 1e-14;

/** Validates options into the normalised core; returns the core and the mismatch. */
export function _bjtCore(options: BjtPairOptions): {
  core: _BjtCore;
  inputCommonMode: number;
  temperature: number;
  mismatch: Required<BjtPairMismatch>;
} {
  _requireOptionsObject(options);
  const temperature = options.temperature ?? DEFAULT_TEMPERATURE;
  const vt = thermalVoltage(temperature);
  const rails = _rails(options.positiveRail, options.negativeRail, options.inputCommonMode);
  const tail = _normalizeTail(options.tail);
  const degeneration = options.degeneration ?? 0;
  requireNonNegative("degeneration", degeneration, "Ω");
  const beta = _requirePositiveOrInfinite("beta", options.beta ?? DEFAULT_BETA, "");
  const earlyVoltage = _requirePositiveOrInfinite(
    "earlyVoltage",
    options.earlyVoltage ?? Infinity,
    "V",
  );
  const saturationCurrent = options.saturationCurrent ?? DEFAULT_SATURATION_CURRENT;
  requirePositive("saturationCurrent", saturationCurrent, "A");
  if (options.baseEmitterVoltage !== undefined) {
    requirePositive("baseEmitterVoltage", options.baseEmitterVoltage, "V");
  }
  const load = options.load;
  let coreLoad: _BjtCore["load"];
  if (load?.kind === "resistors") {
    requirePositive("load.resistance", load.resistance, "Ω");
    coreLoad = { kind: "resistors", resistance: load.resistance };
  } else if (load?.kind === "mirror") {
    requirePositive("load.earlyVoltage", load.earlyVoltage, "V");
    const mirrorIs = load.saturationCurrent ?? DEFAULT_SATURATION_CURRENT;
    requirePositive("load.saturationCurrent", mirrorIs, "A");
    if (load.baseEmitterVoltage !== undefined) {
      requirePositive("load.baseEmitterVoltage", load.baseEmitterVoltage, "V");
    }
    if (load.outputVoltage !== undefined) {
      requireFinite("load.outputVoltage", load.outputVoltage);
    }
    coreLoad = {
      kind: "mirror",
      beta: _requirePositiveOrInfinite("load.beta", load.beta ?? DEFAULT_BETA, ""),
      earlyVoltage: load.earlyVoltage,
      baseEmitterVoltage: load.baseEmitterVoltage,
      saturationCurrent: mirrorIs,
      outputVoltage: load.outputVoltage,
    };
  } else {
    throw _unknownLoadKind(load);
  }
  const given = options.mismatch ?? {};
  const mismatch = {
    loadResistance: _mismatch("mismatch.loadResistance", given.loadResistance),
    saturationCurrent: _mismatch("mismatch.saturationCurrent", given.saturationCurrent),
    beta: _mismatch("mismatch.beta", given.beta),
  };
  const core: _BjtCore = {
    thermalVoltage: vt,
    positiveRail: rails.positiveRail,
    negativeRail: rails.negativeRail,
    tail,
    degeneration,
    beta,
    earlyVoltage,
    baseEmitterVoltage: options.baseEmitterVoltage,
    saturationCurrent,
    load: coreLoad,
  };
  return { core, inputCommonMode: rails.inputCommonMode, temperature, mismatch };
}

/** Nominal saturation current: given, or derived from a fixed VBE at the nominal current. */
export function _bjtNominalIs(core: _BjtCore, current: number): number {
  if (core.baseEmitterVoltage === undefined) return core.saturationCurrent;
  const ic = (_alpha(core.beta) * current) / 2;
  return ic / Math.expm1(core.baseEmitterVoltage / core.thermalVoltage);
}

/** Per-device values from the nominal ones and relative mismatches. */
export function _bjtParts(
  core: _BjtCore,
  nominalIs: number,
  mismatch: Required<BjtPairMismatch>,
): _BjtParts {
  const rc = core.load.kind === "resistors" ? core.load.resistance : Number.NaN;
  const split = (x: number, d: number): [number, number] => [x * (1 + d / 2), x * (1 - d / 2)];
  const [rc1, rc2] = split(rc, mismatch.loadResistance);
  const [is1, is2] = split(nominalIs, mismatch.saturationCurrent);
  const [beta1, beta2] = core.beta === Infinity
    ? [Infinity, Infinity]
    : split(core.beta, mismatch.beta);
  return { rc1, rc2, is1, is2, beta1, beta2 };
}

const BJT_WORDS: _PairWords = {
  device: "Q",
  output: "collector",
  common: "emitter",
  inputDrop: "VBE + IE·RE",
  mirrorLimit: "the mirror's diode voltage plus VBE, so Q1's collector stays above its emitter",
};

/**
 * Designs and analyses a BJT long-tailed pair.
 *
 * Small-signal results come from an exact nodal solution of the hybrid-π model (gm = Ic/VT,
 * rπ = β/gm, ro = VA/Ic) with every mismatch applied, so they reduce to the textbook forms
 * for a matched pair (REFERENCE §3.1): Ad = αRC/re, Acm,se = −αRC/(re + 2REE),
 * CMRR_se = (re + 2REE)/(2re). `estimates` holds those closed forms.
 *
 * @param options The design: tail, load, rails, devices, mismatch and requirements.
 * @returns Operating point, small-signal model, offsets, ranges, transfer curve, noise, slew,
 *   distortion, the two-port view and the design checks.
 * @throws {RangeError} For non-physical input (a current or resistance ≤ 0, inverted rails,
 *   a common-mode voltage outside the rails) and for a bias that cannot work: a tail node at or
 *   below the negative rail, a resistor tail with no current, or a collector below its emitter.
 * @throws {TypeError} For a missing or unknown tail or load kind.
 *
 * @example Example A of REFERENCE §3.4: 1 mA tail with 50 kΩ, 10 kΩ collector resistors
 * ```ts
 * import { bjtPair } from "./bjt_pair.ts";
 * import { ok } from "node:assert/strict";
 * const pair = bjtPair({
 *   tail: { kind: "source", current: 1e-3, outputResistance: 50e3 },
 *   load: { kind: "resistors", resistance: 10e3 },
 *   positiveRail: 15,
 *   negativeRail: -15,
 *   baseEmitterVoltage: 0.7,
 * });
 * ok(Math.abs(pair.gain.differential - 191.49) < 0.01);
 * ok(Math.abs(pair.cmrr.singleEndedDb - 59.71) < 0.005);
 * ok(pair.checks.every((check) => check.pass));
 * ```
 */
export function bjtPair(options: BjtPairOptions): BjtPairResult {
  const { core, inputCommonMode, temperature, mismatch } = _bjtCore(options);
  const vt = core.thermalVoltage;
  const vicm = inputCommonMode;
  const re = core.degeneration;
  const current = _bjtTailCurrent(core, vicm);
  if (!(current > 0)) {
    throw new RangeError(
      `Expected inputCommonMode to be high enough for the tail resistor to carry current ` +
        `(above the negative rail plus VBE), but found ${vicm}`,
    );
  }
  const nominalIs = _bjtNominalIs(core, current);
  const parts = _bjtParts(core, nominalIs, mismatch);
  const point = _bjtOperatingPoint(core, parts, current, vicm);
  const tail = core.tail;

  _requireBiasRoom({
    tail,
    positiveRail: core.positiveRail,
    negativeRail: core.negativeRail,
    inputCommonMode: vicm,
    tailVoltage: point.emitterVoltage,
    load: core.load,
    currents: [point.ic1, point.ic2],
    resistors: [parts.rc1, parts.rc2],
    firstOutputVoltage: point.vc1,
  }, BJT_WORDS);
  const mirrorLoad = core.load.kind === "mirror";

  const network = _bjtNetwork(core, parts, point);
  const response = _solvePair(network, true);
  const gain = _pairGain(response, mirrorLoad);

  // Nominal (average) small-signal values.
  const alpha = _alpha(core.beta);
  const ie = current / 2;
  const emitterResistance = vt / ie;
  const reTotal = emitterResistance + re;
  const gm = 0.5 * (network.q1.gm + network.q2.gm);
  const effectiveTransconductance = alpha / reTotal;
  const gm1 = point.alpha1 / (vt / point.ie1 + re);
  const gm2 = point.alpha2 / (vt / point.ie2 + re);
  const gmDelta = (gm1 - gm2) / (0.5 * (gm1 + gm2));
  const cmrr = _cmrr(
    gain,
    tail.resistance,
    reTotal,
    mismatch.loadResistance,
    gmDelta,
    mirrorLoad,
  );

  // Closed forms.
  const rc = core.load.kind === "resistors" ? core.load.resistance : Number.NaN;
  const ro2 = _bjtOutputResistance(point.ic2, core.earlyVoltage);
  // Collector output resistance of a degenerated device: ro + (RE ‖ rπ)(1 + gm·ro).
  const rpi2 = core.beta / network.q2.gm;
  const rout2 = ro2 +
    (rpi2 === Infinity ? re : (re * rpi2) / (re + rpi2)) * (1 + network.q2.gm * ro2);
  const ro4 = point.mirror
    ? _bjtOutputResistance(point.mirror.ic4, (core.load as { earlyVoltage: number }).earlyVoltage)
    : Number.NaN;
  const mirrorBeta = core.load.kind === "mirror" ? core.load.beta : Infinity;
  const estimates: BjtPairEstimates = {
    differentialGain: mirrorLoad ? Number.NaN : (alpha * rc) / reTotal,
    commonModeGain: mirrorLoad ? Number.NaN : (-alpha * rc) / (reTotal + 2 * tail.resistance),
    cmrrSingleEnded: mirrorLoad ? Number.NaN : (reTotal + 2 * tail.resistance) / (2 * reTotal),
    activeLoadGain: mirrorLoad
      ? effectiveTransconductance * parallelUnchecked(rout2, ro4)
      : Number.NaN,
    systematicOffset: mirrorLoad ? (2 * vt) / mirrorBeta : 0,
  };

  // Offsets: first-order sources, then the exact large-signal null.
  const scale = vt + re * ie;
  const alphaDelta = core.beta === Infinity ? 0 : mismatch.beta / (core.beta + 1);
  const mirrorError = point.mirror ? 1 / point.mirror.ratio - 1 : 0;
  const sources = {
    loadResistance: mirrorLoad ? 0 : scale * mismatch.loadResistance,
    saturationCurrent: vt * mismatch.saturationCurrent,
    beta: re * ie * alphaDelta,
    systematic: -scale * mirrorError,
  };
  const offset = _pairOffset(
    sources,
    [sources.loadResistance, sources.saturationCurrent, sources.beta],
    _bjtExactOffset(core, parts, point),
  );

  const inputBiasCurrent = 0.5 * (point.ib1 + point.ib2);
  const nominalBase = core.beta === Infinity ? 0 : ie / (core.beta + 1);

  // Input common-mode range (vbe and IE·RE held at their operating-point values).
  const drop = Math.max(point.vbe1 + point.ie1 * re, point.vbe2 + point.ie2 * re);
  const min = core.negativeRail + tail.compliance + drop;
  let maxStrict: number;
  let maxRelaxed: number;
  if (mirrorLoad) {
    maxStrict = Math.min(point.vc1, point.vc2);
    maxRelaxed = maxStrict + RELAXED_BASE_COLLECTOR_VOLTAGE;
  } else if (tail.kind !== "resistor") {
    maxStrict = Math.min(point.vc1, point.vc2);
    maxRelaxed = maxStrict + RELAXED_BASE_COLLECTOR_VOLTAGE;
  } else {
    // Vc_i(V) = VCC − k_i·(V − drop − VEE), k_i = α_i·share_i·RC_i/(R + RE/2); solve Vc = V − margin.
    const series = tail.resistance + re / 2;
    const at = (margin: number) =>
      Math.min(
        ...[[point.ic1, parts.rc1], [point.ic2, parts.rc2]].map(([ic, r]) => {
          const k = ((ic / current) * r) / series;
          return (core.positiveRail + margin + k * (drop + core.negativeRail)) / (1 + k);
        }),
      );
    maxStrict = at(0);
    maxRelaxed = at(RELAXED_BASE_COLLECTOR_VOLTAGE);
  }
  const inputCommonModeRange: PairInputCommonModeRange = { min, max: maxStrict, maxRelaxed };

  const transferParts = parts;
  const differenceCurrent = (vid: number): number => {
    const u = _bjtSplit(core, transferParts, current, vid);
    const [i1, i2] = _bjtCurrents(transferParts, current, u);
    return i1 - i2;
  };
  const inputForDifferenceCurrent = (difference: number): number => {
    requireFinite("current", difference);
    const a1 = point.alpha1;
    const a2 = point.alpha2;
    if (!(difference > -a2 * current && difference < a1 * current)) {
      throw new RangeError(
        `Expected current to lie strictly between ${-a2 * current} A and ${
          a1 * current
        } A, but found ${difference}`,
      );
    }
    const ie1 = (difference + a2 * current) / (a1 + a2);
    const ie2 = current - ie1;
    const u = Math.log(ie1 / ie2);
    return vt * u + re * (ie1 - ie2) + vt * Math.log((a1 * parts.is2) / (a2 * parts.is1));
  };
  const fullScale = 2 * vt + current * re;
  const linearInputRange = _linearRange(differenceCurrent, fullScale);

  const rb = options.baseResistance ?? 0;
  requireNonNegative("baseResistance", rb, "Ω");
  const fourKT = 4 * BOLTZMANN * temperature;
  const noise = _pairNoise(
    Math.sqrt(fourKT * (rb + 1 / (2 * gm) + re)),
    shotNoiseDensity(inputBiasCurrent),
  );

  const slew = _slew(
    options.compensationCapacitance,
    alpha * current,
    effectiveTransconductance,
    mirrorLoad,
  );

  const thirdHarmonic = (amplitude: number) =>
    _thirdHarmonic(
      differenceCurrent,
      amplitude,
      fullScale,
      (2 * vt) / 3 / fullScale,
      (2 * vt) / 5 / fullScale,
    );

  const output = _pairOutput(options.output, mirrorLoad);
  const cm = response.commonMode;
  const inputResistance: PairInputResistance = {
    differential: 1 / response.differential.ib1,
    commonModePerInput: 1 / cm.ib1,
    commonModeTied: 1 / (cm.ib1 + cm.ib2),
  };
  const { outputResistance, twoPort } = _pairPorts(response, {
    name: options.name ?? "BJT input pair",
    output,
    mirrorLoad,
    gain,
    inputResistance: inputResistance.differential,
  });

  const devices = [1, 2].map((index): BjtPairDevice => {
    const first = index === 1;
    const ic = first ? point.ic1 : point.ic2;
    const vc = first ? point.vc1 : point.vc2;
    const small = first ? network.q1 : network.q2;
    return {
      collectorCurrent: ic,
      emitterCurrent: first ? point.ie1 : point.ie2,
      baseCurrent: first ? point.ib1 : point.ib2,
      baseEmitterVoltage: first ? point.vbe1 : point.vbe2,
      collectorVoltage: vc,
      collectorEmitterVoltage: vc - point.emitterVoltage,
      baseCollectorVoltage: vicm - vc,
      headroom: vc - vicm,
      transconductance: small.gm,
      inputResistance: small.gpi === 0 ? Infinity : 1 / small.gpi,
      outputResistance: small.go === 0 ? Infinity : 1 / small.go,
    };
  }) as [BjtPairDevice, BjtPairDevice];

  const requirements = options.requirements ?? {};
  const relaxed = requirements.relaxedSaturation ?? false;
  const headroomWanted = requirements.headroom ?? 0;
  requireFinite("requirements.headroom", headroomWanted);
  const limit = headroomWanted - (relaxed ? RELAXED_BASE_COLLECTOR_VOLTAGE : 0);
  const checks: CheckResult[] = devices.map((device, i) =>
    atLeast(
      `Q${i + 1} active (collector above base${relaxed ? " − 0.4 V" : ""})`,
      device.headroom,
      limit,
      { unit: "V" },
    )
  );
  const tailHeadroom = _tailHeadroom(tail, point.emitterVoltage, core.negativeRail);
  if (tail.kind !== "resistor") {
    checks.push(atLeast("tail source headroom", tailHeadroom, 0, { unit: "V" }));
  }
  checks.push(
    ..._requirementChecks(requirements, {
      range: inputCommonModeRange,
      cmrr,
      output,
      worstCaseOffset: offset.worstCase,
      slew,
      linearInputRange,
      relaxed,
    }),
  );

  return {
    kind: "bjt",
    temperature,
    thermalVoltage: vt,
    tailCurrent: current,
    tailResistance: tail.resistance,
    tailVoltage: point.emitterVoltage,
    tailHeadroom,
    devices,
    mirror: point.mirror
      ? {
        diodeCurrent: point.mirror.ic3,
        outputCurrent: point.mirror.ic4,
        emitterBaseVoltage: point.mirror.veb,
        outputResistance: ro4,
      }
      : undefined,
    transconductance: gm,
    emitterResistance,
    effectiveTransconductance,
    gain,
    cmrr,
    estimates,
    inputResistance,
    outputResistance,
    offset,
    inputBiasCurrent,
    inputOffsetCurrent: nominalBase * Math.abs(mismatch.beta),
    inputCommonModeRange,
    linearInputRange,
    differenceCurrent,
    inputForDifferenceCurrent,
    noise,
    slew,
    thirdHarmonic,
    twoPort,
    checks,
  };
}
