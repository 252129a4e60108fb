/**
 * The VBE multiplier ("bias spreader") that sets the output stage's quiescent current, and
 * its design inverse with resistor values rounded to a preferred-value series.
 *
 * ```
 *   top ────┬──────────┐
 *           R1         │C        V = VBE·(1 + R1/R2) + IB·R1
 *           ├──────── B          dV/dT = (1 + R1/R2)·dVBE/dT
 *           R2         │E
 *   bottom ─┴──────────┘
 * ```
 *
 * Mount the multiplier transistor on the heat sink (or on a driver) so its VBE tracks the
 * output devices; its slope is the multiplier times its own VBE slope.
 *
 * @module
 */
import { requireFinite, requireNonNegative, requirePositive } from "../_validate.ts";
import { DEFAULT_TEMPERATURE } from "../physics/constants.ts";
import { vbeTemperatureSlope } from "../physics/junction.ts";
import { nearestPreferred, type PreferredSeriesName } from "../units/preferred_values.ts";
import { followerPairBiasVoltage, followerPairQuiescentCurrent } from "./follower.ts";

/** Options for {@linkcode vbeMultiplier}. */
export interface VbeMultiplierOptions {
  /** VBE of the multiplier transistor at its operating current, in V. */
  baseEmitterVoltage: number;
  /** R1, from collector to base, in Ω. */
  collectorBaseResistance: number;
  /** R2, from base to emitter, in Ω. */
  baseEmitterResistance: number;
  /**
   * Base current of the multiplier transistor, in A; it flows through R1 and adds IB·R1.
   * @default {0}
   */
  baseCurrent?: number;
  /**
   * Temperature in K (for the VBE slope).
   * @default {300}
   */
  temperature?: number;
  /**
   * dVBE/dT of the multiplier transistor in V/K.
   * @default {(VBE − 1.205 V − 3·VT)/T, the saturation-current law of REFERENCE §1.1}
   */
  vbeTemperatureCoefficient?: number;
}

/** The VBE multiplier's voltage and temperature slope. */
export interface VbeMultiplier {
  /** Voltage across the multiplier in V. */
  voltage: number;
  /** Multiplication factor 1 + R1/R2. */
  multiplier: number;
  /** The part of the voltage due to the base current, IB·R1, in V. */
  baseCurrentShift: number;
  /** dVBE/dT of the transistor used, in V/K. */
  vbeTemperatureCoefficient: number;
  /** dV/dT of the multiplier, (1 + R1/R2)·dVBE/dT, in V/K. */
  temperatureSlope: number;
}

/**
 * Voltage and temperature slope of a VBE multiplier: V = VBE·(1 + R1/R2) + IB·R1.
 *
 * @param options VBE, the two resistors, base current, temperature.
 * @returns The voltage, the multiplier and the temperature slope.
 * @throws {RangeError} If a value is out of range.
 *
 * @example VBE = 0.65 V, R1 = 2.2 kΩ, R2 = 1 kΩ (REFERENCE E5.12)
 * ```ts
 * import { vbeMultiplier } from "./bias_spreader.ts";
 * import { ok } from "node:assert/strict";
 * const spreader = vbeMultiplier({
 *   baseEmitterVoltage: 0.65, collectorBaseResistance: 2200, baseEmitterResistance: 1000,
 * });
 * ok(Math.abs(spreader.voltage - 2.08) < 1e-12);
 * ok(Math.abs(spreader.temperatureSlope - -6.747e-3) < 1e-6);
 * ```
 */
export function vbeMultiplier(options: VbeMultiplierOptions): VbeMultiplier {
  const vbe = options.baseEmitterVoltage;
  requirePositive("baseEmitterVoltage", vbe, "V");
  requireNonNegative("collectorBaseResistance", options.collectorBaseResistance, "Ω");
  requirePositive("baseEmitterResistance", options.baseEmitterResistance, "Ω");
  const ib = options.baseCurrent ?? 0;
  requireNonNegative("baseCurrent", ib, "A");
  const temperature = options.temperature ?? DEFAULT_TEMPERATURE;
  requirePositive("temperature", temperature, "K");
  const slope = options.vbeTemperatureCoefficient ?? vbeTemperatureSlope(vbe, { temperature });
  requireFinite("vbeTemperatureCoefficient", slope);
  const multiplier = 1 + options.collectorBaseResistance / options.baseEmitterResistance;
  const baseCurrentShift = ib * options.collectorBaseResistance;
  return {
    voltage: vbe * multiplier + baseCurrentShift,
    multiplier,
    baseCurrentShift,
    vbeTemperatureCoefficient: slope,
    temperatureSlope: multiplier * slope,
  };
}

/** Options for {@linkcode designVbeMultiplier}. */
export interface DesignVbeMultiplierOptions {
  /** Voltage the multiplier must give, in V. Give this or `targetQuiescentCurrent`. */
  targetVoltage?: number;
  /**
   * Quiescent current of a single follower pair to set, in A; the target voltage is then
   * 2·VBE(Iq) + 2·Iq·RE + `additionalVoltage`. Needs `emitterResistance` and
   * `saturationCurrent`.
   */
  targetQuiescentCurrent?: number;
  /** Emitter resistor of each output half in Ω (with `targetQuiescentCurrent`). */
  emitterResistance?: number;
  /** Saturation current Is of the output devices in A (with `targetQuiescentCurrent`). */
  saturationCurrent?: number;
  /**
   * Extra junction drops in the bias chain, e.g. two driver VBEs of a Darlington stage, in V.
   * @default {0}
   */
  additionalVoltage?: number;
  /** VBE of the multiplier transistor in V. */
  baseEmitterVoltage: number;
  /**
   * R2, from base to emitter, in Ω; kept as given.
   * @default {1000}
   */
  baseEmitterResistance?: number;
  /**
   * Base current of the multiplier transistor in A.
   * @default {0}
   */
  baseCurrent?: number;
  /**
   * Preferred-value series R1 is rounded to (nearest in log distance).
   * @default {"E24"}
   */
  series?: PreferredSeriesName;
  /**
   * Temperature in K.
   * @default {300}
   */
  temperature?: number;
}

/** A VBE multiplier design. */
export interface VbeMultiplierDesign {
  /** The voltage aimed at, in V. */
  targetVoltage: number;
  /** R1 that gives exactly the target, in Ω. */
  exactCollectorBaseResistance: number;
  /** R1 rounded to the series, in Ω. */
  collectorBaseResistance: number;
  /** R2 as used, in Ω. */
  baseEmitterResistance: number;
  /** The series used. */
  series: PreferredSeriesName;
  /** The multiplier built from the rounded R1. */
  result: VbeMultiplier;
  /** Quiescent current the rounded design sets, for a `targetQuiescentCurrent` design, in A. */
  quiescentCurrent?: number;
}

/**
 * Chooses R1 of a VBE multiplier for a target voltage or a target quiescent current:
 * R1 = (V − VBE)/(VBE/R2 + IB), then rounds it to a preferred value.
 *
 * @param options The target, the transistor, R2 and the series.
 * @returns The exact and rounded R1 and what the rounded design gives.
 * @throws {TypeError} If neither or both targets are given.
 * @throws {RangeError} If a value is out of range or the target is not above VBE.
 *
 * @example 2.6 V from VBE = 0.62 V with R2 = 1 kΩ (REFERENCE E5.13)
 * ```ts
 * import { designVbeMultiplier } from "./bias_spreader.ts";
 * import { equal, ok } from "node:assert/strict";
 * const e24 = designVbeMultiplier({ targetVoltage: 2.6, baseEmitterVoltage: 0.62 });
 * ok(Math.abs(e24.exactCollectorBaseResistance - 3193.5) < 0.1);
 * equal(e24.collectorBaseResistance, 3300);
 * const e96 = designVbeMultiplier({ targetVoltage: 2.6, baseEmitterVoltage: 0.62, series: "E96" });
 * equal(e96.collectorBaseResistance, 3160);
 * ```
 */
export function designVbeMultiplier(options: DesignVbeMultiplierOptions): VbeMultiplierDesign {
  const byVoltage = options.targetVoltage !== undefined;
  const byCurrent = options.targetQuiescentCurrent !== undefined;
  if (byVoltage === byCurrent) {
    throw new TypeError(
      "Expected exactly one of targetVoltage and targetQuiescentCurrent, but found " +
        (byVoltage ? "both" : "neither"),
    );
  }
  const temperature = options.temperature ?? DEFAULT_TEMPERATURE;
  const extra = options.additionalVoltage ?? 0;
  requireNonNegative("additionalVoltage", extra, "V");
  let pair:
    | { emitterResistance: number; saturationCurrent: number; temperature: number }
    | undefined;
  let target: number;
  if (byCurrent) {
    requirePositive("emitterResistance", options.emitterResistance ?? NaN, "Ω");
    requirePositive("saturationCurrent", options.saturationCurrent ?? NaN, "A");
    pair = {
      emitterResistance: options.emitterResistance!,
      saturationCurrent: options.saturationCurrent!,
      temperature,
    };
    requirePositive("targetQuiescentCurrent", options.targetQuiescentCurrent, "A");
    target = followerPairBiasVoltage(options.targetQuiescentCurrent!, pair) + extra;
  } else {
    target = options.targetVoltage!;
  }
  const vbe = options.baseEmitterVoltage;
  requirePositive("baseEmitterVoltage", vbe, "V");
  requirePositive("targetVoltage", target, "V");
  if (!(target > vbe)) {
    throw new RangeError(
      `Expected the target voltage to be above baseEmitterVoltage (${vbe} V), but found ${target}`,
    );
  }
  const r2 = options.baseEmitterResistance ?? 1000;
  requirePositive("baseEmitterResistance", r2, "Ω");
  const ib = options.baseCurrent ?? 0;
  requireNonNegative("baseCurrent", ib, "A");
  const series = options.series ?? "E24";
  const exact = (target - vbe) / (vbe / r2 + ib);
  const rounded = nearestPreferred(exact, series);
  const result = vbeMultiplier({
    baseEmitterVoltage: vbe,
    collectorBaseResistance: rounded,
    baseEmitterResistance: r2,
    baseCurrent: ib,
    temperature,
  });
  return {
    targetVoltage: target,
    exactCollectorBaseResistance: exact,
    collectorBaseResistance: rounded,
    baseEmitterResistance: r2,
    series,
    result,
    quiescentCurrent: pair === undefined
      ? undefined
      : followerPairQuiescentCurrent(result.voltage - extra, pair),
  };
}
