/**
 * The RKM code of IEC 60062: component values printed with the multiplier letter in place of
 * the decimal point ("4K7", "R47", "6n8"), plus an optional tolerance letter.
 *
 * @module
 */
import { requireFinite, requirePositive } from "../_validate.ts";
import { scaleByPowerOfTen } from "./_prefixes.ts";
import { readRkm, TOLERANCE_LETTERS } from "./_rkm.ts";
import { QuantitySyntaxError } from "./quantity_syntax_error.ts";

/** A value read from an RKM code. */
export interface RkmValue {
  /** The value in Ω or F. */
  value: number;
  /** `"Ω"` for the letters R K M G T, `"F"` for p n µ (u) m. */
  unit: "Ω" | "F";
  /** Tolerance as a fraction (J = 0.05), when the code carried a tolerance letter. */
  tolerance?: number;
}

/**
 * The IEC 60062 tolerance letters and the tolerance each stands for, as a fraction.
 *
 * @example J is ±5 %
 * ```ts
 * import { RKM_TOLERANCE_LETTERS } from "./rkm_code.ts";
 * import { equal } from "node:assert/strict";
 * equal(RKM_TOLERANCE_LETTERS.get("J"), 0.05);
 * ```
 */
export const RKM_TOLERANCE_LETTERS: ReadonlyMap<string, number> = TOLERANCE_LETTERS;

/**
 * Reads an RKM code: digits, a multiplier letter standing for the decimal point, more
 * digits, and an optional tolerance letter.
 *
 * Multiplier letters: R (×1), K or k (×10³), M (×10⁶), G (×10⁹), T (×10¹²) for resistors;
 * p, n, µ or u, m for capacitors (a trailing `F` after these is the unit). Tolerance letters:
 * B C D F G J K M (±0.1 % … ±20 %). Because K is both kilo and ±10 %, a K after a complete
 * value is the tolerance: "4K7K" is 4.7 kΩ ±10 %, "10KK" is 10 kΩ ±10 %.
 *
 * @param text The code, e.g. `"4K7J"`; surrounding white space is ignored.
 * @returns The value, its unit and its tolerance.
 * @throws {QuantitySyntaxError} If the text is not an RKM code.
 *
 * @example Resistors, capacitors and a tolerance letter
 * ```ts
 * import { parseRkm } from "./rkm_code.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(parseRkm("4K7"), { value: 4700, unit: "Ω" });
 * deepEqual(parseRkm("R47"), { value: 0.47, unit: "Ω" });
 * deepEqual(parseRkm("6n8"), { value: 6.8e-9, unit: "F" });
 * deepEqual(parseRkm("4K7K"), { value: 4700, unit: "Ω", tolerance: 0.1 });
 * ```
 */
export function parseRkm(text: string): RkmValue {
  if (typeof text !== "string") {
    throw new TypeError(`Expected text to be a string, but found ${String(text)}`);
  }
  const start = text.length - text.trimStart().length;
  const reading = readRkm(text.trim());
  if (reading === undefined) {
    const body = text.trim();
    // Point at the first character after the leading digits: that is where a code breaks.
    const digits = /^\d*/.exec(body)![0].length;
    const column = body === "" ? 1 : start + Math.min(digits, body.length - 1) + 1;
    throw new QuantitySyntaxError(
      text,
      column,
      "an RKM code such as 4K7, R47 or 6n8 (digits, a letter R K M G T p n µ m, digits, " +
        "an optional tolerance letter)",
    );
  }
  const result: RkmValue = { value: reading.value, unit: reading.unit as "Ω" | "F" };
  if (reading.tolerance !== undefined) result.tolerance = reading.tolerance;
  return result;
}

/** Options for {@linkcode formatRkm}. */
export interface FormatRkmOptions {
  /**
   * Which letters to use: resistor letters R K M G T, or capacitor letters p n µ m.
   * @default {"Ω"}
   */
  unit?: "Ω" | "F";
  /**
   * Significant digits kept.
   * @default {3}
   */
  digits?: number;
  /**
   * Tolerance to append as its letter, as a fraction (0.05 → "J").
   * @default {undefined}
   */
  tolerance?: number;
  /**
   * Write `u` instead of `µ` for capacitors, for plain-ASCII parts lists.
   * @default {false}
   */
  ascii?: boolean;
}

const RESISTOR_STEPS: ReadonlyArray<readonly [number, string]> = [
  [12, "T"],
  [9, "G"],
  [6, "M"],
  [3, "K"],
  [0, "R"],
];
const CAPACITOR_STEPS: ReadonlyArray<readonly [number, string]> = [
  [-3, "m"],
  [-6, "µ"],
  [-9, "n"],
  [-12, "p"],
];

/**
 * Writes a value as an RKM code: 4700 Ω → "4K7", 0.47 Ω → "R47", 6.8 nF → "6n8".
 *
 * A single integer digit gets a trailing 0 so the code cannot be misread ("1M0", "2R0");
 * longer integers stand alone ("10K", "100R").
 *
 * @param value Resistance in Ω or capacitance in F.
 * @param options Letters, digits, tolerance letter.
 * @returns The code.
 * @throws {RangeError} If `value` is not positive, is beyond the letters (1000 TΩ and 1 F
 *   upwards, below 1 mΩ or 1 fF), or `tolerance` has no letter.
 *
 * @example Round trips of the IEC 60062 examples
 * ```ts
 * import { formatRkm } from "./rkm_code.ts";
 * import { equal } from "node:assert/strict";
 * equal(formatRkm(4700), "4K7");
 * equal(formatRkm(1e6), "1M0");
 * equal(formatRkm(100), "100R");
 * equal(formatRkm(0.47), "R47");
 * equal(formatRkm(6.8e-9, { unit: "F" }), "6n8");
 * equal(formatRkm(4700, { tolerance: 0.05 }), "4K7J");
 * ```
 */
export function formatRkm(value: number, options: FormatRkmOptions = {}): string {
  requirePositive("value", value, options.unit ?? "Ω");
  const unit = options.unit ?? "Ω";
  const digits = options.digits ?? 3;
  requireFinite("digits", digits);
  if (!Number.isInteger(digits) || digits < 1 || digits > 15) {
    throw new RangeError(`Expected digits to be an integer from 1 to 15, but found ${digits}`);
  }
  const rounded = Number(value.toPrecision(digits));
  const steps = unit === "F" ? CAPACITOR_STEPS : RESISTOR_STEPS;
  const top = steps[0][0] + 3;
  if (rounded >= 10 ** top) {
    throw new RangeError(
      `Expected value to be below ${10 ** top} ${unit} for an RKM code, but found ${value}`,
    );
  }
  const [exponent, letter] = steps.find(([e]) => rounded >= 10 ** e) ?? steps[steps.length - 1];
  if (rounded < 10 ** (exponent - 3)) {
    throw new RangeError(
      `Expected value to be at least ${10 ** (exponent - 3)} ${unit} for an RKM code, ` +
        `but found ${value}`,
    );
  }
  const mantissa = scaleByPowerOfTen(rounded, -exponent);
  let [whole, fraction = ""] = String(Number(mantissa.toPrecision(digits))).split(".");
  if (whole === "0") whole = "";
  if (fraction === "" && whole.length === 1) fraction = "0";
  const shown = letter === "µ" && options.ascii ? "u" : letter;
  return `${whole}${shown}${fraction}${toleranceLetter(options.tolerance)}`;
}

function toleranceLetter(tolerance: number | undefined): string {
  if (tolerance === undefined) return "";
  for (const [letter, value] of TOLERANCE_LETTERS) {
    if (Math.abs(value - tolerance) <= 1e-12) return letter;
  }
  throw new RangeError(
    `Expected tolerance to be one of ${
      [...TOLERANCE_LETTERS.values()].join(", ")
    } for an RKM letter, but found ${tolerance}`,
  );
}
