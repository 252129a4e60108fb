/**
 * Reading values typed by people: plain numbers (`0.002`, `2e-3`), SI prefixes (`2m`,
 * `100n`, `4.7k`, `2.2µ`) and RKM codes as printed on parts (`4k7`, `4R7`, `R47`, `2M2`,
 * `4n7`). A unit symbol after the value is allowed (`2mA`, `4k7Ω`, `100nF`).
 *
 * @module
 */

const MULTIPLIERS: Record<string, number> = {
  T: 1e12,
  G: 1e9,
  M: 1e6,
  k: 1e3,
  K: 1e3,
  R: 1,
  m: 1e-3,
  u: 1e-6,
  "µ": 1e-6,
  "μ": 1e-6,
  n: 1e-9,
  p: 1e-12,
  f: 1e-15,
};

/** Unit symbols that may follow a value; they do not change it. */
const UNITS = [
  "ohm",
  "Ohm",
  "Hz",
  "Ω",
  "A",
  "V",
  "F",
  "H",
  "W",
  "S",
  "s",
  "K",
  "°C",
  "°",
  "dB",
  "%",
];

/** Options for {@linkcode parseValue}. */
export interface ParseValueOptions {
  /**
   * The unit the value is in; a trailing copy of it is ignored (as are common unit symbols).
   * @default {""}
   */
  unit?: string;
}

/**
 * Parses a number written as plain, SI-prefixed or RKM text.
 *
 * @param text What the person typed.
 * @param options Expected unit.
 * @returns The value in base units.
 * @throws {SyntaxError} If the text is not a number in one of these forms.
 *
 * @example
 * ```ts
 * import { parseValue } from "./parse_value.ts";
 * import { equal, throws } from "node:assert/strict";
 * equal(parseValue("2m"), 0.002); // closed form: m = 1e-3
 * equal(parseValue("4k7"), 4700); // closed form: RKM
 * equal(parseValue("R47"), 0.47); // closed form: RKM
 * equal(parseValue("2.2µ"), 2.2e-6); // closed form
 * equal(parseValue("2mA"), 0.002); // closed form
 * equal(parseValue("100nF"), 1e-7); // closed form
 * equal(parseValue("-1.5e-3"), -0.0015); // closed form
 * throws(() => parseValue("two"), SyntaxError);
 * ```
 */
export function parseValue(text: string, options: ParseValueOptions = {}): number {
  const body = text.trim();
  const direct = parseBare(body);
  if (direct !== undefined) return direct;
  const units = options.unit ? [options.unit, ...UNITS] : UNITS;
  for (const unit of units) {
    if (unit && body.endsWith(unit) && body.length > unit.length) {
      const value = parseBare(body.slice(0, -unit.length).trim());
      if (value !== undefined) return value;
    }
  }
  throw new SyntaxError(
    `Expected a number such as 0.002, 2e-3, 2m or 4k7, but found ${JSON.stringify(text)}`,
  );
}

function parseBare(body: string): number | undefined {
  const plain = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;
  if (plain.test(body)) return Number(body);
  const prefixed = /^([+-]?(?:\d+\.?\d*|\.\d+))\s?([TGMkKRmuµμnpf])$/.exec(body);
  if (prefixed) return scaled(prefixed[1], MULTIPLIERS[prefixed[2]]);
  const rkm = /^([+-]?)(\d*)([TGMkKRmuµμnpf])(\d+)$/.exec(body);
  if (rkm && (rkm[2] !== "" || rkm[3] === "R")) {
    return scaled(`${rkm[1]}${rkm[2] || "0"}.${rkm[4]}`, MULTIPLIERS[rkm[3]]);
  }
  return undefined;
}

/** Multiplies without binary noise: 4.7 × 1e3 gives 4700, not 4700.000000000001. */
function scaled(mantissa: string, multiplier: number): number {
  const exponent = Math.round(Math.log10(multiplier));
  return Number(`${mantissa}e${exponent}`);
}
