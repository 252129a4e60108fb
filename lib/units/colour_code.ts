/**
 * The resistor colour code of IEC 60062: bands to value and tolerance, and back.
 *
 * @module
 */
import { requirePositive } from "../_validate.ts";
import { scaleByPowerOfTen } from "./_prefixes.ts";
import { QuantitySyntaxError } from "./quantity_syntax_error.ts";

/** Digit colours, black 0 to white 9. */
const DIGITS: ReadonlyArray<string> = [
  "black",
  "brown",
  "red",
  "orange",
  "yellow",
  "green",
  "blue",
  "violet",
  "grey",
  "white",
];

/** Multiplier band as a power of ten: the digit colours give 10^digit, gold and silver
 * divide. */
const MULTIPLIERS: ReadonlyMap<string, number> = new Map([
  ...DIGITS.map((colour, digit) => [colour, digit] as const),
  ["gold", -1],
  ["silver", -2],
]);

/** Tolerance band as a fraction. */
const TOLERANCES: ReadonlyMap<string, number> = new Map([
  ["brown", 0.01],
  ["red", 0.02],
  ["green", 0.005],
  ["blue", 0.0025],
  ["violet", 0.001],
  ["grey", 0.0005],
  ["gold", 0.05],
  ["silver", 0.1],
]);

/** Spellings folded onto the names above. */
const ALIASES: ReadonlyMap<string, string> = new Map([["gray", "grey"], ["purple", "violet"]]);

/**
 * Tolerance of a resistor marked with no tolerance band (three bands).
 *
 * Common practice, no source: the old marking left the band off for ±20 % parts.
 */
const UNMARKED_TOLERANCE = 0.2;

/** What a set of colour bands says. */
export interface ColourBandReading {
  /** Resistance in Ω. */
  value: number;
  /** Tolerance as a fraction (gold = 0.05; 0.2 when there is no tolerance band). */
  tolerance: number;
}

/**
 * Decodes the colour bands of a resistor, read from the end opposite the tolerance band.
 *
 * Three bands: two digits and a multiplier (±20 %). Four bands: two digits, multiplier,
 * tolerance. Five bands: three digits, multiplier, tolerance. Colours are the IEC 60062 names
 * in any case; "gray" and "purple" are accepted for grey and violet.
 *
 * @param bands The colours, as an array or as one string separated by hyphens, commas or
 *   spaces: `"brown-black-red-gold"`.
 * @returns Resistance and tolerance.
 * @throws {QuantitySyntaxError} If a band is not a colour that may stand there, or there are
 *   not three to five bands. For an array, `column` counts in the bands joined by hyphens.
 *
 * @example Brown-black-red-gold is 1 kΩ ±5 %
 * ```ts
 * import { decodeColourBands } from "./colour_code.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(decodeColourBands("brown-black-red-gold"), { value: 1000, tolerance: 0.05 });
 * deepEqual(decodeColourBands(["yellow", "violet", "black", "brown", "brown"]), {
 *   value: 4700,
 *   tolerance: 0.01,
 * });
 * ```
 */
export function decodeColourBands(bands: string | readonly string[]): ColourBandReading {
  const text = typeof bands === "string" ? bands : bands.join("-");
  const found = [...text.matchAll(/[^\s,\-]+/g)].map((match) => ({
    colour: ALIASES.get(match[0].toLowerCase()) ?? match[0].toLowerCase(),
    column: match.index + 1,
  }));
  if (found.length < 3 || found.length > 5) {
    throw new QuantitySyntaxError(
      text,
      found.length > 5 ? found[5].column : text.length + 1,
      `3 to 5 colour bands (found ${found.length})`,
    );
  }
  const digitCount = found.length === 5 ? 3 : 2;
  let significand = 0;
  for (const { colour, column } of found.slice(0, digitCount)) {
    const digit = DIGITS.indexOf(colour);
    if (digit < 0) throw new QuantitySyntaxError(text, column, "a digit colour (black to white)");
    significand = significand * 10 + digit;
  }
  const multiplierBand = found[digitCount];
  const exponent = MULTIPLIERS.get(multiplierBand.colour);
  if (exponent === undefined) {
    throw new QuantitySyntaxError(
      text,
      multiplierBand.column,
      "a multiplier colour (black to white, gold, silver)",
    );
  }
  let tolerance = UNMARKED_TOLERANCE;
  const toleranceBand = found[digitCount + 1];
  if (toleranceBand !== undefined) {
    const marked = TOLERANCES.get(toleranceBand.colour);
    if (marked === undefined) {
      throw new QuantitySyntaxError(
        text,
        toleranceBand.column,
        "a tolerance colour (brown, red, green, blue, violet, grey, gold, silver)",
      );
    }
    tolerance = marked;
  }
  return { value: scaleByPowerOfTen(significand, exponent), tolerance };
}

/** Options for {@linkcode encodeColourBands}. */
export interface EncodeColourBandsOptions {
  /**
   * Tolerance as a fraction; it must have a colour.
   * @default {0.05 for four bands, 0.01 for five}
   */
  tolerance?: number;
  /**
   * Four bands (two digits) or five (three digits).
   * @default {4}
   */
  bands?: 4 | 5;
}

/**
 * Writes a resistance as colour bands, the inverse of {@linkcode decodeColourBands}.
 *
 * @param value Resistance in Ω.
 * @param options Tolerance and band count.
 * @returns Colour names, first digit first.
 * @throws {RangeError} If the value needs more significant digits than the bands hold, its
 *   multiplier is outside silver (×0.01) to white (×10⁹), or the tolerance has no colour.
 *
 * @example 1 kΩ ±5 % and 4.7 kΩ ±1 %
 * ```ts
 * import { encodeColourBands } from "./colour_code.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(encodeColourBands(1000), ["brown", "black", "red", "gold"]);
 * deepEqual(encodeColourBands(4700, { bands: 5 }), ["yellow", "violet", "black", "brown", "brown"]);
 * ```
 */
export function encodeColourBands(value: number, options: EncodeColourBandsOptions = {}): string[] {
  requirePositive("value", value, "Ω");
  const bandCount = options.bands ?? 4;
  if (bandCount !== 4 && bandCount !== 5) {
    throw new RangeError(`Expected bands to be 4 or 5, but found ${bandCount}`);
  }
  const digitCount = bandCount - 2;
  const tolerance = options.tolerance ?? (bandCount === 4 ? 0.05 : 0.01);
  const toleranceColour = [...TOLERANCES].find(([, t]) => Math.abs(t - tolerance) <= 1e-12)?.[0];
  if (toleranceColour === undefined) {
    throw new RangeError(`Expected tolerance to have a colour band, but found ${tolerance}`);
  }
  let exponent = Math.floor(Math.log10(value)) - (digitCount - 1);
  let significand = Math.round(scaleByPowerOfTen(value, -exponent));
  if (significand >= 10 ** digitCount) {
    significand = Math.round(significand / 10);
    exponent += 1;
  }
  if (exponent < -2) {
    // Below the silver multiplier a leading black band still marks it: 0.05 Ω = 0-5-silver.
    exponent = -2;
    significand = Math.round(scaleByPowerOfTen(value, 2));
  }
  if (Math.abs(scaleByPowerOfTen(significand, exponent) - value) > 1e-9 * value) {
    throw new RangeError(
      `Expected value to have at most ${digitCount} significant digits for ${bandCount} bands, ` +
        `but found ${value}`,
    );
  }
  const multiplier = [...MULTIPLIERS].find(([, e]) => e === exponent)?.[0];
  if (multiplier === undefined) {
    throw new RangeError(
      `Expected value to need a multiplier from ×0.01 to ×1e9 with ${bandCount} bands, ` +
        `but found ${value}`,
    );
  }
  const digits = String(significand).padStart(digitCount, "0").split("").map(Number);
  return [...digits.map((digit) => DIGITS[digit]), multiplier, toleranceColour];
}
