/**
 * Slew rate and sine level: the two sides of the full-power bandwidth relation
 * SR = 2π·f·V̂ (REFERENCE E3.8).
 *
 * @module
 */
import { requirePositive } from "../_validate.ts";

/**
 * The slew rate a sine of peak `peak` at `frequency` demands at its zero crossing: 2π·f·V̂.
 *
 * @param peak Peak amplitude V̂, V (> 0).
 * @param frequency Frequency f, Hz (> 0).
 * @returns Slew rate in V/s.
 * @throws {RangeError} If `peak` or `frequency` is not positive.
 *
 * @example 40 V peak at 20 kHz needs 5.027 V/µs
 * ```ts
 * import { sineSlewRate } from "./slew_rate.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(sineSlewRate(40, 20e3) - 5.0265e6) < 100);
 * ```
 */
export function sineSlewRate(peak: number, frequency: number): number {
  requirePositive("peak", peak, "V");
  requirePositive("frequency", frequency, "Hz");
  return 2 * Math.PI * frequency * peak;
}

/**
 * The highest frequency at which a slew-limited amplifier still delivers a full sine of peak
 * `peak` (the full-power bandwidth): SR/(2π·V̂).
 *
 * @param slewRate Slew rate, V/s (> 0).
 * @param peak Peak amplitude V̂, V (> 0).
 * @returns Frequency in Hz.
 * @throws {RangeError} If `slewRate` or `peak` is not positive.
 *
 * @example 10 V/µs at 40 V peak: 39.79 kHz
 * ```ts
 * import { slewLimitedFrequency } from "./slew_rate.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(slewLimitedFrequency(10e6, 40) - 39789) < 1);
 * ```
 */
export function slewLimitedFrequency(slewRate: number, peak: number): number {
  requirePositive("slewRate", slewRate, "V/s");
  requirePositive("peak", peak, "V");
  return slewRate / (2 * Math.PI * peak);
}

// Thermal noise lives with the physics; re-exported here so existing imports keep working.
export { resistorNoiseDensity, type ResistorNoiseOptions } from "../physics/noise.ts";
