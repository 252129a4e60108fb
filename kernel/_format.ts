/**
 * Numbers with units for the terminal and the report. The kernel does not import the library,
 * so this is a small engineering-notation formatter of its own.
 *
 * @module
 */

/** Units that take SI prefixes (m, µ, k, M, …); others are printed as plain numbers. */
const PREFIXED_UNITS = new Set([
  "V",
  "A",
  "Ω",
  "F",
  "Hz",
  "W",
  "s",
  "H",
  "S",
  "J",
  "C",
  "V/s",
  "A/V",
  "V/V",
]);
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

/**
 * Formats a quantity for a reader: engineering prefixes for SI units, four significant
 * digits, a space before the unit (none before an angle's `°`).
 *
 * @param value The number.
 * @param unit The unit symbol (`""` for a ratio).
 * @returns The text, e.g. `"2.2 kΩ"`, `"61.1°"`, `"not a number"`.
 *
 * @example
 * ```ts
 * import { formatQuantity } from "./_format.ts";
 * import { equal } from "node:assert/strict";
 * equal(formatQuantity(2200, "Ω"), "2.2 kΩ");
 * equal(formatQuantity(0.000012, "A"), "12 µA");
 * equal(formatQuantity(61.14, "°"), "61.14°");
 * equal(formatQuantity(-Infinity, "V"), "−∞ V");
 * ```
 */
export function formatQuantity(value: number, unit: string): string {
  // "ratio" names a pure number; writing it after every value only adds noise.
  if (unit === "ratio") unit = "";
  const join = (number: string) =>
    unit === "" ? number : /^[°′″]$/.test(unit) ? number + unit : `${number} ${unit}`;
  if (Number.isNaN(value)) return "not a number";
  if (!Number.isFinite(value)) return join(value > 0 ? "∞" : "−∞");
  if (value === 0) return join("0");
  if (PREFIXED_UNITS.has(unit)) {
    const magnitude = Math.abs(value);
    const [scale, prefix] = PREFIXES.find(([scale]) => magnitude >= scale * 0.99995) ??
      PREFIXES[PREFIXES.length - 1];
    return `${plain(value / scale)} ${prefix}${unit}`;
  }
  return join(plain(value));
}

/** Four significant digits, trailing zeros dropped, a true minus sign. */
function plain(value: number): string {
  const magnitude = Math.abs(value);
  const text = magnitude >= 1e6 || magnitude < 1e-4 ? value.toExponential(3) : value.toPrecision(4);
  const trimmed = text.includes("e")
    ? text.replace(/\.?0+e/, "e").replace("e+", "e")
    : text.includes(".")
    ? text.replace(/\.?0+$/, "")
    : text;
  return trimmed.replace(/^-/, "−");
}

/**
 * Formats a check's limit as a relation.
 *
 * @param limit The limit's kind and bounds.
 * @param unit The unit symbol.
 * @returns E.g. `"≥ 45°"`, `"≤ 150 °C"`, `"9 V … 11 V"`.
 *
 * @example
 * ```ts
 * import { formatLimit } from "./_format.ts";
 * import { equal } from "node:assert/strict";
 * equal(formatLimit({ kind: "atLeast", min: 45 }, "°"), "≥ 45°");
 * equal(formatLimit({ kind: "within", min: 9, max: 11 }, "V"), "9 V … 11 V");
 * ```
 */
export function formatLimit(
  limit: { kind: string; min?: number; max?: number },
  unit: string,
): string {
  const hasMin = typeof limit.min === "number";
  const hasMax = typeof limit.max === "number";
  if (hasMin && hasMax) {
    return `${formatQuantity(limit.min!, unit)} … ${formatQuantity(limit.max!, unit)}`;
  }
  if (hasMin) return `≥ ${formatQuantity(limit.min!, unit)}`;
  if (hasMax) return `≤ ${formatQuantity(limit.max!, unit)}`;
  return limit.kind === "" ? "—" : limit.kind;
}

/**
 * Formats a margin with its size relative to the bound.
 *
 * @param margin Distance to the nearer bound (negative when failing).
 * @param ratio The margin as a fraction of the bound (NaN when the bound is 0).
 * @param unit The unit symbol.
 * @returns E.g. `"+16.1° (36 %)"`, `"−6 °C (−4 %)"`.
 *
 * @example
 * ```ts
 * import { formatMargin } from "./_format.ts";
 * import { equal } from "node:assert/strict";
 * equal(formatMargin(16.1, 0.3578, "°"), "+16.1° (35.8 %)");
 * equal(formatMargin(-6, Number.NaN, "°C"), "−6 °C");
 * ```
 */
export function formatMargin(margin: number, ratio: number, unit: string): string {
  const sign = margin > 0 ? "+" : "";
  const main = sign + formatQuantity(margin, unit);
  if (!Number.isFinite(ratio) || !Number.isFinite(margin)) return main;
  const percent = plain(Number((ratio * 100).toPrecision(3)));
  return `${main} (${percent} %)`;
}

/**
 * Formats a duration in milliseconds for a cell's header.
 *
 * @param ms Milliseconds.
 * @returns E.g. `"0.4 ms"`, `"12 ms"`, `"1.3 s"`.
 *
 * @example
 * ```ts
 * import { formatDuration } from "./_format.ts";
 * import { equal } from "node:assert/strict";
 * equal(formatDuration(1340), "1.3 s");
 * equal(formatDuration(0.42), "0.4 ms");
 * ```
 */
export function formatDuration(ms: number): string {
  if (!Number.isFinite(ms) || ms < 0) return "";
  if (ms >= 1000) return `${(ms / 1000).toFixed(1)} s`;
  if (ms >= 10) return `${Math.round(ms)} ms`;
  return `${ms.toFixed(1)} ms`;
}
