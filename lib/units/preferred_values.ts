/**
 * IEC 60063 preferred-number series E3 to E192, and rounding a computed value to one.
 *
 * E3 to E24 are the tabulated lists of the standard: eight E24 values differ from the
 * formula (2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 8.2), so they are written out here. E48, E96
 * and E192 follow round(10^(i/n), 2 decimals), except E192's 9.20 (the formula gives 9.19).
 *
 * @module
 */
import { requirePositive } from "../_validate.ts";
import { scaleByPowerOfTen } from "./_prefixes.ts";

/** Names of the IEC 60063 series. */
export type PreferredSeriesName = "E3" | "E6" | "E12" | "E24" | "E48" | "E96" | "E192";

/** The series names, coarsest first. */
export const PREFERRED_SERIES_NAMES: readonly PreferredSeriesName[] = [
  "E3",
  "E6",
  "E12",
  "E24",
  "E48",
  "E96",
  "E192",
];

// Values are kept as whole hundredths (100..999) so that membership tests and scaling to a
// decade are exact integer work.
// deno-fmt-ignore
const E24_TABLE = [
  100, 110, 120, 130, 150, 160, 180, 200, 220, 240, 270, 300,
  330, 360, 390, 430, 470, 510, 560, 620, 680, 750, 820, 910,
];
const TABULATED: Readonly<Record<"E3" | "E6" | "E12" | "E24", readonly number[]>> = {
  E3: [100, 220, 470],
  E6: E24_TABLE.filter((_, i) => i % 4 === 0),
  E12: E24_TABLE.filter((_, i) => i % 2 === 0),
  E24: E24_TABLE,
};

const cache = new Map<PreferredSeriesName, readonly number[]>();

function hundredths(name: PreferredSeriesName): readonly number[] {
  const cached = cache.get(name);
  if (cached !== undefined) return cached;
  let values: readonly number[];
  if (name === "E3" || name === "E6" || name === "E12" || name === "E24") {
    values = TABULATED[name];
  } else if (name === "E48" || name === "E96" || name === "E192") {
    const n = Number(name.slice(1));
    values = Array.from({ length: n }, (_, i) => {
      const rounded = Math.round(100 * 10 ** (i / n));
      // IEC 60063 lists 9.20 where the formula gives 9.19479 → 9.19.
      return name === "E192" && rounded === 919 ? 920 : rounded;
    });
  } else {
    throw new TypeError(
      `Expected series to be one of ${PREFERRED_SERIES_NAMES.join(", ")}, but found ${
        JSON.stringify(name)
      }`,
    );
  }
  cache.set(name, values);
  return values;
}

/**
 * The values of one decade of a series, from 1.0 up to (not including) 10.
 *
 * @param series The series name.
 * @returns The values, ascending, e.g. E12 → `[1, 1.2, 1.5, …, 8.2]`.
 * @throws {TypeError} If `series` is not a series name.
 *
 * @example E6, and E24's 4.7 where the formula would give 4.6
 * ```ts
 * import { preferredSeries } from "./preferred_values.ts";
 * import { deepEqual, ok } from "node:assert/strict";
 * deepEqual(preferredSeries("E6"), [1, 1.5, 2.2, 3.3, 4.7, 6.8]);
 * ok(preferredSeries("E24").includes(4.7));
 * ```
 */
export function preferredSeries(series: PreferredSeriesName): number[] {
  return hundredths(series).map((h) => h / 100);
}

/** The decade exponent d with 10^d ≤ value < 10^(d+1), robust to log10 rounding. */
function decadeOf(value: number): number {
  let decade = Math.floor(Math.log10(value));
  if (value >= 10 ** (decade + 1)) decade += 1;
  if (value < 10 ** decade) decade -= 1;
  return decade;
}

/** Series members around `value`: the last of the decade below, its own decade, and the
 * first of the next, so rounding across 9.1 → 10 needs no special case. */
function candidates(value: number, series: PreferredSeriesName): number[] {
  const table = hundredths(series);
  const decade = decadeOf(value);
  const toValue = (h: number, d: number) => scaleByPowerOfTen(h, d - 2);
  return [
    toValue(table[table.length - 1], decade - 1),
    ...table.map((h) => toValue(h, decade)),
    toValue(table[0], decade + 1),
  ];
}

/** Relative slack for "is already a member": computed values carry rounding noise. */
const SAME = 1e-9;

/**
 * The series member nearest to `value` in log (geometric) distance, at any decade.
 *
 * Between neighbours a < b the boundary is √(ab), not (a + b)/2: in E24, 4.5 k goes to
 * 4.7 k (the boundary is 4.4956 k), and 9.6 k goes up to 10 k. An exact tie goes up.
 *
 * @param value The computed value, in any unit (Ω, F, H).
 * @param series The series name.
 * @returns The nearest member, e.g. 4700 (not 4.7).
 * @throws {RangeError} If `value` is not greater than 0: no series holds it.
 * @throws {TypeError} If `value` is not a finite number or `series` is not a series name.
 *
 * @example Log distance, and wrap-around into the next decade
 * ```ts
 * import { nearestPreferred } from "./preferred_values.ts";
 * import { equal } from "node:assert/strict";
 * equal(nearestPreferred(4500, "E24"), 4700);
 * equal(nearestPreferred(9600, "E24"), 10000);
 * equal(nearestPreferred(3193.5, "E96"), 3160);
 * ```
 */
export function nearestPreferred(value: number, series: PreferredSeriesName): number {
  requirePositive("value", value);
  let best = NaN;
  let bestDistance = Infinity;
  for (const candidate of candidates(value, series)) {
    const distance = Math.abs(Math.log(candidate / value));
    // `<=` with ascending candidates makes an exact tie go to the larger value.
    if (distance <= bestDistance) {
      best = candidate;
      bestDistance = distance;
    }
  }
  return best;
}

/**
 * The smallest series member at or above `value` (the value itself when it is a member).
 *
 * Use it where the part must be at least the computed value, e.g. a resistor that sets a
 * minimum current limit. Values within one part in 10⁹ of a member count as that member.
 *
 * @param value The computed value.
 * @param series The series name.
 * @returns The member at or above `value`.
 * @throws {RangeError} If `value` is not greater than 0.
 * @throws {TypeError} If `value` is not a finite number or `series` is not a series name.
 *
 * @example 3.1935 kΩ rounds up to 3.3 kΩ in E24
 * ```ts
 * import { preferredUp } from "./preferred_values.ts";
 * import { equal } from "node:assert/strict";
 * equal(preferredUp(3193.5, "E24"), 3300);
 * equal(preferredUp(3300, "E24"), 3300);
 * ```
 */
export function preferredUp(value: number, series: PreferredSeriesName): number {
  requirePositive("value", value);
  return candidates(value, series).find((c) => c >= value * (1 - SAME))!;
}

/**
 * The largest series member at or below `value` (the value itself when it is a member).
 *
 * @param value The computed value.
 * @param series The series name.
 * @returns The member at or below `value`.
 * @throws {RangeError} If `value` is not greater than 0.
 * @throws {TypeError} If `value` is not a finite number or `series` is not a series name.
 *
 * @example 3.1935 kΩ rounds down to 3.0 kΩ in E24; 999 Ω drops to the decade below
 * ```ts
 * import { preferredDown } from "./preferred_values.ts";
 * import { equal } from "node:assert/strict";
 * equal(preferredDown(3193.5, "E24"), 3000);
 * equal(preferredDown(1000, "E12"), 1000);
 * equal(preferredDown(999, "E12"), 820);
 * ```
 */
export function preferredDown(value: number, series: PreferredSeriesName): number {
  requirePositive("value", value);
  return candidates(value, series).findLast((c) => c <= value * (1 + SAME))!;
}

/**
 * Whether `value` is a member of the series at some decade (to one part in 10⁹).
 *
 * @param value The value to test.
 * @param series The series name.
 * @returns True for members such as 4700 in E24; false for 0 and negative values.
 * @throws {TypeError} If `series` is not a series name.
 *
 * @example 4.7 k is an E12 value, 4.3 k only an E24 one
 * ```ts
 * import { isPreferred } from "./preferred_values.ts";
 * import { equal } from "node:assert/strict";
 * equal(isPreferred(4700, "E12"), true);
 * equal(isPreferred(4300, "E12"), false);
 * equal(isPreferred(4300, "E24"), true);
 * ```
 */
export function isPreferred(value: number, series: PreferredSeriesName): boolean {
  hundredths(series);
  if (!(Number.isFinite(value) && value > 0)) return false;
  return candidates(value, series).some((c) => Math.abs(c - value) <= SAME * value);
}

/**
 * Every series member from `min` to `max` inclusive, ascending: the values a sweep over
 * stock parts should visit.
 *
 * @param min Lower end.
 * @param max Upper end (at least `min`).
 * @param series The series name.
 * @returns The members in the range.
 * @throws {RangeError} If `min` is not positive, `max < min`, or the range holds more than
 *   100 000 values.
 * @throws {TypeError} If `series` is not a series name.
 *
 * @example E12 from 1 kΩ to 2.2 kΩ
 * ```ts
 * import { preferredValuesBetween } from "./preferred_values.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(preferredValuesBetween(1000, 2200, "E12"), [1000, 1200, 1500, 1800, 2200]);
 * ```
 */
export function preferredValuesBetween(
  min: number,
  max: number,
  series: PreferredSeriesName,
): number[] {
  requirePositive("min", min);
  requirePositive("max", max);
  if (max < min) throw new RangeError(`Expected max to be at least min (${min}), but found ${max}`);
  const table = hundredths(series);
  const decades = decadeOf(max) - decadeOf(min) + 1;
  if (decades * table.length > 100_000) {
    throw new RangeError(
      `Expected at most 100000 values between min and max, but found about ${
        decades * table.length
      }`,
    );
  }
  const result: number[] = [];
  for (let decade = decadeOf(min); decade <= decadeOf(max); decade++) {
    for (const h of table) {
      const value = scaleByPowerOfTen(h, decade - 2);
      if (value >= min * (1 - SAME) && value <= max * (1 + SAME)) result.push(value);
    }
  }
  return result;
}
