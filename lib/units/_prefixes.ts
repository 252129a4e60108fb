/**
 * SI prefixes and unit symbols as the parsers read them (private to `units/`).
 *
 * @module
 */

/**
 * Prefix letters a designer types, as powers of ten. `u` stands in for `µ` on a plain
 * keyboard and capital `K` is the kilo of the RKM code.
 */
export const PREFIX_EXPONENTS: ReadonlyMap<string, number> = new Map([
  ["f", -15],
  ["p", -12],
  ["n", -9],
  ["u", -6],
  ["µ", -6], // U+00B5 MICRO SIGN
  ["μ", -6], // U+03BC GREEK SMALL LETTER MU, which many keyboards produce instead
  ["m", -3],
  ["k", 3],
  ["K", 3],
  ["M", 6],
  ["G", 9],
  ["T", 12],
]);

/** Unit spellings the parsers accept, mapped to the symbol the library reports. */
export const UNIT_SYMBOLS: ReadonlyMap<string, string> = new Map([
  ["V", "V"],
  ["A", "A"],
  ["Ω", "Ω"], // U+03A9
  ["Ω", "Ω"], // U+2126 OHM SIGN, normalised to the Greek letter
  ["ohm", "Ω"],
  ["ohms", "Ω"],
  ["F", "F"],
  ["H", "H"],
  ["Hz", "Hz"],
  ["W", "W"],
  ["J", "J"],
  ["C", "C"],
  ["S", "S"],
  ["s", "s"],
  ["K", "K"],
  ["K/W", "K/W"],
  ["dB", "dB"],
  ["°C", "°C"],
  ["°", "°"],
]);

/** Units that never take an SI prefix ("3 kdB" is not a quantity). */
export const UNPREFIXABLE_UNITS: ReadonlySet<string> = new Set(["dB", "°C", "°", "K/W"]);

/**
 * Scale words that turn a number into a plain fraction: "5 %" is 0.05, "100 ppm/K" is
 * 1e-4 per kelvin. Entries are the power of ten and the unit the result carries.
 */
export const SCALE_WORDS: ReadonlyMap<string, readonly [number, string]> = new Map([
  ["%", [-2, ""]],
  ["ppm", [-6, ""]],
  ["%/K", [-2, "1/K"]],
  ["ppm/K", [-6, "1/K"]],
]);

/**
 * `mantissa · 10^exponent` computed so that exact decimal inputs give the nearest double:
 * dividing by an exact power of ten rounds once, multiplying by 10^-n would round twice.
 */
export function scaleByPowerOfTen(mantissa: number, exponent: number): number {
  return exponent >= 0 ? mantissa * 10 ** exponent : mantissa / 10 ** -exponent;
}
