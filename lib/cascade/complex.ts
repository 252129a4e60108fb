/**
 * Complex arithmetic on the plain `Complex {re, im}` objects the cascade passes around
 * (impedances and gains at one frequency).
 *
 * These helpers do no validation and follow IEEE arithmetic (a zero divisor gives NaN or
 * infinite parts), because sweeps call them in inner loops.
 *
 * @module
 */
import type { Complex } from "./two_port.ts";

const DEGREES_PER_RADIAN = 180 / Math.PI;

/**
 * Makes a complex number.
 *
 * @param re Real part.
 * @param im Imaginary part; 0 when left out.
 * @returns `{ re, im }`.
 *
 * @example A purely real impedance
 * ```ts
 * import { complex } from "./complex.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(complex(8), { re: 8, im: 0 });
 * ```
 */
export function complex(re: number, im = 0): Complex {
  return { re, im };
}

/**
 * Adds two complex numbers.
 *
 * @param a First term.
 * @param b Second term.
 * @returns a + b.
 *
 * @example Series impedances add
 * ```ts
 * import { complexAdd } from "./complex.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(complexAdd({ re: 100, im: 0 }, { re: 0, im: -50 }), { re: 100, im: -50 });
 * ```
 */
export function complexAdd(a: Complex, b: Complex): Complex {
  return { re: a.re + b.re, im: a.im + b.im };
}

/**
 * Subtracts one complex number from another.
 *
 * @param a Minuend.
 * @param b Subtrahend.
 * @returns a − b.
 *
 * @example
 * ```ts
 * import { complexSub } from "./complex.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(complexSub({ re: 3, im: 4 }, { re: 1, im: 1 }), { re: 2, im: 3 });
 * ```
 */
export function complexSub(a: Complex, b: Complex): Complex {
  return { re: a.re - b.re, im: a.im - b.im };
}

/**
 * Multiplies two complex numbers (magnitudes multiply, phases add).
 *
 * @param a First factor.
 * @param b Second factor.
 * @returns a · b.
 *
 * @example j · j = −1
 * ```ts
 * import { complexMul } from "./complex.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(complexMul({ re: 0, im: 1 }, { re: 0, im: 1 }), { re: -1, im: 0 });
 * ```
 */
export function complexMul(a: Complex, b: Complex): Complex {
  return { re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re };
}

/**
 * Divides two complex numbers, scaling by the larger part of the divisor so that very large
 * or very small impedances do not overflow on the way.
 *
 * @param a Dividend.
 * @param b Divisor.
 * @returns a / b (NaN or infinite parts when `b` is zero).
 *
 * @example 1 / j = −j
 * ```ts
 * import { complexDiv } from "./complex.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(complexDiv({ re: 1, im: 0 }, { re: 0, im: 1 }), { re: 0, im: -1 });
 * ```
 */
export function complexDiv(a: Complex, b: Complex): Complex {
  if (Math.abs(b.re) >= Math.abs(b.im)) {
    const r = b.im / b.re;
    const d = b.re + b.im * r;
    return { re: (a.re + a.im * r) / d, im: (a.im - a.re * r) / d };
  }
  const r = b.re / b.im;
  const d = b.re * r + b.im;
  return { re: (a.re * r + a.im) / d, im: (a.im * r - a.re) / d };
}

/**
 * Multiplies a complex number by a real one.
 *
 * @param a The complex number.
 * @param factor Real factor.
 * @returns factor · a.
 *
 * @example
 * ```ts
 * import { complexScale } from "./complex.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(complexScale({ re: 1, im: -2 }, 3), { re: 3, im: -6 });
 * ```
 */
export function complexScale(a: Complex, factor: number): Complex {
  return { re: a.re * factor, im: a.im * factor };
}

/**
 * The reciprocal 1/a (an impedance's admittance).
 *
 * @param a The complex number.
 * @returns 1 / a.
 *
 * @example
 * ```ts
 * import { complexInverse } from "./complex.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(complexInverse({ re: 0, im: 2 }), { re: 0, im: -0.5 });
 * ```
 */
export function complexInverse(a: Complex): Complex {
  return complexDiv({ re: 1, im: 0 }, a);
}

/**
 * Magnitude |a|.
 *
 * @param a The complex number.
 * @returns √(re² + im²), computed without overflow.
 *
 * @example
 * ```ts
 * import { complexAbs } from "./complex.ts";
 * import { equal } from "node:assert/strict";
 * equal(complexAbs({ re: 3, im: 4 }), 5);
 * ```
 */
export function complexAbs(a: Complex): number {
  return Math.hypot(a.re, a.im);
}

/**
 * Angle of a complex number in radians, in (−π, π].
 *
 * @param a The complex number.
 * @returns atan2(im, re) in rad.
 *
 * @example
 * ```ts
 * import { complexArg } from "./complex.ts";
 * import { equal } from "node:assert/strict";
 * equal(complexArg({ re: 0, im: 1 }), Math.PI / 2);
 * ```
 */
export function complexArg(a: Complex): number {
  return Math.atan2(a.im, a.re);
}

/**
 * Angle of a complex number in degrees, in (−180°, 180°].
 *
 * @param a The complex number.
 * @returns The angle in °.
 *
 * @example An inverting gain sits at 180°
 * ```ts
 * import { complexArgDegrees } from "./complex.ts";
 * import { equal } from "node:assert/strict";
 * equal(complexArgDegrees({ re: -1547, im: 0 }), 180);
 * ```
 */
export function complexArgDegrees(a: Complex): number {
  return Math.atan2(a.im, a.re) * DEGREES_PER_RADIAN;
}

/**
 * Magnitude in decibels, 20·log10|a| (for voltage gains and divider ratios).
 *
 * @param a The complex number.
 * @returns 20·log10|a| in dB (−∞ for zero).
 *
 * @example A divider of one half is −6.02 dB
 * ```ts
 * import { complexDb } from "./complex.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(complexDb({ re: 0.5, im: 0 }) + 6.0206) < 1e-4);
 * ```
 */
export function complexDb(a: Complex): number {
  return 20 * Math.log10(Math.hypot(a.re, a.im));
}

/**
 * Two impedances in parallel, a‖b = ab/(a + b). An infinite impedance (an open circuit)
 * leaves the other one; two zeros give zero.
 *
 * @param a First impedance in Ω.
 * @param b Second impedance in Ω.
 * @returns a‖b in Ω.
 *
 * @example 20 kΩ ‖ 50 kΩ
 * ```ts
 * import { complexParallel } from "./complex.ts";
 * import { ok } from "node:assert/strict";
 * const z = complexParallel({ re: 20e3, im: 0 }, { re: 50e3, im: 0 });
 * ok(Math.abs(z.re - 14285.714) < 1e-3 && z.im === 0);
 * ```
 */
export function complexParallel(a: Complex, b: Complex): Complex {
  if (!Number.isFinite(a.re) || !Number.isFinite(a.im)) return { re: b.re, im: b.im };
  if (!Number.isFinite(b.re) || !Number.isFinite(b.im)) return { re: a.re, im: a.im };
  const sum = { re: a.re + b.re, im: a.im + b.im };
  if (sum.re === 0 && sum.im === 0) {
    // Both zero: a short stays a short. Otherwise a lossless L‖C at resonance: open.
    return a.re === 0 && a.im === 0 ? { re: 0, im: 0 } : { re: Infinity, im: 0 };
  }
  return complexDiv(complexMul(a, b), sum);
}

/** Options for {@linkcode complexFromPolar}. */
export interface FromPolarOptions {
  /**
   * Unit of the angle.
   * @default {"rad"}
   */
  angleUnit?: "rad" | "deg";
}

/**
 * Builds a complex number from magnitude and angle.
 *
 * @param magnitude |z|.
 * @param angle Angle, in radians unless `angleUnit` says degrees.
 * @param options Angle unit.
 * @returns magnitude · e^(j·angle).
 *
 * @example 2∠90°
 * ```ts
 * import { complexFromPolar } from "./complex.ts";
 * import { ok } from "node:assert/strict";
 * const z = complexFromPolar(2, 90, { angleUnit: "deg" });
 * ok(Math.abs(z.re) < 1e-15 && z.im === 2);
 * ```
 */
export function complexFromPolar(
  magnitude: number,
  angle: number,
  options: FromPolarOptions = {},
): Complex {
  const radians = options.angleUnit === "deg" ? angle / DEGREES_PER_RADIAN : angle;
  return { re: magnitude * Math.cos(radians), im: magnitude * Math.sin(radians) };
}
