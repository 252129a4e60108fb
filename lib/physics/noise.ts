/**
 * White-noise densities from first principles: thermal (Johnson–Nyquist) noise 4kTR of a
 * resistance [JN28] and shot noise 2qI of a current crossing a junction [Sch18].
 *
 * ```
 *   resistor R at T:   en² = 4kT·R   (V²/Hz)       in² = 4kT/R   (A²/Hz)
 *   current I:         in² = 2q·I    (A²/Hz)
 * ```
 *
 * @module
 */
import { requireNonNegative, requirePositive } from "../_validate.ts";
import { BOLTZMANN, DEFAULT_TEMPERATURE, ELEMENTARY_CHARGE } from "./constants.ts";

/** Options for {@linkcode resistorNoiseDensity} and {@linkcode thermalNoisePower}. */
export interface ResistorNoiseOptions {
  /**
   * Temperature, K.
   * @default {300}
   */
  temperature?: number;
}

/**
 * Thermal noise power density of a resistance, 4kTR in V²/Hz ([JN28]). Noise powers of
 * independent sources add, so sum these before taking the square root.
 *
 * @param resistance R, Ω (≥ 0).
 * @param options Temperature.
 * @returns en² in V²/Hz.
 * @throws {RangeError} If `resistance` is negative or the temperature is not above 0 K.
 * @throws {TypeError} If `resistance` is not a finite number.
 *
 * @example 4kT at 300 K is 1.6568e-20 V²/(Hz·Ω) (REFERENCE E3.11)
 * ```ts
 * import { thermalNoisePower } from "./noise.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(thermalNoisePower(1) / 1.6568e-20 - 1) < 1e-4);
 * ```
 */
export function thermalNoisePower(resistance: number, options: ResistorNoiseOptions = {}): number {
  requireNonNegative("resistance", resistance, "Ω");
  const temperature = options.temperature ?? DEFAULT_TEMPERATURE;
  requirePositive("temperature", temperature, "K");
  return 4 * BOLTZMANN * temperature * resistance;
}

/**
 * Thermal (Johnson–Nyquist) noise voltage density of a resistor, √(4kTR) ([JN28]).
 *
 * @param resistance R, Ω (≥ 0).
 * @param options Temperature.
 * @returns Noise density in V/√Hz.
 * @throws {RangeError} If `resistance` is negative or the temperature is not above 0 K.
 * @throws {TypeError} If `resistance` is not a finite number.
 *
 * @example 1 kΩ at 300 K: 4.070 nV/√Hz (REFERENCE E3.11)
 * ```ts
 * import { resistorNoiseDensity } from "./noise.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(resistorNoiseDensity(1e3) - 4.070e-9) < 1e-12);
 * ```
 */
export function resistorNoiseDensity(
  resistance: number,
  options: ResistorNoiseOptions = {},
): number {
  return Math.sqrt(thermalNoisePower(resistance, options));
}

/**
 * Shot-noise current density of a direct current crossing a barrier (a junction's bias or
 * base current), √(2qI) in A/√Hz ([Sch18]).
 *
 * @param current I, A (≥ 0; the magnitude of the current).
 * @returns in in A/√Hz.
 * @throws {RangeError} If `current` is negative.
 * @throws {TypeError} If `current` is not a finite number.
 *
 * @example 5 µA of base current: 1.266 pA/√Hz (REFERENCE E3.9)
 * ```ts
 * import { shotNoiseDensity } from "./noise.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(shotNoiseDensity(5e-6) - 1.266e-12) < 1e-15);
 * ```
 */
export function shotNoiseDensity(current: number): number {
  requireNonNegative("current", current, "A");
  return Math.sqrt(2 * ELEMENTARY_CHARGE * current);
}
