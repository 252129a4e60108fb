/**
 * Common-emitter gain stage (the BJT voltage-amplifier stage, VAS), with optional emitter
 * degeneration, emitter-follower pre-driver and cascode.
 *
 * ```
 *                 +V
 *                  │
 *             RC / active load (collectorResistance)
 *                  │
 *              [cascode]         (optional: raises the output resistance)
 *                  ├──────── out ──▶ next stage (loadResistance)
 *    in ──[EF]──┤ Q1             (optional follower: multiplies the input resistance by β+1)
 *                  │
 *                  RE            (optional degeneration)
 *                  │
 *                 −V
 * ```
 *
 * Conventions: ro = VA/Ic (the VA + Vce variant is not used); re = α/gm; VT = kT/q at the
 * given temperature (300 K unless set).
 *
 * @module
 */
import { requireNonNegative, requirePositive } from "../_validate.ts";
import type { CheckResult } from "../checks/check.ts";
import { requirePositiveOrInfinite } from "../cascade/_require.ts";
import type { TwoPort } from "../cascade/two_port.ts";
import { DEFAULT_TEMPERATURE } from "../physics/constants.ts";
import { thermalVoltage } from "../physics/thermal_voltage.ts";
import { type DeviceSmallSignal, gainStageCore } from "./_gain_stage.ts";
import { figures } from "./_figures.ts";

/** Emitter-follower pre-driver ahead of the common-emitter transistor. */
export interface EmitterFollowerOptions {
  /** Follower's collector current in A. */
  collectorCurrent: number;
  /**
   * Follower's current gain β.
   * @default {the main transistor's beta}
   */
  beta?: number;
  /**
   * Follower's Early voltage in V.
   * @default {Infinity}
   */
  earlyVoltage?: number;
  /**
   * Resistance from the follower's emitter to the rail in Ω (`Infinity` for a current
   * source); it sits in parallel with the main transistor's input.
   * @default {Infinity}
   */
  emitterResistance?: number;
}

/** A common-base transistor stacked on the common-emitter one. */
export interface BjtCascodeOptions {
  /**
   * Cascode transistor's β.
   * @default {the main transistor's beta}
   */
  beta?: number;
  /**
   * Cascode transistor's Early voltage in V.
   * @default {the main transistor's earlyVoltage}
   */
  earlyVoltage?: number;
}

/** Options for {@linkcode commonEmitterStage}. */
export interface CommonEmitterOptions {
  /** Collector bias current Ic in A. */
  collectorCurrent: number;
  /** Current gain β. */
  beta: number;
  /**
   * Early voltage VA in V (ro = VA/Ic).
   * @default {Infinity}
   */
  earlyVoltage?: number;
  /**
   * Collector resistor, or the output resistance of the active (current-source) load, in Ω.
   * @default {Infinity}
   */
  collectorResistance?: number;
  /**
   * Resistance the stage drives in Ω: the next stage's input resistance.
   * @default {Infinity}
   */
  loadResistance?: number;
  /**
   * Emitter degeneration RE in Ω.
   * @default {0}
   */
  emitterResistance?: number;
  /**
   * Absolute temperature in K.
   * @default {300}
   */
  temperature?: number;
  /**
   * Resistance driving the stage's input in Ω (the previous stage's output resistance);
   * sets the input pole.
   * @default {0}
   */
  drivingResistance?: number;
  /**
   * Collector-base capacitance Cµ in F (plus any compensation capacitor across the stage).
   * @default {0}
   */
  collectorBaseCapacitance?: number;
  /**
   * Base-emitter capacitance Cπ in F.
   * @default {0}
   */
  baseEmitterCapacitance?: number;
  /**
   * Further capacitance at the output node in F (next stage's input, wiring).
   * @default {0}
   */
  outputCapacitance?: number;
  /** Emitter-follower pre-driver. */
  emitterFollower?: EmitterFollowerOptions;
  /** Cascode transistor on the collector. */
  cascode?: BjtCascodeOptions;
  /**
   * Label in cascade tables.
   * @default {"VAS"}
   */
  name?: string;
  /** Required |gain| into the load; adds a check when given. */
  minimumGain?: number;
  /** Required input-pole frequency in Hz; adds a check when given. */
  minimumInputPoleFrequency?: number;
}

/** Operating point of {@linkcode commonEmitterStage}. */
export interface CommonEmitterOperatingPoint {
  /** Collector current in A. */
  collectorCurrent: number;
  /** Base current Ic/β in A (what the previous stage, or the follower, must supply). */
  baseCurrent: number;
  /** Emitter current Ic(β+1)/β in A. */
  emitterCurrent: number;
  /** DC drop across RE in V. */
  emitterResistorVoltage: number;
  /** Thermal voltage used, in V. */
  thermalVoltage: number;
  /** Follower's base current in A, when there is a follower. */
  followerBaseCurrent?: number;
}

/** Hybrid-π values of the main transistor (and of the follower and cascode). */
export interface CommonEmitterSmallSignal {
  /** gm = Ic/VT in S. */
  transconductance: number;
  /** rπ = β/gm in Ω. */
  baseResistance: number;
  /** ro = VA/Ic in Ω. */
  outputResistanceOfDevice: number;
  /** re = α/gm in Ω. */
  emitterResistanceOfDevice: number;
  /** Effective transconductance with degeneration, β/(rπ + (β+1)RE), in S (times α of the cascode, if any). */
  effectiveTransconductance: number;
  /** Resistance looking into the collector, ro·[1 + gm(RE‖rπ)], in Ω. */
  collectorResistanceOfDevice: number;
  /** Resistance looking into the output node before the collector resistor (cascode included), in Ω. */
  outputNodeResistance: number;
  /** Follower's hybrid-π values, when there is one. */
  follower?: { transconductance: number; baseResistance: number; outputResistance: number };
}

/** Result of {@linkcode commonEmitterStage} and {@linkcode commonSourceStage}'s shared fields. */
export interface GainStageFigures {
  /** Stage input resistance in Ω (follower included). */
  inputResistance: number;
  /** Stage output resistance in Ω, without the load. */
  outputResistance: number;
  /** Open-circuit (unloaded) voltage gain. */
  openCircuitGain: number;
  /** Voltage gain into `loadResistance`. */
  gain: number;
  /** |gain| in dB. */
  gainDb: number;
  /** Voltage gain of the follower (1 without one). */
  followerGain: number;
  /** Gain across the feedback capacitance (input to the main device's own output node). */
  millerGain: number;
  /** Miller capacitance Cµ(1 + |millerGain|) at the input, in F. */
  millerCapacitance: number;
  /** Total input capacitance of the main device, Cπ/(1 + gm·RE) + CM, in F. */
  inputCapacitance: number;
  /** Resistance driving the main device's input node in Ω (source, or the follower's output). */
  inputNodeDrivingResistance: number;
  /** Rdrive ‖ Rin of the main device in Ω: the resistance the input capacitance sees. */
  inputNodeResistance: number;
  /** Input pole 1/(2π·(Rdrive ‖ Rin)·Cin) in Hz (Miller approximation); ∞ without capacitance. */
  inputPoleFrequency: number;
  /** The two-port view for {@linkcode cascade}; has `at()` when capacitances are given. */
  twoPort: TwoPort;
  /** Design checks. */
  checks: CheckResult[];
}

/** Result of {@linkcode commonEmitterStage}. */
export interface CommonEmitterStage extends GainStageFigures {
  /** Bias currents and voltages. */
  operatingPoint: CommonEmitterOperatingPoint;
  /** Hybrid-π values. */
  smallSignal: CommonEmitterSmallSignal;
}

function bjt(collectorCurrent: number, beta: number, earlyVoltage: number, vt: number) {
  const gm = collectorCurrent / vt;
  return { gm, rpi: beta / gm, ro: earlyVoltage / collectorCurrent, beta };
}

/**
 * Builds a common-emitter gain stage: operating point, hybrid-π model, gain into the given
 * load, input and output resistance, Miller capacitance and input pole, two-port view and
 * checks (formulas of [SS7] ch. 7 and ch. 10, [GHLM5] ch. 3).
 *
 * The Miller capacitance is an input-side approximation: it misses the output pole and the
 * right-half-plane zero, so use {@linkcode millerCompensation} for phase margin.
 *
 * @param options Bias, device, load and optional degeneration, follower, cascode.
 * @returns The stage.
 * @throws {RangeError} If a current, β, Early voltage, temperature or resistance is out of
 * range (names the option and the value).
 *
 * @example A VAS at 2 mA into 200 kΩ: gain −1547
 * ```ts
 * import { commonEmitterStage } from "./common_emitter.ts";
 * import { ok } from "node:assert/strict";
 * const vas = commonEmitterStage({
 *   collectorCurrent: 2e-3, beta: 150, earlyVoltage: 80,
 *   collectorResistance: 50e3, loadResistance: 200e3,
 * });
 * ok(Math.abs(vas.gain + 1547.3) < 0.1);
 * ok(Math.abs(vas.outputResistance - 22222) < 1);
 * ```
 */
export function commonEmitterStage(options: CommonEmitterOptions): CommonEmitterStage {
  const ic = options.collectorCurrent;
  const beta = options.beta;
  requirePositive("collectorCurrent", ic, "A");
  requirePositive("beta", beta);
  const va = options.earlyVoltage ?? Infinity;
  requirePositiveOrInfinite("earlyVoltage", va, "V");
  const rc = options.collectorResistance ?? Infinity;
  requirePositiveOrInfinite("collectorResistance", rc, "Ω");
  const rl = options.loadResistance ?? Infinity;
  requirePositiveOrInfinite("loadResistance", rl, "Ω");
  const re = options.emitterResistance ?? 0;
  requireNonNegative("emitterResistance", re, "Ω");
  const temperature = options.temperature ?? DEFAULT_TEMPERATURE;
  requirePositive("temperature", temperature, "K");
  const rs = options.drivingResistance ?? 0;
  requireNonNegative("drivingResistance", rs, "Ω");
  const cmu = options.collectorBaseCapacitance ?? 0;
  requireNonNegative("collectorBaseCapacitance", cmu, "F");
  const cpi = options.baseEmitterCapacitance ?? 0;
  requireNonNegative("baseEmitterCapacitance", cpi, "F");
  const cout = options.outputCapacitance ?? 0;
  requireNonNegative("outputCapacitance", cout, "F");
  const vt = thermalVoltage(temperature);
  const device = bjt(ic, beta, va, vt);

  let cascode: DeviceSmallSignal | undefined;
  if (options.cascode) {
    const cb = options.cascode.beta ?? beta;
    requirePositive("cascode.beta", cb);
    const cva = options.cascode.earlyVoltage ?? va;
    requirePositiveOrInfinite("cascode.earlyVoltage", cva, "V");
    cascode = bjt(ic, cb, cva, vt);
  }
  let follower;
  if (options.emitterFollower) {
    const ef = options.emitterFollower;
    requirePositive("emitterFollower.collectorCurrent", ef.collectorCurrent, "A");
    const fb = ef.beta ?? beta;
    requirePositive("emitterFollower.beta", fb);
    const fva = ef.earlyVoltage ?? Infinity;
    requirePositiveOrInfinite("emitterFollower.earlyVoltage", fva, "V");
    const fre = ef.emitterResistance ?? Infinity;
    requirePositiveOrInfinite("emitterFollower.emitterResistance", fre, "Ω");
    follower = { ...bjt(ef.collectorCurrent, fb, fva, vt), emitterResistance: fre };
  }

  const core = gainStageCore({
    name: options.name ?? "VAS",
    device,
    degeneration: re,
    loadResistor: rc,
    loadResistance: rl,
    cascode,
    follower,
    drivingResistance: rs,
    feedbackCapacitance: cmu,
    inputCapacitance: cpi,
    outputCapacitance: cout,
  });

  const emitterCurrent = (ic * (beta + 1)) / beta;
  const operatingPoint: CommonEmitterOperatingPoint = {
    collectorCurrent: ic,
    baseCurrent: ic / beta,
    emitterCurrent,
    emitterResistorVoltage: emitterCurrent * re,
    thermalVoltage: vt,
  };
  if (follower) {
    operatingPoint.followerBaseCurrent = options.emitterFollower!.collectorCurrent / follower.beta;
  }
  const smallSignal: CommonEmitterSmallSignal = {
    transconductance: device.gm,
    baseResistance: device.rpi,
    outputResistanceOfDevice: device.ro,
    emitterResistanceOfDevice: (beta / (beta + 1)) / device.gm,
    effectiveTransconductance: core.transconductance,
    collectorResistanceOfDevice: core.deviceOutputResistance,
    outputNodeResistance: core.outputNodeResistance,
  };
  if (follower) {
    smallSignal.follower = {
      transconductance: follower.gm,
      baseResistance: follower.rpi,
      outputResistance: follower.ro,
    };
  }
  return {
    operatingPoint,
    smallSignal,
    ...figures(core, options),
  };
}
