/**
 * Decibels and the ratios they stand for.
 *
 * A voltage (or current) ratio r is 20·log10|r| dB; a power ratio p is 10·log10 p dB. Gains
 * in the library are plain ratios; these helpers convert only at the edge, for display and
 * for limits written in dB.
 *
 * @module
 */
import { requireFinite, requireNonNegative } from "../_validate.ts";

/**
 * Decibels of a voltage or current ratio: 20·log10|ratio|.
 *
 * The sign of the ratio (an inverting gain) is a phase, not a level, so it is dropped.
 *
 * @param ratio Voltage or current ratio, e.g. a gain of -1547.
 * @returns The level in dB; `-Infinity` for a ratio of 0.
 * @throws {TypeError} If `ratio` is not a finite number.
 *
 * @example A gain of 50 is 33.98 dB; 1/√2 is -3.01 dB
 * ```ts
 * import { voltageRatioToDb } from "./decibels.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(voltageRatioToDb(50) - 33.9794) < 1e-4);
 * ok(Math.abs(voltageRatioToDb(Math.SQRT1_2) + 3.0103) < 1e-4);
 * ```
 */
export function voltageRatioToDb(ratio: number): number {
  requireFinite("ratio", ratio);
  return 20 * Math.log10(Math.abs(ratio));
}

/**
 * Decibels of a power ratio: 10·log10(ratio).
 *
 * @param ratio Power ratio, at least 0.
 * @returns The level in dB; `-Infinity` for a ratio of 0.
 * @throws {RangeError} If `ratio` is negative: a power ratio cannot be.
 * @throws {TypeError} If `ratio` is not a finite number.
 *
 * @example Half the power is -3.01 dB
 * ```ts
 * import { powerRatioToDb } from "./decibels.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(powerRatioToDb(0.5) + 3.0103) < 1e-4);
 * ```
 */
export function powerRatioToDb(ratio: number): number {
  requireNonNegative("ratio", ratio);
  return 10 * Math.log10(ratio);
}

/**
 * The voltage (or current) ratio of a level in dB: 10^(dB/20).
 *
 * @param db Level in dB.
 * @returns The ratio, always positive.
 * @throws {TypeError} If `db` is not a finite number.
 *
 * @example -40 dB is 1 %
 * ```ts
 * import { dbToVoltageRatio } from "./decibels.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(dbToVoltageRatio(-40) - 0.01) < 1e-15);
 * ```
 */
export function dbToVoltageRatio(db: number): number {
  requireFinite("db", db);
  return 10 ** (db / 20);
}

/**
 * The power ratio of a level in dB: 10^(dB/10).
 *
 * @param db Level in dB.
 * @returns The ratio, always positive.
 * @throws {TypeError} If `db` is not a finite number.
 *
 * @example 20 dB is a power ratio of 100
 * ```ts
 * import { dbToPowerRatio } from "./decibels.ts";
 * import { equal } from "node:assert/strict";
 * equal(dbToPowerRatio(20), 100);
 * ```
 */
export function dbToPowerRatio(db: number): number {
  requireFinite("db", db);
  return 10 ** (db / 10);
}
