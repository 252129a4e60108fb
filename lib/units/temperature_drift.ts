/**
 * How far a component's value moves with temperature, from its temperature coefficient.
 *
 * @module
 */
import { requireFinite } from "../_validate.ts";

/** Options for {@linkcode temperatureDrift}. */
export interface TemperatureDriftOptions {
  /** Temperature coefficient as a fraction per kelvin: +100 ppm/K is `100e-6`. */
  coefficient: number;
  /** Temperature change in K (a rise is positive). */
  temperatureChange: number;
}

/** A value before and after a temperature change. */
export interface TemperatureDrift {
  /** Change of the value, in its unit: R·TCR·ΔT. */
  change: number;
  /** The value after the change: R·(1 + TCR·ΔT). */
  value: number;
  /** The change as a fraction of the nominal value: TCR·ΔT. */
  relativeChange: number;
}

/**
 * The linear temperature drift of a component: ΔR = R·TCR·ΔT.
 *
 * Linear in ΔT, as catalogue TCRs are specified; self-heating is the caller's ΔT.
 *
 * @param nominal The value at the reference temperature (Ω, F, …).
 * @param options Temperature coefficient and temperature change.
 * @returns Change, new value and relative change.
 * @throws {TypeError} If an input is not a finite number.
 *
 * @example 10 kΩ at +100 ppm/K warmed by 50 K moves by 50 Ω
 * ```ts
 * import { temperatureDrift } from "./temperature_drift.ts";
 * import { ok } from "node:assert/strict";
 * const drift = temperatureDrift(10e3, { coefficient: 100e-6, temperatureChange: 50 });
 * ok(Math.abs(drift.change - 50) < 1e-9);
 * ```
 */
export function temperatureDrift(
  nominal: number,
  options: TemperatureDriftOptions,
): TemperatureDrift {
  requireFinite("nominal", nominal);
  requireFinite("coefficient", options.coefficient);
  requireFinite("temperatureChange", options.temperatureChange);
  const relativeChange = options.coefficient * options.temperatureChange;
  return {
    change: nominal * relativeChange,
    value: nominal * (1 + relativeChange),
    relativeChange,
  };
}
