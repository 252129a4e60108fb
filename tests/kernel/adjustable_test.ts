/**
 * Adjustable values, reading typed values (SI prefixes and RKM codes), and the sandbox's
 * line protocol.
 */
import fc from "fast-check";
import {
  adjustable,
  ADJUSTABLE_REGISTRY,
  type AdjustableRegistry,
} from "../../kernel/adjustable/adjustable.ts";
import { parseValue } from "../../kernel/adjustable/parse_value.ts";
import { decodeLine, encodeLine } from "../../kernel/sandbox/protocol.ts";
import { assert, assertClose, assertEquals, assertThrows } from "../_assert.ts";

Deno.test("parseValue() reads plain numbers, SI prefixes, RKM codes and trailing units", () => {
  assertEquals(parseValue("0.002"), 0.002); // closed form
  assertEquals(parseValue("2e-3"), 0.002); // closed form
  assertEquals(parseValue("2m"), 0.002); // closed form: m = 1e-3
  assertEquals(parseValue("2mA"), 0.002); // closed form
  assertEquals(parseValue("4.7k"), 4700); // closed form
  assertEquals(parseValue("4k7"), 4700); // closed form: RKM (IEC 60062)
  assertEquals(parseValue("4K7"), 4700); // closed form: RKM, capital K
  assertEquals(parseValue("4R7"), 4.7); // closed form: RKM
  assertEquals(parseValue("R47"), 0.47); // closed form: RKM
  assertEquals(parseValue("2M2"), 2.2e6); // closed form: RKM, M is mega
  assertEquals(parseValue("4n7"), 4.7e-9); // closed form: RKM
  assertEquals(parseValue("100nF"), 1e-7); // closed form
  assertEquals(parseValue("2.2µ"), 2.2e-6); // closed form
  assertEquals(parseValue("2.2u"), 2.2e-6); // closed form
  assertEquals(parseValue("10 kΩ"), 10e3); // closed form
  assertEquals(parseValue(" -3.5 "), -3.5); // closed form
  for (const bad of ["", "k", "4k7k", "two", "1..2", "--1", "4 k 7"]) {
    assertThrows(() => parseValue(bad), SyntaxError, bad);
  }
});

Deno.test("parseValue() reads back what an engineer writes for any value with a prefix", () => {
  const prefixes: Array<[string, number]> = [
    ["p", 1e-12],
    ["n", 1e-9],
    ["u", 1e-6],
    ["m", 1e-3],
    ["", 1],
    ["k", 1e3],
    ["M", 1e6],
    ["G", 1e9],
  ];
  fc.assert(
    fc.property(
      fc.integer({ min: 1, max: 999_999 }),
      fc.constantFrom(...prefixes),
      (milli, [prefix, scale]) => {
        const mantissa = milli / 1000;
        assertClose(parseValue(`${mantissa}${prefix}`), mantissa * scale, { rtol: 1e-12 }); // closed form, float rounding
        if (Number.isInteger(mantissa * 10) && mantissa >= 1 && mantissa < 1000 && prefix !== "") {
          const [whole, tenth] = mantissa.toFixed(1).split(".");
          assertClose(parseValue(`${whole}${prefix}${tenth}`), mantissa * scale, { rtol: 1e-12 }); // closed form: RKM
        }
      },
    ),
    { numRuns: 300 },
  );
});

Deno.test("adjustable() returns its default, or the value set for its name, and registers itself", () => {
  const slot = globalThis as unknown as Record<symbol, AdjustableRegistry | undefined>;
  const previous = slot[ADJUSTABLE_REGISTRY];
  const registry: AdjustableRegistry = { values: { tail: 3e-3 }, declared: [] };
  slot[ADJUSTABLE_REGISTRY] = registry;
  try {
    const options = { unit: "A", min: 1e-3, max: 5e-3, step: 1e-4 };
    assertEquals(adjustable(2e-3, options), 2e-3); // exact: unnamed, so the default
    assertEquals(adjustable.named("tail")(2e-3, options), 3e-3); // exact: as set
    assertEquals(adjustable.named("other")(2e-3, options), 2e-3); // exact: nothing set
    assertEquals(registry.declared.map((d) => [d.name, d.value, d.label]), [
      ["", 2e-3, ""],
      ["tail", 3e-3, "tail"],
      ["other", 2e-3, "other"],
    ]);
    registry.values.tail = 9;
    assertThrows(
      () => adjustable.named("tail")(2e-3, options),
      /Expected the value set for tail to be a finite number within/,
    );
  } finally {
    slot[ADJUSTABLE_REGISTRY] = previous;
  }
});

Deno.test("adjustable() rejects a default outside its range, an inverted range and a negative step", () => {
  assertThrows(() => adjustable(7, { min: 0, max: 5 }), RangeError);
  assertThrows(() => adjustable(NaN), RangeError);
  assertThrows(() => adjustable(1, { min: 5, max: 0 }), RangeError);
  assertThrows(() => adjustable(1, { step: -1 }), RangeError);
});

Deno.test("the sandbox protocol carries NaN and infinities through JSON lines", () => {
  fc.assert(
    fc.property(fc.array(fc.double()), (values) => {
      const line = encodeLine({ values });
      assert.ok(line.endsWith("\n") && !line.slice(0, -1).includes("\n"));
      const back = (decodeLine(line) as { values: number[] }).values;
      assertEquals(back.map(String), values.map((v) => String(Object.is(v, -0) ? 0 : v)));
    }),
    { numRuns: 200 },
  );
});
