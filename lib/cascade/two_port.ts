/**
 * The two-port view every stage exposes, so a cascade can join stages with their loading.
 *
 * ```
 *   source ──Zs──┬── stage 1 ──┬── stage 2 ── … ──Zout──┬── load
 *                Zin,1    Avo,1·vin, Zout,1             ZL
 * ```
 *
 * @module
 */

/** A complex number as a plain object (impedances, gains at a frequency). */
export interface Complex {
  /** Real part. */
  re: number;
  /** Imaginary part. */
  im: number;
}

/** A stage's two-port values at one frequency. */
export interface TwoPortAt {
  /** Input impedance in Ω. */
  inputImpedance: Complex;
  /** Open-circuit (unloaded) voltage gain. */
  openCircuitGain: Complex;
  /** Thevenin output impedance in Ω. */
  outputImpedance: Complex;
}

/** Voltage-amplifier two-port of a stage. */
export interface TwoPort {
  /** Short label for tables, e.g. `"input pair"`. */
  name: string;
  /** Mid-band input resistance in Ω (`Infinity` for a gate input). */
  inputResistance: number;
  /** Mid-band open-circuit voltage gain (signed). */
  openCircuitGain: number;
  /** Mid-band output resistance in Ω. */
  outputResistance: number;
  /** Values at `frequency` (Hz); absent when the stage is flat over frequency. */
  at?: (frequency: number) => TwoPortAt;
}

/**
 * A stage's two-port values at `frequency`: its own `at()` when it has one, otherwise the
 * mid-band resistances and gain as complex numbers (a stage that is flat over frequency).
 *
 * @param stage The stage's two-port view.
 * @param frequency f in Hz.
 * @returns Input impedance, open-circuit gain and output impedance at `frequency`.
 *
 * @example A flat stage gives its mid-band values
 * ```ts
 * import { twoPortAt } from "./two_port.ts";
 * import { deepEqual } from "node:assert/strict";
 * const buffer = { name: "buffer", inputResistance: 1e5, openCircuitGain: 0.97, outputResistance: 0.3 };
 * deepEqual(twoPortAt(buffer, 1e3).openCircuitGain, { re: 0.97, im: 0 });
 * ```
 */
export function twoPortAt(stage: TwoPort, frequency: number): TwoPortAt {
  if (stage.at) return stage.at(frequency);
  return {
    inputImpedance: { re: stage.inputResistance, im: 0 },
    openCircuitGain: { re: stage.openCircuitGain, im: 0 },
    outputImpedance: { re: stage.outputResistance, im: 0 },
  };
}
