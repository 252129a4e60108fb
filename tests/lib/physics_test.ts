/**
 * Physics against REFERENCE §1: CODATA 2018 constants, thermal voltage, the saturation-current
 * temperature law and the Vbe and Ic slopes that follow from it, including the traps of §1.4.
 */
import fc from "fast-check";
import { assert, assertClose, assertEquals, assertThrows } from "../_assert.ts";
import {
  baseEmitterVoltage,
  BOLTZMANN,
  collectorCurrentSlope,
  DEFAULT_BANDGAP_VOLTAGE,
  DEFAULT_TEMPERATURE,
  DEFAULT_TEMPERATURE_EXPONENT,
  ELEMENTARY_CHARGE,
  kelvin,
  saturationCurrentAtTemperature,
  saturationCurrentSlope,
  thermalVoltage,
  vbeAtTemperature,
  vbeChangeForCurrentRatio,
  vbeTemperatureSlope,
} from "../../lib/physics/mod.ts";
import {
  resistorNoiseDensity as physicsResistorNoise,
  shotNoiseDensity,
  thermalNoisePower,
} from "../../lib/physics/noise.ts";
import { resistorNoiseDensity as pairResistorNoise } from "../../lib/input_pair/mod.ts";

Deno.test("the constants are the exact 2019 SI values and k/q matches REFERENCE §1.1", () => {
  assertEquals(BOLTZMANN, 1.380649e-23); // CODATA18: k exact
  assertEquals(ELEMENTARY_CHARGE, 1.602176634e-19); // CODATA18: q exact
  assertClose(BOLTZMANN / ELEMENTARY_CHARGE, 8.617333262e-5, { rtol: 1e-9 }); // REFERENCE §1.1 k/q
  assertEquals(DEFAULT_TEMPERATURE, 300); // REFERENCE §0.1: default T = 300 K
  assertEquals(DEFAULT_BANDGAP_VOLTAGE, 1.205); // REFERENCE §1.1 / GHLM5 ch. 4 (from memory)
  assertEquals(DEFAULT_TEMPERATURE_EXPONENT, 3); // REFERENCE §1.1 / GHLM5 ch. 4 (from memory)
});

Deno.test("thermalVoltage() gives E1.1 to E1.4 at 300 K, 27 °C, 25 °C and 290 K", () => {
  assertClose(thermalVoltage(300), 25.852e-3, { rtol: 1e-3 }); // REFERENCE E1.1 / SS7 ch. 6 (from memory)
  assertClose(thermalVoltage(300), 25.85200e-3, { rtol: 2e-7 }); // REFERENCE E1.1: 25.85200 mV printed to 7 figures
  assertClose(thermalVoltage(kelvin(27)), 25.865e-3, { rtol: 1e-3 }); // REFERENCE E1.2 / CODATA18
  assertClose(thermalVoltage(kelvin(25)), 25.693e-3, { rtol: 1e-3 }); // REFERENCE E1.3 / CODATA18
  assertClose(thermalVoltage(290), 24.990e-3, { rtol: 1e-3 }); // REFERENCE E1.4 / CODATA18
});

Deno.test("thermalVoltage(300) is 3.3 % above the rounded 25 mV, which a test must see", () => {
  const vt = thermalVoltage(300);
  assertClose(vt / 0.025 - 1, 0.0341, { rtol: 5e-3 }); // REFERENCE §1.4 trap: 25 mV instead of 25.85 mV is already a 3.3 % error, rtol 5e-3
  assert(Math.abs(vt - 0.025) / vt > 0.03, "25 mV is not the 300 K thermal voltage");
  assert(Math.abs(vt - 0.026) / vt > 5e-3, "26 mV is not the 300 K thermal voltage either");
});

Deno.test("vbeTemperatureSlope() gives -2.109 mV/K at 0.65 V and 300 K (E1.5)", () => {
  assertClose(vbeTemperatureSlope(0.65), -2.109e-3, { rtol: 1e-3 }); // REFERENCE E1.5 / GHLM5 ch. 4 (from memory)
  const explicit = { temperature: 300, bandgapVoltage: 1.205, temperatureExponent: 3 };
  assertClose(vbeTemperatureSlope(0.65, explicit), -2.109e-3, { rtol: 1e-3 }); // REFERENCE E1.5, options explicit
});

Deno.test("vbeTemperatureSlope() gives -2.003 mV/K at 0.60 V, 25 °C with VG0 = 1.12 V (E1.6)", () => {
  const slope = vbeTemperatureSlope(0.6, { temperature: 298.15, bandgapVoltage: 1.12 });
  assertClose(slope, -2.003e-3, { rtol: 1e-3 }); // REFERENCE E1.6 / D from GHLM5 ch. 4 law
});

Deno.test("using the 300 K bandgap 1.12 V for VG0 understates the Vbe slope by 13 %", () => {
  const right = vbeTemperatureSlope(0.65, { bandgapVoltage: 1.205 });
  const wrong = vbeTemperatureSlope(0.65, { bandgapVoltage: 1.12 });
  assertClose(wrong, -1.825e-3, { rtol: 1e-3 }); // REFERENCE §1.4 trap: 1.12 V gives -1.825 mV/K
  assertClose(1 - wrong / right, 0.13, { rtol: 0.05 }); // REFERENCE §1.4 trap: "13 % lower" (2 figures)
});

Deno.test("vbeTemperatureSlope() replaces η by η − a for a bias current growing as T^a", () => {
  const ptat = vbeTemperatureSlope(0.65, { currentExponent: 1 });
  const vt = thermalVoltage(300);
  assertClose(ptat, (0.65 - 1.205 - 2 * vt) / 300, { rtol: 1e-12 }); // REFERENCE §1.1 (η − a), closed form
});

Deno.test("saturationCurrentAtTemperature() grows Is by 4.963 from 300 K to 310 K (E1.7)", () => {
  const ratio = saturationCurrentAtTemperature(1e-14, { temperature: 310 }) / 1e-14;
  assertClose(ratio, 4.963, { rtol: 1e-3 }); // REFERENCE E1.7 / GHLM5 ch. 4 (from memory)
  assertClose(ratio ** (1 / 10) - 1, 0.174, { rtol: 5e-3 }); // REFERENCE E1.7: mean 17.4 %/K
});

Deno.test("saturationCurrentSlope() gives 16.54 %/K at 300 K: Is doubles every 4.19 K (E1.8)", () => {
  const slope = saturationCurrentSlope();
  assertClose(slope, 0.1654, { rtol: 1e-3 }); // REFERENCE E1.8 / D from the GHLM5 Is law
  assertClose(Math.LN2 / slope, 4.19, { rtol: 5e-3 }); // REFERENCE E1.8: doubles every 4.19 K
});

Deno.test("vbeAtTemperature() moves 0.650 V at 300 K to 0.62887 V at 310 K (E1.9)", () => {
  const exact = vbeAtTemperature(0.65, { temperature: 310, referenceTemperature: 300 });
  assertClose(exact, 0.62887, { atol: 5e-6, rtol: 0 }); // REFERENCE E1.9: 0.62887 V, printed to 10 µV
  const linear = 0.65 + 10 * vbeTemperatureSlope(0.65);
  assertClose(linear, 0.62891, { atol: 5e-6, rtol: 0 }); // REFERENCE E1.9: linear estimate 0.62891 V
  assert(linear > exact, "the linear estimate sits above the exact value (REFERENCE E1.9)");
});

Deno.test("collectorCurrentSlope() gives 8.16 %/K at a fixed Vbe of 0.65 V (E1.10)", () => {
  assertClose(collectorCurrentSlope(0.65), 0.0816, { rtol: 1e-3 }); // REFERENCE E1.10 / D
  const slope = collectorCurrentSlope(0.65);
  assert(slope > 0.08 && slope < 0.1); // REFERENCE §1.3: "roughly 8–10 %/K" (HH3 "about 9 %/°C", from memory)
});

Deno.test("vbeChangeForCurrentRatio() gives 59.526 mV per decade and 17.919 mV per doubling", () => {
  assertClose(vbeChangeForCurrentRatio(10), 59.526e-3, { rtol: 1e-3 }); // REFERENCE §1.3: VT·ln 10 at 300 K
  assertClose(vbeChangeForCurrentRatio(2), 17.919e-3, { rtol: 1e-3 }); // REFERENCE §1.3: VT·ln 2 at 300 K
  const vbe1 = baseEmitterVoltage(1e-4, 1e-14);
  const vbe2 = baseEmitterVoltage(1e-3, 1e-14);
  assertClose(vbe2 - vbe1, 59.526e-3, { rtol: 1e-3 }); // REFERENCE §1.3: 59.526 mV/decade
});

Deno.test("baseEmitterVoltage() gives 0.65479 V at 1 mA with Is = 1e-14 A (E2.2)", () => {
  assertClose(baseEmitterVoltage(1e-3, 1e-14), 0.65479, { rtol: 1e-3 }); // REFERENCE E2.2 / SS7 ch. 6 (from memory)
  assertClose(baseEmitterVoltage(1e-3, 1e-14), 0.65479, { atol: 5e-6, rtol: 0 }); // REFERENCE E2.2, printed to 10 µV
  assertEquals(baseEmitterVoltage(0, 1e-14), 0); // closed form: no current, no voltage
  assertThrows(() => baseEmitterVoltage(-1e-3, 1e-14), RangeError);
  assertThrows(() => baseEmitterVoltage(1e-3, 0), RangeError);
});

Deno.test("the junction helpers refuse non-physical temperatures", () => {
  assertThrows(() => saturationCurrentAtTemperature(1e-14, { temperature: 0 }), RangeError);
  assertThrows(() => vbeAtTemperature(0.65, { referenceTemperature: -1 }), RangeError);
  assertThrows(() => vbeTemperatureSlope(0.65, { bandgapVoltage: 0 }), RangeError);
  assertThrows(() => saturationCurrentSlope({ temperature: -300 }), RangeError);
});

// ── Properties ───────────────────────────────────────────────────────────────────────────

Deno.test("Vbe rises monotonically with current at any temperature", () => {
  fc.assert(
    fc.property(
      fc.double({ min: -12, max: 0, noNaN: true }),
      fc.double({ min: 1e-3, max: 1, noNaN: true }),
      fc.double({ min: 200, max: 450, noNaN: true }),
      (exponent, step, temperature) => {
        const low = 10 ** exponent;
        const high = low * (1 + step);
        assert(
          baseEmitterVoltage(high, 1e-14, { temperature }) >
            baseEmitterVoltage(low, 1e-14, { temperature }),
        );
      },
    ),
    { numRuns: 300 },
  );
});

Deno.test("vbeTemperatureSlope() is the derivative of vbeAtTemperature()", () => {
  fc.assert(
    fc.property(
      fc.double({ min: 0.4, max: 0.8, noNaN: true }),
      fc.double({ min: 220, max: 420, noNaN: true }),
      fc.double({ min: 1.1, max: 1.25, noNaN: true }),
      fc.double({ min: 2, max: 4, noNaN: true }),
      (vbe, temperature, bandgapVoltage, temperatureExponent) => {
        const law = { bandgapVoltage, temperatureExponent, referenceTemperature: temperature };
        const h = 1e-3;
        const up = vbeAtTemperature(vbe, { ...law, temperature: temperature + h });
        const down = vbeAtTemperature(vbe, { ...law, temperature: temperature - h });
        const slope = vbeTemperatureSlope(vbe, {
          temperature,
          bandgapVoltage,
          temperatureExponent,
        });
        assertClose((up - down) / (2 * h), slope, { rtol: 1e-5 }); // closed form: central difference of the exact law, error O(h²)
      },
    ),
    { numRuns: 200 },
  );
});

Deno.test("saturationCurrentAtTemperature() returns to its start after a round trip", () => {
  fc.assert(
    fc.property(
      fc.double({ min: 200, max: 450, noNaN: true }),
      fc.double({ min: 200, max: 450, noNaN: true }),
      (t0, t1) => {
        const there = saturationCurrentAtTemperature(1e-14, {
          temperature: t1,
          referenceTemperature: t0,
        });
        const back = saturationCurrentAtTemperature(there, {
          temperature: t0,
          referenceTemperature: t1,
        });
        assertClose(back, 1e-14, { rtol: 1e-9 }); // closed form: the law composes
        assert((t1 > t0) === (there > 1e-14) || t1 === t0); // closed form: d(ln Is)/dT > 0, so Is rises with temperature
      },
    ),
    { numRuns: 200 },
  );
});

Deno.test("physics/noise gives 4kTR, √(4kTR) and √(2qI) at the REFERENCE E3.9 and E3.11 values", () => {
  assertClose(thermalNoisePower(1), 1.6568e-20, { rtol: 1e-4 }); // REFERENCE E3.11 4kT at 300 K / [JN28], CODATA 2018
  assertClose(physicsResistorNoise(1e3), 4.070e-9, { rtol: 1e-3 }); // REFERENCE E3.11 1 kΩ at 300 K / [JN28]
  assertClose(physicsResistorNoise(1e3, { temperature: 290 }), 4.002e-9, { rtol: 1e-3 }); // REFERENCE E3.11 290 K / [JN28]
  assertClose(shotNoiseDensity(5e-6), 1.266e-12, { rtol: 1e-3 }); // REFERENCE E3.9 in per input, IB = 5 µA / [Sch18]
  assertThrows(() => thermalNoisePower(-1), RangeError);
  assertThrows(() => shotNoiseDensity(-1e-6), RangeError);
  assertThrows(() => physicsResistorNoise(1e3, { temperature: 0 }), RangeError);
});

Deno.test("the input pair's resistorNoiseDensity is the physics one, re-exported", () => {
  assertEquals(pairResistorNoise, physicsResistorNoise);
});

Deno.test("thermal noise powers of series resistors add: 4kT(R1 + R2) = 4kT·R1 + 4kT·R2", () => {
  fc.assert(
    fc.property(
      fc.double({ min: 0, max: 1e7, noNaN: true }),
      fc.double({ min: 0, max: 1e7, noNaN: true }),
      (r1, r2) => {
        const sum = thermalNoisePower(r1) + thermalNoisePower(r2);
        return Math.abs(thermalNoisePower(r1 + r2) - sum) <= 1e-12 * sum;
      },
    ),
    { numRuns: 200 },
  );
});
