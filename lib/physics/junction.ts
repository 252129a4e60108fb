/**
 * Temperature behaviour of a pn junction: the saturation-current law and what follows from
 * it for Vbe and Ic.
 *
 * ```
 *   Is(T) = Is(T0) · (T/T0)^η · exp[ (VG0 / (k/q)) · (1/T0 − 1/T) ]
 *
 *   Vbe │╲                 at fixed Ic, Vbe falls about 2 mV/K:
 *       │  ╲               dVbe/dT = (Vbe − VG0 − η·VT) / T
 *       │    ╲
 *       └──────── T
 * ```
 *
 * VG0 is the bandgap voltage extrapolated to 0 K (about 1.205 V), not the 300 K bandgap of
 * silicon (1.12 V); η is about 3. Keep the two as a consistent pair: mixing 1.12 V with the
 * η = 3 of the 1.205 V fit understates the Vbe slope by about 13 %.
 *
 * @module
 */
import { requireFinite, requirePositive } from "../_validate.ts";
import { BOLTZMANN, DEFAULT_TEMPERATURE, ELEMENTARY_CHARGE } from "./constants.ts";
import { thermalVoltage } from "./thermal_voltage.ts";

/** Default extrapolated bandgap voltage VG0 of silicon, in V (Gray, Hurst, Lewis & Meyer). */
export const DEFAULT_BANDGAP_VOLTAGE = 1.205;

/** Default temperature exponent η of the saturation current (range about 3 to 4). */
export const DEFAULT_TEMPERATURE_EXPONENT = 3;

/** The two parameters of the saturation-current temperature law. */
export interface JunctionLawOptions {
  /**
   * Bandgap voltage VG0 extrapolated to 0 K, in V.
   * @default {1.205}
   */
  bandgapVoltage?: number;
  /**
   * Temperature exponent η of Is.
   * @default {3}
   */
  temperatureExponent?: number;
}

/** Options for {@linkcode saturationCurrentAtTemperature} and {@linkcode vbeAtTemperature}. */
export interface JunctionTemperatureOptions extends JunctionLawOptions {
  /**
   * Temperature to move to, in K.
   * @default {300}
   */
  temperature?: number;
  /**
   * Temperature at which the given Is or Vbe holds, in K.
   * @default {300}
   */
  referenceTemperature?: number;
}

/** Options for the slope helpers, which act at one temperature. */
export interface JunctionSlopeOptions extends JunctionLawOptions {
  /**
   * Junction temperature in K.
   * @default {300}
   */
  temperature?: number;
}

/** Options for {@linkcode vbeTemperatureSlope}. */
export interface VbeSlopeOptions extends JunctionSlopeOptions {
  /**
   * Exponent a of a bias current that itself grows as T^a (0 for a fixed current; 1 for a
   * current proportional to absolute temperature). It replaces η by η − a.
   * @default {0}
   */
  currentExponent?: number;
}

/** Options for the helpers that need only a temperature. */
export interface TemperatureOptions {
  /**
   * Junction temperature in K.
   * @default {300}
   */
  temperature?: number;
}

function lawOf(options: JunctionLawOptions): { vg0: number; eta: number } {
  const vg0 = options.bandgapVoltage ?? DEFAULT_BANDGAP_VOLTAGE;
  const eta = options.temperatureExponent ?? DEFAULT_TEMPERATURE_EXPONENT;
  requirePositive("bandgapVoltage", vg0, "V");
  requireFinite("temperatureExponent", eta);
  return { vg0, eta };
}

/** ln[Is(T)/Is(T0)] from the law above. */
function logSaturationRatio(temperature: number, reference: number, vg0: number, eta: number) {
  const kOverQ = BOLTZMANN / ELEMENTARY_CHARGE;
  return eta * Math.log(temperature / reference) +
    (vg0 / kOverQ) * (1 / reference - 1 / temperature);
}

/**
 * Saturation current at another temperature: Is(T) = Is(T0)·(T/T0)^η·exp[(VG0/(k/q))(1/T0 − 1/T)].
 *
 * @param saturationCurrent Is at `referenceTemperature`, in A.
 * @param options Target and reference temperatures, VG0 and η.
 * @returns Is at `temperature`, in A.
 * @throws {RangeError} If a current, temperature or VG0 is not positive.
 *
 * @example Is grows about 5 times from 300 K to 310 K
 * ```ts
 * import { saturationCurrentAtTemperature } from "./junction.ts";
 * import { ok } from "node:assert/strict";
 * const ratio = saturationCurrentAtTemperature(1, { temperature: 310 });
 * ok(Math.abs(ratio - 4.963) < 1e-3);
 * ```
 */
export function saturationCurrentAtTemperature(
  saturationCurrent: number,
  options: JunctionTemperatureOptions = {},
): number {
  requirePositive("saturationCurrent", saturationCurrent, "A");
  const temperature = options.temperature ?? DEFAULT_TEMPERATURE;
  const reference = options.referenceTemperature ?? DEFAULT_TEMPERATURE;
  requirePositive("temperature", temperature, "K");
  requirePositive("referenceTemperature", reference, "K");
  const { vg0, eta } = lawOf(options);
  return saturationCurrent * Math.exp(logSaturationRatio(temperature, reference, vg0, eta));
}

/**
 * Relative temperature slope of the saturation current: d(ln Is)/dT = η/T + VG0/(VT·T).
 *
 * @param options Temperature, VG0 and η.
 * @returns The slope in 1/K (0.1654 means +16.54 %/K).
 * @throws {RangeError} If the temperature or VG0 is not positive.
 *
 * @example 16.54 %/K at 300 K: Is doubles about every 4.19 K
 * ```ts
 * import { saturationCurrentSlope } from "./junction.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(saturationCurrentSlope() - 0.16540) < 1e-4);
 * ```
 */
export function saturationCurrentSlope(options: JunctionSlopeOptions = {}): number {
  const temperature = options.temperature ?? DEFAULT_TEMPERATURE;
  const vt = thermalVoltage(temperature);
  const { vg0, eta } = lawOf(options);
  return eta / temperature + vg0 / (vt * temperature);
}

/**
 * Relative temperature slope of the collector current at a fixed Vbe:
 * d(ln Ic)/dT = η/T + (VG0 − Vbe)/(VT·T).
 *
 * This is why a fixed-voltage bias runs away without emitter resistance or thermal tracking.
 *
 * @param vbe The fixed base-emitter voltage, in V.
 * @param options Temperature, VG0 and η.
 * @returns The slope in 1/K (0.0816 means +8.16 %/K).
 * @throws {RangeError} If the temperature or VG0 is not positive.
 * @throws {TypeError} If `vbe` is not a finite number.
 *
 * @example Ic grows 8.16 %/K at Vbe = 0.65 V, 300 K
 * ```ts
 * import { collectorCurrentSlope } from "./junction.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(collectorCurrentSlope(0.65) - 0.0816) < 1e-4);
 * ```
 */
export function collectorCurrentSlope(vbe: number, options: JunctionSlopeOptions = {}): number {
  requireFinite("vbe", vbe);
  const temperature = options.temperature ?? DEFAULT_TEMPERATURE;
  const vt = thermalVoltage(temperature);
  const { vg0, eta } = lawOf(options);
  return eta / temperature + (vg0 - vbe) / (vt * temperature);
}

/**
 * Junction voltage at a current: Vbe = VT·ln(I/Is + 1).
 *
 * @param current Forward current (Ic for a transistor), in A; 0 gives 0 V.
 * @param saturationCurrent Is at the same temperature, in A.
 * @param options Temperature.
 * @returns Vbe in V.
 * @throws {RangeError} If `current` is negative or `saturationCurrent` or the temperature is
 *   not positive.
 *
 * @example 1 mA through Is = 1e-14 A at 300 K needs 0.65479 V
 * ```ts
 * import { baseEmitterVoltage } from "./junction.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(baseEmitterVoltage(1e-3, 1e-14) - 0.65479) < 1e-5);
 * ```
 */
export function baseEmitterVoltage(
  current: number,
  saturationCurrent: number,
  options: TemperatureOptions = {},
): number {
  requireFinite("current", current);
  if (current < 0) {
    throw new RangeError(`Expected current to be at least 0 A, but found ${current}`);
  }
  requirePositive("saturationCurrent", saturationCurrent, "A");
  // log1p keeps the "+ 1" meaningful at currents near Is.
  return thermalVoltage(options.temperature ?? DEFAULT_TEMPERATURE) *
    Math.log1p(current / saturationCurrent);
}

/**
 * Change of Vbe for a ratio of currents at one temperature: ΔVbe = VT·ln(ratio).
 *
 * @param ratio Current ratio I2/I1.
 * @param options Temperature.
 * @returns ΔVbe in V: 59.526 mV for a decade at 300 K, 17.919 mV for a factor of 2.
 * @throws {RangeError} If `ratio` or the temperature is not positive.
 *
 * @example A decade of current moves Vbe by 59.526 mV at 300 K
 * ```ts
 * import { vbeChangeForCurrentRatio } from "./junction.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(vbeChangeForCurrentRatio(10) - 0.059526) < 1e-6);
 * ```
 */
export function vbeChangeForCurrentRatio(ratio: number, options: TemperatureOptions = {}): number {
  requirePositive("ratio", ratio);
  return thermalVoltage(options.temperature ?? DEFAULT_TEMPERATURE) * Math.log(ratio);
}

/**
 * Temperature slope of Vbe at a fixed (or T^a) collector current:
 * dVbe/dT = (Vbe − VG0 − (η − a)·VT)/T.
 *
 * @param vbe Base-emitter voltage at `temperature`, in V.
 * @param options Temperature, VG0, η and the current's own exponent a.
 * @returns The slope in V/K (about -2 mV/K).
 * @throws {RangeError} If the temperature or VG0 is not positive.
 * @throws {TypeError} If `vbe` is not a finite number.
 *
 * @example -2.109 mV/K at 0.65 V and 300 K
 * ```ts
 * import { vbeTemperatureSlope } from "./junction.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(vbeTemperatureSlope(0.65) + 2.109e-3) < 1e-6);
 * ```
 */
export function vbeTemperatureSlope(vbe: number, options: VbeSlopeOptions = {}): number {
  requireFinite("vbe", vbe);
  const temperature = options.temperature ?? DEFAULT_TEMPERATURE;
  const vt = thermalVoltage(temperature);
  const { vg0, eta } = lawOf(options);
  const a = options.currentExponent ?? 0;
  requireFinite("currentExponent", a);
  return (vbe - vg0 - (eta - a) * vt) / temperature;
}

/**
 * Vbe at another temperature with the collector current held fixed:
 * Vbe(T) = (T/T0)·Vbe(T0) − VT(T)·ln[Is(T)/Is(T0)].
 *
 * Exact under the Is law (no linearisation), so it also serves far from T0.
 *
 * @param vbe Vbe at `referenceTemperature`, in V.
 * @param options Target and reference temperatures, VG0 and η.
 * @returns Vbe at `temperature`, in V.
 * @throws {RangeError} If a temperature or VG0 is not positive.
 * @throws {TypeError} If `vbe` is not a finite number.
 *
 * @example 0.650 V at 300 K becomes 0.62887 V at 310 K
 * ```ts
 * import { vbeAtTemperature } from "./junction.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(vbeAtTemperature(0.65, { temperature: 310 }) - 0.62887) < 1e-5);
 * ```
 */
export function vbeAtTemperature(vbe: number, options: JunctionTemperatureOptions = {}): number {
  requireFinite("vbe", vbe);
  const temperature = options.temperature ?? DEFAULT_TEMPERATURE;
  const reference = options.referenceTemperature ?? DEFAULT_TEMPERATURE;
  requirePositive("temperature", temperature, "K");
  requirePositive("referenceTemperature", reference, "K");
  const { vg0, eta } = lawOf(options);
  return (temperature / reference) * vbe -
    thermalVoltage(temperature) * logSaturationRatio(temperature, reference, vg0, eta);
}
