/**
 * Devices against REFERENCE §2 (E2.1–E2.9) and the compound-pair values of §5 (E5.11, E5.14),
 * with the traps of §2.5 and property tests.
 */
import fc from "fast-check";
import { assert, assertClose, assertEquals, assertThrows } from "../_assert.ts";
import { kelvin, thermalVoltage } from "../../lib/physics/mod.ts";
import {
  bjt,
  bjtCollectorCurrent,
  bjtSaturationCurrent,
  bjtSaturationVoltage,
  bjtSmallSignal,
  bjtTransportCurrents,
  bjtVbe,
  complementaryPairBeta,
  darlingtonBeta,
  mosfet,
  mosfetDrainCurrent,
  mosfetOverdrive,
  mosfetSmallSignal,
  weakInversionGm,
  weakInversionOverdrive,
} from "../../lib/devices/mod.ts";

// ── BJT ──────────────────────────────────────────────────────────────────────────────────

Deno.test("bjtSmallSignal() gives E2.1 at 1 mA, β = 100, VA = 100 V, 300 K", () => {
  const m = bjtSmallSignal(bjt({ beta: 100, earlyVoltage: 100 }), { collectorCurrent: 1e-3 });
  assertClose(m.gm, 38.682e-3, { rtol: 1e-3 }); // REFERENCE E2.1 / SS7 ch. 7 (from memory)
  assertClose(m.rPi, 2585.2, { rtol: 1e-3 }); // REFERENCE E2.1 / SS7 ch. 7 (from memory)
  assertClose(m.ro, 100.0e3, { rtol: 1e-3 }); // REFERENCE E2.1 / SS7 ch. 7 (from memory)
  assertClose(m.re, 25.596, { rtol: 1e-3 }); // REFERENCE E2.1: re = α/gm / SS7 ch. 7 (from memory)
  assertClose(1 / m.gm, 25.852, { rtol: 1e-3 }); // REFERENCE E2.1: 1/gm = 25.852 Ω
  assertClose(m.intrinsicGain, 3868.2, { rtol: 1e-3 }); // REFERENCE E2.1: gm·ro = VA/VT
  assertClose(m.rPi, (m.beta + 1) * m.re, { rtol: 1e-12 }); // REFERENCE §2.1: rπ = (β+1)·re
  assertClose(m.baseCurrent, 10e-6, { rtol: 1e-12 }); // REFERENCE §2.1: IB = Ic/β
  assertClose(m.emitterCurrent, 1.01e-3, { rtol: 1e-12 }); // REFERENCE §2.1: IE = Ic/α
});

Deno.test("bjtSmallSignal() uses re = α/gm, which differs from 1/gm by 1 % at β = 100", () => {
  const m = bjtSmallSignal(bjt({ beta: 100 }), { collectorCurrent: 1e-3 });
  assertClose(1 - m.re * m.gm, 1 / 101, { rtol: 1e-3 }); // REFERENCE §2.5 trap: re = α/gm, not 1/gm; at β = 100 the difference is 1 %, rtol 1e-3
  assert(Math.abs(m.re - 1 / m.gm) / m.re > 5e-3, "a 4-figure test sees α/gm ≠ 1/gm");
});

Deno.test("bjtSmallSignal() gives E2.3 with both ro conventions at 27 °C", () => {
  const q = bjt({ beta: 250, earlyVoltage: 75 });
  const temperature = kelvin(27); // REFERENCE E2.3: T = 300.15 K
  const m = bjtSmallSignal(q, { collectorCurrent: 0.25e-3, temperature });
  assertClose(m.gm, 9.6656e-3, { rtol: 1e-3 }); // REFERENCE E2.3 / SS7 ch. 7 (from memory)
  assertClose(m.rPi, 25.865e3, { rtol: 1e-3 }); // REFERENCE E2.3 / SS7 ch. 7 (from memory)
  assertClose(m.ro, 300.0e3, { rtol: 1e-3 }); // REFERENCE E2.3: ro = VA/Ic (our default)
  assertClose(m.re, 103.05, { rtol: 1e-3 }); // REFERENCE E2.3: re = α/gm
  assertClose(m.intrinsicGain, 2899.7, { rtol: 1e-3 }); // REFERENCE E2.3: gm·ro with ro = VA/Ic
  const withVce = bjtSmallSignal(q, {
    collectorCurrent: 0.25e-3,
    temperature,
    collectorEmitterVoltage: 10,
    outputResistanceRule: "earlyVoltagePlusVce",
  });
  assertClose(withVce.ro, 340.0e3, { rtol: 1e-3 }); // REFERENCE E2.3: (VA+Vce)/Ic = 340.0 kΩ
  assertClose(withVce.ro / m.ro - 1, 0.13, { rtol: 0.03 }); // REFERENCE §2.5 trap: the two conventions differ by Vce/VA = 13 % in E2.3 (2 figures)
});

Deno.test("bjtSmallSignal() needs Vce for the (VA + Vce)/Ic rule and a positive current", () => {
  const q = bjt({ earlyVoltage: 75 });
  assertThrows(
    () =>
      bjtSmallSignal(q, { collectorCurrent: 1e-3, outputResistanceRule: "earlyVoltagePlusVce" }),
    TypeError,
  );
  assertThrows(() => bjtSmallSignal(q, { collectorCurrent: 0 }), {
    name: "RangeError",
    message: "Expected collectorCurrent to be greater than 0 A, but found 0",
  });
  assertEquals(bjtSmallSignal(bjt(), { collectorCurrent: 1e-3 }).ro, Infinity); // no VA: ro = ∞
});

Deno.test("bjtSmallSignal() at 300 K is not the 40 mS a hidden 25 mV would give", () => {
  const m = bjtSmallSignal(bjt(), { collectorCurrent: 1e-3 });
  assert(Math.abs(m.gm - 0.04) / m.gm > 0.03); // REFERENCE §1.4 trap: 1 mA / 25 mV = 40 mS is 3.4 % high against 1 mA / 25.852 mV
  assertClose(m.gm, 1e-3 / thermalVoltage(300), { rtol: 1e-12 }); // REFERENCE §2.1 gm = Ic/VT
});

Deno.test("bjtVbe() gives E2.2's 0.65479 V at 1 mA and inverts bjtCollectorCurrent()", () => {
  const q = bjt({ saturationCurrent: 1e-14 });
  assertClose(bjtVbe(q, 1e-3), 0.65479, { rtol: 1e-3 }); // REFERENCE E2.2 / SS7 ch. 6 (from memory)
  assertClose(bjtVbe(q, 1e-3), 0.65479, { atol: 5e-6, rtol: 0 }); // REFERENCE E2.2, printed to 10 µV
  assertClose(bjtCollectorCurrent(q, bjtVbe(q, 1e-3)), 1e-3, { rtol: 1e-12 }); // closed form inverse
});

Deno.test("bjtVbe() gives E5.11's 0.65896 V at Iq = VT/0.22 Ω with Is = 1e-12 A", () => {
  const iq = thermalVoltage(300) / 0.22; // REFERENCE E5.9: Iq = VT/RE = 117.5 mA
  assertClose(iq, 117.5e-3, { rtol: 1e-3 }); // REFERENCE E5.9 / Self6 (from memory)
  const vbe = bjtVbe(bjt({ saturationCurrent: 1e-12 }), iq);
  assertClose(vbe, 0.65896, { rtol: 1e-3 }); // REFERENCE E5.11 / SS7 ch. 12 (from memory)
  assertClose(2 * (vbe + iq * 0.22), 1.3696, { rtol: 1e-3 }); // REFERENCE E5.11: Vbias = 2·(VBE + Iq·RE) = 1.3696 V across both bases
});

Deno.test("bjtVbe() falls about 2.1 mV per kelvin through the device's Is law", () => {
  const q = bjt();
  const ic = bjtCollectorCurrent(q, 0.65); // the current that needs 0.65 V at 300 K
  const slope = (bjtVbe(q, ic, { temperature: 300.01 }) - bjtVbe(q, ic, { temperature: 299.99 })) /
    0.02;
  assertClose(slope, -2.109e-3, { rtol: 1e-3 }); // REFERENCE E1.5 / GHLM5 ch. 4 (from memory)
  const ratio = bjtSaturationCurrent(q, { temperature: 310 }) / q.saturationCurrent;
  assertClose(ratio, 4.963, { rtol: 1e-3 }); // REFERENCE E1.7 / GHLM5 ch. 4 (from memory)
});

Deno.test("bjtCollectorCurrent() applies the Early factor (1 + Vce/VA)", () => {
  const q = bjt({ earlyVoltage: 100 });
  const ratio = bjtCollectorCurrent(q, 0.65, { collectorEmitterVoltage: 10 }) /
    bjtCollectorCurrent(q, 0.65);
  assertClose(ratio, 1.1, { rtol: 1e-12 }); // REFERENCE §2.1 forward-active law, closed form
});

Deno.test("bjtTransportCurrents() gives E2.4 in the forward-active region", () => {
  const q = bjt({ saturationCurrent: 1e-14, beta: 100, reverseBeta: 1 });
  const i = bjtTransportCurrents(q, { vbe: 0.65, vbc: -5 });
  assertClose(i.collectorCurrent, 830.84e-6, { rtol: 1e-3 }); // REFERENCE E2.4 / EM54
  assertClose(i.baseCurrent, 8308.4e-9, { rtol: 1e-3 }); // REFERENCE E2.4 / EM54
  assertClose(i.emitterCurrent, i.collectorCurrent + i.baseCurrent, { rtol: 1e-15 }); // KCL
});

Deno.test("bjtTransportCurrents() gives E2.5 in saturation with Ic/IB = 31.01", () => {
  const q = bjt({ saturationCurrent: 1e-14, beta: 100, reverseBeta: 1 });
  const i = bjtTransportCurrents(q, { vbe: 0.7, vbc: 0.6 });
  assertClose(i.collectorCurrent, 5.5073e-3, { rtol: 1e-3 }); // REFERENCE E2.5 / EM54
  assertClose(i.baseCurrent, 177.58e-6, { rtol: 1e-3 }); // REFERENCE E2.5 / EM54
  assertClose(i.collectorCurrent / i.baseCurrent, 31.01, { rtol: 1e-3 }); // REFERENCE E2.5
});

Deno.test("bjtSaturationVoltage() gives E2.6: 66.96 mV at βf = 10 and 120.1 mV at βf = 50", () => {
  const q = bjt({ beta: 100, reverseBeta: 1 });
  assertClose(bjtSaturationVoltage(q, 10), 66.96e-3, { rtol: 1e-3 }); // REFERENCE E2.6 / SS7, GHLM5 (from memory)
  assertClose(bjtSaturationVoltage(q, 50), 120.1e-3, { rtol: 1e-3 }); // REFERENCE E2.6 / SS7, GHLM5 (from memory)
  assertThrows(() => bjtSaturationVoltage(q, 100), RangeError); // βf = βF: not saturated
  assertThrows(() => bjtSaturationVoltage(q, 0), RangeError);
});

Deno.test("solving the transport equations for Ic/IB = 10 at Vbe = 0.7 V also gives 66.96 mV", () => {
  const q = bjt({ beta: 100, reverseBeta: 1 });
  const forcedBeta = (vbc: number) => {
    const i = bjtTransportCurrents(q, { vbe: 0.7, vbc });
    return i.collectorCurrent / i.baseCurrent;
  };
  // Ic/IB falls as the collector junction comes on: bisect for 10.
  let low = 0.3;
  let high = 0.7;
  for (let k = 0; k < 100; k++) {
    const mid = (low + high) / 2;
    if (forcedBeta(mid) > 10) low = mid;
    else high = mid;
  }
  const vce = 0.7 - (low + high) / 2;
  assertClose(vce, 66.96e-3, { rtol: 1e-3 }); // REFERENCE E2.6: transport solve gives 66.96 mV
  assertClose(vce, bjtSaturationVoltage(q, 10), { rtol: 1e-6 }); // closed form agrees with solve
});

Deno.test("a PNP reads like an NPN in forward-direction quantities", () => {
  const npn = bjt({ beta: 150, earlyVoltage: 80 });
  const pnp = bjt({ polarity: "pnp", beta: 150, earlyVoltage: 80 });
  assertEquals(pnp.polarity, "pnp");
  assertEquals(
    bjtSmallSignal(pnp, { collectorCurrent: 2e-3 }),
    bjtSmallSignal(npn, { collectorCurrent: 2e-3 }),
  );
  const m = bjtSmallSignal(pnp, { collectorCurrent: 2e-3 });
  assertClose(m.gm, 77.363e-3, { rtol: 1e-3 }); // REFERENCE E4.1 / SS7 ch. 7 (from memory)
  assertClose(m.rPi, 1938.9, { rtol: 1e-3 }); // REFERENCE E4.1 / SS7 ch. 7 (from memory)
  assertClose(m.ro, 40.0e3, { rtol: 1e-3 }); // REFERENCE E4.1 / SS7 ch. 7 (from memory)
});

Deno.test("bjt() rejects non-physical parameters with the parameter's name", () => {
  assertThrows(() => bjt({ beta: -5 }), {
    name: "RangeError",
    message: "Expected beta to be greater than 0, but found -5",
  });
  assertThrows(() => bjt({ saturationCurrent: 0 }), RangeError);
  assertThrows(() => bjt({ earlyVoltage: -50 }), RangeError);
  assertThrows(() => bjt({ polarity: "nnp" as "npn" }), TypeError);
  assert(Object.isFrozen(bjt()));
});

// ── Compound pairs ───────────────────────────────────────────────────────────────────────

Deno.test("darlingtonBeta() and complementaryPairBeta() give E5.14", () => {
  assertEquals(darlingtonBeta(100, 50), 5150); // REFERENCE E5.14 / SS7 ch. 12 (from memory), exact
  assertEquals(complementaryPairBeta(100, 50), 5100); // REFERENCE E5.14 / D, SS7 ch. 12, exact
  assertThrows(() => darlingtonBeta(0, 50), RangeError);
});

// ── MOSFET ───────────────────────────────────────────────────────────────────────────────

Deno.test("mosfetSmallSignal() gives E2.7 at Vov = 0.2 V, k′ = 200 µA/V², W/L = 10, λ = 0.1", () => {
  const m1 = mosfet({
    processTransconductance: 200e-6,
    aspectRatio: 10,
    channelLengthModulation: 0.1,
  });
  const m = mosfetSmallSignal(m1, { overdrive: 0.2 });
  assertClose(m.drainCurrent, 40.0e-6, { rtol: 1e-3 }); // REFERENCE E2.7 / SS7 ch. 5 (from memory)
  assertClose(m.gm, 0.4e-3, { rtol: 1e-3 }); // REFERENCE E2.7 / SS7 ch. 7 (from memory)
  assertClose(m.gmFromOverdrive, 0.4e-3, { rtol: 1e-3 }); // REFERENCE E2.7: k′(W/L)Vov
  assertClose(m.gmFromCurrentAndOverdrive, 0.4e-3, { rtol: 1e-3 }); // REFERENCE E2.7: 2Id/Vov
  assertClose(m.gmFromCurrent, 0.4e-3, { rtol: 1e-3 }); // REFERENCE E2.7: √(2k′(W/L)Id)
  assertClose(m.ro, 250.0e3, { rtol: 1e-3 }); // REFERENCE E2.7: ro = 1/(λId)
  assertClose(m.intrinsicGain, 100.0, { rtol: 1e-3 }); // REFERENCE E2.7: gm·ro = 2/(λVov)
  assertEquals(m.nearWeakInversion, false); // 0.2 V > 2nVT = 77.56 mV
  assertEquals(m.warnings, []);
});

Deno.test("mosfetSmallSignal() gives E2.8 from Id = 250 µA, k′ = 120 µA/V², W/L = 20", () => {
  const m1 = mosfet({
    processTransconductance: 120e-6,
    aspectRatio: 20,
    thresholdVoltage: 0.5,
    channelLengthModulation: 0.05,
  });
  const m = mosfetSmallSignal(m1, { drainCurrent: 250e-6 });
  assertClose(m.overdrive, 0.45644, { rtol: 1e-3 }); // REFERENCE E2.8 / SS7 ch. 5 (from memory)
  assertClose(m.gateSourceVoltage, 0.95644, { rtol: 1e-3 }); // REFERENCE E2.8: Vgs = Vt + Vov
  assertClose(m.gm, 1.0954e-3, { rtol: 1e-3 }); // REFERENCE E2.8 / SS7 ch. 7 (from memory)
  assertClose(m.ro, 80.0e3, { rtol: 1e-3 }); // REFERENCE E2.8: ro = 1/(λId)
  assertClose(m.intrinsicGain, 87.64, { rtol: 1e-3 }); // REFERENCE E2.8: gm·ro
  assertClose(mosfetOverdrive(m1, 250e-6), 0.45644, { rtol: 1e-3 }); // REFERENCE E2.8
});

Deno.test("weakInversionGm() gives E2.9: 257.9 µS at 10 µA, n = 1.5, and the 77.56 mV change-over", () => {
  assertClose(weakInversionGm(10e-6, { slopeFactor: 1.5 }), 257.9e-6, { rtol: 1e-3 }); // REFERENCE E2.9 / Tsividis (from memory)
  assertClose(weakInversionGm(10e-6) / 10e-6, 25.79, { rtol: 1e-3 }); // REFERENCE E2.9: gm/Id
  assertClose(weakInversionOverdrive({ slopeFactor: 1.5 }), 77.56e-3, { rtol: 1e-3 }); // REFERENCE E2.9: 2nVT
});

Deno.test("mosfetSmallSignal() warns when the overdrive is below 2nVT", () => {
  const m1 = mosfet({ processTransconductance: 200e-6, aspectRatio: 100 });
  const m = mosfetSmallSignal(m1, { overdrive: 0.05 });
  assertEquals(m.nearWeakInversion, true);
  assertEquals(m.warnings.length, 1);
  assert(m.warnings[0].includes("weak inversion"), m.warnings[0]);
  assert(m.gm > m.weakInversionGm); // REFERENCE §2.4: below about 2nVT the square law overestimates gm
  assertClose(m.weakInversionOverdrive, 77.56e-3, { rtol: 1e-3 }); // REFERENCE E2.9: 2nVT
  const atBoundary = mosfetSmallSignal(m1, { overdrive: weakInversionOverdrive() });
  assertClose(atBoundary.gm, atBoundary.weakInversionGm, { rtol: 1e-12 }); // REFERENCE §2.2 (D): the gm laws meet at 2nVT
  assertEquals(atBoundary.nearWeakInversion, false);
});

Deno.test("mosfetSmallSignal() warns when Vds leaves saturation", () => {
  const m1 = mosfet({ processTransconductance: 200e-6, aspectRatio: 10 });
  const m = mosfetSmallSignal(m1, { overdrive: 0.3, drainSourceVoltage: 0.1 });
  assert(m.warnings.some((w) => w.includes("triode")));
});

Deno.test("mosfetDrainCurrent() follows the square law in saturation and triode", () => {
  const m1 = mosfet({
    processTransconductance: 200e-6,
    aspectRatio: 10,
    channelLengthModulation: 0.1,
  });
  const sat = mosfetDrainCurrent(m1, { gateSourceVoltage: 0.7, drainSourceVoltage: 1 });
  assertEquals(sat.region, "saturation");
  assertClose(sat.drainCurrent, 40e-6 * 1.1, { rtol: 1e-12 }); // REFERENCE §2.2 with (1 + λVds)
  const lin = mosfetDrainCurrent(m1, { gateSourceVoltage: 0.7, drainSourceVoltage: 0.1 });
  assertEquals(lin.region, "triode");
  assertClose(lin.drainCurrent, 2e-3 * (0.2 * 0.1 - 0.005), { rtol: 1e-12 }); // REFERENCE §2.2 triode
  assertEquals(
    mosfetDrainCurrent(m1, { gateSourceVoltage: 0.4, drainSourceVoltage: 1 }).region,
    "cutoff",
  );
  // REFERENCE §2.2 triode and saturation meet at Vds = Vov (λ = 0), closed form
  const ideal = mosfet({ processTransconductance: 200e-6, aspectRatio: 10 });
  const edge = mosfetDrainCurrent(ideal, {
    gateSourceVoltage: 0.7,
    drainSourceVoltage: 0.2 - 1e-12,
  });
  assertClose(edge.drainCurrent, 40e-6, { rtol: 1e-9 }); // REFERENCE §2.2: laws meet at Vds = Vov
});

Deno.test("mosfet() and mosfetSmallSignal() reject bad input with the parameter's name", () => {
  assertThrows(() => mosfet({ processTransconductance: -1, aspectRatio: 10 }), RangeError);
  assertThrows(
    () => mosfet({ processTransconductance: 1e-4, aspectRatio: 10, channelLengthModulation: -0.1 }),
    RangeError,
  );
  const m1 = mosfet({ processTransconductance: 1e-4, aspectRatio: 10 });
  assertThrows(() => mosfetSmallSignal(m1, {}), TypeError);
  assertThrows(() => mosfetSmallSignal(m1, { drainCurrent: 1e-4, overdrive: 0.2 }), TypeError);
  assertThrows(() => mosfetSmallSignal(m1, { drainCurrent: -1e-4 }), RangeError);
});

// ── Properties ───────────────────────────────────────────────────────────────────────────

Deno.test("bjtVbe() rises monotonically with collector current", () => {
  const q = bjt({ earlyVoltage: 100 });
  fc.assert(
    fc.property(
      fc.double({ min: -12, max: 0, noNaN: true }),
      fc.double({ min: 1e-3, max: 1, noNaN: true }),
      fc.double({ min: 220, max: 420, noNaN: true }),
      (exponent, step, temperature) => {
        const ic = 10 ** exponent;
        assert(bjtVbe(q, ic * (1 + step), { temperature }) > bjtVbe(q, ic, { temperature }));
      },
    ),
    { numRuns: 300 },
  );
});

Deno.test("the transport model's Ic/IB approaches βF deep in the forward-active region", () => {
  fc.assert(
    fc.property(
      fc.double({ min: 20, max: 500, noNaN: true }),
      fc.double({ min: 0.5, max: 0.75, noNaN: true }),
      (beta, vbe) => {
        const i = bjtTransportCurrents(bjt({ beta }), { vbe, vbc: -5 });
        assertClose(i.collectorCurrent / i.baseCurrent, beta, { rtol: 1e-5 }); // REFERENCE §2.1 / EM54; the reverse leakage terms shift the ratio by about β·e^(−Vbe/VT)
        assertClose(i.collectorCurrent, bjtCollectorCurrent(bjt({ beta }), vbe), { rtol: 1e-6 }); // EM54 vs §2.1
      },
    ),
    { numRuns: 200 },
  );
});

Deno.test("the three gm forms agree and gm·ro = 2/(λ·Vov) when λ·Vds is left out", () => {
  fc.assert(
    fc.property(
      fc.double({ min: 10e-6, max: 500e-6, noNaN: true }),
      fc.double({ min: 1, max: 200, noNaN: true }),
      fc.double({ min: 1e-6, max: 1e-2, noNaN: true }),
      fc.double({ min: 0.01, max: 0.3, noNaN: true }),
      (k, aspectRatio, drainCurrent, lambda) => {
        const m1 = mosfet({
          processTransconductance: k,
          aspectRatio,
          channelLengthModulation: lambda,
        });
        const m = mosfetSmallSignal(m1, { drainCurrent });
        assertClose(m.gmFromOverdrive, m.gm, { rtol: 1e-9 }); // REFERENCE §2.2 gm three ways
        assertClose(m.gmFromCurrent, m.gm, { rtol: 1e-9 }); // REFERENCE §2.2 gm three ways
        assertClose(m.intrinsicGain, 2 / (lambda * m.overdrive), { rtol: 1e-9 }); // REFERENCE §2.2
        assertEquals(m.nearWeakInversion, m.overdrive < weakInversionOverdrive());
      },
    ),
    { numRuns: 300 },
  );
});
