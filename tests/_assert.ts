/**
 * Small assertion helpers over `node:assert/strict` (the JSR standard library is not
 * reachable from our machines).
 *
 * @module
 */
import assert from "node:assert/strict";

export { assert };
export const assertEquals: typeof assert.deepEqual = assert.deepEqual;
export const assertThrows: typeof assert.throws = assert.throws;
export const assertRejects: typeof assert.rejects = assert.rejects;

/** Tolerances for {@linkcode assertClose}. */
export interface CloseOptions {
  /** Relative tolerance. @default {1e-3} */
  rtol?: number;
  /** Absolute tolerance, for expected values at or near zero. @default {0} */
  atol?: number;
}

/**
 * Asserts `|actual - expected| <= atol + rtol·|expected|`.
 *
 * @param actual Computed value.
 * @param expected Reference value.
 * @param options Tolerances.
 * @param message Prefix for the failure message (name the source here).
 */
export function assertClose(
  actual: number,
  expected: number,
  options: CloseOptions = {},
  message = "",
): void {
  const rtol = options.rtol ?? 1e-3;
  const atol = options.atol ?? 0;
  const error = Math.abs(actual - expected);
  if (!(error <= atol + rtol * Math.abs(expected))) {
    throw new assert.AssertionError({
      message:
        `${message ? message + ": " : ""}expected ${expected} (rtol ${rtol}, atol ${atol}), ` +
        `but found ${actual} (relative error ${(error / Math.abs(expected)).toExponential(2)})`,
      actual,
      expected,
    });
  }
}
