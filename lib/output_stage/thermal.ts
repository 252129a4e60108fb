/**
 * The heat path of the output devices, and the thermal-runaway loop of a fixed bias voltage.
 *
 * ```
 *   Tj ─θjc─ Tc ─θcs─┐          one heat sink, N devices:
 *   Tj ─θjc─ Tc ─θcs─┼─ Ts ─θsa─ Ta     Ts = Ta + ΣP·θsa
 *   Tj ─θjc─ Tc ─θcs─┘                  Tj,k = Ts + Pk·(θjc + θcs)
 * ```
 *
 * Runaway: a rise ΔT lowers VBE by |dVBE/dT|·ΔT; with the bias voltage fixed, the current
 * rises by that over (RE + re), the device heats by VCE·ΔI·θ, and the loop gain of that
 * circle must stay below 1. It is a steady-state small-signal estimate (REFERENCE §5.7).
 *
 * All temperatures are in kelvin; use `kelvin()` and `celsius()` at the edges.
 *
 * @module
 */
import { requireFinite, requireNonNegative, requirePositive } from "../_validate.ts";
import { DEFAULT_TEMPERATURE } from "../physics/constants.ts";
import { thermalVoltage } from "../physics/thermal_voltage.ts";

/** Thermal resistances of one device's path, in K/W. */
export interface DeviceThermalPath {
  /** Junction to case θjc in K/W. */
  junctionToCase: number;
  /**
   * Case to heat sink θcs (insulating washer and compound) in K/W.
   * @default {0}
   */
  caseToSink?: number;
}

/** Options for {@linkcode heatSinkTemperatures}. */
export interface HeatSinkTemperaturesOptions extends DeviceThermalPath {
  /** Heat sink to ambient θsa in K/W (of the whole sink). */
  sinkToAmbient: number;
  /** Ambient temperature in K. */
  ambientTemperature: number;
}

/** Temperatures along the heat path. */
export interface HeatSinkTemperatures {
  /** Total power into the heat sink in W. */
  totalPower: number;
  /** Heat-sink temperature in K. */
  sinkTemperature: number;
  /** Case temperature of each device in K, in the order of the powers. */
  caseTemperatures: number[];
  /** Junction temperature of each device in K. */
  junctionTemperatures: number[];
  /** The hottest junction in K. */
  maxJunctionTemperature: number;
}

function powers(devicePower: number | readonly number[]): number[] {
  const list = typeof devicePower === "number" ? [devicePower] : [...devicePower];
  if (list.length === 0) throw new RangeError("Expected devicePower to list at least one device");
  list.forEach((p, i) => requireNonNegative(`devicePower[${i}]`, p, "W"));
  return list;
}

function pathResistance(path: DeviceThermalPath): number {
  requireNonNegative("junctionToCase", path.junctionToCase, "K/W");
  const caseToSink = path.caseToSink ?? 0;
  requireNonNegative("caseToSink", caseToSink, "K/W");
  return path.junctionToCase + caseToSink;
}

/**
 * Junction, case and heat-sink temperatures of devices sharing one heat sink:
 * Tj = Ta + ΣP·θsa + P·(θjc + θcs).
 *
 * @param devicePower The dissipation of each device on the sink in W (a number for one).
 * @param options Thermal resistances and ambient temperature.
 * @returns Sink, case and junction temperatures.
 * @throws {RangeError} If a value is out of range.
 *
 * @example One 15.5 W device on its own sink at 40 °C ambient (REFERENCE E5.19)
 * ```ts
 * import { heatSinkTemperatures } from "./thermal.ts";
 * import { ok } from "node:assert/strict";
 * const t = heatSinkTemperatures(15.5, {
 *   junctionToCase: 1.0, caseToSink: 0.5, sinkToAmbient: 2.0, ambientTemperature: 313.15,
 * });
 * ok(Math.abs(t.maxJunctionTemperature - 273.15 - 94.25) < 1e-9);
 * ```
 */
export function heatSinkTemperatures(
  devicePower: number | readonly number[],
  options: HeatSinkTemperaturesOptions,
): HeatSinkTemperatures {
  const list = powers(devicePower);
  const theta = pathResistance(options);
  requireNonNegative("sinkToAmbient", options.sinkToAmbient, "K/W");
  requirePositive("ambientTemperature", options.ambientTemperature, "K");
  const totalPower = list.reduce((a, b) => a + b, 0);
  const sinkTemperature = options.ambientTemperature + totalPower * options.sinkToAmbient;
  const caseTemperatures = list.map((p) => sinkTemperature + p * (options.caseToSink ?? 0));
  const junctionTemperatures = list.map((p) => sinkTemperature + p * theta);
  return {
    totalPower,
    sinkTemperature,
    caseTemperatures,
    junctionTemperatures,
    maxJunctionTemperature: Math.max(...junctionTemperatures),
  };
}

/** Options for {@linkcode requiredSinkToAmbient}. */
export interface RequiredSinkToAmbientOptions extends DeviceThermalPath {
  /** Ambient temperature in K. */
  ambientTemperature: number;
  /**
   * Highest junction temperature allowed in K.
   * @default {398.15 (125 °C, derated from a typical 150 °C maximum; common practice)}
   */
  maxJunctionTemperature?: number;
}

/** The heat sink a set of devices needs. */
export interface RequiredSinkToAmbient {
  /**
   * Largest θsa in K/W that keeps every junction at or below the limit; zero or negative
   * when the limit cannot be met even with an ideal sink (see `feasible`).
   */
  sinkToAmbient: number;
  /** Heat-sink temperature with that sink, in K. */
  sinkTemperature: number;
  /** False when junction-to-sink alone already exceeds the limit. */
  feasible: boolean;
}

/**
 * The largest heat-sink thermal resistance θsa that keeps every junction under a limit:
 * θsa = min over devices of (Tj,max − Ta − Pk·(θjc + θcs))/ΣP.
 *
 * @param devicePower The dissipation of each device on the sink in W.
 * @param options Device path, ambient and junction limit.
 * @returns θsa, the resulting sink temperature, and whether the limit is reachable.
 * @throws {RangeError} If a value is out of range or the total power is zero.
 *
 * @example Two devices of 15.515 W each at 40 °C ambient, Tj ≤ 125 °C (REFERENCE E5.20)
 * ```ts
 * import { requiredSinkToAmbient } from "./thermal.ts";
 * import { ok } from "node:assert/strict";
 * const sink = requiredSinkToAmbient([15.515, 15.515], {
 *   junctionToCase: 0.7, caseToSink: 0.3, ambientTemperature: 313.15,
 * });
 * ok(Math.abs(sink.sinkToAmbient - 2.239) < 1e-3);
 * ```
 */
export function requiredSinkToAmbient(
  devicePower: number | readonly number[],
  options: RequiredSinkToAmbientOptions,
): RequiredSinkToAmbient {
  const list = powers(devicePower);
  const theta = pathResistance(options);
  requirePositive("ambientTemperature", options.ambientTemperature, "K");
  const limit = options.maxJunctionTemperature ?? 398.15;
  requirePositive("maxJunctionTemperature", limit, "K");
  const totalPower = list.reduce((a, b) => a + b, 0);
  requirePositive("total devicePower", totalPower, "W");
  const sinkLimit = Math.min(...list.map((p) => limit - p * theta));
  const sinkToAmbient = (sinkLimit - options.ambientTemperature) / totalPower;
  return {
    sinkToAmbient,
    sinkTemperature: options.ambientTemperature + totalPower * sinkToAmbient,
    feasible: sinkToAmbient > 0,
  };
}

/** Options for {@linkcode deratedPower}. */
export interface DeratedPowerOptions {
  /** Junction to case θjc in K/W. */
  junctionToCase: number;
  /**
   * Absolute maximum junction temperature from the data sheet in K.
   * @default {423.15 (150 °C)}
   */
  maxJunctionTemperature?: number;
}

/**
 * The most a device may dissipate with its case held at `caseTemperature`:
 * (Tj,max − Tc)/θjc, and zero at or above Tj,max.
 *
 * @param caseTemperature Case temperature in K.
 * @param options θjc and the junction limit.
 * @returns Allowed dissipation in W.
 * @throws {RangeError} If a value is out of range.
 *
 * @example 150 °C part with θjc = 0.625 K/W (REFERENCE E5.21)
 * ```ts
 * import { deratedPower } from "./thermal.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(deratedPower(298.15, { junctionToCase: 0.625 }) - 200) < 1e-9);
 * ok(Math.abs(deratedPower(348.15, { junctionToCase: 0.625 }) - 120) < 1e-9);
 * ```
 */
export function deratedPower(caseTemperature: number, options: DeratedPowerOptions): number {
  requirePositive("caseTemperature", caseTemperature, "K");
  requirePositive("junctionToCase", options.junctionToCase, "K/W");
  const limit = options.maxJunctionTemperature ?? 423.15;
  requirePositive("maxJunctionTemperature", limit, "K");
  return Math.max(0, (limit - caseTemperature) / options.junctionToCase);
}

/** Options for {@linkcode thermalRunawayGain}. */
export interface ThermalRunawayOptions {
  /** Collector-emitter voltage of the device at idle in V (VCC for a follower). */
  collectorEmitterVoltage: number;
  /** Quiescent current in A (sets re = VT/Iq). */
  quiescentCurrent: number;
  /** External emitter resistor in Ω (0 allowed). */
  emitterResistance: number;
  /** Junction temperature rise per watt of this device's dissipation, θ, in K/W. */
  thermalResistance: number;
  /**
   * Temperature slope of VBE in V/K (negative); its magnitude is used.
   * @default {-0.0021}
   */
  vbeTemperatureCoefficient?: number;
  /**
   * Junction temperature in K (for re).
   * @default {300}
   */
  temperature?: number;
}

/** The thermal-runaway loop of a fixed bias voltage. */
export interface ThermalRunaway {
  /** re = VT/Iq in Ω. */
  intrinsicEmitterResistance: number;
  /** dIc/dT = |dVBE/dT|/(RE + re) in A/K. */
  currentSlope: number;
  /** dP/dT = VCE·dIc/dT in W/K. */
  powerSlope: number;
  /** Loop gain L = θ·dP/dT; the bias is thermally stable when L < 1. */
  loopGain: number;
  /** True when `loopGain < 1`. */
  stable: boolean;
}

/**
 * Loop gain of thermal runaway for a fixed bias voltage: L = θ·VCE·|dVBE/dT|/(RE + re).
 *
 * @param options Voltage, current, resistors and the VBE tempco.
 * @returns The loop and its stability.
 * @throws {RangeError} If a value is out of range.
 *
 * @example 0.22 Ω emitter resistors keep it stable (REFERENCE E5.22)
 * ```ts
 * import { thermalRunawayGain } from "./thermal.ts";
 * import { equal, ok } from "node:assert/strict";
 * const loop = thermalRunawayGain({
 *   collectorEmitterVoltage: 35, quiescentCurrent: 0.1175, emitterResistance: 0.22,
 *   thermalResistance: 3.5,
 * });
 * ok(Math.abs(loop.loopGain - 0.5847) < 1e-3);
 * equal(loop.stable, true);
 * ```
 */
export function thermalRunawayGain(options: ThermalRunawayOptions): ThermalRunaway {
  requirePositive("collectorEmitterVoltage", options.collectorEmitterVoltage, "V");
  requirePositive("quiescentCurrent", options.quiescentCurrent, "A");
  requireNonNegative("emitterResistance", options.emitterResistance, "Ω");
  requireNonNegative("thermalResistance", options.thermalResistance, "K/W");
  const slope = options.vbeTemperatureCoefficient ?? -0.0021;
  requireFinite("vbeTemperatureCoefficient", slope);
  const vt = thermalVoltage(options.temperature ?? DEFAULT_TEMPERATURE);
  const intrinsicEmitterResistance = vt / options.quiescentCurrent;
  const currentSlope = Math.abs(slope) / (options.emitterResistance + intrinsicEmitterResistance);
  const powerSlope = options.collectorEmitterVoltage * currentSlope;
  const loopGain = options.thermalResistance * powerSlope;
  return {
    intrinsicEmitterResistance,
    currentSlope,
    powerSlope,
    loopGain,
    stable: loopGain < 1,
  };
}
