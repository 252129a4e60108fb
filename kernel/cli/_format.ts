/**
 * Numbers with units for the terminal (the kernel cannot use the library's formatter).
 *
 * @module
 */

const PREFIXES: Array<[number, string]> = [
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

const PLAIN_UNITS = new Set(["", "dB", "%", "°", "°C", "K/W", "ratio"]);

/**
 * Formats a quantity with an SI prefix and four significant digits.
 *
 * @param value The value in base units.
 * @param unit The unit symbol.
 * @returns E.g. `"4.7 kΩ"`, `"61.1°"`, `"NaN V"`.
 *
 * @example
 * ```ts
 * import { formatQuantity } from "./_format.ts";
 * import { equal } from "node:assert/strict";
 * equal(formatQuantity(4700, "Ω"), "4.7 kΩ");
 * equal(formatQuantity(0.0386817, "S"), "38.68 mS");
 * equal(formatQuantity(61.1, "°"), "61.1°");
 * ```
 */
export function formatQuantity(value: number, unit: string): string {
  const space = unit === "" || unit === "°" || unit === "%" ? "" : " ";
  if (!Number.isFinite(value)) return `${value}${space}${unit}`;
  if (value === 0 || PLAIN_UNITS.has(unit)) return `${trim(value.toPrecision(4))}${space}${unit}`;
  const magnitude = Math.abs(value);
  const [scale, prefix] = PREFIXES.find(([s]) => magnitude >= s * 0.99995) ??
    PREFIXES[PREFIXES.length - 1];
  return `${trim((value / scale).toPrecision(4))}${space}${prefix}${unit}`;
}

function trim(text: string): string {
  if (text.includes("e")) return text;
  return text.includes(".") ? text.replace(/\.?0+$/, "") : text;
}
