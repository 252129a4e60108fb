/**
 * Thermal voltage and temperature-scale helpers.
 *
 * @module
 */
import { requirePositive } from "../_validate.ts";
import { BOLTZMANN, CELSIUS_OFFSET, ELEMENTARY_CHARGE } from "./constants.ts";

/**
 * Thermal voltage VT = kT/q.
 *
 * @param temperature Absolute temperature in K.
 * @returns VT in V.
 * @throws {RangeError} If `temperature` is not above 0 K.
 *
 * @example 300 K gives 25.852 mV
 * ```ts
 * import { thermalVoltage } from "./thermal_voltage.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(thermalVoltage(300) - 0.025852) < 1e-6);
 * ```
 */
export function thermalVoltage(temperature: number): number {
  requirePositive("temperature", temperature, "K");
  return (BOLTZMANN * temperature) / ELEMENTARY_CHARGE;
}

/**
 * Converts degrees Celsius to kelvin.
 *
 * @param temperatureC Temperature in °C.
 * @returns Temperature in K.
 * @throws {RangeError} If the result is not above absolute zero.
 *
 * @example
 * ```ts
 * import { kelvin } from "./thermal_voltage.ts";
 * import { equal } from "node:assert/strict";
 * equal(kelvin(25), 298.15);
 * ```
 */
export function kelvin(temperatureC: number): number {
  const temperatureK = temperatureC + CELSIUS_OFFSET;
  requirePositive("temperatureC + 273.15", temperatureK, "K");
  return temperatureK;
}

/**
 * Converts kelvin to degrees Celsius.
 *
 * @param temperatureK Temperature in K.
 * @returns Temperature in °C.
 *
 * @example
 * ```ts
 * import { celsius } from "./thermal_voltage.ts";
 * import { equal } from "node:assert/strict";
 * equal(celsius(300), 26.850000000000023);
 * ```
 */
export function celsius(temperatureK: number): number {
  requirePositive("temperatureK", temperatureK, "K");
  return temperatureK - CELSIUS_OFFSET;
}
