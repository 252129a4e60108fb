/**
 * Unvalidated arithmetic for inner loops whose inputs were validated once, up front.
 *
 * @module
 */
import type { Complex } from "./two_port.ts";

/** R‖C through the admittance 1/R + jωC; R may be Infinity, C may be 0. */
export function parallelRcUnchecked(
  resistance: number,
  capacitance: number,
  frequency: number,
): Complex {
  const g = 1 / resistance;
  // A resistance so small that 1/R overflows is a short in parallel with anything.
  if (g === Infinity) return { re: resistance, im: 0 };
  const b = 2 * Math.PI * frequency * capacitance;
  const d = g * g + b * b;
  if (d === 0) return { re: Infinity, im: 0 };
  return { re: g / d, im: -b / d };
}

/** a‖b for non-negative resistances; Infinity is an open circuit. */
export function parallelUnchecked(a: number, b: number): number {
  if (a === Infinity) return b;
  if (b === Infinity) return a;
  if (a === 0 || b === 0) return 0;
  return (a * b) / (a + b);
}
