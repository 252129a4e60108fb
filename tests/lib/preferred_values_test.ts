/**
 * IEC 60063 preferred values against REFERENCE §8.1–§8.2 and E5.13, plus property tests for
 * the rounding helpers.
 */
import fc from "fast-check";
import { assert, assertClose, assertEquals, assertThrows } from "../_assert.ts";
import {
  isPreferred,
  nearestPreferred,
  PREFERRED_SERIES_NAMES,
  preferredDown,
  preferredSeries,
  type PreferredSeriesName,
  preferredUp,
  preferredValuesBetween,
} from "../../lib/units/mod.ts";

// ── The lists, exactly as REFERENCE §8.1 prints them ─────────────────────────────────────

/** Reads a list as REFERENCE §8.1 prints it ("1.0, 1.2, 1.5"), so the text can be compared by eye. */
function listed(text: string): number[] {
  return text.split(",").map((item) => Number(item.trim()));
}

Deno.test("preferredSeries() gives E3, E6, E12 and E24 exactly as tabulated", () => {
  assertEquals(preferredSeries("E3"), listed("1.0, 2.2, 4.7")); // REFERENCE §8.1 / IEC 60063: E3, exact
  assertEquals(preferredSeries("E6"), listed("1.0, 1.5, 2.2, 3.3, 4.7, 6.8")); // REFERENCE §8.1 / IEC 60063: E6 (±20 %), exact
  const e12Printed = listed("1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2");
  assertEquals(preferredSeries("E12"), e12Printed); // REFERENCE §8.1 / IEC 60063: E12 (±10 %), exact
  const e24Printed = listed(
    "1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, " +
      "3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1",
  );
  assertEquals(preferredSeries("E24"), e24Printed); // REFERENCE §8.1 / IEC 60063: E24 (±5 %), exact
});

Deno.test("preferredSeries() gives E48 and E96 exactly as REFERENCE §8.1 lists them", () => {
  const e48Printed = listed(
    "1.00, 1.05, 1.10, 1.15, 1.21, 1.27, 1.33, 1.40, 1.47, 1.54, 1.62, 1.69, 1.78, 1.87, " +
      "1.96, 2.05, 2.15, 2.26, 2.37, 2.49, 2.61, 2.74, 2.87, 3.01, 3.16, 3.32, 3.48, 3.65, " +
      "3.83, 4.02, 4.22, 4.42, 4.64, 4.87, 5.11, 5.36, 5.62, 5.90, 6.19, 6.49, 6.81, 7.15, " +
      "7.50, 7.87, 8.25, 8.66, 9.09, 9.53",
  );
  assertEquals(preferredSeries("E48"), e48Printed); // REFERENCE §8.1 / IEC 60063: E48 (±2 %), exact
  const e96Printed = listed(
    "1.00, 1.02, 1.05, 1.07, 1.10, 1.13, 1.15, 1.18, 1.21, 1.24, 1.27, 1.30, 1.33, 1.37, " +
      "1.40, 1.43, 1.47, 1.50, 1.54, 1.58, 1.62, 1.65, 1.69, 1.74, 1.78, 1.82, 1.87, 1.91, " +
      "1.96, 2.00, 2.05, 2.10, 2.15, 2.21, 2.26, 2.32, 2.37, 2.43, 2.49, 2.55, 2.61, 2.67, " +
      "2.74, 2.80, 2.87, 2.94, 3.01, 3.09, 3.16, 3.24, 3.32, 3.40, 3.48, 3.57, 3.65, 3.74, " +
      "3.83, 3.92, 4.02, 4.12, 4.22, 4.32, 4.42, 4.53, 4.64, 4.75, 4.87, 4.99, 5.11, 5.23, " +
      "5.36, 5.49, 5.62, 5.76, 5.90, 6.04, 6.19, 6.34, 6.49, 6.65, 6.81, 6.98, 7.15, 7.32, " +
      "7.50, 7.68, 7.87, 8.06, 8.25, 8.45, 8.66, 8.87, 9.09, 9.31, 9.53, 9.76",
  );
  assertEquals(preferredSeries("E96"), e96Printed); // REFERENCE §8.1 / IEC 60063: E96 (±1 %), exact
});

Deno.test("preferredSeries() has 3 to 192 values per decade, ascending, from 1.0 below 10", () => {
  for (const name of PREFERRED_SERIES_NAMES) {
    const values = preferredSeries(name);
    assertEquals(values.length, Number(name.slice(1))); // IEC 60063: n values per decade
    assertEquals(values[0], 1); // IEC 60063: every series starts at 1.0
    assert(values.every((v, i) => i === 0 || v > values[i - 1]), `${name} ascends`);
    assert(values[values.length - 1] < 10, `${name} stays in one decade`);
  }
});

Deno.test("E24 differs from round(10^(i/24), 1 decimal) at exactly the eight listed values", () => {
  const e24 = preferredSeries("E24");
  const formula = e24.map((_, i) => Math.round(10 * 10 ** (i / 24)) / 10);
  const differing = e24.filter((v, i) => v !== formula[i]);
  assertEquals(differing, [2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 8.2]); // REFERENCE §8.1 / IEC 60063: the E24 values that differ from the formula, exact
  assertEquals(formula.filter((v, i) => v !== e24[i]), [2.6, 2.9, 3.2, 3.5, 3.8, 4.2, 4.6, 8.3]); // REFERENCE §8.1: what the formula would have given instead, exact
});

Deno.test("the E12 and E6 exceptions are the subsets of the E24 ones", () => {
  const exceptions = new Set([2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 8.2]); // REFERENCE §8.1
  assertEquals(preferredSeries("E12").filter((v) => exceptions.has(v)), [2.7, 3.3, 3.9, 4.7, 8.2]); // REFERENCE §8.1 / IEC 60063: E12 exceptions 2.7, 3.3, 3.9, 4.7, 8.2, exact
  assertEquals(preferredSeries("E6").filter((v) => exceptions.has(v)), [3.3, 4.7]); // REFERENCE §8.1 / IEC 60063: E6 exceptions 3.3, 4.7, exact
  const e24 = preferredSeries("E24");
  assertEquals(preferredSeries("E12"), e24.filter((_, i) => i % 2 === 0)); // IEC 60063: E12 is every 2nd E24 value, exact
  assertEquals(preferredSeries("E6"), e24.filter((_, i) => i % 4 === 0)); // IEC 60063: E6 is every 4th E24 value, exact
});

Deno.test("E192 follows the formula except for 9.20 and holds E96 as every second value", () => {
  const e192 = preferredSeries("E192");
  const formula = e192.map((_, i) => Math.round(100 * 10 ** (i / 192)) / 100);
  assertEquals(e192.filter((v, i) => v !== formula[i]), [9.2]); // REFERENCE §8.1 / IEC 60063 (from memory): the one exception is 9.20 (formula 9.19), exact
  assertEquals(formula.filter((v, i) => v !== e192[i]), [9.19]); // REFERENCE §8.1: formula gives 9.19
  assertClose(10 ** (185 / 192), 9.19479, { rtol: 1e-5 }); // REFERENCE §8.1: formula 9.19479
  assertEquals(e192.filter((_, i) => i % 2 === 0), preferredSeries("E96")); // closed form: 10^(2i/192) = 10^(i/96), so E96 is every second E192 value, exact
  assertEquals(preferredSeries("E96").filter((_, i) => i % 2 === 0), preferredSeries("E48")); // closed form
});

Deno.test("preferredSeries() rejects a name that is not a series", () => {
  assertThrows(() => preferredSeries("E10" as PreferredSeriesName), TypeError);
});

// ── Rounding to a series ─────────────────────────────────────────────────────────────────

Deno.test("nearestPreferred() takes 4.5 k to 4.7 k in E24 by log distance", () => {
  assertEquals(nearestPreferred(4500, "E24"), 4700); // REFERENCE §8.2: 4.5 k → 4.7 k (E24), exact
  assertClose(Math.sqrt(4.3 * 4.7), 4.4956, { rtol: 1e-4 }); // REFERENCE §8.2: the boundary is √(4.3·4.7) = 4.4956 k, rtol 1e-4
  assertEquals(nearestPreferred(4495, "E24"), 4300); // REFERENCE §8.2: just below the boundary
  assertEquals(nearestPreferred(4496, "E24"), 4700); // REFERENCE §8.2: just above the boundary
});

Deno.test("nearestPreferred() takes 2.45 k to 2.7 k in E12, where a linear midpoint would tie", () => {
  assertEquals(nearestPreferred(2450, "E12"), 2700); // REFERENCE §8.2: 2.45 k → 2.7 k (E12), exact
  assertClose(Math.sqrt(2.2 * 2.7), 2.4372, { rtol: 1e-4 }); // REFERENCE §8.2: boundary 2.4372
  assertEquals(nearestPreferred(2437, "E12"), 2200); // REFERENCE §8.2: below the boundary
});

Deno.test("nearestPreferred() wraps 9.6 k into the next decade as 10 k", () => {
  assertEquals(nearestPreferred(9600, "E24"), 10000); // REFERENCE §8.2: 9.6 k → 10 k, not 9.1 k
  assertClose(Math.sqrt(9.1 * 10), 9.539, { rtol: 1e-3 }); // REFERENCE §8.2: boundary 9.539
  assertEquals(nearestPreferred(9530, "E24"), 9100); // REFERENCE §8.2: below the boundary
  assertEquals(nearestPreferred(0.99, "E3"), 1); // closed form: wrap from 0.47 → 1.0
  assertEquals(nearestPreferred(0.6, "E3"), 0.47); // closed form: √(0.47·1.0) = 0.6856
});

Deno.test("nearestPreferred() rounds the Vbe-multiplier resistor of E5.13 to 3.3 k (E24) and 3.16 k (E96)", () => {
  const r1 = (2.6 / 0.62 - 1) * 1e3; // REFERENCE E5.13: R1/R2 = 3.1935 with R2 = 1 kΩ
  assertClose(r1, 3193.5, { rtol: 1e-3 }); // REFERENCE E5.13: R1 = 3.1935 kΩ
  assertEquals(nearestPreferred(r1, "E24"), 3300); // REFERENCE E5.13: nearest E24 3.3 kΩ, exact
  assertEquals(nearestPreferred(r1, "E96"), 3160); // REFERENCE E5.13: nearest E96 3.16 kΩ, exact
  assertClose(Math.sqrt(3.0 * 3.3), 3.1464, { rtol: 1e-4 }); // REFERENCE E5.13: E24 midpoint
  assertClose(Math.sqrt(3.16 * 3.24), 3.1997, { rtol: 1e-4 }); // REFERENCE E5.13: E96 midpoint
});

Deno.test("preferredUp() and preferredDown() bracket a value and keep members as they are", () => {
  assertEquals(preferredUp(3193.5, "E24"), 3300); // REFERENCE E5.13 / IEC 60063 E24, exact
  assertEquals(preferredDown(3193.5, "E24"), 3000); // REFERENCE E5.13 / IEC 60063 E24, exact
  assertEquals(preferredUp(9200, "E24"), 10000); // IEC 60063 E24, decade wrap-around, exact
  assertEquals(preferredDown(999, "E12"), 820); // IEC 60063 E12, decade wrap-around, exact
  assertEquals(preferredUp(4700, "E12"), 4700); // IEC 60063 E12 member, exact
  assertEquals(preferredDown(4700, "E12"), 4700); // IEC 60063 E12 member, exact
  assertEquals(preferredUp(4.7e-9 * (1 + 1e-12), "E6"), 4.7e-9); // float noise counts as member
  assertEquals(preferredUp(9.195e3, "E192"), 9.2e3); // REFERENCE §8.1: E192 9.20 exception, exact
});

Deno.test("the rounding helpers work at any decade, including picofarads and megohms", () => {
  assertEquals(nearestPreferred(2.05e-12, "E12"), 2.2e-12); // IEC 60063 E12, exact double
  assertEquals(nearestPreferred(1.3e6, "E6"), 1.5e6); // IEC 60063 E6, exact
  assertEquals(nearestPreferred(1.6e-6, "E48"), 1.62e-6); // IEC 60063 E48, exact double
});

Deno.test("the rounding helpers throw RangeError for values no series can hold", () => {
  assertThrows(() => nearestPreferred(0, "E24"), RangeError);
  assertThrows(() => nearestPreferred(-4700, "E24"), RangeError);
  assertThrows(() => preferredUp(-1, "E12"), RangeError);
  assertThrows(() => preferredDown(0, "E12"), RangeError);
  assertThrows(() => nearestPreferred(NaN, "E12"), TypeError);
  assertThrows(() => nearestPreferred(Infinity, "E12"), TypeError);
});

Deno.test("isPreferred() and preferredValuesBetween() agree with the lists", () => {
  assertEquals(isPreferred(4300, "E24"), true); // IEC 60063 E24
  assertEquals(isPreferred(4300, "E12"), false); // IEC 60063 E12
  assertEquals(isPreferred(3.16e-6, "E96"), true); // IEC 60063 E96
  assertEquals(isPreferred(0, "E96"), false);
  const decade = [1000, 1200, 1500, 1800, 2200, 2700, 3300, 3900, 4700, 5600, 6800, 8200, 10000];
  assertEquals(preferredValuesBetween(1e3, 10e3, "E12"), decade); // IEC 60063 E12, 1 k to 10 k inclusive, exact
  assertEquals(preferredValuesBetween(1, 1e6, "E96").length, 6 * 96 + 1); // IEC 60063, exact
  assertThrows(() => preferredValuesBetween(10, 1, "E12"), RangeError);
});

// ── Properties ───────────────────────────────────────────────────────────────────────────

const seriesName = fc.constantFrom(...PREFERRED_SERIES_NAMES);
const anyValue = fc.double({ min: -15, max: 15, noNaN: true }).map((e) => 10 ** e);

Deno.test("nearestPreferred() always returns a member within half the local step in log distance", () => {
  fc.assert(
    fc.property(anyValue, seriesName, (value, series) => {
      const nearest = nearestPreferred(value, series);
      assert(isPreferred(nearest, series), `${nearest} is in ${series}`);
      const down = preferredDown(value, series);
      const up = preferredUp(value, series);
      // closed form: the geometric boundary is √(down·up), so the distance is at most half the
      // log step between the bracketing members (plus the 1e-9 "already a member" slack)
      const halfStep = Math.log(up / down) / 2;
      assert(Math.abs(Math.log(nearest / value)) <= halfStep + 1e-9);
      assert(nearest === down || nearest === up, "nearest is one of the two neighbours");
    }),
    { numRuns: 1000 },
  );
});

Deno.test("preferredDown() ≤ value ≤ preferredUp(), both members, with no member between them", () => {
  fc.assert(
    fc.property(anyValue, seriesName, (value, series) => {
      const down = preferredDown(value, series);
      const up = preferredUp(value, series);
      assert(down <= value * (1 + 1e-9) && up >= value * (1 - 1e-9));
      assert(isPreferred(down, series) && isPreferred(up, series));
      const between = preferredValuesBetween(down, up, series);
      assert(between.length <= 2, `${between.length} members between ${down} and ${up}`);
    }),
    { numRuns: 500 },
  );
});

Deno.test("nearestPreferred() scales with the decade", () => {
  fc.assert(
    fc.property(
      fc.double({ min: 1, max: 9.99, noNaN: true }),
      fc.integer({ min: -12, max: 9 }),
      seriesName,
      (mantissa, decade, series) => {
        const base = nearestPreferred(mantissa, series);
        const scaled = nearestPreferred(Number(`${mantissa}e${decade}`), series);
        assertClose(scaled, Number(`${base}e${decade}`), { rtol: 1e-12 }); // closed form: IEC 60063 repeats every decade
      },
    ),
    { numRuns: 500 },
  );
});
