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
