/**
 * Small-signal follower buffers: the emitter follower (common collector) and the source
 * follower (common drain), each with its two-port view ([SS7] ch. 7).
 *
 * ```
 *          +V                          Z = RE ‖ ro (what the emitter drives without the load)
 *           │                          ZL = Z ‖ RL
 *   Rs  B ┤ Q  (β, gm, re = α/gm)
 *  ─/\/\─┤   E ──┬──── out ── RL       Rin  = (β+1)(re + ZL)
 *                RE (or a source)      Av   = ZL/(ZL + re)           (base to output)
 *                │                     Rout = (Rs/(β+1) + re) ‖ Z     (Thevenin, Rs driving)
 *               −V
 * ```
 *
 * The two-port view is bilateral-safe for a cascade: its input resistance already holds the
 * stated load, so its output resistance is the one with the input held (re ‖ Z). Then
 * source factor × Avo × load factor gives exactly ZL/(ZL + re + Rs/(β+1)). The Thevenin
 * output resistance a reviewer quotes, with Rs reflected through β + 1, is `outputResistance`.
 *
 * @module
 */
import { requireNonNegative, requirePositive } from "../_validate.ts";
import { atLeast, type CheckResult } from "../checks/check.ts";
import { parallelUnchecked } from "../cascade/_fast.ts";
import { requirePositiveOrInfinite } from "../cascade/_require.ts";
import type { TwoPort } from "../cascade/two_port.ts";
import { DEFAULT_TEMPERATURE } from "../physics/constants.ts";
import { thermalVoltage } from "../physics/thermal_voltage.ts";

/** Options for {@linkcode emitterFollowerStage}. */
export interface EmitterFollowerStageOptions {
  /** Collector bias current Ic in A. */
  collectorCurrent: number;
  /** Current gain β. */
  beta: number;
  /**
   * Early voltage VA in V (ro = VA/Ic, in parallel with the emitter load).
   * @default {Infinity}
   */
  earlyVoltage?: number;
  /**
   * Emitter resistor to the rail, or the output resistance of the emitter current source,
   * in Ω.
   * @default {Infinity}
   */
  emitterResistance?: number;
  /**
   * Resistance the follower drives in Ω (the next stage's input).
   * @default {Infinity}
   */
  loadResistance?: number;
  /**
   * Resistance driving the base in Ω (the previous stage's output resistance).
   * @default {0}
   */
  drivingResistance?: number;
  /**
   * Absolute temperature in K.
   * @default {300}
   */
  temperature?: number;
  /**
   * Label in cascade tables.
   * @default {"emitter follower"}
   */
  name?: string;
  /** Required input resistance in Ω; adds a check when given. */
  minimumInputResistance?: number;
  /** Required gain from the source into the load; adds a check when given. */
  minimumGain?: number;
}

/** Result of {@linkcode emitterFollowerStage} and {@linkcode sourceFollowerStage}. */
export interface FollowerStage {
  /** Bias values. */
  operatingPoint: {
    /** Collector (drain) current in A. */
    current: number;
    /** Base current Ic/β in A (0 for a MOSFET). */
    inputCurrent: number;
    /** Thermal voltage used, in V (BJT only). */
    thermalVoltage?: number;
  };
  /** Small-signal values of the device. */
  smallSignal: {
    /** gm in S. */
    transconductance: number;
    /** Resistance looking into the emitter (source) with the input held: α/gm (1/(gm + gmb)), Ω. */
    emitterResistanceOfDevice: number;
    /** ro in Ω. */
    outputResistanceOfDevice: number;
  };
  /** Input resistance with the load, in Ω: (β+1)(re + ZL) (∞ for a gate). */
  inputResistance: number;
  /** Gain from the input terminal to the output, unloaded (RL = ∞): Z/(Z + re). */
  openCircuitGain: number;
  /** Gain from the input terminal into the load: ZL/(ZL + re). */
  gain: number;
  /** Gain from the source voltage (behind Rs) into the load: ZL/(ZL + re + Rs/(β+1)). */
  sourceGain: number;
  /** Thevenin output resistance with Rs driving, (Rs/(β+1) + re) ‖ Z, in Ω. */
  outputResistance: number;
  /** Cascade view: inputResistance, openCircuitGain and the input-held output resistance. */
  twoPort: TwoPort;
  /** Loading of the output by the load (factor ≥ 0.9) and any requested checks. */
  checks: CheckResult[];
}

interface FollowerCore {
  name: string;
  beta: number;
  /**
   * Share of the emitter (source) current the output keeps: 1 for a BJT, gm/(gm + gmb) for a
   * MOSFET with body effect. It scales every gain, not the resistances.
   */
  gainShare: number;
  emitterResistanceOfDevice: number;
  emitterLoad: number;
  loadResistance: number;
  drivingResistance: number;
  minimumInputResistance?: number;
  minimumGain?: number;
}

function followerFigures(x: FollowerCore): Omit<FollowerStage, "operatingPoint" | "smallSignal"> {
  const re = x.emitterResistanceOfDevice;
  const k = x.beta + 1;
  const z = x.emitterLoad;
  const zl = parallelUnchecked(z, x.loadResistance);
  const inputResistance = k === Infinity ? Infinity : k * (re + zl);
  const openCircuitGain = (z === Infinity ? 1 : z / (z + re)) * x.gainShare;
  const gain = (zl === Infinity ? 1 : zl / (zl + re)) * x.gainShare;
  const reflected = k === Infinity ? 0 : x.drivingResistance / k;
  const sourceGain = (zl === Infinity ? 1 : zl / (zl + re + reflected)) * x.gainShare;
  const outputResistance = parallelUnchecked(reflected + re, z);
  const twoPort: TwoPort = {
    name: x.name,
    inputResistance,
    openCircuitGain,
    outputResistance: parallelUnchecked(re, z),
  };
  const rl = x.loadResistance;
  const checks: CheckResult[] = [
    // Same 0.9 rule as every cascade interface (common practice, no source).
    atLeast(
      `loading of ${x.name} by its load`,
      rl === Infinity ? 1 : rl / (outputResistance + rl),
      0.9,
    ),
  ];
  if (x.minimumInputResistance !== undefined) {
    requirePositive("minimumInputResistance", x.minimumInputResistance, "Ω");
    checks.push(
      atLeast("follower input resistance", inputResistance, x.minimumInputResistance, {
        unit: "Ω",
      }),
    );
  }
  if (x.minimumGain !== undefined) {
    requirePositive("minimumGain", x.minimumGain);
    checks.push(atLeast("follower gain", sourceGain, x.minimumGain));
  }
  return {
    inputResistance,
    openCircuitGain,
    gain,
    sourceGain,
    outputResistance,
    twoPort,
    checks,
  };
}

/**
 * A small-signal emitter follower (common-collector buffer): input resistance
 * (β+1)(re + RL‖RE‖ro), gain ZL/(ZL + re), Thevenin output resistance Rs/(β+1) + re (in
 * parallel with RE ‖ ro), and the two-port view ([SS7] ch. 7; re = α/gm, ro = VA/Ic).
 *
 * @param options Bias, device, emitter resistor, load and driving resistance.
 * @returns The stage, with its two-port view and checks.
 * @throws {RangeError} If a current, β, VA, resistance or temperature is out of range.
 *
 * @example 1 mA, β = 100, driving 1 kΩ from 10 kΩ
 * ```ts
 * import { emitterFollowerStage } from "./follower_stage.ts";
 * import { ok } from "node:assert/strict";
 * const buffer = emitterFollowerStage({
 *   collectorCurrent: 1e-3, beta: 100, loadResistance: 1e3, drivingResistance: 10e3,
 * });
 * // Rin = 101 × (25.596 Ω + 1 kΩ) ≈ 103.6 kΩ; Rout = 10 kΩ/101 + 25.596 Ω ≈ 124.6 Ω
 * ok(Math.abs(buffer.inputResistance - 103585) < 1);
 * ok(Math.abs(buffer.outputResistance - 124.61) < 0.01);
 * ```
 */
export function emitterFollowerStage(options: EmitterFollowerStageOptions): FollowerStage {
  const ic = options.collectorCurrent;
  const beta = options.beta;
  requirePositive("collectorCurrent", ic, "A");
  requirePositive("beta", beta);
  const va = options.earlyVoltage ?? Infinity;
  requirePositiveOrInfinite("earlyVoltage", va, "V");
  const rE = options.emitterResistance ?? Infinity;
  requirePositiveOrInfinite("emitterResistance", rE, "Ω");
  const rl = options.loadResistance ?? Infinity;
  requirePositiveOrInfinite("loadResistance", rl, "Ω");
  const rs = options.drivingResistance ?? 0;
  requireNonNegative("drivingResistance", rs, "Ω");
  const temperature = options.temperature ?? DEFAULT_TEMPERATURE;
  requirePositive("temperature", temperature, "K");
  const vt = thermalVoltage(temperature);
  const gm = ic / vt;
  const re = beta / (beta + 1) / gm; // α/gm; requirePositive has already refused an infinite β
  const ro = va / ic;
  return {
    operatingPoint: { current: ic, inputCurrent: ic / beta, thermalVoltage: vt },
    smallSignal: {
      transconductance: gm,
      emitterResistanceOfDevice: re,
      outputResistanceOfDevice: ro,
    },
    ...followerFigures({
      name: options.name ?? "emitter follower",
      beta,
      gainShare: 1,
      emitterResistanceOfDevice: re,
      emitterLoad: parallelUnchecked(rE, ro),
      loadResistance: rl,
      drivingResistance: rs,
      minimumInputResistance: options.minimumInputResistance,
      minimumGain: options.minimumGain,
    }),
  };
}

/** Options for {@linkcode sourceFollowerStage}. */
export interface SourceFollowerStageOptions {
  /** Drain bias current Id in A. */
  drainCurrent: number;
  /** Overdrive Vov = Vgs − Vt in V (gm = 2Id/Vov, square law). */
  overdrive: number;
  /**
   * Channel-length modulation λ in 1/V (ro = 1/(λ·Id)).
   * @default {0}
   */
  lambda?: number;
  /**
   * Body-effect ratio χ = gmb/gm (0 when the source is tied to the body).
   * @default {0}
   */
  bodyEffectRatio?: number;
  /**
   * Source resistor to the rail, or the output resistance of the source current sink, in Ω.
   * @default {Infinity}
   */
  sourceResistance?: number;
  /**
   * Resistance the follower drives in Ω.
   * @default {Infinity}
   */
  loadResistance?: number;
  /**
   * Label in cascade tables.
   * @default {"source follower"}
   */
  name?: string;
  /** Required gain into the load; adds a check when given. */
  minimumGain?: number;
}

/**
 * A small-signal source follower (common-drain buffer): gain gm·ZL/(1 + (gm + gmb)·ZL),
 * output resistance 1/(gm + gmb) ‖ Z, infinite input resistance ([SS7] ch. 7, [Raz2] ch. 3).
 * The gate draws no current, so the driving resistance does not enter.
 *
 * @param options Bias, overdrive, λ, body effect, source resistor and load.
 * @returns The stage, with its two-port view and checks.
 * @throws {RangeError} If a current, overdrive, λ, χ or resistance is out of range.
 *
 * @example 1 mA at 0.2 V overdrive into 1 kΩ: gm = 10 mS, gain 10/11
 * ```ts
 * import { sourceFollowerStage } from "./follower_stage.ts";
 * import { ok } from "node:assert/strict";
 * const buffer = sourceFollowerStage({ drainCurrent: 1e-3, overdrive: 0.2, loadResistance: 1e3 });
 * ok(Math.abs(buffer.gain - 10 / 11) < 1e-12);
 * ok(Math.abs(buffer.outputResistance - 100) < 1e-9);
 * ```
 */
export function sourceFollowerStage(options: SourceFollowerStageOptions): FollowerStage {
  const id = options.drainCurrent;
  const vov = options.overdrive;
  requirePositive("drainCurrent", id, "A");
  requirePositive("overdrive", vov, "V");
  const lambda = options.lambda ?? 0;
  requireNonNegative("lambda", lambda, "1/V");
  const chi = options.bodyEffectRatio ?? 0;
  requireNonNegative("bodyEffectRatio", chi);
  const rS = options.sourceResistance ?? Infinity;
  requirePositiveOrInfinite("sourceResistance", rS, "Ω");
  const rl = options.loadResistance ?? Infinity;
  requirePositiveOrInfinite("loadResistance", rl, "Ω");
  const gm = (2 * id) / vov;
  const ro = lambda === 0 ? Infinity : 1 / (lambda * id);
  // The follower's own "re": the source looks like 1/(gm + gmb) with the gate held, and the
  // open-circuit gain gm·Z/(1 + (gm + gmb)Z) is Z'/(Z' + 1/(gm + gmb)) times gm/(gm + gmb).
  const rSource = 1 / (gm * (1 + chi));
  const share = 1 / (1 + chi);
  return {
    operatingPoint: { current: id, inputCurrent: 0 },
    smallSignal: {
      transconductance: gm,
      emitterResistanceOfDevice: rSource,
      outputResistanceOfDevice: ro,
    },
    ...followerFigures({
      name: options.name ?? "source follower",
      beta: Infinity,
      gainShare: share,
      emitterResistanceOfDevice: rSource,
      emitterLoad: parallelUnchecked(rS, ro),
      loadResistance: rl,
      drivingResistance: 0,
      minimumGain: options.minimumGain,
    }),
  };
}
