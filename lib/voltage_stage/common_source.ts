/**
 * Common-source gain stage (MOSFET), with optional source degeneration and cascode.
 *
 * ```
 *              +V
 *               │
 *          RD / active load (drainResistance)
 *               │
 *           [cascode]
 *               ├──── out ──▶ next stage (loadResistance)
 *   in ──────┤ M1
 *               │
 *               RS  (degenerationResistance; body effect ignored)
 *               │
 *              −V
 * ```
 *
 * Square law with the ½ inside: Id = ½·kn·Vov², kn = k′W/L, so gm = 2Id/Vov = √(2·kn·Id);
 * ro = 1/(λ·Id).
 *
 * @module
 */
import { requireFinite, requireNonNegative, requirePositive } from "../_validate.ts";
import { atLeast } from "../checks/check.ts";
import { requirePositiveOrInfinite } from "../cascade/_require.ts";
import { DEFAULT_TEMPERATURE } from "../physics/constants.ts";
import { thermalVoltage } from "../physics/thermal_voltage.ts";
import { figures } from "./_figures.ts";
import { type DeviceSmallSignal, gainStageCore } from "./_gain_stage.ts";
import type { GainStageFigures } from "./common_emitter.ts";

/** A common-gate MOSFET stacked on the common-source one. */
export interface MosCascodeOptions {
  /**
   * Cascode device's overdrive in V.
   * @default {the main device's overdrive}
   */
  overdrive?: number;
  /**
   * Cascode device's channel-length modulation λ in 1/V.
   * @default {the main device's lambda}
   */
  lambda?: number;
}

/** Options for {@linkcode commonSourceStage}. Give `overdrive` or `transconductanceParameter`. */
export interface CommonSourceOptions {
  /** Drain bias current Id in A. */
  drainCurrent: number;
  /** Overdrive Vov = Vgs − Vt in V. */
  overdrive?: number;
  /** kn = k′·W/L in A/V² (with Id = ½·kn·Vov²). */
  transconductanceParameter?: number;
  /**
   * Channel-length modulation λ in 1/V (ro = 1/(λ·Id)).
   * @default {0}
   */
  lambda?: number;
  /** Threshold voltage Vt in V; gives the gate-source voltage. */
  thresholdVoltage?: number;
  /**
   * Drain resistor, or the output resistance of the active load, in Ω.
   * @default {Infinity}
   */
  drainResistance?: number;
  /**
   * Resistance the stage drives in Ω (the next stage's input).
   * @default {Infinity}
   */
  loadResistance?: number;
  /**
   * Source degeneration RS in Ω.
   * @default {0}
   */
  degenerationResistance?: number;
  /**
   * Resistance driving the gate in Ω; sets the input pole.
   * @default {0}
   */
  drivingResistance?: number;
  /**
   * Gate-drain capacitance Cgd in F (plus any capacitor across the stage).
   * @default {0}
   */
  gateDrainCapacitance?: number;
  /**
   * Gate-source capacitance Cgs in F.
   * @default {0}
   */
  gateSourceCapacitance?: number;
  /**
   * Further capacitance at the output node in F.
   * @default {0}
   */
  outputCapacitance?: number;
  /** Cascode device on the drain. */
  cascode?: MosCascodeOptions;
  /**
   * Weak-inversion slope factor n for the overdrive check (n ≈ 1.2–1.6: [Tsividis]).
   * @default {1.5}
   */
  slopeFactor?: number;
  /**
   * Absolute temperature in K (for the weak-inversion check).
   * @default {300}
   */
  temperature?: number;
  /**
   * Label in cascade tables.
   * @default {"CS stage"}
   */
  name?: string;
  /** Required |gain| into the load; adds a check when given. */
  minimumGain?: number;
  /** Required input-pole frequency in Hz; adds a check when given. */
  minimumInputPoleFrequency?: number;
}

/** Result of {@linkcode commonSourceStage}. */
export interface CommonSourceStage extends GainStageFigures {
  /** Bias values. */
  operatingPoint: {
    /** Drain current in A. */
    drainCurrent: number;
    /** Overdrive Vov in V. */
    overdrive: number;
    /** kn = 2Id/Vov² in A/V². */
    transconductanceParameter: number;
    /** Vgs = Vt + Vov in V, when Vt was given. */
    gateSourceVoltage?: number;
    /** DC drop across RS in V. */
    degenerationVoltage: number;
  };
  /** Small-signal values. */
  smallSignal: {
    /** gm = 2Id/Vov in S. */
    transconductance: number;
    /** ro = 1/(λ·Id) in Ω. */
    outputResistanceOfDevice: number;
    /** gm/(1 + gm·RS) in S. */
    effectiveTransconductance: number;
    /** ro·(1 + gm·RS) in Ω. */
    drainResistanceOfDevice: number;
    /** Resistance into the output node before RD (cascode included), in Ω. */
    outputNodeResistance: number;
    /** Intrinsic gain gm·ro = 2/(λ·Vov). */
    intrinsicGain: number;
  };
}

/**
 * Builds a common-source gain stage: operating point, small-signal model, gain into the load,
 * output resistance, Miller capacitance and input pole, two-port view and checks ([SS7] ch. 7
 * and ch. 10, [Raz2] ch. 3). The checks include an overdrive check against the weak-inversion
 * change-over 2·n·VT, below which the square law overstates gm.
 *
 * @param options Bias, device, load, optional degeneration and cascode.
 * @returns The stage.
 * @throws {RangeError} If neither or both of `overdrive` and `transconductanceParameter` are
 * given, or a value is out of range (names the option and the value).
 *
 * @example 250 µA at kn = 2.4 mA/V², λ = 0.05 V⁻¹, no drain resistor: gain −gm·ro
 * ```ts
 * import { commonSourceStage } from "./common_source.ts";
 * import { ok } from "node:assert/strict";
 * const cs = commonSourceStage({ drainCurrent: 250e-6, transconductanceParameter: 2.4e-3, lambda: 0.05 });
 * ok(Math.abs(cs.smallSignal.transconductance - 1.0954e-3) < 1e-7);
 * ok(Math.abs(cs.gain + 87.64) < 0.01);
 * ```
 */
export function commonSourceStage(options: CommonSourceOptions): CommonSourceStage {
  const id = options.drainCurrent;
  requirePositive("drainCurrent", id, "A");
  const hasVov = options.overdrive !== undefined;
  const hasKn = options.transconductanceParameter !== undefined;
  if (hasVov === hasKn) {
    throw new RangeError(
      `Expected exactly one of overdrive and transconductanceParameter, but found ${
        hasVov ? "both" : "neither"
      }`,
    );
  }
  let vov: number;
  let kn: number;
  if (hasVov) {
    vov = options.overdrive!;
    requirePositive("overdrive", vov, "V");
    kn = (2 * id) / (vov * vov);
  } else {
    kn = options.transconductanceParameter!;
    requirePositive("transconductanceParameter", kn, "A/V²");
    vov = Math.sqrt((2 * id) / kn);
  }
  const lambda = options.lambda ?? 0;
  requireNonNegative("lambda", lambda, "1/V");
  const rd = options.drainResistance ?? Infinity;
  requirePositiveOrInfinite("drainResistance", rd, "Ω");
  const rl = options.loadResistance ?? Infinity;
  requirePositiveOrInfinite("loadResistance", rl, "Ω");
  const rs = options.degenerationResistance ?? 0;
  requireNonNegative("degenerationResistance", rs, "Ω");
  const rsig = options.drivingResistance ?? 0;
  requireNonNegative("drivingResistance", rsig, "Ω");
  const cgd = options.gateDrainCapacitance ?? 0;
  requireNonNegative("gateDrainCapacitance", cgd, "F");
  const cgs = options.gateSourceCapacitance ?? 0;
  requireNonNegative("gateSourceCapacitance", cgs, "F");
  const cout = options.outputCapacitance ?? 0;
  requireNonNegative("outputCapacitance", cout, "F");
  const n = options.slopeFactor ?? 1.5;
  requirePositive("slopeFactor", n);
  const temperature = options.temperature ?? DEFAULT_TEMPERATURE;
  requirePositive("temperature", temperature, "K");

  const mos = (overdrive: number, lam: number): DeviceSmallSignal => ({
    gm: (2 * id) / overdrive,
    rpi: Infinity,
    ro: lam === 0 ? Infinity : 1 / (lam * id),
    beta: Infinity,
  });
  const device = mos(vov, lambda);
  let cascode: DeviceSmallSignal | undefined;
  if (options.cascode) {
    const cvov = options.cascode.overdrive ?? vov;
    requirePositive("cascode.overdrive", cvov, "V");
    const clam = options.cascode.lambda ?? lambda;
    requireNonNegative("cascode.lambda", clam, "1/V");
    cascode = mos(cvov, clam);
  }
  const core = gainStageCore({
    name: options.name ?? "CS stage",
    device,
    degeneration: rs,
    loadResistor: rd,
    loadResistance: rl,
    cascode,
    drivingResistance: rsig,
    feedbackCapacitance: cgd,
    inputCapacitance: cgs,
    outputCapacitance: cout,
  });
  // Where 2Id/Vov meets Id/(n·VT): an estimate of the edge of strong inversion (REFERENCE §2.2).
  const changeOver = 2 * n * thermalVoltage(temperature);
  const operatingPoint: CommonSourceStage["operatingPoint"] = {
    drainCurrent: id,
    overdrive: vov,
    transconductanceParameter: kn,
    degenerationVoltage: id * rs,
  };
  if (options.thresholdVoltage !== undefined) {
    requireFinite("thresholdVoltage", options.thresholdVoltage);
    operatingPoint.gateSourceVoltage = options.thresholdVoltage + vov;
  }
  return {
    operatingPoint,
    smallSignal: {
      transconductance: device.gm,
      outputResistanceOfDevice: device.ro,
      effectiveTransconductance: core.transconductance,
      drainResistanceOfDevice: core.deviceOutputResistance,
      outputNodeResistance: core.outputNodeResistance,
      intrinsicGain: device.gm * device.ro,
    },
    ...figures(core, options, [
      atLeast("overdrive above weak inversion (2nVT)", vov, changeOver, { unit: "V" }),
    ]),
  };
}
