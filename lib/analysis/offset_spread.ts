/**
 * Offset from mismatch: BJT saturation-current mismatch, MOS threshold mismatch (Pelgrom),
 * and the output offset of a non-inverting feedback amplifier.
 *
 * @module
 */
import { requireFinite, requireNonNegative, requirePositive } from "../_validate.ts";
import { DEFAULT_TEMPERATURE } from "../physics/constants.ts";
import { thermalVoltage } from "../physics/thermal_voltage.ts";

/** Options for {@linkcode saturationCurrentMismatchOffset}. */
export interface SaturationCurrentOffsetOptions {
  /**
   * Junction temperature in K.
   * @default {300}
   */
  temperature?: number;
}

/**
 * Input offset voltage of a BJT pair from saturation-current mismatch: VOS = VT·ln(Is1/Is2)
 * ([SS7] ch. 9, from memory). A 10 % Is spread is VT·ln 1.1 ≈ 2.46 mV at 300 K.
 *
 * @param ratio Is1/Is2, > 0 (1.1 for a device with 10 % more Is).
 * @param options Temperature.
 * @returns VOS in V (positive when Is1 > Is2).
 * @throws {RangeError} If `ratio` or the temperature is not above 0.
 *
 * @example 10 % and 20 % Is mismatch at 300 K: 2.464 mV and 4.713 mV
 * ```ts
 * import { saturationCurrentMismatchOffset } from "./offset_spread.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(saturationCurrentMismatchOffset(1.1) - 2.464e-3) < 1e-6);
 * ok(Math.abs(saturationCurrentMismatchOffset(1.2) - 4.713e-3) < 1e-6);
 * ```
 */
export function saturationCurrentMismatchOffset(
  ratio: number,
  options: SaturationCurrentOffsetOptions = {},
): number {
  requirePositive("ratio", ratio);
  return thermalVoltage(options.temperature ?? DEFAULT_TEMPERATURE) * Math.log(ratio);
}

/** Options for {@linkcode pelgromThresholdMismatch}. */
export interface PelgromOptions {
  /**
   * Matching coefficient A_VT in V·m (5 mV·µm = 5e-9 V·m). It depends on the process (a few
   * mV·µm, smaller for thinner gate oxide): take it from the foundry's matching data.
   */
  coefficient: number;
  /** Gate width W in m. */
  width: number;
  /** Gate length L in m. */
  length: number;
}

/**
 * Standard deviation of the threshold difference between two identical, adjacent MOS
 * transistors (Pelgrom's area law): σ(ΔVt) = A_VT/√(W·L) ([Pelgrom89]; limits in [DM03]).
 * The distance term of the law is left out: it matters only for devices far apart.
 *
 * @param options A_VT, W and L.
 * @returns σ(ΔVt) in V.
 * @throws {RangeError} If a value is not above 0.
 *
 * @example A_VT = 5 mV·µm, 20 µm × 2 µm: 0.79 mV
 * ```ts
 * import { pelgromThresholdMismatch } from "./offset_spread.ts";
 * import { ok } from "node:assert/strict";
 * const sigma = pelgromThresholdMismatch({ coefficient: 5e-9, width: 20e-6, length: 2e-6 });
 * ok(Math.abs(sigma - 0.7906e-3) < 1e-7);
 * ```
 */
export function pelgromThresholdMismatch(options: PelgromOptions): number {
  const { coefficient, width, length } = options;
  requirePositive("coefficient", coefficient, "V·m");
  requirePositive("width", width, "m");
  requirePositive("length", length, "m");
  return coefficient / Math.sqrt(width * length);
}

/** Options for {@linkcode feedbackAmplifierOutputOffset}. */
export interface FeedbackOffsetOptions {
  /**
   * Input offset voltage VOS,in in V (or its σ, to get the σ of the output offset).
   * @default {0}
   */
  inputOffset?: number;
  /**
   * Input bias current IB in A, taken equal at both inputs. Positive when each input pin
   * sources current into its DC resistance; an NPN input stage sinks base current, so give
   * it as negative (the magnitude is what an offset budget needs).
   * @default {0}
   */
  biasCurrent?: number;
  /** DC resistance R₊ from the non-inverting input to ground (the input bias resistor), Ω. */
  plusResistance: number;
  /** Feedback resistor Rf from the output to the inverting input, Ω. */
  feedbackResistance: number;
  /** Resistor Rg from the inverting input to ground, Ω. */
  groundResistance: number;
  /**
   * A capacitor in series with Rg (the usual audio arrangement): DC gain 1, and the
   * inverting input then sees Rf alone at DC.
   * @default {false}
   */
  dcBlocking?: boolean;
}

/** Output offset of a non-inverting feedback amplifier. */
export interface FeedbackOffset {
  /** DC gain G_DC = 1 + Rf/Rg, or 1 with a DC-blocking capacitor. */
  dcGain: number;
  /** DC resistance R₊ at the non-inverting input, Ω. */
  plusResistance: number;
  /** DC resistance R₋ at the inverting input: Rf‖Rg, or Rf with a blocking capacitor, Ω. */
  minusResistance: number;
  /** Offset referred to the input, VOS,in + IB·(R₊ − R₋), V. */
  inputReferredOffset: number;
  /** Output offset VOS,out = G_DC·[VOS,in + IB·(R₊ − R₋)], V. */
  outputOffset: number;
}

/**
 * Output offset of a non-inverting feedback amplifier from input offset voltage and bias
 * current into unequal DC resistances: VOS,out = [VOS,in + IB·(R₊ − R₋)]·G_DC ([SS7] ch. 2,
 * from memory). The cure it points to: match R₊ to R₋, and block DC in the ground leg.
 *
 * ```
 *   in ──┬──(+)
 *        R₊    op ──┬── out
 *        │  ┌─(−)   │
 *       0 V ├──Rf───┘
 *           Rg
 *           ═ (optional DC-blocking capacitor)
 *           0 V
 * ```
 *
 * @param options Offset, bias current, resistances and DC blocking.
 * @returns DC gain, the two DC resistances, and the input- and output-referred offsets.
 * @throws {RangeError} If a resistance is not above 0 Ω (R₊ may be 0).
 *
 * @example σ(VOS,in) = 1.5 mV, Rf = 22 kΩ, Rg = 1 kΩ, no blocking capacitor: σ(out) = 34.5 mV
 * ```ts
 * import { feedbackAmplifierOutputOffset } from "./offset_spread.ts";
 * import { ok } from "node:assert/strict";
 * const offset = feedbackAmplifierOutputOffset({
 *   inputOffset: 1.5e-3,
 *   plusResistance: 0,
 *   feedbackResistance: 22e3,
 *   groundResistance: 1e3,
 * });
 * ok(offset.dcGain === 23);
 * ok(Math.abs(offset.outputOffset - 34.5e-3) < 1e-12);
 * ```
 */
export function feedbackAmplifierOutputOffset(options: FeedbackOffsetOptions): FeedbackOffset {
  const inputOffset = options.inputOffset ?? 0;
  const biasCurrent = options.biasCurrent ?? 0;
  requireFinite("inputOffset", inputOffset);
  requireFinite("biasCurrent", biasCurrent);
  const { plusResistance, feedbackResistance: rf, groundResistance: rg } = options;
  requireNonNegative("plusResistance", plusResistance, "Ω");
  requirePositive("feedbackResistance", rf, "Ω");
  requirePositive("groundResistance", rg, "Ω");
  const blocked = options.dcBlocking ?? false;
  const dcGain = blocked ? 1 : 1 + rf / rg;
  const minusResistance = blocked ? rf : (rf * rg) / (rf + rg);
  const inputReferredOffset = inputOffset + biasCurrent * (plusResistance - minusResistance);
  return {
    dcGain,
    plusResistance,
    minusResistance,
    inputReferredOffset,
    outputOffset: dcGain * inputReferredOffset,
  };
}
