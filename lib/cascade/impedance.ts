/**
 * Impedances of resistors, capacitors and inductors at a frequency, and the divider that
 * every stage interface forms.
 *
 * ```
 *   Zout ──┬── (next stage)      factor = Zin / (Zout + Zin)
 *          Zin
 *          │
 *         ─┴─
 * ```
 *
 * @module
 */
import { requireNonNegative, requirePositive } from "../_validate.ts";
import { requirePositiveOrInfinite } from "./_require.ts";
import { parallelRcUnchecked, parallelUnchecked } from "./_fast.ts";
import type { Complex } from "./two_port.ts";

/**
 * Impedance of a capacitor, 1/(jωC).
 *
 * @param capacitance C in F.
 * @param frequency f in Hz.
 * @returns The impedance in Ω (an open circuit, `{re: Infinity, im: 0}`, at 0 Hz).
 * @throws {RangeError} If `capacitance` is not above 0 F or `frequency` is negative.
 *
 * @example 100 nF at 1 kHz is −j1.59 kΩ
 * ```ts
 * import { capacitorImpedance } from "./impedance.ts";
 * import { ok } from "node:assert/strict";
 * const z = capacitorImpedance(100e-9, 1e3);
 * ok(z.re === 0 && Math.abs(z.im + 1591.55) < 0.01);
 * ```
 */
export function capacitorImpedance(capacitance: number, frequency: number): Complex {
  requirePositive("capacitance", capacitance, "F");
  requireNonNegative("frequency", frequency, "Hz");
  if (frequency === 0) return { re: Infinity, im: 0 };
  return { re: 0, im: -1 / (2 * Math.PI * frequency * capacitance) };
}

/**
 * Impedance of an inductor, jωL.
 *
 * @param inductance L in H.
 * @param frequency f in Hz.
 * @returns The impedance in Ω.
 * @throws {RangeError} If `inductance` is negative or `frequency` is negative.
 *
 * @example A 10 µH output coil at 20 kHz
 * ```ts
 * import { inductorImpedance } from "./impedance.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(inductorImpedance(10e-6, 20e3).im - 1.2566) < 1e-4);
 * ```
 */
export function inductorImpedance(inductance: number, frequency: number): Complex {
  requireNonNegative("inductance", inductance, "H");
  requireNonNegative("frequency", frequency, "Hz");
  return { re: 0, im: 2 * Math.PI * frequency * inductance };
}

/**
 * A resistor in parallel with a capacitor, R/(1 + jωRC), computed through the admittance
 * 1/R + jωC so that an infinite R (a gate) or a zero C (no capacitance) both work.
 *
 * @param resistance R in Ω (may be `Infinity`).
 * @param capacitance C in F (may be 0).
 * @param frequency f in Hz.
 * @returns R‖C in Ω.
 * @throws {RangeError} If `resistance` is not above 0 Ω, or `capacitance` or `frequency` is
 * negative.
 *
 * @example 50 kΩ ‖ 100 pF at 50 kHz is 26.85 kΩ ∠ −57.5°
 * ```ts
 * import { rcParallelImpedance } from "./impedance.ts";
 * import { complexAbs, complexArgDegrees } from "./complex.ts";
 * import { ok } from "node:assert/strict";
 * const z = rcParallelImpedance(50e3, 100e-12, 50e3);
 * ok(Math.abs(complexAbs(z) - 26851) < 1);
 * ok(Math.abs(complexArgDegrees(z) + 57.52) < 0.01);
 * ```
 */
export function rcParallelImpedance(
  resistance: number,
  capacitance: number,
  frequency: number,
): Complex {
  requirePositiveOrInfinite("resistance", resistance, "Ω");
  requireNonNegative("capacitance", capacitance, "F");
  requireNonNegative("frequency", frequency, "Hz");
  return parallelRcUnchecked(resistance, capacitance, frequency);
}

/**
 * A resistor in series with a capacitor, R + 1/(jωC).
 *
 * @param resistance R in Ω (may be 0).
 * @param capacitance C in F.
 * @param frequency f in Hz (above 0: the series capacitor blocks DC).
 * @returns The impedance in Ω.
 * @throws {RangeError} If `resistance` is negative, or `capacitance` or `frequency` is not
 * above 0.
 *
 * @example A Zobel network's 10 Ω + 100 nF at 159.15 kHz is 10 − j10 Ω
 * ```ts
 * import { rcSeriesImpedance } from "./impedance.ts";
 * import { ok } from "node:assert/strict";
 * const z = rcSeriesImpedance(10, 100e-9, 1 / (2 * Math.PI * 10 * 100e-9));
 * ok(z.re === 10 && Math.abs(z.im + 10) < 1e-9);
 * ```
 */
export function rcSeriesImpedance(
  resistance: number,
  capacitance: number,
  frequency: number,
): Complex {
  requireNonNegative("resistance", resistance, "Ω");
  requirePositive("capacitance", capacitance, "F");
  requirePositive("frequency", frequency, "Hz");
  return { re: resistance, im: -1 / (2 * Math.PI * frequency * capacitance) };
}

/**
 * Corner frequency of an RC pole, 1/(2πRC).
 *
 * @param resistance R in Ω.
 * @param capacitance C in F.
 * @returns f in Hz.
 * @throws {RangeError} If either value is not above 0.
 *
 * @example 14.29 kΩ with 100 pF sits at 111.4 kHz
 * ```ts
 * import { rcPoleFrequency } from "./impedance.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(rcPoleFrequency(14285.714, 100e-12) - 111408) < 1);
 * ```
 */
export function rcPoleFrequency(resistance: number, capacitance: number): number {
  requirePositive("resistance", resistance, "Ω");
  requirePositive("capacitance", capacitance, "F");
  return 1 / (2 * Math.PI * resistance * capacitance);
}

/**
 * Two resistances in parallel, xy/(x + y); an infinite one leaves the other.
 *
 * @param a First resistance in Ω (≥ 0, may be `Infinity`).
 * @param b Second resistance in Ω (≥ 0, may be `Infinity`).
 * @returns a‖b in Ω.
 * @throws {RangeError} If either value is negative or NaN.
 *
 * @example An active load's 50 kΩ with ro = 40 kΩ
 * ```ts
 * import { parallelResistance } from "./impedance.ts";
 * import { ok, equal } from "node:assert/strict";
 * ok(Math.abs(parallelResistance(50e3, 40e3) - 22222.22) < 0.01);
 * equal(parallelResistance(Infinity, 470), 470);
 * ```
 */
export function parallelResistance(a: number, b: number): number {
  if (!(a >= 0)) throw new RangeError(`Expected a to be at least 0 Ω, but found ${a}`);
  if (!(b >= 0)) throw new RangeError(`Expected b to be at least 0 Ω, but found ${b}`);
  return parallelUnchecked(a, b);
}

/**
 * Loading factor of a resistive interface, Zin/(Zout + Zin): the fraction of a stage's
 * open-circuit output voltage that reaches the next stage.
 *
 * @param outputResistance Driving stage's output resistance in Ω (≥ 0, finite).
 * @param inputResistance Next stage's input resistance in Ω (> 0, may be `Infinity`).
 * @returns The factor, in (0, 1].
 * @throws {RangeError} If `outputResistance` is negative or infinite, or `inputResistance`
 * is not above 0 Ω.
 *
 * @example 10 kΩ into 20 kΩ keeps two thirds
 * ```ts
 * import { loadingFactor } from "./impedance.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(loadingFactor(10e3, 20e3) - 2 / 3) < 1e-12);
 * ```
 */
export function loadingFactor(outputResistance: number, inputResistance: number): number {
  requireNonNegative("outputResistance", outputResistance, "Ω");
  requirePositiveOrInfinite("inputResistance", inputResistance, "Ω");
  return inputResistance === Infinity ? 1 : inputResistance / (outputResistance + inputResistance);
}

/**
 * Loading factor of an interface at one frequency, Zin/(Zout + Zin), complex.
 *
 * @param outputImpedance Driving stage's output impedance in Ω.
 * @param inputImpedance Next stage's input impedance in Ω (an infinite real part means an
 * open input: factor 1).
 * @returns The complex divider ratio.
 *
 * @example 20 kΩ into 50 kΩ ‖ 100 pF at 50 kHz: 0.6517 ∠ −24.17°
 * ```ts
 * import { loadingFactorAt, rcParallelImpedance } from "./impedance.ts";
 * import { complexAbs, complexArgDegrees } from "./complex.ts";
 * import { ok } from "node:assert/strict";
 * const k = loadingFactorAt({ re: 20e3, im: 0 }, rcParallelImpedance(50e3, 100e-12, 50e3));
 * ok(Math.abs(complexAbs(k) - 0.65167) < 1e-5);
 * ok(Math.abs(complexArgDegrees(k) + 24.17) < 0.01);
 * ```
 */
export function loadingFactorAt(outputImpedance: Complex, inputImpedance: Complex): Complex {
  const zi = inputImpedance;
  if (!Number.isFinite(zi.re) || !Number.isFinite(zi.im)) return { re: 1, im: 0 };
  // zi / (zo + zi), divided inline (Smith's scaling) to keep sweeps allocation-light.
  const dr = outputImpedance.re + zi.re;
  const di = outputImpedance.im + zi.im;
  if (Math.abs(dr) >= Math.abs(di)) {
    const r = di / dr;
    const d = dr + di * r;
    return { re: (zi.re + zi.im * r) / d, im: (zi.im - zi.re * r) / d };
  }
  const r = dr / di;
  const d = dr * r + di;
  return { re: (zi.re * r + zi.im) / d, im: (zi.im * r - zi.re) / d };
}
