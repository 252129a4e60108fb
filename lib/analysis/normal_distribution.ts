/**
 * The standard normal distribution: cumulative probability and its inverse (the z value of a
 * fractile), for closed-form tolerance statistics such as "CMRR at the 5th percentile".
 *
 * @module
 */
import { requireFinite } from "../_validate.ts";

const INV_SQRT_2PI = 1 / Math.sqrt(2 * Math.PI);

function density(x: number): number {
  return INV_SQRT_2PI * Math.exp(-0.5 * x * x);
}

// Upper tail Q(t) = 1 − Φ(t) for t ≥ 0, accurate in relative terms far into the tail.
function upperTail(t: number): number {
  if (t < 5) {
    // Taylor series Φ(t) = ½ + φ(t)·(t + t³/3 + t⁵/(3·5) + …), all terms positive, so it
    // converges without cancellation (G. Marsaglia, "Evaluating the normal distribution",
    // J. Statistical Software 11(4), 2004). At t < 5 the subtraction 1 − Φ keeps ≥ 9 digits.
    let term = t;
    let sum = t;
    const square = t * t;
    for (let k = 3; sum + term !== sum; k += 2) {
      term *= square / k;
      sum += term;
    }
    return 0.5 - density(t) * sum;
  }
  // Laplace's continued fraction Q(t) = φ(t)/(t + 1/(t + 2/(t + 3/(t + …)))), evaluated from
  // the tail end; at t ≥ 5, 60 levels are far more than double precision needs.
  let fraction = t;
  for (let k = 60; k >= 1; k--) fraction = t + k / fraction;
  return density(t) / fraction;
}

/**
 * Cumulative probability of the standard normal distribution, Φ(x) = P(Z ≤ x).
 *
 * @param x The z value.
 * @returns Φ(x), from 0 to 1; small results keep their relative accuracy.
 * @throws {TypeError} If `x` is NaN.
 *
 * @example Φ(1.959964) ≈ 0.975
 * ```ts
 * import { standardNormalCdf } from "./normal_distribution.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(standardNormalCdf(1.959964) - 0.975) < 1e-7);
 * ok(standardNormalCdf(0) === 0.5);
 * ```
 */
export function standardNormalCdf(x: number): number {
  if (typeof x !== "number" || Number.isNaN(x)) {
    throw new TypeError(`Expected x to be a number, but found ${x}`);
  }
  if (x === Infinity) return 1;
  if (x === -Infinity) return 0;
  return x >= 0 ? 1 - upperTail(x) : upperTail(-x);
}

/**
 * The z value below which a standard normal variable falls with probability p: Φ⁻¹(p).
 *
 * Starts from a rational approximation good to about 4.5·10⁻⁴ (C. Hastings, as given in
 * Abramowitz & Stegun 26.2.23, from memory) and polishes it with Halley steps on
 * {@linkcode standardNormalCdf}, to close to double precision.
 *
 * @param p Probability, strictly between 0 and 1.
 * @returns z with Φ(z) = p.
 * @throws {RangeError} If `p` is not strictly between 0 and 1.
 *
 * @example The two-sided 95 % point and the median of |Z|
 * ```ts
 * import { standardNormalQuantile } from "./normal_distribution.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(standardNormalQuantile(0.975) - 1.959964) < 1e-6);
 * ok(Math.abs(standardNormalQuantile(0.75) - 0.674490) < 1e-6);
 * ```
 */
export function standardNormalQuantile(p: number): number {
  requireFinite("p", p);
  if (!(p > 0 && p < 1)) {
    throw new RangeError(`Expected p to be between 0 and 1 (exclusive), but found ${p}`);
  }
  if (p === 0.5) return 0;
  // Work in the lower tail, where Φ is small and keeps its relative precision.
  const tail = p < 0.5 ? p : 1 - p;
  const t = Math.sqrt(-2 * Math.log(tail));
  let z = -(t - (2.515517 + 0.802853 * t + 0.010328 * t * t) /
      (1 + 1.432788 * t + 0.189269 * t * t + 0.001308 * t * t * t));
  for (let step = 0; step < 4; step++) {
    const u = (standardNormalCdf(z) - tail) / density(z);
    // Halley: Φ'' = −zφ, so the correction is u/(1 + z·u/2).
    const next = z - u / (1 + (z * u) / 2);
    if (next === z) break;
    z = next;
  }
  return p < 0.5 ? z : -z;
}
