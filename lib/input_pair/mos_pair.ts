/**
 * The MOSFET long-tailed (differential) pair, square law: operating point per device, gains,
 * CMRR, offset, input common-mode range, large-signal transfer with its clamp at √2·Vov,
 * noise, slew rate, distortion, the two-port view and the design checks.
 *
 * ```
 *        VDD ──┬─────────────┬──            load: RD1, RD2, or a PMOS mirror M3 (diode) / M4
 *             RD1           RD2
 *              ├─ d1   d2 ───┤
 *   v1 ──┤ M1                  M2 ├── v2
 *              RS            RS            (optional degeneration)
 *              └──────┬──────┘
 *                     Iss, RSS             tail: source, mirror or resistor
 *        VSS ─────────┴──────
 * ```
 *
 * @module
 */
import { requireFinite, requireNonNegative, requirePositive } from "../_validate.ts";
import { atLeast, type CheckResult } from "../checks/check.ts";
import { parallelUnchecked } from "../cascade/_fast.ts";
import type { TwoPort } from "../cascade/two_port.ts";
import { BOLTZMANN, DEFAULT_TEMPERATURE } from "../physics/constants.ts";
import { weakInversionOverdrive } from "../devices/mosfet.ts";
import {
  type _MosCore,
  _mosExactOffset,
  _mosInput,
  _mosNetwork,
  _mosOperatingPoint,
  type _MosParts,
  _mosSplit,
  _mosTailCurrent,
} from "./_mos_core.ts";
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
  _show,
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

/** The load of a MOSFET pair. */
export type MosPairLoad =
  | {
    kind: "resistors";
    /** Drain resistor RD of each side (nominal), Ω. */
    resistance: number;
  }
  | {
    kind: "mirror";
    /** kp = k′p·W/L of each PMOS mirror device, A/V² (Id = ½·kp·Vov²). */
    transconductanceParameter: number;
    /** Threshold magnitude |Vtp| of the mirror devices, V. */
    threshold: number;
    /** Channel-length modulation λp of the mirror devices, 1/V (> 0: it sets the gain). */
    lambda: number;
    /**
     * DC voltage of the output node (set by the next stage), V.
     * @default {positiveRail − VSG of the diode (balanced)}
     */
    outputVoltage?: number;
  };

/** Device and resistor mismatch, each split evenly between the two sides. */
export interface MosPairMismatch {
  /** ΔRD/RD = (RD1 − RD2)/RD. @default {0} */
  loadResistance?: number;
  /** ΔVt = Vt1 − Vt2, V (device 1 = Vt + ΔVt/2). @default {0} */
  threshold?: number;
  /** Δ(W/L)/(W/L) = (kn1 − kn2)/kn. @default {0} */
  aspectRatio?: number;
}

/** Options for {@linkcode mosPair}. */
export interface MosPairOptions {
  /** The tail: current source, mirror or resistor. */
  tail: PairTail;
  /** Drain resistors or a PMOS current-mirror (active) load. */
  load: MosPairLoad;
  /** kn = k′·W/L of each input device, A/V² (Id = ½·kn·Vov²; REFERENCE §2.5 on the factor 2). */
  transconductanceParameter: number;
  /** Threshold voltage Vt of the input devices, V. */
  threshold: number;
  /** Positive rail VDD, V. */
  positiveRail: number;
  /** Negative rail VSS, V; must lie below `positiveRail`. */
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
   * Channel-length modulation λ of the input devices, 1/V (ro = 1/(λ·Id)).
   * @default {0}
   */
  lambda?: number;
  /**
   * Source degeneration resistor RS in each source, Ω.
   * @default {0}
   */
  degeneration?: number;
  /**
   * Channel noise factor γ (input noise 4kT·γ/gm per device); 2/3 for long channels.
   * @default {2/3}
   */
  noiseFactor?: number;
  /**
   * Subthreshold slope factor n, for the weak-inversion check Vov ≥ 2n·VT.
   * @default {1.5}
   */
  slopeFactor?: number;
  /** Device and resistor mismatch. */
  mismatch?: MosPairMismatch;
  /** Miller compensation capacitor the pair drives, F; adds `slew`. */
  compensationCapacitance?: number;
  /**
   * Output used by the two-port view and the CMRR requirement.
   * @default {"singleEnded"}
   */
  output?: PairOutput;
  /** Design requirements; each one given adds a check. */
  requirements?: PairRequirements;
  /**
   * Label for the two-port view and tables.
   * @default {"MOS input pair"}
   */
  name?: string;
}

/** One input device at the operating point (vid = 0). */
export interface MosPairDevice {
  /** Drain current Id, A. */
  drainCurrent: number;
  /** Overdrive Vov = Vgs − Vt, V. */
  overdrive: number;
  /** Gate-source voltage, V. */
  gateSourceVoltage: number;
  /** Drain voltage, V. */
  drainVoltage: number;
  /** Vds, V. */
  drainSourceVoltage: number;
  /** Headroom to the saturation limit, Vds − Vov, V (negative: in triode). */
  headroom: number;
  /** gm = √(2·kn·Id), S. */
  transconductance: number;
  /** ro = 1/(λ·Id), Ω. */
  outputResistance: number;
}

/** Textbook closed forms for comparison with the exact small-signal values. */
export interface MosPairEstimates {
  /** Gm·RD, differential output (resistive loads; NaN for a mirror). Gm = 1/(1/gm + RS). */
  differentialGain: number;
  /** −Gm·RD/(1 + 2Gm·RSS), single-ended (resistive loads). */
  commonModeGain: number;
  /** (1 + 2Gm·RSS)/2, the matched single-ended CMRR (resistive loads). */
  cmrrSingleEnded: number;
  /** Gm·(ro2 ‖ ro4) for a mirror load (NaN for resistors). */
  activeLoadGain: number;
  /** |Acm| ≈ 1/(2·gm3·RSS) for a mirror load. */
  activeLoadCommonModeGain: number;
  /** CMRR ≈ (1 + 2gm1·RSS)·gm3·(ro2 ‖ ro4) for a mirror load. */
  activeLoadCmrr: number;
}

/** Result of {@linkcode mosPair}. */
export interface MosPairResult {
  /** Which kind of pair. */
  kind: "mos";
  /** Temperature, K. */
  temperature: number;
  /** Tail current Iss at the operating point, A. */
  tailCurrent: number;
  /** Small-signal tail resistance RSS, Ω. */
  tailResistance: number;
  /** Common-source (tail) node voltage, V. */
  tailVoltage: number;
  /** Voltage across the tail source beyond its compliance, V (NaN for a resistor tail). */
  tailHeadroom: number;
  /** Nominal overdrive Vov = √(Iss/kn) of each device at Id = Iss/2, V. */
  overdrive: number;
  /** The two input devices at vid = 0. */
  devices: [MosPairDevice, MosPairDevice];
  /**
   * Mirror devices (mirror load only): diode and output currents (A), VSG (V) and the output
   * device's ro4 = 1/(λp·Id4) (Ω).
   */
  mirror?: {
    diodeCurrent: number;
    outputCurrent: number;
    sourceGateVoltage: number;
    outputResistance: number;
  };
  /** gm of one device, Iss/Vov (average of the two), S. */
  transconductance: number;
  /** Degenerated transconductance Gm = 1/(1/gm + RS) of one device, S. */
  effectiveTransconductance: number;
  /** Small-signal gains (exact nodal solution). */
  gain: PairGain;
  /** CMRR by each definition. */
  cmrr: PairCmrr;
  /** Closed-form estimates. */
  estimates: MosPairEstimates;
  /** Input resistances (Infinity: gates). */
  inputResistance: PairInputResistance;
  /** Output resistances. */
  outputResistance: PairOutputResistance;
  /** Input offset voltage, sources `loadResistance`, `threshold`, `aspectRatio`, `systematic`. */
  offset: PairOffset;
  /** Input common-mode range. */
  inputCommonModeRange: PairInputCommonModeRange;
  /** |vid| at 1 % compression, V (0.2821·Vov without RS). */
  linearInputRange: number;
  /** |vid| beyond which one device carries the whole tail, V (√2·Vov when matched, no RS). */
  fullSwitchingInput: number;
  /** Large-signal difference current Id1 − Id2 at vid (V), A, clamped at ±Iss. */
  differenceCurrent: (vid: number) => number;
  /** The vid (V) giving a difference current (A) in [−Iss, Iss]. */
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

/** Validates options into the normalised core. */
export function _mosCore(options: MosPairOptions): {
  core: _MosCore;
  inputCommonMode: number;
  temperature: number;
  mismatch: Required<MosPairMismatch>;
} {
  _requireOptionsObject(options);
  const temperature = options.temperature ?? DEFAULT_TEMPERATURE;
  requirePositive("temperature", temperature, "K");
  const rails = _rails(options.positiveRail, options.negativeRail, options.inputCommonMode);
  const tail = _normalizeTail(options.tail);
  const degeneration = options.degeneration ?? 0;
  requireNonNegative("degeneration", degeneration, "Ω");
  requirePositive("transconductanceParameter", options.transconductanceParameter, "A/V²");
  requireFinite("threshold", options.threshold);
  const lambda = options.lambda ?? 0;
  requireNonNegative("lambda", lambda, "1/V");
  const load = options.load;
  let coreLoad: _MosCore["load"];
  if (load?.kind === "resistors") {
    requirePositive("load.resistance", load.resistance, "Ω");
    coreLoad = { kind: "resistors", resistance: load.resistance };
  } else if (load?.kind === "mirror") {
    requirePositive("load.transconductanceParameter", load.transconductanceParameter, "A/V²");
    requireFinite("load.threshold", load.threshold);
    requirePositive("load.lambda", load.lambda, "1/V");
    if (load.outputVoltage !== undefined) requireFinite("load.outputVoltage", load.outputVoltage);
    coreLoad = {
      kind: "mirror",
      transconductanceParameter: load.transconductanceParameter,
      threshold: Math.abs(load.threshold),
      lambda: load.lambda,
      outputVoltage: load.outputVoltage,
    };
  } else {
    throw _unknownLoadKind(load);
  }
  const given = options.mismatch ?? {};
  const thresholdMismatch = given.threshold ?? 0;
  requireFinite("mismatch.threshold", thresholdMismatch);
  const mismatch = {
    loadResistance: _mismatch("mismatch.loadResistance", given.loadResistance),
    threshold: thresholdMismatch,
    aspectRatio: _mismatch("mismatch.aspectRatio", given.aspectRatio),
  };
  const core: _MosCore = {
    positiveRail: rails.positiveRail,
    negativeRail: rails.negativeRail,
    tail,
    degeneration,
    transconductanceParameter: options.transconductanceParameter,
    threshold: options.threshold,
    lambda,
    load: coreLoad,
  };
  return { core, inputCommonMode: rails.inputCommonMode, temperature, mismatch };
}

/** Per-device values from the nominal ones and the mismatch. */
export function _mosParts(core: _MosCore, mismatch: Required<MosPairMismatch>): _MosParts {
  const rd = core.load.kind === "resistors" ? core.load.resistance : Number.NaN;
  const kn = core.transconductanceParameter;
  return {
    rd1: rd * (1 + mismatch.loadResistance / 2),
    rd2: rd * (1 - mismatch.loadResistance / 2),
    kn1: kn * (1 + mismatch.aspectRatio / 2),
    kn2: kn * (1 - mismatch.aspectRatio / 2),
    vt1: core.threshold + mismatch.threshold / 2,
    vt2: core.threshold - mismatch.threshold / 2,
  };
}

const MOS_WORDS: _PairWords = {
  device: "M",
  output: "drain",
  common: "source",
  inputDrop: "VGS + Id·RS",
  mirrorLimit: "so M1's drain stays above its source under the mirror's diode",
};

/**
 * Designs and analyses a MOSFET long-tailed pair (long-channel square law).
 *
 * Small-signal results come from an exact nodal solution (gm = √(2kn·Id), ro = 1/(λId)) with
 * every mismatch applied; for the 5-transistor OTA (mirror load) this is the exact value of
 * REFERENCE E3.3, and `estimates` holds the textbook approximations beside it.
 *
 * @param options The design: tail, load, devices, rails, mismatch and requirements.
 * @returns Operating point, small-signal model, offsets, ranges, transfer curve, noise, slew,
 *   distortion, the two-port view and the design checks.
 * @throws {RangeError} For non-physical input (a current, resistance or kn ≤ 0, inverted
 *   rails, a common-mode voltage outside the rails) and for a bias that cannot work: a tail
 *   node at or below the negative rail, a resistor tail with no current, or a drain below its
 *   source.
 * @throws {TypeError} For a missing or unknown tail or load kind.
 *
 * @example Example B of REFERENCE §3.5: 200 µA tail, kn = 5 mA/V², 10 kΩ drain resistors
 * ```ts
 * import { mosPair } from "./mos_pair.ts";
 * import { ok } from "node:assert/strict";
 * const pair = mosPair({
 *   tail: { kind: "source", current: 200e-6, outputResistance: 100e3, compliance: 0.3 },
 *   load: { kind: "resistors", resistance: 10e3 },
 *   transconductanceParameter: 5e-3,
 *   threshold: 0.5,
 *   positiveRail: 3.3,
 *   negativeRail: 0,
 * });
 * ok(Math.abs(pair.overdrive - 0.2) < 1e-12);
 * ok(Math.abs(pair.gain.differential - 10) < 1e-9);
 * ok(Math.abs(pair.inputCommonModeRange.max - 2.8) < 1e-9);
 * ```
 */
export function mosPair(options: MosPairOptions): MosPairResult {
  const { core, inputCommonMode, temperature, mismatch } = _mosCore(options);
  const vicm = inputCommonMode;
  const rs = core.degeneration;
  const current = _mosTailCurrent(core, vicm);
  if (!(current > 0)) {
    throw new RangeError(
      `Expected inputCommonMode to be above the negative rail plus Vt (${
        _show(core.negativeRail + core.threshold)
      } V) so the tail resistor carries current, but found ${vicm}`,
    );
  }
  const parts = _mosParts(core, mismatch);
  const point = _mosOperatingPoint(core, parts, current, vicm);
  const tail = core.tail;
  _requireBiasRoom({
    tail,
    positiveRail: core.positiveRail,
    negativeRail: core.negativeRail,
    inputCommonMode: vicm,
    tailVoltage: point.sourceVoltage,
    load: core.load,
    currents: [point.id1, point.id2],
    resistors: [parts.rd1, parts.rd2],
    firstOutputVoltage: point.vd1,
  }, MOS_WORDS);
  const mirrorLoad = core.load.kind === "mirror";

  const network = _mosNetwork(core, parts, point);
  const response = _solvePair(network, true);
  const gain = _pairGain(response, mirrorLoad);

  const kn = core.transconductanceParameter;
  const overdrive = Math.sqrt(current / kn);
  const gm = 0.5 * (network.q1.gm + network.q2.gm);
  const nominalGm = current / overdrive;
  const effectiveTransconductance = 1 / (1 / nominalGm + rs);
  const g1 = 1 / (1 / network.q1.gm + rs);
  const g2 = 1 / (1 / network.q2.gm + rs);
  const cmrr = _cmrr(
    gain,
    tail.resistance,
    1 / nominalGm + rs,
    mismatch.loadResistance,
    (g1 - g2) / (0.5 * (g1 + g2)),
    mirrorLoad,
  );

  const rd = core.load.kind === "resistors" ? core.load.resistance : Number.NaN;
  const ro2 = 1 / network.q2.go;
  const rout2 = ro2 + rs * (1 + network.q2.gm * ro2);
  const rsum = 2 * effectiveTransconductance * tail.resistance;
  let activeLoadGain = Number.NaN;
  let activeLoadCommonModeGain = Number.NaN;
  let activeLoadCmrr = Number.NaN;
  if (network.load.kind === "mirror") {
    const ro4 = 1 / network.load.q4.go;
    const gm3 = network.load.q3.gm;
    activeLoadGain = effectiveTransconductance * parallelUnchecked(rout2, ro4);
    activeLoadCommonModeGain = 1 / (2 * gm3 * tail.resistance);
    activeLoadCmrr = (1 + rsum) * gm3 * parallelUnchecked(rout2, ro4);
  }
  const estimates: MosPairEstimates = {
    differentialGain: mirrorLoad ? Number.NaN : effectiveTransconductance * rd,
    commonModeGain: mirrorLoad ? Number.NaN : (-effectiveTransconductance * rd) / (1 + rsum),
    cmrrSingleEnded: mirrorLoad ? Number.NaN : (1 + rsum) / 2,
    activeLoadGain,
    activeLoadCommonModeGain,
    activeLoadCmrr,
  };

  const scale = overdrive / 2 + (rs * current) / 2;
  const mirrorError = point.mirror ? 1 / point.mirror.ratio - 1 : 0;
  const sources = {
    loadResistance: mirrorLoad ? 0 : scale * mismatch.loadResistance,
    threshold: -mismatch.threshold,
    aspectRatio: (overdrive / 2) * mismatch.aspectRatio,
    systematic: -scale * mirrorError,
  };
  const offset = _pairOffset(
    sources,
    [sources.loadResistance, sources.threshold, sources.aspectRatio],
    _mosExactOffset(core, parts, point),
  );

  // Input common-mode range (VGS + Id·RS held at its operating-point value).
  const drop = Math.max(
    parts.vt1 + point.vov1 + point.id1 * rs,
    parts.vt2 + point.vov2 + point.id2 * rs,
  );
  const min = tail.kind === "resistor"
    ? core.negativeRail + core.threshold
    : core.negativeRail + tail.compliance + drop;
  let max: number;
  if (mirrorLoad || tail.kind !== "resistor") {
    max = Math.min(point.vd1 + parts.vt1, point.vd2 + parts.vt2);
  } else {
    const series = tail.resistance + rs / 2;
    max = Math.min(
      ...[[point.id1, parts.rd1, parts.vt1], [point.id2, parts.rd2, parts.vt2]].map(
        ([id, r, vt]) => {
          const k = ((id / current) * r) / series;
          return (core.positiveRail + vt + k * (drop + core.negativeRail)) / (1 + k);
        },
      ),
    );
  }
  const inputCommonModeRange: PairInputCommonModeRange = { min, max, maxRelaxed: max };

  const differenceCurrent = (vid: number): number => current * _mosSplit(core, parts, current, vid);
  const inputForDifferenceCurrent = (difference: number): number => {
    requireFinite("current", difference);
    if (!(Math.abs(difference) <= current)) {
      throw new RangeError(
        `Expected current to lie between ${-current} A and ${current} A, but found ${difference}`,
      );
    }
    return _mosInput(core, parts, current, difference / current);
  };
  const fullScale = overdrive + rs * current;
  const linearInputRange = _linearRange(differenceCurrent, fullScale);
  const fullSwitchingInput = Math.max(
    Math.abs(_mosInput(core, parts, current, 1)),
    Math.abs(_mosInput(core, parts, current, -1)),
  );

  const gamma = options.noiseFactor ?? 2 / 3;
  requirePositive("noiseFactor", gamma);
  const fourKT = 4 * BOLTZMANN * temperature;
  const noise = _pairNoise(Math.sqrt(fourKT * (gamma / gm + rs)), 0);

  const slew = _slew(
    options.compensationCapacitance,
    current,
    effectiveTransconductance,
    mirrorLoad,
  );
  const thirdHarmonic = (amplitude: number) =>
    _thirdHarmonic(
      differenceCurrent,
      amplitude,
      fullScale,
      overdrive / 8 / fullScale,
      (7 * overdrive) / 128 / fullScale,
    );

  const output = _pairOutput(options.output, mirrorLoad);
  const inputResistance: PairInputResistance = {
    differential: Infinity,
    commonModePerInput: Infinity,
    commonModeTied: Infinity,
  };
  const { outputResistance, twoPort } = _pairPorts(response, {
    name: options.name ?? "MOS input pair",
    output,
    mirrorLoad,
    gain,
    inputResistance: Infinity,
  });

  const devices = [1, 2].map((index): MosPairDevice => {
    const first = index === 1;
    const id = first ? point.id1 : point.id2;
    const vov = first ? point.vov1 : point.vov2;
    const vt = first ? parts.vt1 : parts.vt2;
    const vd = first ? point.vd1 : point.vd2;
    const small = first ? network.q1 : network.q2;
    const vgs = vt + vov;
    return {
      drainCurrent: id,
      overdrive: vov,
      gateSourceVoltage: vgs,
      drainVoltage: vd,
      drainSourceVoltage: vd - point.sourceVoltage,
      headroom: vd - (vicm - vt),
      transconductance: small.gm,
      outputResistance: small.go === 0 ? Infinity : 1 / small.go,
    };
  }) as [MosPairDevice, MosPairDevice];

  const requirements = options.requirements ?? {};
  const headroomWanted = requirements.headroom ?? 0;
  requireFinite("requirements.headroom", headroomWanted);
  const checks: CheckResult[] = devices.map((device, i) =>
    atLeast(`M${i + 1} saturated (Vds − Vov)`, device.headroom, headroomWanted, { unit: "V" })
  );
  const tailHeadroom = _tailHeadroom(tail, point.sourceVoltage, core.negativeRail);
  if (tail.kind !== "resistor") {
    checks.push(atLeast("tail source headroom", tailHeadroom, 0, { unit: "V" }));
  }
  const slopeFactor = options.slopeFactor ?? 1.5;
  checks.push(
    atLeast(
      "overdrive above weak inversion (2n·VT)",
      Math.min(point.vov1, point.vov2),
      weakInversionOverdrive({ slopeFactor, temperature }),
      { unit: "V" },
    ),
  );
  checks.push(
    ..._requirementChecks(requirements, {
      range: inputCommonModeRange,
      cmrr,
      output,
      worstCaseOffset: offset.worstCase,
      slew,
      linearInputRange,
      relaxed: false,
    }),
  );

  return {
    kind: "mos",
    temperature,
    tailCurrent: current,
    tailResistance: tail.resistance,
    tailVoltage: point.sourceVoltage,
    tailHeadroom,
    overdrive,
    devices,
    mirror: point.mirror
      ? {
        diodeCurrent: point.mirror.id3,
        outputCurrent: point.mirror.id4,
        sourceGateVoltage: point.mirror.vsg,
        outputResistance: 1 / (network.load as { q4: { go: number } }).q4.go,
      }
      : undefined,
    transconductance: gm,
    effectiveTransconductance,
    gain,
    cmrr,
    estimates,
    inputResistance,
    outputResistance,
    offset,
    inputCommonModeRange,
    linearInputRange,
    fullSwitchingInput,
    differenceCurrent,
    inputForDifferenceCurrent,
    noise,
    slew,
    thirdHarmonic,
    twoPort,
    checks,
  };
}
