/**
 * Engineering-notation formatting: the one place numbers become text with units.
 *
 * @module
 */

const PREFIXES: ReadonlyArray<readonly [number, string]> = [
  [1e12, "T"],
  [1e9, "G"],
  [1e6, "M"],
  [1e3, "k"],
  [1, ""],
  [1e-3, "m"],
  [1e-6, "µ"],
  [1e-9, "n"],
  [1e-12, "p"],
  [1e-15, "f"],
];

/**
 * Trade units: what designers write instead of the SI unit, with their size in that SI unit
 * (a slew rate reads "19.9 V/µs" on every datasheet, not "19.9 MV/s"). Values in a trade
 * unit are printed as plain numbers, never with a prefix. Design checks can report in one
 * through their `displayUnit` option.
 */
export const TRADE_UNITS: Readonly<Record<string, { siUnit: string; size: number }>> = {
  "V/µs": { siUnit: "V/s", size: 1e6 },
};

/** Units that are printed as they are, never with an SI prefix. */
const UNPREFIXED = new Set(["dB", "%", "°", "°C", "K/W", "ratio", "", ...Object.keys(TRADE_UNITS)]);

/** Units that name a pure number: printed without any unit text. */
const UNITLESS = new Set(["", "ratio"]);

/** Options for {@linkcode formatSi}. */
export interface FormatOptions {
  /**
   * Significant digits shown.
   * @default {4}
   */
  digits?: number;
}

/**
 * Formats a quantity in engineering notation with an SI prefix: `4700, "Ω"` → `"4.7 kΩ"`.
 *
 * Trailing zeros are dropped, so component values read as they are marked. Units such as
 * `dB`, `%`, `°C` and the trade units of {@linkcode TRADE_UNITS} (`V/µs`) are never
 * prefixed; `""` and `"ratio"` (a pure number) print the number alone.
 *
 * @param value The quantity in SI base units.
 * @param unit Unit symbol, e.g. `"Ω"`, `"F"`, `"dB"`.
 * @param options Formatting options.
 * @returns The formatted text, or `"NaN"`, `"∞"`, `"-∞"` for non-finite values.
 *
 * @example Resistors, capacitors and decibels
 * ```ts
 * import { formatSi } from "./format.ts";
 * import { equal } from "node:assert/strict";
 * equal(formatSi(4700, "Ω"), "4.7 kΩ");
 * equal(formatSi(100e-9, "F"), "100 nF");
 * equal(formatSi(-3.0103, "dB", { digits: 3 }), "-3.01 dB");
 * equal(formatSi(0.025852, "V"), "25.85 mV");
 * equal(formatSi(0.40572, "ratio"), "0.4057");
 * equal(formatSi(19.94, "V/µs", { digits: 3 }), "19.9 V/µs");
 * ```
 */
export function formatSi(value: number, unit: string, options: FormatOptions = {}): string {
  const digits = options.digits ?? 4;
  if (UNITLESS.has(unit)) unit = "";
  const space = unit === "" || unit === "%" || unit === "°" ? "" : " ";
  if (Number.isNaN(value)) return `NaN${space}${unit}`;
  if (!Number.isFinite(value)) return `${value > 0 ? "∞" : "-∞"}${space}${unit}`;
  if (value === 0) return `0${space}${unit}`;
  if (UNPREFIXED.has(unit)) return `${trimZeros(value.toPrecision(digits))}${space}${unit}`;
  const magnitude = Math.abs(value);
  let [scale, prefix] = PREFIXES[PREFIXES.length - 1];
  for (const [s, p] of PREFIXES) {
    if (magnitude >= s * (1 - 0.5 * 10 ** (1 - digits))) {
      [scale, prefix] = [s, p];
      break;
    }
  }
  if (magnitude >= 1e15) [scale, prefix] = [1e12, "T"];
  const mantissa = trimZeros((value / scale).toPrecision(digits));
  // Rounding can carry into the next prefix (999.96 → "1000"): one more pass fixes it.
  if (Math.abs(Number(mantissa)) >= 1000 && scale < 1e12) {
    return formatSi(Number(mantissa) * scale, unit, options);
  }
  return `${mantissa}${space}${prefix}${unit}`;
}

function trimZeros(text: string): string {
  if (text.includes("e")) {
    const [mantissa, exponent] = text.split("e");
    return `${trimZeros(mantissa)}e${exponent}`;
  }
  return text.includes(".") ? text.replace(/\.?0+$/, "") : text;
}
