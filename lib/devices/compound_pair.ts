/**
 * Current gain of two-transistor compound devices used in output stages.
 *
 * ```
 *   Darlington (same polarity)          complementary feedback pair (opposite polarity)
 *
 *   B ── Q1 base                         B ── Q1 base (NPN driver)
 *        Q1 emitter ── Q2 base                Q1 collector ── Q2 base (PNP)
 *        both collectors ── C                 Q1 emitter + Q2 collector ── "E"
 *        Q2 emitter ── E                      Q2 emitter ── "C"
 * ```
 *
 * @module
 */
import { requirePositive } from "../_validate.ts";

/**
 * Current gain of a Darlington pair: β = β1·β2 + β1 + β2 (about β1·β2).
 *
 * @param beta1 Current gain of the input transistor.
 * @param beta2 Current gain of the output transistor.
 * @returns The compound current gain.
 * @throws {RangeError} If a gain is not positive.
 *
 * @example β1 = 100, β2 = 50
 * ```ts
 * import { darlingtonBeta } from "./compound_pair.ts";
 * import { equal } from "node:assert/strict";
 * equal(darlingtonBeta(100, 50), 5150);
 * ```
 */
export function darlingtonBeta(beta1: number, beta2: number): number {
  requirePositive("beta1", beta1);
  requirePositive("beta2", beta2);
  return beta1 * beta2 + beta1 + beta2;
}

/**
 * Current gain of a complementary feedback pair: β = β1·(1 + β2) (about β1·β2).
 *
 * @param beta1 Current gain of the input (driver) transistor.
 * @param beta2 Current gain of the output transistor of opposite polarity.
 * @returns The compound current gain.
 * @throws {RangeError} If a gain is not positive.
 *
 * @example β1 = 100, β2 = 50
 * ```ts
 * import { complementaryPairBeta } from "./compound_pair.ts";
 * import { equal } from "node:assert/strict";
 * equal(complementaryPairBeta(100, 50), 5100);
 * ```
 */
export function complementaryPairBeta(beta1: number, beta2: number): number {
  requirePositive("beta1", beta1);
  requirePositive("beta2", beta2);
  return beta1 * (1 + beta2);
}
