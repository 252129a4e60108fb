/**
 * Values and units against REFERENCE §8.3–§8.4 (IEC 60062 RKM code, tolerance letters,
 * colour code, temperature coefficient), decibel levels quoted across REFERENCE, and
 * property tests for the round trips between text and numbers.
 */
import fc from "fast-check";
import { assert, assertClose, assertEquals, assertThrows } from "../_assert.ts";
import {
  dbToPowerRatio,
  dbToVoltageRatio,
  decodeColourBands,
  encodeColourBands,
  formatRkm,
  formatSi,
  parseQuantity,
  parseQuantityParts,
  parseRkm,
  powerRatioToDb,
  QuantitySyntaxError,
  RKM_TOLERANCE_LETTERS,
  temperatureDrift,
  voltageRatioToDb,
} from "../../lib/units/mod.ts";

// ── SI notation ──────────────────────────────────────────────────────────────────────────

Deno.test("parseQuantity() reads SI prefixes with and without units and spaces", () => {
  assertEquals(parseQuantity("4.7k"), 4700); // closed form (SI prefix k = 1e3), exact
  assertEquals(parseQuantity("100n"), 100e-9); // closed form (n = 1e-9), exact
  assertEquals(parseQuantity("2.2 µF"), 2.2e-6); // closed form (µ = 1e-6), exact
  assertEquals(parseQuantity("2.2 μF"), 2.2e-6); // closed form, Greek mu accepted, exact
  assertEquals(parseQuantity("2.2uF"), 2.2e-6); // closed form, ASCII u for µ, exact
  assertEquals(parseQuantity("10 kΩ"), 10e3); // closed form, exact
  assertEquals(parseQuantity("10 kohm"), 10e3); // closed form, spelled-out ohm, exact
  assertEquals(parseQuantity("1e-3 A"), 1e-3); // closed form, exponent notation, exact
  assertEquals(parseQuantity("  -15 V "), -15); // closed form, sign and white space, exact
  assertEquals(parseQuantity("−15V"), -15); // closed form, U+2212 minus sign, exact
  assertEquals(parseQuantity("1M"), 1e6); // closed form (M = mega), exact
  assertEquals(parseQuantity("1m"), 1e-3); // closed form (m = milli), exact
  assertEquals(parseQuantity(".5 pF"), 0.5e-12); // closed form, leading decimal point, exact
  assertEquals(parseQuantity("20 kHz"), 20e3); // closed form, exact
});

Deno.test("parseQuantity() reads the kernel's --set values such as tailCurrent=2m", () => {
  assertEquals(parseQuantity("2m", { unit: "A" }), 2e-3); // closed form (m = 1e-3), exact
  assertEquals(parseQuantity("2 mA", { unit: "A" }), 2e-3); // closed form, exact
});

Deno.test("parseQuantity() keeps dB and °C as written and scales % and ppm to fractions", () => {
  assertEquals(parseQuantity("-3 dB"), -3); // closed form: dB values are returned as written
  assertEquals(parseQuantity("25 °C"), 25); // closed form: no conversion to K, exact
  assertEquals(parseQuantity("5 %"), 0.05); // closed form (% = 1e-2), exact
  assertEquals(parseQuantity("100 ppm/K"), 1e-4); // closed form (ppm = 1e-6), exact
  assertEquals(parseQuantityParts("100 ppm/K").unit, "1/K");
  assertThrows(() => parseQuantity("3 kdB"), QuantitySyntaxError);
});

Deno.test("parseQuantity() reads a lone K as kilo unless kelvin is the expected unit", () => {
  assertEquals(parseQuantity("10K"), 10e3); // IEC 60062 RKM habit "10K" = 10 kΩ, exact
  assertEquals(parseQuantity("300 K", { unit: "K" }), 300); // closed form, kelvin, exact
});

Deno.test("parseQuantity() rejects a unit other than the expected one and says where", () => {
  assertThrows(() => parseQuantity("10 mV", { unit: "A" }), (error: unknown) => {
    assert(error instanceof QuantitySyntaxError && error instanceof SyntaxError);
    assertEquals(error.column, 5);
    return true;
  });
  assertThrows(() => parseQuantity("4n7F", { unit: "Ω" }), { column: 4 });
  assertThrows(() => parseQuantity("5 %", { unit: "V" }), { column: 3 });
});

Deno.test("parseQuantity() reports the column of the first character it cannot read", () => {
  const cases: Array<[string, number]> = [
    ["4.7x", 4],
    ["", 1],
    ["   ", 1],
    ["k", 1],
    ["-", 2],
    ["  abc", 3],
    ["1.2.3", 4],
    ["10 mm", 5],
    ["4,7k", 2],
  ];
  for (const [text, column] of cases) {
    assertThrows(() => parseQuantity(text), (error: unknown) => {
      assert(error instanceof QuantitySyntaxError, `${JSON.stringify(text)} should not parse`);
      assertEquals(error.column, column, `column for ${JSON.stringify(text)}`);
      assertEquals(error.text, text);
      return true;
    });
  }
});

Deno.test("parseQuantity() rejects numbers beyond a double and text that is not a string", () => {
  assertThrows(() => parseQuantity("1e400"), RangeError);
  assertThrows(() => parseQuantity(42 as unknown as string), TypeError);
});

// ── RKM code ─────────────────────────────────────────────────────────────────────────────

Deno.test("parseRkm() reads every IEC 60062 example of REFERENCE §8.3", () => {
  assertEquals(parseRkm("4K7").value, 4700); // REFERENCE §8.3 / IEC 60062: 4K7 = 4700 Ω, exact
  assertEquals(parseRkm("2R2").value, 2.2); // REFERENCE §8.3 / IEC 60062: 2R2 = 2.2 Ω, exact
  assertEquals(parseRkm("R47").value, 0.47); // REFERENCE §8.3 / IEC 60062: R47 = 0.47 Ω, exact
  assertEquals(parseRkm("1M0").value, 1e6); // REFERENCE §8.3 / IEC 60062: 1M0 = 1 MΩ, exact
  assertEquals(parseRkm("100R").value, 100); // REFERENCE §8.3 / IEC 60062: 100R = 100 Ω, exact
  assertEquals(parseRkm("10K").value, 10e3); // REFERENCE §8.3 / IEC 60062: 10K = 10 kΩ, exact
  assertEquals(parseRkm("6n8").value, 6.8e-9); // REFERENCE §8.3 / IEC 60062: 6n8 = 6.8 nF, exact
  assertEquals(parseRkm("2p2").value, 2.2e-12); // REFERENCE §8.3 / IEC 60062: 2p2 = 2.2 pF, exact
  assertEquals(parseRkm("4µ7").value, 4.7e-6); // REFERENCE §8.3 / IEC 60062: 4µ7 = 4.7 µF, exact
  assertEquals(parseRkm("4u7").value, 4.7e-6); // REFERENCE §8.3 / IEC 60062: u for µ, exact
  assertEquals(parseRkm("4K7").unit, "Ω");
  assertEquals(parseRkm("6n8").unit, "F");
  assertEquals(parseRkm("1G5").value, 1.5e9); // IEC 60062: G = ×10⁹ (REFERENCE §8.3), exact
  assertEquals(parseRkm("2T2").value, 2.2e12); // IEC 60062: T = ×10¹² (REFERENCE §8.3), exact
  assertEquals(parseRkm("4m7").value, 4.7e-3); // IEC 60062: m = ×10⁻³ F (REFERENCE §8.3), exact
});

Deno.test("parseQuantity() reads RKM codes through the same entry point", () => {
  assertEquals(parseQuantity("4K7"), 4700); // REFERENCE §8.3 / IEC 60062, exact
  assertEquals(parseQuantity("4k7"), 4700); // issue 2 item 1 ("4k7") / IEC 60062, exact
  assertEquals(parseQuantity("R47"), 0.47); // REFERENCE §8.3 / IEC 60062, exact
  assertEquals(parseQuantity("6n8F"), 6.8e-9); // IEC 60062 with the unit written, exact
  assertEquals(parseQuantityParts("2R2").notation, "rkm");
  assertEquals(parseQuantityParts("4.7k").notation, "si");
});

Deno.test("parseRkm() reads every tolerance letter of REFERENCE §8.3", () => {
  const letters: Array<[string, number]> = [
    ["B", 0.001], // REFERENCE §8.3 / IEC 60062: B ±0.1 %
    ["C", 0.0025], // REFERENCE §8.3 / IEC 60062: C ±0.25 %
    ["D", 0.005], // REFERENCE §8.3 / IEC 60062: D ±0.5 %
    ["F", 0.01], // REFERENCE §8.3 / IEC 60062: F ±1 %
    ["G", 0.02], // REFERENCE §8.3 / IEC 60062: G ±2 %
    ["J", 0.05], // REFERENCE §8.3 / IEC 60062: J ±5 %
    ["K", 0.1], // REFERENCE §8.3 / IEC 60062: K ±10 %
    ["M", 0.2], // REFERENCE §8.3 / IEC 60062: M ±20 %
  ];
  for (const [letter, tolerance] of letters) {
    assertEquals(parseRkm(`4K7${letter}`), { value: 4700, unit: "Ω", tolerance }); // exact
    assertEquals(RKM_TOLERANCE_LETTERS.get(letter), tolerance); // exact
  }
  assertEquals(RKM_TOLERANCE_LETTERS.size, 8); // REFERENCE §8.3: eight letters B…M, exact
});

Deno.test("parseRkm() reads 4K7J as 4700 Ω ±5 % and 4K7K as 4.7 kΩ ±10 %", () => {
  assertEquals(parseRkm("4K7J"), { value: 4700, unit: "Ω", tolerance: 0.05 }); // REFERENCE §8.3
  assertEquals(parseRkm("4K7K"), { value: 4700, unit: "Ω", tolerance: 0.1 }); // REFERENCE §8.3: "a trailing K after a complete value ("4K7K") means ±10 %", exact
  assertEquals(parseRkm("10KK"), { value: 10e3, unit: "Ω", tolerance: 0.1 }); // same rule, exact
  assertEquals(parseRkm("4n7J"), { value: 4.7e-9, unit: "F", tolerance: 0.05 }); // IEC 60062
  assertEquals(parseQuantityParts("4K7K").tolerance, 0.1); // REFERENCE §8.3, exact
});

Deno.test("parseRkm() rejects text that is not an RKM code with a column", () => {
  assertThrows(() => parseRkm("4.7k"), { name: "QuantitySyntaxError", column: 2 });
  assertThrows(() => parseRkm("4K7X"), QuantitySyntaxError);
  assertThrows(() => parseRkm("K"), QuantitySyntaxError);
  assertThrows(() => parseRkm(""), { column: 1 });
  assertThrows(() => parseRkm("4K7FJ"), QuantitySyntaxError);
});

Deno.test("formatRkm() writes the REFERENCE §8.3 examples back as they are printed", () => {
  assertEquals(formatRkm(4700), "4K7"); // REFERENCE §8.3 / IEC 60062, exact
  assertEquals(formatRkm(2.2), "2R2"); // REFERENCE §8.3 / IEC 60062, exact
  assertEquals(formatRkm(0.47), "R47"); // REFERENCE §8.3 / IEC 60062, exact
  assertEquals(formatRkm(1e6), "1M0"); // REFERENCE §8.3 / IEC 60062, exact
  assertEquals(formatRkm(100), "100R"); // REFERENCE §8.3 / IEC 60062, exact
  assertEquals(formatRkm(10e3), "10K"); // REFERENCE §8.3 / IEC 60062, exact
  assertEquals(formatRkm(6.8e-9, { unit: "F" }), "6n8"); // REFERENCE §8.3 / IEC 60062, exact
  assertEquals(formatRkm(2.2e-12, { unit: "F" }), "2p2"); // REFERENCE §8.3 / IEC 60062, exact
  assertEquals(formatRkm(4.7e-6, { unit: "F" }), "4µ7"); // REFERENCE §8.3 / IEC 60062, exact
  assertEquals(formatRkm(4.7e-6, { unit: "F", ascii: true }), "4u7"); // IEC 60062 u for µ
  assertEquals(formatRkm(4700, { tolerance: 0.05 }), "4K7J"); // REFERENCE §8.3 J ±5 %, exact
  assertEquals(formatRkm(4700, { tolerance: 0.1 }), "4K7K"); // REFERENCE §8.3 K ±10 %, exact
});

Deno.test("formatRkm() rounds to its digits, carries into the next letter and rejects the impossible", () => {
  assertEquals(formatRkm(4712), "4K71"); // closed form, 3 significant digits
  assertEquals(formatRkm(999.6), "1K0"); // closed form, rounding carries into kilo
  assertEquals(formatRkm(0.047), "R047"); // closed form
  assertThrows(() => formatRkm(0), RangeError);
  assertThrows(() => formatRkm(-4700), RangeError);
  assertThrows(() => formatRkm(1.5, { unit: "F" }), RangeError);
  assertThrows(() => formatRkm(4700, { tolerance: 0.03 }), RangeError);
});

Deno.test("formatRkm() and parseRkm() round-trip any value to three significant digits", () => {
  fc.assert(
    fc.property(
      fc.double({ min: 0, max: 1, noNaN: true }),
      fc.constantFrom<"Ω" | "F">("Ω", "F"),
      (position, unit) => {
        // Spread over the letters' reach: 1.3 mΩ … 790 TΩ, 1.3 fF … 0.98 F.
        const exponent = unit === "Ω" ? -2.9 + 17.8 * position : -14.9 + 14.89 * position;
        const value = 10 ** exponent;
        const code = formatRkm(value, { unit });
        const back = parseRkm(code);
        assertEquals(back.unit, unit);
        assertClose(back.value, value, { rtol: 5e-3 }, code); // closed form: rounding to 3 significant digits moves a value by at most 0.5 %
      },
    ),
    { numRuns: 500 },
  );
});

// ── Colour code ──────────────────────────────────────────────────────────────────────────

Deno.test("decodeColourBands() reads brown-black-red-gold as 1 kΩ ±5 %", () => {
  assertEquals(decodeColourBands("brown-black-red-gold"), { value: 1000, tolerance: 0.05 }); // REFERENCE §8.3 / IEC 60062: brown-black-red-gold = 1 kΩ ±5 %, exact
  assertEquals(decodeColourBands(["Brown", "Black", "Red", "Gold"]).value, 1000); // same, exact
});

Deno.test("decodeColourBands() gives every digit, multiplier and tolerance colour its value", () => {
  const digits = [
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
  for (const [digit, colour] of digits.entries()) {
    assertEquals(decodeColourBands([colour, "black", "black", "gold"]).value, digit * 10); // REFERENCE §8.3 / IEC 60062: digit colours black 0 … white 9, exact
    assertEquals(decodeColourBands(["brown", "black", colour, "gold"]).value, 10 * 10 ** digit); // REFERENCE §8.3 / IEC 60062: the multiplier band of digit colour d is ×10^d, exact
  }
  assertEquals(decodeColourBands("yellow violet gold gold").value, 4.7); // REFERENCE §8.3 / IEC 60062: multiplier gold ×0.1, silver ×0.01, exact
  assertEquals(decodeColourBands("yellow violet silver gold").value, 0.47); // IEC 60062 silver ×0.01
  const tolerances: Array<[string, number]> = [
    ["brown", 0.01], // REFERENCE §8.3 / IEC 60062
    ["red", 0.02], // REFERENCE §8.3 / IEC 60062
    ["green", 0.005], // REFERENCE §8.3 / IEC 60062
    ["blue", 0.0025], // REFERENCE §8.3 / IEC 60062
    ["violet", 0.001], // REFERENCE §8.3 / IEC 60062
    ["grey", 0.0005], // REFERENCE §8.3 / IEC 60062
    ["gold", 0.05], // REFERENCE §8.3 / IEC 60062
    ["silver", 0.1], // REFERENCE §8.3 / IEC 60062
  ];
  for (const [colour, tolerance] of tolerances) {
    assertEquals(decodeColourBands(["brown", "black", "red", colour]).tolerance, tolerance); // exact
  }
});

Deno.test("decodeColourBands() reads three-band (±20 %) and five-band markings", () => {
  assertEquals(decodeColourBands("red-red-brown"), { value: 220, tolerance: 0.2 }); // common practice, no source: a missing tolerance band means ±20 %, exact
  const fiveBands = decodeColourBands("brown-black-black-brown-brown");
  assertEquals(fiveBands, { value: 1000, tolerance: 0.01 }); // IEC 60062 five bands (3 digits), exact
  assertEquals(decodeColourBands("gray purple black gold").value, 87); // aliases, exact
});

Deno.test("decodeColourBands() points at the band that cannot stand where it is", () => {
  assertThrows(() => decodeColourBands("gold-black-red-gold"), { column: 1 });
  assertThrows(() => decodeColourBands("brown-black-pink-gold"), { column: 13 });
  assertThrows(() => decodeColourBands("brown-black-red-orange"), { column: 17 });
  assertThrows(() => decodeColourBands("brown-black"), QuantitySyntaxError);
  assertThrows(() => decodeColourBands("brown brown brown brown brown brown"), { column: 31 });
});

Deno.test("encodeColourBands() inverts decodeColourBands() for markable values", () => {
  assertEquals(encodeColourBands(1000), ["brown", "black", "red", "gold"]); // REFERENCE §8.3
  assertEquals(encodeColourBands(0.05, { tolerance: 0.1 }), ["black", "green", "silver", "silver"]); // IEC 60062
  assertThrows(() => encodeColourBands(4750), RangeError); // needs three digits
  assertThrows(() => encodeColourBands(1e12), RangeError); // beyond the white multiplier
  assertThrows(() => encodeColourBands(1000, { tolerance: 0.03 }), RangeError);
  fc.assert(
    fc.property(
      fc.integer({ min: 10, max: 999 }),
      fc.integer({ min: -2, max: 9 }),
      fc.constantFrom(0.01, 0.02, 0.005, 0.05),
      (significand, exponent, tolerance) => {
        const value = Number(`${significand}e${exponent}`);
        const bands = encodeColourBands(value, { bands: 5, tolerance });
        assertEquals(decodeColourBands(bands), { value, tolerance }); // exact round trip
      },
    ),
    { numRuns: 300 },
  );
});

// ── Round trip with formatSi ─────────────────────────────────────────────────────────────

Deno.test("parseQuantity() reads back what formatSi() writes, within its rounding", () => {
  fc.assert(
    fc.property(
      fc.double({ min: -15, max: 14.9, noNaN: true }),
      fc.boolean(),
      fc.constantFrom("Ω", "F", "V", "A", "Hz", "W", "H", "s"),
      fc.integer({ min: 2, max: 6 }),
      (exponent, negative, unit, digits) => {
        const value = (negative ? -1 : 1) * 10 ** exponent;
        const text = formatSi(value, unit, { digits });
        const parsed = parseQuantityParts(text, { unit });
        assertEquals(parsed.unit, unit);
        assertClose(parsed.value, value, { rtol: 0.5 * 10 ** (1 - digits) * (1 + 1e-9) }, text); // closed form: rounding to `digits` significant digits moves a value by ≤ ½·10^(1−digits)
      },
    ),
    { numRuns: 1000 },
  );
});

Deno.test("parseQuantity() reads formatSi() decibel text back unchanged", () => {
  assertEquals(parseQuantity(formatSi(-3.0103, "dB", { digits: 3 })), -3.01); // exact round trip
});

// ── Decibels ─────────────────────────────────────────────────────────────────────────────

Deno.test("voltageRatioToDb() reproduces the dB levels quoted in REFERENCE", () => {
  assertClose(voltageRatioToDb(50), 33.98, { rtol: 1e-3 }); // REFERENCE E3.2 / E9.1: 50 = 33.98 dB
  assertClose(voltageRatioToDb(967.54), 59.71, { rtol: 1e-3 }); // REFERENCE §3.4 CMRR_se 59.71 dB
  assertClose(voltageRatioToDb(193509), 105.7, { rtol: 1e-3 }); // REFERENCE §3.4 CMRR_d 105.7 dB
  assertClose(voltageRatioToDb(274.98), 48.79, { rtol: 1e-3 }); // REFERENCE E9.2: 48.79 dB
  assertClose(voltageRatioToDb(2524.8), 68.04, { rtol: 1e-3 }); // REFERENCE E9.3: 68.04 dB
  assertClose(voltageRatioToDb(-1547.3), 63.79, { rtol: 1e-3 }); // REFERENCE E4.1: |Av| 63.79 dB
  assertClose(voltageRatioToDb(0.01118), -39.03, { rtol: 1e-3 }); // REFERENCE E7.2: -39.03 dB
  assertClose(voltageRatioToDb(0.01), -40, { rtol: 1e-12 }); // REFERENCE §7.1: 1 % = -40 dB
  assertClose(voltageRatioToDb(0.001), -60, { rtol: 1e-12 }); // REFERENCE §7.1: 0.1 % = -60 dB
  assertClose(voltageRatioToDb(Math.SQRT1_2), -3.0103, { rtol: 1e-4 }); // closed form 20·log10(1/√2)
  assertEquals(voltageRatioToDb(0), -Infinity); // closed form log10(0)
});

Deno.test("powerRatioToDb() and the inverse helpers agree with the definitions", () => {
  assertClose(powerRatioToDb(2), 3.0103, { rtol: 1e-4 }); // closed form 10·log10(2)
  assertClose(powerRatioToDb(100), 20, { rtol: 1e-12 }); // closed form
  assertClose(dbToVoltageRatio(33.98), 50, { rtol: 1e-3 }); // REFERENCE E3.2 inverted
  assertClose(dbToPowerRatio(-3.0103), 0.5, { rtol: 1e-4 }); // closed form
  assertThrows(() => powerRatioToDb(-1), RangeError);
  assertThrows(() => voltageRatioToDb(NaN), TypeError);
  fc.assert(
    fc.property(fc.double({ min: -200, max: 200, noNaN: true }), (db) => {
      assertClose(voltageRatioToDb(dbToVoltageRatio(db)), db, { rtol: 1e-12, atol: 1e-12 }); // closed form
      assertClose(powerRatioToDb(dbToPowerRatio(db)), db, { rtol: 1e-12, atol: 1e-12 }); // closed form
      assertClose(dbToPowerRatio(db), dbToVoltageRatio(db) ** 2, { rtol: 1e-12 }); // closed form: a power ratio is the square of a voltage ratio
    }),
    { numRuns: 300 },
  );
});

// ── Temperature coefficient ──────────────────────────────────────────────────────────────

Deno.test("temperatureDrift() moves 10 kΩ at +100 ppm/K by 50 Ω when warmed 50 K", () => {
  const drift = temperatureDrift(10e3, { coefficient: 100e-6, temperatureChange: 50 });
  assertClose(drift.change, 50.0, { rtol: 1e-3 }); // REFERENCE §8.4 worked: ΔR = 50.00 Ω
  assertClose(drift.relativeChange, 0.005, { rtol: 1e-3 }); // REFERENCE §8.4 worked: +0.5 %
  assertClose(drift.value, 10050, { rtol: 1e-9 }); // closed form R(1 + TCR·ΔT)
  assertClose(parseQuantity("100 ppm/K") * 10e3 * 50, 50.0, { rtol: 1e-3 }); // REFERENCE §8.4
});
