/**
 * Reading quantities typed by a designer: SI notation ("4.7k", "2.2 µF", "-3 dB") and the
 * RKM code of IEC 60062 ("4K7", "R47", "6n8"), through one entry point.
 *
 * @module
 */
import { PREFIX_EXPONENTS, SCALE_WORDS, UNIT_SYMBOLS, UNPREFIXABLE_UNITS } from "./_prefixes.ts";
import { readRkm } from "./_rkm.ts";
import { QuantitySyntaxError } from "./quantity_syntax_error.ts";

/** Options for {@linkcode parseQuantity} and {@linkcode parseQuantityParts}. */
export interface ParseQuantityOptions {
  /**
   * The unit the caller expects, e.g. `"Ω"` or `"A"`. A unit written in the text must then
   * be this one, and a lone `K` after the number means kelvin rather than kilo when the
   * expected unit is `"K"`. Without it any known unit is accepted.
   * @default {undefined}
   */
  unit?: string;
}

/** A quantity read from text, with what the text said about it. */
export interface ParsedQuantity {
  /** The value in SI base units (a fraction for `%` and `ppm`). */
  value: number;
  /**
   * The unit: as written, else the expected unit, else the one an RKM letter implies
   * (`Ω` for R K M G T, `F` for p n µ m), else `""`.
   */
  unit: string;
  /** Tolerance as a fraction (RKM letter "J" gives 0.05), when the text gave one. */
  tolerance?: number;
  /** Which notation the text used. */
  notation: "si" | "rkm";
}

const SIGNS: ReadonlyMap<string, number> = new Map([["+", 1], ["-", -1], ["−", -1]]);
const NUMBER = /^(\d+(?:\.\d*)?|\.\d+)(?:[eE]([+-]?\d+))?/;
const SPACE = /^[ \u00a0\u2009\u202f]*/;

/**
 * Reads a quantity in SI notation or RKM code and returns its value in SI base units.
 *
 * Accepted forms (surrounding white space is ignored):
 *
 * - SI: a decimal number with an optional exponent, optional space, an optional prefix
 *   (f p n µ/u m k/K M G T) and an optional unit: `"4.7k"`, `"2.2 µF"`, `"10 kΩ"`, `"1e-3 A"`,
 *   `"100n"`. `dB`, `°C` and `°` take no prefix and are returned as written (`"-3 dB"` gives
 *   -3; convert with the decibel helpers). `%`, `ppm`, `%/K` and `ppm/K` scale to a fraction
 *   (`"5 %"` gives 0.05).
 * - RKM (IEC 60062): the multiplier letter stands for the decimal point, with an optional
 *   tolerance letter: `"4K7"`, `"2R2"`, `"R47"`, `"1M0"`, `"100R"`, `"6n8"`, `"4µ7"`,
 *   `"4K7J"`. A letter after a complete value is a tolerance, so `"4K7K"` is 4.7 kΩ ±10 %.
 *   Text that reads the same in both notations (`"10k"`, `"100n"`) is read as SI.
 * - `M` is mega and `m` is milli, in both notations.
 *
 * @param text The text to read, e.g. a `--set tailCurrent=2m` value.
 * @param options The expected unit.
 * @returns The value in SI base units.
 * @throws {QuantitySyntaxError} If the text is not a quantity, or names another unit than
 *   `options.unit`; `column` says where.
 * @throws {RangeError} If the number is too large for a double.
 * @throws {TypeError} If `text` is not a string.
 *
 * @example SI notation and RKM code give the same numbers
 * ```ts
 * import { parseQuantity } from "./parse_quantity.ts";
 * import { equal } from "node:assert/strict";
 * equal(parseQuantity("4.7k"), 4700);
 * equal(parseQuantity("4K7"), 4700);
 * equal(parseQuantity("2.2 µF"), 2.2e-6);
 * equal(parseQuantity("2m", { unit: "A" }), 0.002);
 * equal(parseQuantity("-3 dB"), -3);
 * ```
 *
 * @example Text that does not parse says where
 * ```ts
 * import { parseQuantity } from "./parse_quantity.ts";
 * import { throws } from "node:assert/strict";
 * throws(() => parseQuantity("4.7x"), { name: "QuantitySyntaxError", column: 4 });
 * throws(() => parseQuantity("10 mV", { unit: "A" }), { column: 5 });
 * ```
 */
export function parseQuantity(text: string, options: ParseQuantityOptions = {}): number {
  return parseQuantityParts(text, options).value;
}

/**
 * Reads a quantity like {@linkcode parseQuantity} and also returns its unit, its tolerance
 * (from an RKM tolerance letter) and the notation used.
 *
 * @param text The text to read.
 * @param options The expected unit.
 * @returns Value, unit, tolerance and notation.
 * @throws {QuantitySyntaxError} If the text is not a quantity or names another unit.
 * @throws {RangeError} If the number is too large for a double.
 * @throws {TypeError} If `text` is not a string.
 *
 * @example An RKM code with a tolerance letter
 * ```ts
 * import { parseQuantityParts } from "./parse_quantity.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(parseQuantityParts("4K7J"), {
 *   value: 4700,
 *   unit: "Ω",
 *   tolerance: 0.05,
 *   notation: "rkm",
 * });
 * deepEqual(parseQuantityParts("10 kΩ"), { value: 10000, unit: "Ω", notation: "si" });
 * ```
 */
export function parseQuantityParts(
  text: string,
  options: ParseQuantityOptions = {},
): ParsedQuantity {
  if (typeof text !== "string") {
    throw new TypeError(`Expected text to be a string, but found ${String(text)}`);
  }
  const expected = options.unit === undefined ? undefined : normaliseUnit(options.unit);
  const start = text.length - text.trimStart().length;
  const end = text.trimEnd().length;
  if (start >= end) throw new QuantitySyntaxError(text, 1, "a number");
  let position = start;
  const sign = SIGNS.get(text[position]) ?? 1;
  if (SIGNS.has(text[position])) position += 1;
  const body = text.slice(position, end);

  const rkm = readRkm(body);
  if (rkm !== undefined && rkm.distinctive) {
    if (rkm.unitWritten && expected !== undefined && expected !== "F") {
      const faradIndex = body.search(/F[BCDGJKM]?$/);
      throw new QuantitySyntaxError(text, position + faradIndex + 1, `the unit "${expected}"`);
    }
    const parsed: ParsedQuantity = {
      value: sign * rkm.value,
      unit: expected ?? rkm.unit,
      notation: "rkm",
    };
    if (rkm.tolerance !== undefined) parsed.tolerance = rkm.tolerance;
    return parsed;
  }

  const number = NUMBER.exec(body);
  if (number === null) throw new QuantitySyntaxError(text, position + 1, "a number");
  position += number[0].length;
  position += SPACE.exec(text.slice(position, end))![0].length;
  const suffix = readSuffix(text.slice(position, end), expected);
  if ("errorOffset" in suffix) {
    throw new QuantitySyntaxError(text, position + suffix.errorOffset + 1, suffix.wanted);
  }
  if (expected !== undefined && suffix.unit !== "" && suffix.unit !== expected) {
    throw new QuantitySyntaxError(
      text,
      position + suffix.unitOffset + 1,
      `the unit "${expected}"`,
    );
  }
  const exponent = Number(number[2] ?? "0") + suffix.exponent;
  // Decimal text through Number() rounds once: "2.2µ" is exactly the double 2.2e-6.
  const value = sign * Number(`${number[1]}e${exponent}`);
  if (!Number.isFinite(value)) {
    throw new RangeError(
      `Expected text to give a finite number, but found ${JSON.stringify(text)}`,
    );
  }
  return { value, unit: suffix.unit === "" ? expected ?? "" : suffix.unit, notation: "si" };
}

type Suffix =
  | { exponent: number; unit: string; unitOffset: number }
  | { errorOffset: number; wanted: string };

/** Reads what follows the number: nothing, a unit, a prefix, a prefix and a unit, or a
 * scale word such as `%`. */
function readSuffix(suffix: string, expected: string | undefined): Suffix {
  if (suffix === "") return { exponent: 0, unit: "", unitOffset: 0 };
  if (expected !== undefined && suffix === expected) {
    return { exponent: 0, unit: expected, unitOffset: 0 };
  }
  const scale = SCALE_WORDS.get(suffix);
  if (scale !== undefined) {
    if (expected !== undefined && expected !== scale[1]) {
      return { errorOffset: 0, wanted: `the unit "${expected}"` };
    }
    return { exponent: scale[0], unit: scale[1], unitOffset: 0 };
  }
  const unit = UNIT_SYMBOLS.get(suffix);
  // A lone K is kilo (the RKM habit "10K") unless the caller asked for kelvin above.
  if (unit !== undefined && suffix !== "K") return { exponent: 0, unit, unitOffset: 0 };
  const prefix = PREFIX_EXPONENTS.get(suffix[0]);
  if (prefix === undefined) return { errorOffset: 0, wanted: "an SI prefix or a unit" };
  const rest = suffix.slice(1);
  if (rest === "") return { exponent: prefix, unit: "", unitOffset: 1 };
  const prefixedUnit = rest === expected ? expected : UNIT_SYMBOLS.get(rest);
  if (prefixedUnit === undefined || UNPREFIXABLE_UNITS.has(prefixedUnit)) {
    return { errorOffset: 1, wanted: "a unit that takes an SI prefix" };
  }
  return { exponent: prefix, unit: prefixedUnit, unitOffset: 1 };
}

function normaliseUnit(unit: string): string {
  return UNIT_SYMBOLS.get(unit) ?? unit;
}
