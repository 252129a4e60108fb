/**
 * The class-AB output stage against REFERENCE §5.2–§5.5 and §10, closed forms, and
 * property tests.
 */
import fc from "fast-check";
import { assert, assertClose, assertEquals, assertThrows } from "../_assert.ts";
import { isCheck } from "../../lib/checks/check.ts";
import { kelvin } from "../../lib/physics/thermal_voltage.ts";
import { DISPLAY } from "../../lib/display.ts";
import {
  amplifierSafetyCautions,
  classAbOutputStage,
  classBPower,
  classBPowerTable,
  classBWorstCaseDissipation,
  compoundCurrentGain,
  crossoverTransferCurve,
  deratedPower,
  designVbeMultiplier,
  ES1_DC_VOLTAGE_LIMIT,
  followerGain,
  followerOutputResistance,
  followerPairBiasVoltage,
  followerPairQuiescentCurrent,
  gainMatchedBias,
  heatSinkTemperatures,
  requiredSinkToAmbient,
  thermalRunawayGain,
  vbeMultiplier,
} from "../../lib/output_stage/mod.ts";

const VT300 = 0.025851999786435535; // kT/q at 300 K with the exact SI k and q (REFERENCE E1.1)

// ── §5.2 power and efficiency ────────────────────────────────────────────────────────────

Deno.test("classBPower() gives the ±35 V, 8 Ω figures of E5.1", () => {
  const rails = { supplyVoltage: 35, loadImpedance: 8 };
  const full = classBPower(35, rails);
  assertClose(full.outputPower, 76.56, { rtol: 1e-3 }); // REFERENCE E5.1 / SS7 ch. 12 (from memory)
  assertClose(full.supplyPower, 97.48, { rtol: 1e-3 }); // REFERENCE E5.1 / SS7 ch. 12 (from memory)
  const half = classBPower(17.5, rails);
  assertClose(half.outputPower, 19.14, { rtol: 1e-3 }); // REFERENCE E5.1 / SS7 ch. 12 (from memory)
  assertClose(half.supplyPower, 48.74, { rtol: 1e-3 }); // REFERENCE E5.1 / SS7 ch. 12 (from memory)
  assertClose(half.dissipationTotal, 29.60, { rtol: 1e-3 }); // REFERENCE E5.1 / SS7 ch. 12 (from memory)
  assertClose(half.efficiency, 0.3927, { rtol: 1e-3 }); // REFERENCE E5.1 / SS7 ch. 12 (from memory)
});

Deno.test("classBWorstCaseDissipation() reports the total and the per-device figure of E5.1 separately", () => {
  const worst = classBWorstCaseDissipation({ supplyVoltage: 35, loadImpedance: 8 });
  assertClose(worst.dissipationTotal, 31.03, { rtol: 1e-3 }); // REFERENCE E5.1 / SS7 ch. 12, GHLM5 ch. 5 (from memory)
  assertClose(worst.dissipationPerDevice, 15.51, { rtol: 1e-3 }); // REFERENCE E5.1 / SS7 ch. 12 (from memory)
  assertClose(worst.peak, 22.28, { rtol: 1e-3 }); // REFERENCE E5.1 / SS7 ch. 12 (from memory)
  assertClose(worst.efficiency, 0.5, { rtol: 1e-12 }); // closed form: η = (π/4)(2/π) at the worst level
  assertClose(worst.dissipationPerDevice / 76.5625, 0.2026, { rtol: 1e-3 }); // REFERENCE §5.7: 2/π² of Po,max per device
  assertEquals(worst.limitedBySwing, false);
});

Deno.test("classBPower() gives the ±50 V, 4 Ω figures of E5.2", () => {
  const rails = { supplyVoltage: 50, loadImpedance: 4 };
  const full = classBPower(50, rails);
  assertClose(full.outputPower, 312.5, { rtol: 1e-3 }); // REFERENCE E5.2 / SS7 ch. 12 (from memory)
  assertClose(full.supplyPower, 397.9, { rtol: 1e-3 }); // REFERENCE E5.2 / SS7 ch. 12 (from memory)
  const worst = classBWorstCaseDissipation(rails);
  assertClose(worst.dissipationTotal, 126.7, { rtol: 1e-3 }); // REFERENCE E5.2 / SS7 ch. 12 (from memory)
  assertClose(worst.peak, 31.83, { rtol: 1e-3 }); // REFERENCE E5.2 / SS7 ch. 12 (from memory)
  assertClose(worst.dissipationPerDevice, 63.33, { rtol: 1e-3 }); // REFERENCE E5.2 / SS7 ch. 12 (from memory)
  const at45 = classBPower(45, rails);
  assertClose(at45.outputPower, 253.1, { rtol: 1e-3 }); // REFERENCE E5.2 / SS7 ch. 12 (from memory)
  assertClose(at45.supplyPower, 358.1, { rtol: 1e-3 }); // REFERENCE E5.2 / SS7 ch. 12 (from memory)
  assertClose(at45.dissipationTotal, 105.0, { rtol: 1e-3 }); // REFERENCE E5.2 / SS7 ch. 12 (from memory)
  assertClose(at45.efficiency, 0.7069, { rtol: 1e-3 }); // REFERENCE E5.2 / SS7 ch. 12 (from memory)
});

Deno.test("classBWorstCaseDissipation() raises the worst case by 1/cos φ for a 45° load (E5.3)", () => {
  const worst = classBWorstCaseDissipation({
    supplyVoltage: 35,
    loadImpedance: 8,
    loadAngle: Math.PI / 4,
  });
  assertClose(worst.peak, 31.51, { rtol: 1e-3 }); // REFERENCE E5.3 / D (half-cycle average)
  assertClose(worst.dissipationTotal, 43.88, { rtol: 1e-3 }); // REFERENCE E5.3 / D (half-cycle average)
  const resistive = classBWorstCaseDissipation({ supplyVoltage: 35, loadImpedance: 8 });
  assertClose(worst.dissipationTotal / resistive.dissipationTotal, 1.414, { rtol: 1e-3 }); // REFERENCE E5.3 / D
});

Deno.test("classBWorstCaseDissipation() falls back to full swing when 2VCC/(π cos φ) exceeds the rail", () => {
  const worst = classBWorstCaseDissipation({ supplyVoltage: 35, loadImpedance: 8, loadAngle: 1.2 });
  assertEquals(worst.limitedBySwing, true);
  assertEquals(worst.peak, 35); // closed form: clipped at V̂ = VCC (exact)
  const scan = Math.max(
    ...Array.from(
      { length: 3501 },
      (_, i) =>
        classBPower(i / 100, { supplyVoltage: 35, loadImpedance: 8, loadAngle: 1.2 })
          .dissipationTotal,
    ),
  );
  assertClose(worst.dissipationTotal, scan, { rtol: 1e-12 }); // closed form: PD rises monotonically up to VCC here
});

Deno.test("classBPower() reproduces the published class-B example of E5.4 (VCC = 30 V, RL = 16 Ω)", () => {
  const rails = { supplyVoltage: 30, loadImpedance: 16 };
  const full = classBPower(30, rails);
  assertClose(full.outputPower, 28.125, { rtol: 1e-3 }); // REFERENCE E5.4 / BN Ex. 12.8 (from memory)
  assertClose(full.supplyPower, 35.81, { rtol: 1e-3 }); // REFERENCE E5.4 / BN Ex. 12.8 (from memory)
  assertClose(full.efficiency, 0.7854, { rtol: 1e-3 }); // REFERENCE E5.4 / BN Ex. 12.8 (from memory)
  const worst = classBWorstCaseDissipation(rails);
  assertClose(worst.dissipationPerDevice, 5.70, { rtol: 5e-3 }); // REFERENCE E5.4 / BN Ex. 12.8 (3 s.f.)
});

Deno.test("classBPower() gives the efficiencies of E5.5 (VCC = 24 V at 22 V and 6 V peak)", () => {
  const rails = { supplyVoltage: 24, loadImpedance: 8 };
  assertClose(classBPower(22, rails).efficiency, 0.7199, { rtol: 1e-3 }); // REFERENCE E5.5 / BN Ex. 12.9 (book: 72 %)
  assertClose(classBPower(6, rails).efficiency, 0.1963, { rtol: 1e-3 }); // REFERENCE E5.5 / BN Ex. 12.9 (book: 19.6 %)
});

Deno.test("classAbOutputStage() loses the headroom and the VBE chain from the swing (E5.6)", () => {
  const stage = classAbOutputStage({
    supplyVoltage: 35,
    loadResistance: 8,
    emitterResistance: 0.22,
    devices: { kind: "darlington", driverBeta: 100, outputBeta: 50 },
    vasHeadroom: 1,
    driverVbe: 0.7,
    outputVbe: 0.9,
  });
  assertClose(stage.swing.peak, 31.533, { rtol: 1e-4 }); // REFERENCE E5.6 / SS7 ch. 12; CP
  assertClose(stage.swing.peakCurrent, 3.942, { rtol: 1e-3 }); // REFERENCE E5.6 / SS7 ch. 12; CP
  assertClose(stage.swing.outputPower, 62.15, { rtol: 1e-3 }); // REFERENCE E5.6 / SS7 ch. 12; CP
  assertClose(stage.swing.idealOutputPower, 76.56, { rtol: 1e-3 }); // REFERENCE E5.6 / SS7 ch. 12
  assertEquals(stage.swing.limitedBy, "drive");
});

Deno.test("classAbOutputStage() reports 2·VCC·Iq as idle dissipation (E5.7)", () => {
  const stage = classAbOutputStage({
    supplyVoltage: 35,
    loadResistance: 8,
    emitterResistance: 0.22,
    quiescentCurrent: 0.1175,
  });
  assertClose(stage.power.idleTotal, 8.226, { rtol: 1e-3 }); // REFERENCE E5.7 / D
  assertClose(stage.power.idlePerDevice, 4.113, { rtol: 1e-3 }); // REFERENCE E5.7 / D (half of 8.226 W)
  assertEquals(stage.biasChoice, "given");
});

// ── §5.3 follower gain, bias, gain matching ──────────────────────────────────────────────

Deno.test("followerOutputResistance() and followerGain() give the E5.8 values", () => {
  const options = {
    emitterResistance: 0.22,
    emitterCurrent: 1,
    sourceResistance: 1000,
    currentGain: 3000,
  };
  const r = followerOutputResistance(options);
  assertClose(r.reflectedSourceResistance, 0.33322, { rtol: 1e-4 }); // REFERENCE E5.8 / SS7 ch. 12 (from memory)
  assertClose(r.outputResistance, 0.57907, { rtol: 1e-4 }); // REFERENCE E5.8 / SS7 ch. 12, GHLM5 ch. 5 (from memory)
  assertClose(followerGain(8, options), 0.93250, { rtol: 1e-4 }); // REFERENCE E5.8 / SS7 ch. 12 (from memory)
});

Deno.test("gainMatchedBias() puts VT across each emitter resistor (E5.9)", () => {
  const at = (re: number, temperature?: number) =>
    gainMatchedBias(re, { loadResistance: 8, temperature }).matchedQuiescentCurrent;
  assertClose(at(0.22), 0.1175, { rtol: 1e-3 }); // REFERENCE E5.9 / Oliver71; Self6
  assertClose(at(0.10), 0.2585, { rtol: 1e-3 }); // REFERENCE E5.9 / Oliver71; Self6
  assertClose(at(0.33), 0.07834, { rtol: 1e-3 }); // REFERENCE E5.9 / Oliver71; Self6
  assertClose(at(0.22, kelvin(25)), 0.1168, { rtol: 1e-3 }); // REFERENCE E5.9 / Oliver71 (25 °C)
});

Deno.test("gainMatchedBias() matches the crossover gain only at Iq = VT/RE (E5.10)", () => {
  const iq = VT300 / 0.22;
  const gain = (current: number) =>
    gainMatchedBias(0.22, { loadResistance: 8, quiescentCurrent: current }).crossoverGain;
  assertClose(gain(iq), 0.973236, { rtol: 1e-6 }); // REFERENCE E5.10 / Oliver71; D
  assertClose(8 / 8.22, 0.973236, { rtol: 1e-6 }); // REFERENCE E5.10 / closed form RL/(RL + RE)
  assertClose(gain(iq / 2), 0.960384, { rtol: 1e-6 }); // REFERENCE E5.10 / D (under-biased)
  assertClose(gain(iq * 2), 0.979792, { rtol: 1e-6 }); // REFERENCE E5.10 / D ("gm doubling")
  const halved = gainMatchedBias(0.22, { loadResistance: 8, quiescentCurrent: iq / 2 });
  assert(halved.gainMismatch < 0, "under-biased crossover gain sits below the large-signal gain");
  const doubled = gainMatchedBias(0.22, { loadResistance: 8, quiescentCurrent: iq * 2 });
  assert(doubled.gainMismatch > 0, "over-biased crossover gain sits above the large-signal gain");
});

Deno.test("gainMatchedBias() counts per-half base resistance in Oliver's RE, but not a shared drive (REFERENCE §5.7)", () => {
  const bias = gainMatchedBias(0.22, { loadResistance: 8, perHalfSeriesResistance: 0.1 });
  assertClose(bias.matchedQuiescentCurrent, VT300 / 0.32, { rtol: 1e-12 }); // closed form: Iq = VT/(RE + Rb/(β+1))
  assertClose(bias.gainMismatch, 0, { atol: 1e-14 }); // closed form: the gains match at that Iq
  const shared = gainMatchedBias(0.22, { loadResistance: 8, sharedSeriesResistance: 0.33 });
  assertClose(shared.matchedQuiescentCurrent, VT300 / 0.22, { rtol: 1e-12 }); // closed form: a shared Rs/(β+1) drops out
  assertClose(shared.gainMismatch, 0, { atol: 1e-14 }); // closed form: equal on both sides of crossover
  const none = gainMatchedBias(0, { loadResistance: 8, quiescentCurrent: 0.1 });
  assertEquals(none.matchedQuiescentCurrent, Infinity); // closed form: VT/0 (exact)
  assert(none.gainMismatch < 0, "without emitter resistance the crossover gain is always low");
});

Deno.test("followerPairBiasVoltage() gives VBE = 0.65896 V and Vbias = 1.3696 V (E5.11)", () => {
  const iq = VT300 / 0.22;
  const vbe = followerPairBiasVoltage(iq, { emitterResistance: 0, saturationCurrent: 1e-12 }) / 2;
  assertClose(vbe, 0.65896, { rtol: 1e-4 }); // REFERENCE E5.11 / D
  const options = { emitterResistance: 0.22, saturationCurrent: 1e-12 };
  assertClose(followerPairBiasVoltage(iq, options), 1.3696, { rtol: 1e-4 }); // REFERENCE E5.11 / D
  assertClose(followerPairQuiescentCurrent(1.3696, options), iq, { rtol: 2e-3 }); // REFERENCE E5.11 / D (inverse)
  const stage = classAbOutputStage({
    supplyVoltage: 35,
    loadResistance: 8,
    emitterResistance: 0.22,
    devices: { kind: "single", outputBeta: 50 },
    saturationCurrent: 1e-12,
  });
  assertClose(stage.biasVoltage, 1.3696, { rtol: 1e-4 }); // REFERENCE E5.11 / D (whole stage)
});

Deno.test("vbeMultiplier() gives 2.080 V, −6.747 mV/K and 4.400 mV from IB (E5.12)", () => {
  const base = {
    baseEmitterVoltage: 0.65,
    collectorBaseResistance: 2200,
    baseEmitterResistance: 1000,
  };
  const spreader = vbeMultiplier(base);
  assertClose(spreader.voltage, 2.080, { rtol: 1e-3 }); // REFERENCE E5.12 / SS7 ch. 12, GHLM5 ch. 5 (from memory)
  assertClose(spreader.vbeTemperatureCoefficient, -2.109e-3, { rtol: 1e-3 }); // REFERENCE E1.5 / D
  assertClose(spreader.temperatureSlope, -6.747e-3, { rtol: 1e-3 }); // REFERENCE E5.12 / D
  const withBase = vbeMultiplier({ ...base, baseCurrent: 2e-6 });
  assertClose(withBase.baseCurrentShift, 4.400e-3, { rtol: 1e-3 }); // REFERENCE E5.12 / SS7 ch. 12 (from memory)
  assertClose(withBase.voltage - spreader.voltage, 4.400e-3, { rtol: 1e-3 }); // REFERENCE E5.12 / SS7 ch. 12
});

Deno.test("designVbeMultiplier() picks 3.3 kΩ in E24 and 3.16 kΩ in E96 for 2.6 V (E5.13)", () => {
  const e24 = designVbeMultiplier({ targetVoltage: 2.6, baseEmitterVoltage: 0.62 });
  assertClose(e24.exactCollectorBaseResistance / e24.baseEmitterResistance, 3.1935, { rtol: 1e-4 }); // REFERENCE E5.13 / D
  assertEquals(e24.collectorBaseResistance, 3300); // REFERENCE E5.13 / IEC 60063 E24
  const e96 = designVbeMultiplier({ targetVoltage: 2.6, baseEmitterVoltage: 0.62, series: "E96" });
  assertEquals(e96.collectorBaseResistance, 3160); // REFERENCE E5.13 / IEC 60063 E96
  assertClose(e96.result.voltage, 0.62 * (1 + 3.16), { rtol: 1e-12 }); // closed form: VBE·(1 + R1/R2)
});

Deno.test("designVbeMultiplier() rounds about the geometric midpoint 3.1464 kΩ in E24 (E5.13)", () => {
  // R1 = (V − 0.62)/0.62e-3, so V = 0.62·(1 + R1/1000) puts R1 just either side of √(3.0·3.3) k.
  const below = designVbeMultiplier({
    targetVoltage: 0.62 * (1 + 3.140),
    baseEmitterVoltage: 0.62,
  });
  const above = designVbeMultiplier({
    targetVoltage: 0.62 * (1 + 3.153),
    baseEmitterVoltage: 0.62,
  });
  assertEquals(below.collectorBaseResistance, 3000); // REFERENCE E5.13 / REFERENCE §8.2 (midpoint 3.1464)
  assertEquals(above.collectorBaseResistance, 3300); // REFERENCE E5.13 / REFERENCE §8.2 (midpoint 3.1464)
});

Deno.test("designVbeMultiplier() counts the base current and hits a target quiescent current", () => {
  const exact = designVbeMultiplier({
    targetVoltage: 2.6,
    baseEmitterVoltage: 0.62,
    baseCurrent: 2e-6,
    series: "E192",
  });
  const rebuilt = vbeMultiplier({
    baseEmitterVoltage: 0.62,
    collectorBaseResistance: exact.exactCollectorBaseResistance,
    baseEmitterResistance: 1000,
    baseCurrent: 2e-6,
  });
  assertClose(rebuilt.voltage, 2.6, { rtol: 1e-12 }); // closed form: R1 = (V − VBE)/(VBE/R2 + IB)
  const iq = VT300 / 0.22;
  const forCurrent = designVbeMultiplier({
    targetQuiescentCurrent: iq,
    emitterResistance: 0.22,
    saturationCurrent: 1e-12,
    baseEmitterVoltage: 0.62,
    series: "E96",
  });
  assertClose(forCurrent.targetVoltage, 1.3696, { rtol: 1e-4 }); // REFERENCE E5.11 / D
  // E96 steps are about 2.4 %, so the rounded spreader lands within a few tens of mV and the
  // current within a factor the exponential law allows; it must move the right way.
  const achieved = forCurrent.quiescentCurrent!;
  assert(
    (achieved > iq) === (forCurrent.result.voltage > forCurrent.targetVoltage),
    "a higher spreader voltage gives a higher quiescent current",
  );
  assertThrows(() => designVbeMultiplier({ baseEmitterVoltage: 0.62 }), TypeError);
  assertThrows(
    () => designVbeMultiplier({ targetVoltage: 0.5, baseEmitterVoltage: 0.62 }),
    RangeError,
  );
});

Deno.test("compoundCurrentGain() gives 5150 for a Darlington and 5100 for a feedback pair (E5.14)", () => {
  const gains = { driverBeta: 100, outputBeta: 50 };
  assertEquals(compoundCurrentGain("darlington", gains), 5150); // REFERENCE E5.14 / SS7 ch. 12 (from memory)
  assertEquals(compoundCurrentGain("feedbackPair", gains), 5100); // REFERENCE E5.14 / D; SS7 ch. 12
  assertEquals(compoundCurrentGain("single", gains), 50); // closed form: β of the one device
});

// ── §5.4 crossover transfer curve ────────────────────────────────────────────────────────

const CROSSOVER_CASES = [
  // [label, Iq (undefined = VT/RE), V̂in, fundamental, THD_F, HD3, HD5] — REFERENCE E5.15–E5.18
  ["E5.15", undefined, 10, 9.69864, 0.02760e-2, 0.009871e-2, 0.02019e-2],
  ["E5.16", 0.05, 10, 9.65370, 0.1370e-2, 0.1273e-2, 0.04512e-2],
  ["E5.17", undefined, 1, 0.973020, 0.007351e-2, 0.007350e-2, 2.680e-7],
  ["E5.18", 0.2, 10, 9.73614, 0.1023e-2, 0.09446e-2, 0.03787e-2],
] as const;

for (const [label, iq, level, fundamental, thd, hd3, hd5] of CROSSOVER_CASES) {
  Deno.test(`crossoverTransferCurve() reproduces ${label} (Iq = ${iq ?? "VT/RE"}, ${level} V peak)`, () => {
    const curve = crossoverTransferCurve({
      emitterResistance: 0.22,
      loadResistance: 8,
      quiescentCurrent: iq,
    });
    const h = curve.distortion(level);
    assertClose(h.fundamental, fundamental, { rtol: 2e-3 }, label); // REFERENCE E5.15–E5.18 / D after Oliver71
    assertClose(h.thd, thd, { rtol: 2e-3 }, label); // REFERENCE E5.15–E5.18 / D after Oliver71
    assertClose(h.amplitudes[3] / h.fundamental, hd3, { rtol: 2e-3 }, label); // REFERENCE E5.15–E5.18 / D
    assertClose(h.amplitudes[5] / h.fundamental, hd5, { rtol: 2e-3 }, label); // REFERENCE E5.15–E5.18 / D
    assert(h.amplitudes[2] < 1e-12, `${label}: |H2| < 1e-12 by symmetry (REFERENCE §5.4)`);
  });
}

Deno.test("crossoverTransferCurve() gives the incremental gains 0.973236 at 0 V and 0.97238 at 1 V", () => {
  const curve = crossoverTransferCurve({ emitterResistance: 0.22, loadResistance: 8 });
  assertClose(curve.quiescentCurrent, 0.11751, { rtol: 1e-4 }); // REFERENCE §5.4 table (117.51 mA)
  assertClose(curve.incrementalGain(0), 0.973236, { rtol: 2e-3 }); // REFERENCE §5.4 / D
  assertClose(curve.incrementalGain(0), 8 / 8.22, { rtol: 1e-9 }); // closed form RL/(RL + RE) at the Oliver bias
  assertClose(curve.incrementalGain(1), 0.97238, { rtol: 2e-3 }); // REFERENCE §5.4 / D
  // The analytic derivative agrees with a central difference of the solved curve.
  const h = 1e-4;
  const numeric = (curve.transfer(1 + h) - curve.transfer(1 - h)) / (2 * h);
  assertClose(curve.incrementalGain(1), numeric, { rtol: 1e-6 }); // closed form: derivative of the solved curve
});

Deno.test("crossoverTransferCurve() solves every sample to the device equations within 1e-9 V", () => {
  const re = 0.22;
  const rl = 8;
  for (const iq of [0.005, 0.05, 0.11751, 0.2, 2]) {
    const curve = crossoverTransferCurve({
      emitterResistance: re,
      loadResistance: rl,
      quiescentCurrent: iq,
    });
    const vt = curve.thermalVoltage;
    for (const vin of [-30, -10, -1, -0.1, -1e-3, 0, 1e-6, 0.02, 0.3, 2, 10, 30]) {
      const vout = curve.transfer(vin);
      const { npn, pnp } = curve.currents(vin);
      // Back-substitute each device law: the implied vout must match within 1e-9 V.
      const voutFromNpn = vin - (npn - iq) * re - vt * Math.log(npn / iq);
      const voutFromPnp = vin + (pnp - iq) * re + vt * Math.log(pnp / iq);
      assertClose(voutFromNpn, vout, { atol: 1e-9, rtol: 0 }); // REFERENCE §5.4 (solve to ≤ 1e-9 V)
      assertClose(voutFromPnp, vout, { atol: 1e-9, rtol: 0 }); // REFERENCE §5.4 (solve to ≤ 1e-9 V)
      assertClose((npn - pnp) * rl, vout, { atol: 1e-12, rtol: 0 }); // REFERENCE §5.4 (vout = (In − Ip)·RL)
    }
  }
});

Deno.test("crossoverTransferCurve() samples an odd, rising curve over ±inputSpan", () => {
  const curve = crossoverTransferCurve({
    emitterResistance: 0.22,
    loadResistance: 8,
    inputSpan: 2,
    points: 41,
  });
  assertEquals(curve.curve.input.length, 41); // the requested point count (exact)
  assertEquals(curve.curve.input[0], -2); // the requested span (exact)
  assertEquals(curve.curve.input[40], 2); // the requested span (exact)
  for (let i = 1; i < 41; i++) assert(curve.curve.output[i] > curve.curve.output[i - 1]);
  for (let i = 0; i < 41; i++) {
    assertClose(curve.curve.output[i], -curve.curve.output[40 - i], { atol: 1e-12, rtol: 0 }); // closed form: odd symmetry (solver tolerance)
  }
});

Deno.test("crossoverTransferCurve() with RE = 0 follows the closed form vout = 2·Iq·RL·sinh((vin − vout)/VT)", () => {
  const iq = 0.1;
  const curve = crossoverTransferCurve({
    emitterResistance: 0,
    loadResistance: 8,
    quiescentCurrent: iq,
  });
  for (const vin of [0.01, 0.2, 3]) {
    const vout = curve.transfer(vin);
    assertClose(2 * iq * 8 * Math.sinh((vin - vout) / curve.thermalVoltage), vout, { rtol: 1e-10 }); // closed form, RE = 0
  }
});

// ── §5.5 thermal ─────────────────────────────────────────────────────────────────────────

Deno.test("heatSinkTemperatures() gives Tj = 94.25 °C for 15.5 W on its own sink (E5.19)", () => {
  const t = heatSinkTemperatures(15.5, {
    junctionToCase: 1.0,
    caseToSink: 0.5,
    sinkToAmbient: 2.0,
    ambientTemperature: kelvin(40),
  });
  assertClose(t.maxJunctionTemperature, kelvin(94.25), { rtol: 1e-6 }); // REFERENCE E5.19 / SS7 ch. 12, HH3 ch. 9
  assertClose(t.sinkTemperature, kelvin(71), { rtol: 1e-9 }); // closed form: 40 + 15.5·2
  assertClose(t.caseTemperatures[0], kelvin(78.75), { rtol: 1e-9 }); // closed form: 71 + 15.5·0.5
});

Deno.test("requiredSinkToAmbient() gives θsa ≤ 2.239 K/W and a 109.5 °C sink for E5.20", () => {
  const perDevice = classBWorstCaseDissipation({ supplyVoltage: 35, loadImpedance: 8 })
    .dissipationPerDevice;
  assertClose(perDevice, 15.515, { rtol: 1e-3 }); // REFERENCE E5.20 (E5.1 per device)
  const sink = requiredSinkToAmbient([perDevice, perDevice], {
    junctionToCase: 0.7,
    caseToSink: 0.3,
    ambientTemperature: kelvin(40),
    maxJunctionTemperature: kelvin(125),
  });
  assertClose(sink.sinkToAmbient, 2.239, { rtol: 1e-3 }); // REFERENCE E5.20 / SS7 ch. 12, HH3 ch. 9
  assertClose(sink.sinkTemperature, kelvin(109.5), { rtol: 1e-4 }); // REFERENCE E5.20 / HH3 ch. 9
  assertEquals(sink.feasible, true);
  const check = heatSinkTemperatures([perDevice, perDevice], {
    junctionToCase: 0.7,
    caseToSink: 0.3,
    sinkToAmbient: sink.sinkToAmbient,
    ambientTemperature: kelvin(40),
  });
  assertClose(check.maxJunctionTemperature, kelvin(125), { rtol: 1e-12 }); // closed form: the sink just meets the limit
  const hopeless = requiredSinkToAmbient(100, {
    junctionToCase: 2,
    ambientTemperature: kelvin(40),
  });
  assertEquals(hopeless.feasible, false);
});

Deno.test("deratedPower() gives 200 W, 120 W and 80 W at 25, 75 and 100 °C (E5.21)", () => {
  const options = { junctionToCase: 0.625, maxJunctionTemperature: kelvin(150) };
  assertClose(deratedPower(kelvin(25), options), 200.0, { rtol: 1e-3 }); // REFERENCE E5.21 / SS7 ch. 12
  assertClose(deratedPower(kelvin(75), options), 120.0, { rtol: 1e-3 }); // REFERENCE E5.21 / SS7 ch. 12
  assertClose(deratedPower(kelvin(100), options), 80.00, { rtol: 1e-3 }); // REFERENCE E5.21 / SS7 ch. 12
  assertEquals(deratedPower(kelvin(160), options), 0); // closed form: no power above Tj,max (exact)
});

Deno.test("thermalRunawayGain() is 0.5847 with 0.22 Ω emitter resistors and 1.169 without (E5.22, E5.23)", () => {
  const base = {
    collectorEmitterVoltage: 35,
    quiescentCurrent: 0.1175,
    vbeTemperatureCoefficient: -2.1e-3,
    thermalResistance: 3.5,
  };
  const stable = thermalRunawayGain({ ...base, emitterResistance: 0.22 });
  assertClose(stable.intrinsicEmitterResistance, 0.22, { rtol: 1e-3 }); // REFERENCE E5.22 (re = 0.22 Ω)
  assertClose(stable.currentSlope, 4.773e-3, { rtol: 1e-3 }); // REFERENCE E5.22 / D
  assertClose(stable.powerSlope, 0.1670, { rtol: 1e-3 }); // REFERENCE E5.22 / D
  assertClose(stable.loopGain, 0.5847, { rtol: 1e-3 }); // REFERENCE E5.22 / D; SS7 ch. 12, Self6
  assertEquals(stable.stable, true);
  const runaway = thermalRunawayGain({ ...base, emitterResistance: 0 });
  assertClose(runaway.currentSlope, 9.545e-3, { rtol: 1e-3 }); // REFERENCE E5.23 / D
  assertClose(runaway.loopGain, 1.169, { rtol: 1e-3 }); // REFERENCE E5.23 / D
  assertEquals(runaway.stable, false);
});

// ── The whole stage ──────────────────────────────────────────────────────────────────────

const THERMAL = {
  junctionToCase: 0.7,
  caseToSink: 0.3,
  sinkToAmbient: 1.0,
  ambientTemperature: kelvin(40),
};

Deno.test("classAbOutputStage() chooses Iq = VT/(RE + Rb/(β+1)) and passes its checks when sound", () => {
  const stage = classAbOutputStage({
    supplyVoltage: 35,
    loadResistance: 8,
    emitterResistance: 0.22,
    drivingResistance: 1000,
    baseStopperResistance: 300.1,
    devices: { kind: "single", outputBeta: 3000 },
    targetPower: 60,
    deviceMaxDissipation: 25,
    thermal: THERMAL,
  });
  assertEquals(stage.biasChoice, "gainMatched");
  const iq = stage.quiescentCurrent;
  const peakRe = VT300 / stage.swing.peakCurrent;
  const rOne = stage.outputResistance.oneDevice;
  const rBoth = stage.outputResistance.bothDevices;
  assertClose(stage.reflectedSourceResistance, 0.33322, { rtol: 1e-4 }); // REFERENCE E5.8 (Rs/(β+1))
  assertClose(stage.reflectedStopperResistance, 0.1, { rtol: 1e-12 }); // closed form: 300.1/3001
  assertClose(iq, VT300 / 0.32, { rtol: 1e-12 }); // REFERENCE §5.7 / closed form VT/(RE + Rb/(β+1))
  assertClose(stage.gain.crossover, stage.gain.largeSignal, { rtol: 1e-12 }); // REFERENCE §5.1 / D
  assertClose(rOne, 0.32 + peakRe + 1000 / 3001, { rtol: 1e-12 }); // REFERENCE §5.1 / closed form
  assertClose(rBoth, (0.32 + VT300 / iq) / 2 + 1000 / 3001, { rtol: 1e-12 }); // REFERENCE §5.1 / D
  assertEquals(stage.checks.length, 5); // gain match, power, dissipation, Tj, runaway (exact)
  for (const check of stage.checks) {
    assert(isCheck(check), "every check carries the longtail.check marker");
    assert(check.pass, check.reason);
  }
});

Deno.test("classAbOutputStage() fails the gain-matching check when Iq is doubled (E5.10)", () => {
  const stage = classAbOutputStage({
    supplyVoltage: 35,
    loadResistance: 8,
    emitterResistance: 0.22,
    quiescentCurrent: 2 * VT300 / 0.22,
  });
  assertClose(stage.gain.crossover, 0.979792, { rtol: 1e-6 }); // REFERENCE E5.10 / D
  const check = stage.checks.find((c) => c.name.startsWith("crossover gain mismatch"))!;
  assertEquals(check.pass, false);
});

Deno.test("classAbOutputStage() fails power, dissipation, temperature and runaway checks when they apply", () => {
  const stage = classAbOutputStage({
    supplyVoltage: 35,
    loadResistance: 8,
    reactiveLoad: { magnitude: 8, angle: Math.PI / 4 },
    emitterResistance: 0,
    quiescentCurrent: 0.1175,
    targetPower: 100,
    deviceMaxDissipation: 20,
    thermal: { ...THERMAL, sinkToAmbient: 3 },
  });
  assertClose(stage.power.worstCaseReactive!.dissipationTotal, 43.88, { rtol: 1e-3 }); // REFERENCE E5.3
  assertClose(stage.power.designPerDevice, 43.88 / 2 + 35 * 0.1175, { rtol: 1e-3 }); // REFERENCE E5.3 + E5.7 / D
  const byName = new Map(stage.checks.map((c) => [c.name, c]));
  assertEquals(byName.get("output power at full swing")!.pass, false);
  assertEquals(byName.get("dissipation per device (worst case + idle)")!.pass, false);
  assertEquals(byName.get("junction temperature")!.pass, false);
  assertEquals(byName.get("thermal-runaway loop gain")!.pass, false);
  assertEquals(stage.thermal!.runaway.stable, false);
});

Deno.test("classAbOutputStage() power table runs from 0 V to the available swing", () => {
  const stage = classAbOutputStage({
    supplyVoltage: 35,
    loadResistance: 8,
    emitterResistance: 0.22,
    tablePoints: 11,
  });
  assertEquals(stage.power.table.length, 11); // the requested row count (exact)
  assertEquals(stage.power.table[0].outputPower, 0); // closed form: no output at 0 V (exact)
  assertClose(stage.power.table[10].peak, stage.swing.peak, { rtol: 1e-12 }); // closed form: last row at full swing
  assertClose(stage.power.at(17.5).dissipationTotal, 29.60, { rtol: 1e-3 }); // REFERENCE E5.1
});

Deno.test("classAbOutputStage() two-port times the source divider gives the follower gain with Rs", () => {
  const rs = 1000;
  const stage = classAbOutputStage({
    supplyVoltage: 35,
    loadResistance: 8,
    emitterResistance: 0.22,
    drivingResistance: rs,
  });
  const tp = stage.twoPort;
  const cascaded = (tp.inputResistance / (tp.inputResistance + rs)) * tp.openCircuitGain * 8 /
    (8 + tp.outputResistance);
  assertClose(cascaded, stage.gain.crossover, { rtol: 1e-12 }); // closed form: RL/(RL + Rout,both)
});

Deno.test("classAbOutputStage() rejects non-physical input with a RangeError naming the parameter", () => {
  assertThrows(
    () => classAbOutputStage({ supplyVoltage: -35, loadResistance: 8, emitterResistance: 0.22 }),
    { name: "RangeError", message: "Expected supplyVoltage to be greater than 0 V, but found -35" },
  );
  assertThrows(
    () => classAbOutputStage({ supplyVoltage: 35, loadResistance: 0, emitterResistance: 0.22 }),
    RangeError,
  );
  assertThrows(
    () => classAbOutputStage({ supplyVoltage: 35, loadResistance: 8, emitterResistance: 0 }),
    RangeError,
  );
  assertThrows(() => classBPower(36, { supplyVoltage: 35, loadImpedance: 8 }), RangeError);
});

// ── §10 safety ───────────────────────────────────────────────────────────────────────────

Deno.test("amplifierSafetyCautions() gives the stored energy and bleeder figures of REFERENCE §10", () => {
  const safety = amplifierSafetyCautions({
    supplyVoltage: 50,
    reservoirCapacitance: 10_000e-6,
    bleederResistance: 4700,
    outputPower: 100,
    loadResistance: 8,
  });
  assertClose(safety.storedEnergyPerRail!, 12.50, { rtol: 1e-3 }); // REFERENCE §10 (E = ½CV²)
  assertClose(safety.bleederTimeConstant!, 47.00, { rtol: 1e-3 }); // REFERENCE §10 (τ = RC)
  assertClose(safety.timeToTenPercent!, 108.2, { rtol: 1e-3 }); // REFERENCE §10 (2.303τ)
  assertClose(safety.bleederPower!, 0.532, { rtol: 1e-3 }); // REFERENCE §10 (V²/R)
  assertClose(safety.outputRmsVoltage!, 28.28, { rtol: 1e-3 }); // REFERENCE §10 (100 W into 8 Ω)
  assertClose(safety.outputPeakVoltage!, 40.00, { rtol: 1e-3 }); // REFERENCE §10 (100 W into 8 Ω)
  const topics = safety.warnings.map((w) => w.topic);
  for (
    const topic of [
      "mains",
      "rail voltage",
      "output voltage",
      "stored energy",
      "heat",
      "speaker protection",
      "instability",
      "test practice",
    ] as const
  ) {
    assert(topics.includes(topic), `expected a ${topic} caution`);
  }
  assert(/not a safety assessment/.test(safety.disclaimer));
  assert(/not a safety assessment/.test(safety[DISPLAY]()["text/plain"]));
});

Deno.test("amplifierSafetyCautions() flags ±45 V (90 V) but not ±25 V against the ES1 limit", () => {
  const high = amplifierSafetyCautions({ supplyVoltage: 45 });
  assertEquals(high.railToRailVoltage, 90); // REFERENCE §10 (±45 V is 90 V DC)
  assertEquals(ES1_DC_VOLTAGE_LIMIT, 60); // REFERENCE §10 / IEC 62368-1 (from memory)
  assertEquals(high.aboveEs1, true);
  const low = amplifierSafetyCautions({
    supplyVoltage: 25,
    mainsPowered: false,
    heatSinkTemperature: kelvin(45),
  });
  assertEquals(low.aboveEs1, false);
  const topics = low.warnings.map((w) => w.topic);
  assert(!topics.includes("rail voltage") && !topics.includes("mains") && !topics.includes("heat"));
  const hot = amplifierSafetyCautions({ supplyVoltage: 25, heatSinkTemperature: kelvin(85) });
  assert(hot.warnings.some((w) => w.topic === "heat" && w.message.includes("85")));
});

// ── Properties ───────────────────────────────────────────────────────────────────────────

const rails = fc.double({ min: 5, max: 100, noNaN: true });
const loads = fc.double({ min: 1, max: 32, noNaN: true });

Deno.test("class-B efficiency never exceeds π/4 (property)", () => {
  fc.assert(
    fc.property(rails, loads, fc.double({ min: 0, max: 1, noNaN: true }), (vcc, rl, fraction) => {
      const p = classBPower(fraction * vcc, { supplyVoltage: vcc, loadImpedance: rl });
      return p.efficiency <= Math.PI / 4 + 1e-15; // closed form: η = (π/4)(V̂/VCC)
    }),
    { numRuns: 300 },
  );
});

Deno.test("worst-case class-B dissipation is 2VCC²/(π²RL) in total at V̂ = 2VCC/π, half per device (property, scanned)", () => {
  fc.assert(
    fc.property(rails, loads, (vcc, rl) => {
      const rows = classBPowerTable({ supplyVoltage: vcc, loadImpedance: rl, points: 4001 });
      let best = rows[0];
      for (const row of rows) if (row.dissipationTotal > best.dissipationTotal) best = row;
      const total = (2 * vcc * vcc) / (Math.PI ** 2 * rl);
      assertClose(best.dissipationTotal, total, { rtol: 1e-6 }); // closed form 2VCC²/(π²RL), scan step VCC/4000
      assertClose(best.peak, (2 * vcc) / Math.PI, { atol: vcc / 4000, rtol: 0 }); // closed form V̂ = 2VCC/π
      assertClose(best.dissipationPerDevice, total / 2, { rtol: 1e-6 }); // closed form: each device takes half
      const worst = classBWorstCaseDissipation({ supplyVoltage: vcc, loadImpedance: rl });
      assertClose(worst.dissipationTotal, total, { rtol: 1e-12 }); // closed form 2VCC²/(π²RL)
      assertClose(worst.dissipationPerDevice, total / 2, { rtol: 1e-12 }); // closed form VCC²/(π²RL)
    }),
    { numRuns: 50 },
  );
});

Deno.test("the reactive worst case is never exceeded by any level (property)", () => {
  fc.assert(
    fc.property(rails, loads, fc.double({ min: -1.5, max: 1.5, noNaN: true }), (vcc, z, angle) => {
      const load = { supplyVoltage: vcc, loadImpedance: z, loadAngle: angle };
      const worst = classBWorstCaseDissipation(load);
      return classBPowerTable({ ...load, points: 501 }).every((row) =>
        row.dissipationTotal <= worst.dissipationTotal * (1 + 1e-12)
      );
    }),
    { numRuns: 200 },
  );
});

Deno.test("the computed curve's crossover gain equals RL/(RL + (RE + VT/Iq)/2) for any bias (property)", () => {
  fc.assert(
    fc.property(
      fc.double({ min: 0.05, max: 1, noNaN: true }),
      fc.double({ min: 2, max: 16, noNaN: true }),
      fc.double({ min: 0.005, max: 1, noNaN: true }),
      (re, rl, iq) => {
        const curve = crossoverTransferCurve({
          emitterResistance: re,
          loadResistance: rl,
          quiescentCurrent: iq,
          points: 2,
        });
        const expected =
          gainMatchedBias(re, { loadResistance: rl, quiescentCurrent: iq }).crossoverGain;
        assertClose(curve.incrementalGain(0), expected, { rtol: 1e-12 }); // closed form, REFERENCE §5.1
      },
    ),
    { numRuns: 100 },
  );
});

Deno.test("a bigger heat sink never cools the junction, and runaway gain falls as RE grows (property)", () => {
  fc.assert(
    fc.property(
      fc.double({ min: 0.1, max: 5, noNaN: true }),
      fc.double({ min: 0, max: 5, noNaN: true }),
      fc.double({ min: 0, max: 1, noNaN: true }),
      (theta, extra, re) => {
        const options = { junctionToCase: 0.7, caseToSink: 0.3, ambientTemperature: 300 };
        const a = heatSinkTemperatures([10, 10], { ...options, sinkToAmbient: theta });
        const b = heatSinkTemperatures([10, 10], { ...options, sinkToAmbient: theta + extra });
        const loop = (r: number) =>
          thermalRunawayGain({
            collectorEmitterVoltage: 35,
            quiescentCurrent: 0.1,
            emitterResistance: r,
            thermalResistance: 3,
          }).loopGain;
        return b.maxJunctionTemperature >= a.maxJunctionTemperature && loop(re + 0.1) < loop(re);
      },
    ),
    { numRuns: 200 },
  );
});
