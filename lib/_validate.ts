/**
 * Input validation shared by every stage: one sentence, the parameter's name, the offending
 * value, so the designer knows what to fix.
 *
 * @module
 */

/** Formats a number for an error message: full precision, never rounded away. */
function show(value: unknown): string {
  if (typeof value === "number") return String(value);
  if (typeof value === "string") return JSON.stringify(value);
  return String(value);
}

function unitSuffix(unit: string): string {
  return unit === "" ? "" : ` ${unit}`;
}

/**
 * Throws a `TypeError` unless `value` is a finite number.
 *
 * @param name Parameter name as the caller wrote it, e.g. `"tailCurrent"`.
 * @param value The value to check.
 * @throws {TypeError} If `value` is not a number, or is NaN or infinite.
 *
 * @example Accepts a finite number
 * ```ts
 * import { requireFinite } from "./_validate.ts";
 * requireFinite("loadResistance", 8);
 * ```
 */
export function requireFinite(name: string, value: unknown): asserts value is number {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new TypeError(`Expected ${name} to be a finite number, but found ${show(value)}`);
  }
}

/**
 * Throws unless `value` is a finite number greater than zero.
 *
 * @param name Parameter name.
 * @param value The value to check.
 * @param unit SI unit symbol for the message, e.g. `"A"`.
 * @throws {TypeError} If `value` is not a finite number.
 * @throws {RangeError} If `value <= 0`.
 *
 * @example The message names the parameter and the value
 * ```ts
 * import { requirePositive } from "./_validate.ts";
 * import { throws } from "node:assert/strict";
 * throws(() => requirePositive("tailCurrent", -0.001, "A"), {
 *   message: "Expected tailCurrent to be greater than 0 A, but found -0.001",
 * });
 * ```
 */
export function requirePositive(name: string, value: unknown, unit = ""): asserts value is number {
  requireFinite(name, value);
  if (!(value > 0)) {
    throw new RangeError(
      `Expected ${name} to be greater than 0${unitSuffix(unit)}, but found ${show(value)}`,
    );
  }
}

/**
 * Throws unless `value` is a finite number greater than or equal to zero.
 *
 * @param name Parameter name.
 * @param value The value to check.
 * @param unit SI unit symbol for the message.
 * @throws {TypeError} If `value` is not a finite number.
 * @throws {RangeError} If `value < 0`.
 *
 * @example Zero is allowed
 * ```ts
 * import { requireNonNegative } from "./_validate.ts";
 * requireNonNegative("emitterResistance", 0, "Ω");
 * ```
 */
export function requireNonNegative(
  name: string,
  value: unknown,
  unit = "",
): asserts value is number {
  requireFinite(name, value);
  if (!(value >= 0)) {
    throw new RangeError(
      `Expected ${name} to be at least 0${unitSuffix(unit)}, but found ${show(value)}`,
    );
  }
}

/**
 * Throws unless `min <= value <= max`.
 *
 * @param name Parameter name.
 * @param value The value to check.
 * @param min Smallest allowed value.
 * @param max Largest allowed value.
 * @param unit SI unit symbol for the message.
 * @throws {TypeError} If `value` is not a finite number.
 * @throws {RangeError} If `value` lies outside `[min, max]`.
 *
 * @example A phase angle outside ±90°
 * ```ts
 * import { requireInRange } from "./_validate.ts";
 * import { throws } from "node:assert/strict";
 * throws(() => requireInRange("loadAngle", 2, -Math.PI / 2, Math.PI / 2, "rad"), RangeError);
 * ```
 */
export function requireInRange(
  name: string,
  value: unknown,
  min: number,
  max: number,
  unit = "",
): asserts value is number {
  requireFinite(name, value);
  if (!(value >= min && value <= max)) {
    throw new RangeError(
      `Expected ${name} to be between ${min}${unitSuffix(unit)} and ${max}${
        unitSuffix(unit)
      }, but found ${show(value)}`,
    );
  }
}

/**
 * Throws unless `value` is strictly less than `limit`.
 *
 * @param name Parameter name.
 * @param value The value to check.
 * @param limit Exclusive upper limit.
 * @param limitName How to describe the limit, e.g. `"the positive rail (15 V)"`.
 * @param unit SI unit symbol for the message.
 * @throws {RangeError} If `value >= limit`.
 *
 * @example Inverted rails
 * ```ts
 * import { requireBelow } from "./_validate.ts";
 * import { throws } from "node:assert/strict";
 * throws(() => requireBelow("negativeRail", 15, 15, "positiveRail", "V"), RangeError);
 * ```
 */
export function requireBelow(
  name: string,
  value: unknown,
  limit: number,
  limitName: string,
  unit = "",
): asserts value is number {
  requireFinite(name, value);
  if (!(value < limit)) {
    throw new RangeError(
      `Expected ${name} to be below ${limitName} (${limit}${unitSuffix(unit)}), but found ${
        show(value)
      }`,
    );
  }
}
