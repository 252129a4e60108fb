/**
 * Validators the shared `lib/_validate.ts` does not have: resistances that may be infinite
 * (an open circuit, an ideal current-source load, a gate input).
 *
 * @module
 */

/**
 * Throws a `RangeError` unless `value` is greater than zero; `Infinity` is allowed.
 *
 * @param name Parameter name.
 * @param value The value to check.
 * @param unit SI unit symbol for the message.
 * @throws {TypeError} If `value` is not a number or is NaN.
 * @throws {RangeError} If `value <= 0`.
 */
export function requirePositiveOrInfinite(
  name: string,
  value: unknown,
  unit: string,
): asserts value is number {
  if (typeof value !== "number" || Number.isNaN(value)) {
    throw new TypeError(`Expected ${name} to be a number, but found ${String(value)}`);
  }
  if (!(value > 0)) {
    throw new RangeError(`Expected ${name} to be greater than 0 ${unit}, but found ${value}`);
  }
}
