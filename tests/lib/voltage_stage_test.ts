/**
 * Voltage-amplifier stage and Miller compensation. Worked values: REFERENCE §4.2 (E4.1–E4.7);
 * the common-source stage also against REFERENCE E2.8 and E2.9.
 */
import fc from "fast-check";
import { assert, assertClose, assertEquals, assertThrows } from "../_assert.ts";
import { cascade, complexAbs, loopMargins, phaseMarginEstimate } from "../../lib/cascade/mod.ts";
import {
  type CommonEmitterOptions,
  commonEmitterStage,
  commonSourceStage,
  dominantPoleLoopEstimate,
  emitterFollowerStage,
  gainBandwidthProduct,
  millerCompensation,
  type MillerCompensationOptions,
  minimumCompensationCapacitance,
  requiredSecondPoleRatio,
  sourceFollowerStage,
} from "../../lib/voltage_stage/mod.ts";

const E41: CommonEmitterOptions = {
  collectorCurrent: 2e-3,
  beta: 150,
  earlyVoltage: 80,
  temperature: 300,
  collectorResistance: 50e3,
  loadResistance: 200e3,
};

const E44: MillerCompensationOptions = {
  firstTransconductance: 1e-3,
  firstResistance: 1e6,
  firstCapacitance: 1e-12,
  secondTransconductance: 10e-3,
  secondResistance: 100e3,
  secondCapacitance: 10e-12,
  compensationCapacitance: 3e-12,
};

// ---------------------------------------------------------------------------------------------
// E4.1–E4.3: common-emitter VAS

Deno.test("commonEmitterStage() gives gm, rπ, ro, gain and resistances of a 2 mA VAS (E4.1)", () => {
  const vas = commonEmitterStage(E41);
  assertClose(vas.smallSignal.transconductance, 77.363e-3, { rtol: 1e-4 }); // REFERENCE E4.1 / [SS7] ch. 7
  assertClose(vas.smallSignal.baseResistance, 1938.9, { rtol: 1e-4 }); // REFERENCE E4.1 / [SS7] ch. 7
  assertClose(vas.smallSignal.outputResistanceOfDevice, 40.00e3, { rtol: 1e-4 }); // REFERENCE E4.1 / [SS7] ch. 7
  assertClose(-vas.gain / vas.smallSignal.transconductance, 20.00e3, { rtol: 1e-4 }); // REFERENCE E4.1 total load ro‖50k‖200k
  assertClose(vas.gain, -1547.3, { rtol: 1e-4 }); // REFERENCE E4.1 / [SS7] ch. 7
  assertClose(vas.gainDb, 63.79, { rtol: 1e-4 }); // REFERENCE E4.1 / [SS7] ch. 7
  assertClose(vas.inputResistance, 1938.9, { rtol: 1e-4 }); // REFERENCE E4.1 Rin = rπ / [SS7] ch. 7
  assertClose(vas.outputResistance, 22.222e3, { rtol: 1e-4 }); // REFERENCE E4.1 / [SS7] ch. 7
});

Deno.test("commonEmitterStage() with RE = 100 Ω uses the exact degeneration formulas (E4.2)", () => {
  const vas = commonEmitterStage({ ...E41, emitterResistance: 100 });
  assertClose(vas.inputResistance, 17.039e3, { rtol: 1e-4 }); // REFERENCE E4.2 / [SS7] ch. 7
  assertClose(vas.smallSignal.effectiveTransconductance, 8.8034e-3, { rtol: 1e-4 }); // REFERENCE E4.2 / [SS7] ch. 7
  // The approximation gm/(1 + gm·RE) would give 8.8554 mS; the stage must not use it.
  const gm = vas.smallSignal.transconductance;
  assertClose(gm / (1 + gm * 100), 8.8554e-3, { rtol: 1e-4 }); // REFERENCE E4.2 / [GHLM5] ch. 3
  assert(Math.abs(vas.smallSignal.effectiveTransconductance - 8.8554e-3) > 4e-5);
  assertClose(vas.smallSignal.collectorResistanceOfDevice, 334.3e3, { rtol: 5e-4 }); // REFERENCE E4.2 / [GHLM5] ch. 3
  assertClose(-vas.gain / vas.smallSignal.effectiveTransconductance, 35.725e3, { rtol: 1e-4 }); // REFERENCE E4.2 total load
  assertClose(vas.gain, -314.5, { rtol: 5e-4 }); // REFERENCE E4.2 / [SS7] ch. 7
});

Deno.test("commonEmitterStage() gives the Miller capacitance and input pole (E4.3)", () => {
  const vas = commonEmitterStage({
    ...E41,
    collectorBaseCapacitance: 3e-12,
    baseEmitterCapacitance: 20e-12,
    drivingResistance: 20e3,
  });
  assertClose(vas.millerCapacitance, 4.645e-9, { rtol: 5e-4 }); // REFERENCE E4.3 / [Miller20], [SS7] ch. 10
  assertClose(vas.inputNodeResistance, 1767.5, { rtol: 1e-4 }); // REFERENCE E4.3 / [SS7] ch. 10
  assertClose(vas.inputCapacitance, 4.665e-9, { rtol: 5e-4 }); // REFERENCE E4.3 / [SS7] ch. 10
  assertClose(vas.inputPoleFrequency, 19.30e3, { rtol: 5e-4 }); // REFERENCE E4.3 / [SS7] ch. 10
});

Deno.test("commonEmitterStage().twoPort puts the input pole where the cascade sees −3 dB (E4.3)", () => {
  const withLoad = commonEmitterStage({
    ...E41,
    collectorBaseCapacitance: 3e-12,
    baseEmitterCapacitance: 20e-12,
    drivingResistance: 20e3,
  });
  assert(withLoad.twoPort.at !== undefined);
  const chain = cascade({
    stages: [withLoad.twoPort],
    sourceResistance: 20e3,
    loadResistance: 200e3,
  });
  // At 10 Hz the chain is at its mid-band gain; at the pole the input divider is 1/√2 lower.
  assertClose(complexAbs(chain.gainAt(10)), Math.abs(chain.gain), { rtol: 1e-4 }); // closed form, far below the pole
  const drop = chain.at(10).magnitudeDb - chain.at(withLoad.inputPoleFrequency).magnitudeDb;
  assertClose(drop, 3.0103, { rtol: 2e-3 }); // REFERENCE E4.3 single-pole −3 dB point / D
  assertClose(chain.gain, -1547.3 * (1938.9 / (20e3 + 1938.9)), { rtol: 1e-4 }); // REFERENCE E4.1 with the input divider (E6.1 form)
});

Deno.test("an emitter-follower pre-driver multiplies the input resistance by β + 1", () => {
  const plain = commonEmitterStage(E41);
  const buffered = commonEmitterStage({
    ...E41,
    emitterFollower: { collectorCurrent: 1e-3, beta: 100, emitterResistance: Infinity },
  });
  // rπ1 + (β1 + 1)·rπ2 with rπ1 = 100/(1 mA/VT)
  const vt = plain.operatingPoint.thermalVoltage;
  const expected = 100 * vt / 1e-3 + 101 * plain.inputResistance;
  assertClose(buffered.inputResistance, expected, { rtol: 1e-12 }); // closed form, [SS7] ch. 7 follower
  const share = (101 * plain.inputResistance) / expected;
  assertClose(buffered.gain, plain.gain * share, { rtol: 1e-12 }); // closed form, follower gain
  assert(buffered.operatingPoint.followerBaseCurrent! < plain.operatingPoint.baseCurrent);
});

Deno.test("a cascode raises the output resistance and kills the Miller multiplication", () => {
  const plain = commonEmitterStage({
    ...E41,
    collectorResistance: Infinity,
    collectorBaseCapacitance: 3e-12,
  });
  const cascoded = commonEmitterStage({
    ...E41,
    collectorResistance: Infinity,
    collectorBaseCapacitance: 3e-12,
    cascode: {},
  });
  // ro2·[1 + gm2·(ro1 ‖ rπ2)]: the boost is about β for ro1 ≫ rπ2.
  const gm = plain.smallSignal.transconductance;
  const ro = plain.smallSignal.outputResistanceOfDevice;
  const rpi = plain.smallSignal.baseResistance;
  const boosted = ro * (1 + gm * (ro * rpi) / (ro + rpi));
  assertClose(cascoded.smallSignal.outputNodeResistance, boosted, { rtol: 1e-12 }); // closed form, [GHLM5] ch. 3
  assert(cascoded.outputResistance > 50 * plain.outputResistance);
  // The main device's collector sees the cascode's emitter: (ro2 + RL)/(1 + gm2·ro2).
  const rinEmitter = (ro + 200e3) / (1 + gm * ro);
  const node = (ro * rinEmitter) / (ro + rinEmitter);
  assertClose(cascoded.millerGain, -gm * node, { rtol: 1e-12 }); // closed form, [SS7] ch. 7 common-base input
  assert(Math.abs(cascoded.millerGain) < Math.abs(plain.millerGain) / 100);
  assert(cascoded.millerCapacitance < plain.millerCapacitance / 100);
});

// ---------------------------------------------------------------------------------------------
// Common-source stage

Deno.test("commonSourceStage() matches the E2.8 device: Vov, gm, ro and gm·ro", () => {
  const cs = commonSourceStage({
    drainCurrent: 250e-6,
    transconductanceParameter: 120e-6 * 20,
    lambda: 0.05,
    thresholdVoltage: 0.5,
  });
  assertClose(cs.operatingPoint.overdrive, 0.45644, { rtol: 1e-4 }); // REFERENCE E2.8 / [SS7] ch. 5
  assertClose(cs.operatingPoint.gateSourceVoltage!, 0.95644, { rtol: 1e-4 }); // REFERENCE E2.8 / [SS7] ch. 5
  assertClose(cs.smallSignal.transconductance, 1.0954e-3, { rtol: 1e-4 }); // REFERENCE E2.8 / [SS7] ch. 7
  assertClose(cs.smallSignal.outputResistanceOfDevice, 80.00e3, { rtol: 1e-4 }); // REFERENCE E2.8 / [SS7] ch. 7
  assertClose(cs.smallSignal.intrinsicGain, 87.64, { rtol: 1e-4 }); // REFERENCE E2.8 / D
  assertClose(cs.gain, -87.64, { rtol: 1e-4 }); // REFERENCE E2.8 gm·ro, ideal current-source load
});

Deno.test("commonSourceStage() flags an overdrive below the weak-inversion change-over (E2.9)", () => {
  const low = commonSourceStage({ drainCurrent: 10e-6, overdrive: 0.05, slopeFactor: 1.5 });
  const check = low.checks.find((c) => c.name.startsWith("overdrive"))!;
  assertClose(check.limit.min!, 77.56e-3, { rtol: 1e-3 }); // REFERENCE E2.9 2nVT / [Tsividis]
  assertEquals(check.pass, false);
  const high = commonSourceStage({ drainCurrent: 10e-6, overdrive: 0.2 });
  assertEquals(high.checks.find((c) => c.name.startsWith("overdrive"))!.pass, true);
});

Deno.test("commonSourceStage() with source degeneration uses gm/(1 + gm·RS) and ro(1 + gm·RS)", () => {
  const cs = commonSourceStage({
    drainCurrent: 40e-6,
    overdrive: 0.2,
    lambda: 0.1,
    degenerationResistance: 2.5e3,
    drainResistance: 100e3,
  });
  // E2.7 device: gm = 0.4 mS, ro = 250 kΩ; gm·RS = 1.
  assertClose(cs.smallSignal.effectiveTransconductance, 0.2e-3, { rtol: 1e-12 }); // REFERENCE §4.1 CS / [Raz2] ch. 3, E2.7 device
  assertClose(cs.smallSignal.drainResistanceOfDevice, 500e3, { rtol: 1e-12 }); // closed form ro(1 + gm·RS), E2.7 device
  assertClose(cs.gain, -0.2e-3 * (500e3 * 100e3) / 600e3, { rtol: 1e-12 }); // REFERENCE §4.1 CS formula
});

// ---------------------------------------------------------------------------------------------
// E4.4, E4.5: two-stage Miller compensation

Deno.test("millerCompensation() gives A0, b1, b2 and the exact and estimated poles (E4.4)", () => {
  const amp = millerCompensation(E44);
  assertClose(amp.dcGain, 1e6, { rtol: 1e-9 }); // REFERENCE E4.4 / [GHLM5] ch. 9
  assertClose(amp.dcGainDb, 120.0, { rtol: 1e-4 }); // REFERENCE E4.4 / [GHLM5] ch. 9
  assertClose(amp.b1, 0.0030053, { rtol: 1e-4 }); // REFERENCE E4.4 / [GHLM5] ch. 9
  assertClose(amp.b2, 4.300e-12, { rtol: 1e-3 }); // REFERENCE E4.4 / [GHLM5] ch. 9
  assertClose(amp.firstPoleFrequency, 52.96, { rtol: 1e-4 }); // REFERENCE E4.4 / [GHLM5] ch. 9
  assertClose(amp.firstPoleEstimate, 53.05, { rtol: 1e-4 }); // REFERENCE E4.4 / [GHLM5] ch. 9
  assertClose(amp.secondPoleFrequency, 111.2e6, { rtol: 5e-4 }); // REFERENCE E4.4 / [GHLM5] ch. 9
  assertClose(amp.secondPoleEstimate, 111.0e6, { rtol: 5e-4 }); // REFERENCE E4.4 / [GHLM5] ch. 9
  assertClose(amp.secondPoleSimple, 159.2e6, { rtol: 5e-4 }); // REFERENCE E4.4 / [GHLM5] ch. 9
  assertEquals(amp.polesAreComplex, false);
});

Deno.test("millerCompensation() gives the RHP zero, GBW and exact phase margin (E4.4)", () => {
  const amp = millerCompensation(E44);
  assertClose(amp.zeroFrequency, 530.5e6, { rtol: 1e-4 }); // REFERENCE E4.4 / [GHLM5] ch. 9
  assertEquals(amp.zeroInRightHalfPlane, true);
  assertClose(amp.gainBandwidth, 53.05e6, { rtol: 1e-4 }); // REFERENCE E4.4 / [GHLM5] ch. 9
  assertClose(amp.unityGainFrequency, 48.71e6, { rtol: 1e-4 }); // REFERENCE E4.4 exact crossover / D
  assertClose(amp.phaseMargin, 61.10, { rtol: 1e-4 }); // REFERENCE E4.4 exact PM / [Bode45]
  assertClose(amp.phaseMarginEstimate, 58.75, { rtol: 1e-4 }); // REFERENCE E4.4 estimate, full p2 / [AH3] ch. 6
  assertClose(amp.phaseMarginEstimateSimple, 65.85, { rtol: 1e-4 }); // REFERENCE E4.4 estimate, p2 = gm2/C2 / [AH3] ch. 6
});

Deno.test("millerCompensation() shows pole splitting and the nulling-resistor values (E4.4)", () => {
  const amp = millerCompensation(E44);
  assertClose(amp.uncompensatedPoleFrequencies[0], 159.2e3, { rtol: 5e-4 }); // REFERENCE E4.4 / [GHLM5] ch. 9
  assertClose(amp.uncompensatedPoleFrequencies[1], 159.2e3, { rtol: 5e-4 }); // REFERENCE E4.4 / [GHLM5] ch. 9
  assertClose(amp.nullingResistanceForNoZero, 100.0, { rtol: 1e-4 }); // REFERENCE E4.4 / [AH3] ch. 6
  assertClose(amp.nullingResistanceForPoleCancel, 433.3, { rtol: 1e-4 }); // REFERENCE E4.4 / [AH3] ch. 6
});

Deno.test("millerCompensation() moves the zero with Rz: gone at 1/gm2, onto gm2/C2 at the cancel value", () => {
  const none = millerCompensation({ ...E44, nullingResistance: 100 });
  assertEquals(none.zeroFrequency, Infinity);
  const cancel = millerCompensation({ ...E44, nullingResistance: 433.3333333333333 });
  assertEquals(cancel.zeroInRightHalfPlane, false);
  assertClose(cancel.zeroFrequency, cancel.secondPoleSimple, { rtol: 1e-9 }); // closed form, [AH3] ch. 6
  // Removing the RHP zero's lag raises the exact margin.
  assert(none.phaseMargin > millerCompensation(E44).phaseMargin);
});

Deno.test("millerCompensation().at() starts at A0 and its margins match loopMargins()", () => {
  const amp = millerCompensation(E44);
  assertClose(complexAbs(amp.at(1e-3)), 1e6, { rtol: 1e-6 }); // REFERENCE E4.4 A0
  const m = loopMargins(amp.at, { minimumFrequency: 0.01, maximumFrequency: 1e12 });
  assertClose(m.phaseMargin, 61.10, { rtol: 1e-4 }); // REFERENCE E4.4 exact PM / [Bode45]
});

Deno.test("millerCompensation() on the second two-stage example (E4.5)", () => {
  const amp = millerCompensation({
    firstTransconductance: 0.5e-3,
    firstResistance: 500e3,
    firstCapacitance: 0.2e-12,
    secondTransconductance: 4e-3,
    secondResistance: 200e3,
    secondCapacitance: 5e-12,
    compensationCapacitance: 2e-12,
  });
  assertClose(amp.dcGain, 200000, { rtol: 1e-9 }); // REFERENCE E4.5 / [GHLM5] ch. 9
  assertClose(amp.dcGainDb, 106.0, { rtol: 5e-4 }); // REFERENCE E4.5 / [GHLM5] ch. 9
  assertClose(amp.firstPoleFrequency, 198.3, { rtol: 5e-4 }); // REFERENCE E4.5 / [GHLM5] ch. 9
  assertClose(amp.firstPoleEstimate, 198.9, { rtol: 5e-4 }); // REFERENCE E4.5 / [GHLM5] ch. 9
  assertClose(amp.secondPoleFrequency, 112.0e6, { rtol: 5e-4 }); // REFERENCE E4.5 / [GHLM5] ch. 9
  assertClose(amp.secondPoleEstimate, 111.7e6, { rtol: 5e-4 }); // REFERENCE E4.5 / [GHLM5] ch. 9
  assertClose(amp.secondPoleSimple, 127.3e6, { rtol: 5e-4 }); // REFERENCE E4.5 / [GHLM5] ch. 9
  assertClose(amp.zeroFrequency, 318.3e6, { rtol: 5e-4 }); // REFERENCE E4.5 / [GHLM5] ch. 9
  assertClose(amp.gainBandwidth, 39.79e6, { rtol: 1e-4 }); // REFERENCE E4.5 / [GHLM5] ch. 9
  assertClose(amp.unityGainFrequency, 37.84e6, { rtol: 1e-4 }); // REFERENCE E4.5 exact crossover / D
  assertClose(amp.phaseMargin, 64.56, { rtol: 1e-4 }); // REFERENCE E4.5 exact PM / [Bode45]
  assertClose(amp.phaseMarginEstimate, 63.27, { rtol: 1e-4 }); // REFERENCE E4.5 estimate / [AH3] ch. 6
});

Deno.test("millerCompensation() gives slew rates, full-power bandwidth and a loop crossover", () => {
  const amp = millerCompensation({
    ...E44,
    tailCurrent: 100e-6,
    secondStageCurrent: 1e-3,
    outputAmplitude: 10,
    feedbackFactor: 0.1,
    minimumSlewRate: 50e6,
  });
  assertClose(amp.inputStageSlewRate!, 100e-6 / 3e-12, { rtol: 1e-12 }); // REFERENCE §4.1 SR = I_tail/Cc / [SS7] ch. 13
  assertClose(amp.secondStageSlewRate!, 76.92e6, { rtol: 1e-3 }); // REFERENCE §4.1 slew-rate row: I_VAS charges Cc and C2, 1 mA/13 pF / [SS7] ch. 13, [GHLM5] ch. 9 (from memory)
  assertEquals(amp.slewRate, amp.inputStageSlewRate);
  assertClose(amp.fullPowerBandwidth!, amp.slewRate! / (2 * Math.PI * 10), { rtol: 1e-12 }); // closed form SR/(2πV̂)
  assertClose(amp.loopCrossoverEstimate, 5.305e6, { rtol: 1e-3 }); // REFERENCE §4.1 f_c ≈ β·fu with E4.4's fu
  // With β = 0.1 the exact loop crossover sits near β·fu and the margin is larger than at unity gain.
  assertClose(amp.loopCrossoverFrequency, amp.loopCrossoverEstimate, { rtol: 0.02 }); // REFERENCE §4.1 "≈", D
  assert(amp.loopPhaseMargin > amp.phaseMargin);
  const slew = amp.checks.find((c) => c.name === "slew rate")!;
  assertEquals(slew.pass, false); // 33.3 V/µs against 50 V/µs
  assertEquals(slew.unit, "V/µs");
  assertClose(slew.value, 33.33, { rtol: 1e-3 }); // REFERENCE §4.1 SR = I_tail/Cc = 100 µA/3 pF, in V/µs
  assertEquals(slew.reason, "slew rate = 33.33 V/µs is not at least 50 V/µs (short by 16.67 V/µs)");
});

Deno.test("millerCompensation() limits the second stage's slew rate by Cc and the load together", () => {
  const light = millerCompensation({ ...E44, secondStageCurrent: 1e-3 });
  const heavy = millerCompensation({
    ...E44,
    secondStageCurrent: 1e-3,
    secondCapacitance: 100e-12,
  });
  assertClose(light.secondStageSlewRate!, 1e-3 / (3e-12 + 10e-12), { rtol: 1e-12 }); // closed form I₂/(Cc + C2), [SS7] ch. 13 (from memory)
  assertClose(heavy.secondStageSlewRate!, 9.709e6, { rtol: 1e-3 }); // closed form 1 mA/103 pF, [GHLM5] ch. 9 (from memory)
  // Ten times the load capacitance must slow the edge the standing current drives.
  assert(heavy.secondStageSlewRate! < light.secondStageSlewRate! / 7);
});

Deno.test("millerCompensation() tests the RHP zero at β·GBW when a feedback factor is given", () => {
  // gm2 = 5·gm1 puts the zero at 5·GBW: too close for a unity-gain loop (10× rule, [AH3] ch. 6) …
  const weakVas = { ...E44, secondTransconductance: 5e-3, secondResistance: 200e3 };
  const unity = millerCompensation(weakVas);
  const unityZero = unity.checks.find((c) => c.name === "right-half-plane zero / GBW")!;
  assertEquals(unityZero.pass, false);
  assertClose(unityZero.value, 5.0, { rtol: 1e-9 }); // closed form ωz/ωu = gm2/gm1
  // … but 50× above the loop crossover of a gain-of-10 loop (REFERENCE §4.3: test at β·fu).
  const loop = millerCompensation({ ...weakVas, feedbackFactor: 0.1 });
  const loopZero = loop.checks.find((c) =>
    c.name === "right-half-plane zero / loop crossover β·GBW"
  )!;
  assertEquals(loopZero.pass, true);
  assertClose(loopZero.value, 50.0, { rtol: 1e-9 }); // closed form ωz/(β·ωu) = gm2/(β·gm1), REFERENCE §4.3
  assertEquals(loopZero.limit.min, 10);
  assertEquals(loop.checks.some((c) => c.name === "right-half-plane zero / GBW"), false);
});

Deno.test("input stage + compensated VAS two-ports cascade to E4.4's poles, crossover and margin", () => {
  const amp = millerCompensation(E44);
  const chain = cascade({ stages: [amp.inputStageTwoPort, amp.voltageStageTwoPort] });
  assertClose(chain.gain, 1e6, { rtol: 1e-9 }); // REFERENCE E4.4 A0 = gm1R1·gm2R2
  // The two-pole A(s) of REFERENCE §4.1 rebuilt from E4.4's printed poles and zero.
  const p1 = 52.96, p2 = 111.2e6, z = 530.5e6;
  for (const f of [1, 10, 52.96, 1e3, 1e5, 1e7, 48.71e6, 111.2e6, 530.5e6, 1e9]) {
    const g = chain.gainAt(f);
    const expected = 1e6 * Math.hypot(1, f / z) / (Math.hypot(1, f / p1) * Math.hypot(1, f / p2));
    assertClose(complexAbs(g), expected, { rtol: 1e-3 }); // REFERENCE E4.4 poles 52.96 Hz, 111.2 MHz, zero 530.5 MHz / [GHLM5] ch. 9
    const phase = -Math.atan(f / z) - Math.atan(f / p1) - Math.atan(f / p2);
    const error = Math.atan2(g.im, g.re) - phase;
    assertClose(Math.atan2(Math.sin(error), Math.cos(error)), 0, { atol: 1e-3 }); // REFERENCE E4.4 poles and RHP zero (phase error in rad) / [GHLM5] ch. 9
  }
  const m = loopMargins(chain.gainAt, { minimumFrequency: 0.01, maximumFrequency: 1e12 });
  assertClose(m.crossoverFrequency, 48.71e6, { rtol: 1e-3 }); // REFERENCE E4.4 exact crossover / D
  assertClose(m.phaseMargin, 61.10, { rtol: 1e-3 }); // REFERENCE E4.4 exact PM / [Bode45]
  // Pole splitting seen from the output: R2 at DC, a resistance of only (1 + C1/Cc)/gm2
  // between the two poles (the shunt feedback through Cc).
  assertEquals(amp.voltageStageTwoPort.outputResistance, 100e3);
  const zout = amp.voltageStageTwoPort.at!(1e6).outputImpedance;
  assertClose(Math.hypot(zout.re, zout.im), 133.3, { rtol: 0.02 }); // D from REFERENCE §4.1 nodal equations: Zout → (1 + C1/Cc)/gm2 between the poles
});

Deno.test("a grounded Miller capacitance misplaces the poles that the compensated VAS view keeps", () => {
  // The same VAS as a common-emitter stage with Cc as its Cµ: constant Miller multiplication
  // at the input and a grounded Cc at the output miss the pole splitting.
  const amp = millerCompensation(E44);
  const vas = commonEmitterStage({
    collectorCurrent: 10e-3 * 0.025852, // gm2 = 10 mS at 300 K
    beta: 1e9,
    collectorResistance: 100e3,
    collectorBaseCapacitance: 3e-12,
    outputCapacitance: 10e-12,
    drivingResistance: 1e6,
  });
  const approx = cascade({ stages: [amp.inputStageTwoPort, vas.twoPort] });
  const approxMargin = loopMargins(approx.gainAt, {
    minimumFrequency: 0.01,
    maximumFrequency: 1e12,
  });
  assert(Math.abs(approxMargin.phaseMargin - 61.10) > 5);
});

Deno.test("the compensated VAS two-port cascades to millerCompensation().at() for any design", () => {
  fc.assert(
    fc.property(
      fc.double({ min: 1e-4, max: 1e-2, noNaN: true }),
      fc.double({ min: 1e5, max: 1e7, noNaN: true }),
      fc.oneof(fc.constant(0), fc.double({ min: 1e-14, max: 5e-12, noNaN: true })),
      fc.double({ min: 1e-3, max: 1e-1, noNaN: true }),
      fc.double({ min: 1e4, max: 1e6, noNaN: true }),
      fc.double({ min: 1e-12, max: 1e-10, noNaN: true }),
      fc.double({ min: 1e-12, max: 1e-10, noNaN: true }),
      fc.oneof(fc.constant(0), fc.double({ min: 1, max: 1e3, noNaN: true })),
      fc.double({ min: 0, max: 10, noNaN: true }),
      (gm1, r1, c1, gm2, r2, c2, cc, rz, decade) => {
        const amp = millerCompensation({
          firstTransconductance: gm1,
          firstResistance: r1,
          firstCapacitance: c1,
          secondTransconductance: gm2,
          secondResistance: r2,
          secondCapacitance: c2,
          compensationCapacitance: cc,
          nullingResistance: rz,
        });
        const chain = cascade({ stages: [amp.inputStageTwoPort, amp.voltageStageTwoPort] });
        const f = 10 ** decade;
        const a = amp.at(f);
        const b = chain.gainAt(f);
        const size = Math.hypot(a.re, a.im);
        return Math.hypot(a.re - b.re, a.im - b.im) <= 1e-9 * size;
      },
    ),
    { numRuns: 200 },
  );
});

Deno.test("millerCompensation() checks Cc ≥ 0.22·C2 ([AH3] ch. 6) and the phase-margin requirement", () => {
  const ok = millerCompensation({ ...E44, minimumPhaseMargin: 60 });
  const cRule = (r: typeof ok) =>
    r.checks.find((c) => c.name.startsWith("compensation capacitor"))!;
  assertEquals(cRule(ok).pass, true);
  assertClose(cRule(ok).limit.min!, 2.2e-12, { rtol: 1e-12 }); // [AH3] ch. 6, 0.22·CL
  assertEquals(ok.checks.find((c) => c.name === "phase margin")!.pass, true);
  const small = millerCompensation({
    ...E44,
    compensationCapacitance: 1e-12,
    minimumPhaseMargin: 60,
  });
  assertEquals(cRule(small).pass, false);
  assertEquals(small.checks.find((c) => c.name === "phase margin")!.pass, small.phaseMargin >= 60);
});

// ---------------------------------------------------------------------------------------------
// E4.6, E4.7: loop estimates and the 60° rule

Deno.test("dominantPoleLoopEstimate() for an audio loop with a 3 MHz output-stage pole (E4.6)", () => {
  const loop = dominantPoleLoopEstimate({
    firstTransconductance: 6.592e-3,
    compensationCapacitance: 100e-12,
    feedbackFactor: 1 / 21,
    extraPoleFrequencies: [3e6],
  });
  assertClose(loop.gainBandwidth, 10.49e6, { rtol: 5e-4 }); // REFERENCE E4.6 / [SS7] ch. 11
  assertClose(loop.loopCrossoverEstimate, 499.6e3, { rtol: 1e-4 }); // REFERENCE E4.6 / [SS7] ch. 11
  assertClose(loop.phaseMarginEstimate, 80.55, { rtol: 1e-4 }); // REFERENCE E4.6 / [GHLM5] ch. 9
});

Deno.test("the 60° rule: p2 = √3·ωu alone, 2.216·ωu with the zero at 10·ωu, Cc ≥ 0.22·CL (E4.7)", () => {
  assertClose(phaseMarginEstimate(1, { poleFrequencies: [Math.sqrt(3)] }), 60.00, { rtol: 1e-4 }); // REFERENCE E4.7 / [Bode45]
  assertClose(requiredSecondPoleRatio(60), Math.sqrt(3), { rtol: 1e-12 }); // REFERENCE E4.7 / [AH3] ch. 6
  const ratio = requiredSecondPoleRatio(60, { zeroRatio: 10 });
  assertClose(ratio, 2.216, { rtol: 5e-4 }); // REFERENCE E4.7 / [AH3] ch. 6
  const both = { poleFrequencies: [ratio], rightHalfPlaneZeroFrequencies: [10] };
  assertClose(phaseMarginEstimate(1, both), 60.00, { rtol: 1e-9 }); // REFERENCE E4.7 / [AH3] ch. 6
  const cc = minimumCompensationCapacitance({ loadCapacitance: 1e-12 });
  assertClose(cc / 1e-12, 0.2216, { rtol: 5e-4 }); // REFERENCE E4.7 "Cc ≥ 0.22·CL" (2.216/10) / [AH3] ch. 6
  assertClose(gainBandwidthProduct(1e-3, 3e-12), 53.05e6, { rtol: 1e-4 }); // REFERENCE E4.4 fu / [GHLM5] ch. 9
});

// ---------------------------------------------------------------------------------------------
// Properties

Deno.test("phase margin falls as Cc shrinks", () => {
  fc.assert(
    fc.property(
      fc.double({ min: 0.3e-12, max: 30e-12, noNaN: true }),
      fc.double({ min: 0.5, max: 0.95, noNaN: true }),
      (cc, shrink) => {
        const big = millerCompensation({ ...E44, compensationCapacitance: cc });
        const smaller = millerCompensation({ ...E44, compensationCapacitance: cc * shrink });
        return smaller.phaseMargin < big.phaseMargin;
      },
    ),
    { numRuns: 60 },
  );
});

Deno.test("a common-emitter stage's |gain| grows with its load resistance, never past gm·Rout", () => {
  fc.assert(
    fc.property(
      fc.double({ min: 1e3, max: 1e7, noNaN: true }),
      fc.double({ min: 1.01, max: 100, noNaN: true }),
      (rl, factor) => {
        const a = commonEmitterStage({ ...E41, loadResistance: rl });
        const b = commonEmitterStage({ ...E41, loadResistance: rl * factor });
        return Math.abs(b.gain) > Math.abs(a.gain) &&
          Math.abs(b.gain) < Math.abs(a.openCircuitGain);
      },
    ),
    { numRuns: 100 },
  );
});

// ---------------------------------------------------------------------------------------------
// Validation

Deno.test("stage functions reject non-physical input with a RangeError naming the value", () => {
  assertThrows(
    () => commonEmitterStage({ ...E41, collectorCurrent: -0.002 }),
    {
      name: "RangeError",
      message: "Expected collectorCurrent to be greater than 0 A, but found -0.002",
    },
  );
  assertThrows(
    () => commonEmitterStage({ ...E41, emitterResistance: -10 }),
    { name: "RangeError", message: "Expected emitterResistance to be at least 0 Ω, but found -10" },
  );
  assertThrows(
    () => commonEmitterStage({ ...E41, loadResistance: 0 }),
    { name: "RangeError", message: "Expected loadResistance to be greater than 0 Ω, but found 0" },
  );
  assertThrows(() => commonSourceStage({ drainCurrent: 1e-4 }), RangeError);
  assertThrows(() => commonSourceStage({ drainCurrent: 1e-4, overdrive: -0.2 }), RangeError);
  assertThrows(
    () => millerCompensation({ ...E44, compensationCapacitance: 0 }),
    {
      name: "RangeError",
      message: "Expected compensationCapacitance to be greater than 0 F, but found 0",
    },
  );
  assertThrows(() => millerCompensation({ ...E44, feedbackFactor: 2 }), RangeError);
  assertThrows(() => millerCompensation({ ...E44, minimumSlewRate: 1e6 }), RangeError);
  assertThrows(() => requiredSecondPoleRatio(95), RangeError);
});

// ---------------------------------------------------------------------------------------------
// Follower buffers ([SS7] ch. 7)

Deno.test("emitterFollowerStage() gives (β+1)(re + RL), ZL/(ZL + re) and Rs/(β+1) + re", () => {
  const buffer = emitterFollowerStage({
    collectorCurrent: 1e-3,
    beta: 100,
    loadResistance: 1e3,
    drivingResistance: 10e3,
    temperature: 300,
  });
  assertClose(buffer.smallSignal.emitterResistanceOfDevice, 25.596, { rtol: 1e-3 }); // REFERENCE E2.1 re = α/gm
  assertClose(buffer.inputResistance, 101 * (25.596 + 1e3), { rtol: 1e-4 }); // [SS7] ch. 7 Rin = (β+1)(re + RL), with E2.1's re
  assertClose(buffer.gain, 1e3 / (1e3 + 25.596), { rtol: 1e-4 }); // [SS7] ch. 7 Av = RL/(RL + re)
  assertClose(buffer.outputResistance, 10e3 / 101 + 25.596, { rtol: 1e-4 }); // [SS7] ch. 7 Rout = Rs/(β+1) + re; REFERENCE §5.1 with RE = 0
  assertClose(buffer.sourceGain, 1e3 / (1e3 + 25.596 + 10e3 / 101), { rtol: 1e-4 }); // REFERENCE §5.1 gain with Rs/(β+1), RE = 0
  // 1 kΩ behind 124.6 Ω keeps only 0.889 of the open-circuit voltage: under the 0.9 rule.
  assertEquals(buffer.checks[0].pass, false);
});

Deno.test("an emitter follower's two-port cascades to the exact source-to-load gain", () => {
  fc.assert(
    fc.property(
      fc.double({ min: 1e-5, max: 1e-1, noNaN: true }),
      fc.double({ min: 20, max: 1000, noNaN: true }),
      fc.double({ min: 1, max: 1e6, noNaN: true }),
      fc.double({ min: 10, max: 1e6, noNaN: true }),
      fc.double({ min: 0, max: 1e6, noNaN: true }),
      fc.double({ min: 5, max: 200, noNaN: true }),
      (ic, beta, rl, rE, rs, va) => {
        const buffer = emitterFollowerStage({
          collectorCurrent: ic,
          beta,
          earlyVoltage: va,
          emitterResistance: rE,
          loadResistance: rl,
          drivingResistance: rs,
        });
        const chain = cascade({
          stages: [buffer.twoPort],
          sourceResistance: rs,
          loadResistance: rl,
        });
        return Math.abs(chain.gain / buffer.sourceGain - 1) <= 1e-9 && buffer.sourceGain < 1;
      },
    ),
    { numRuns: 200 },
  );
});

Deno.test("sourceFollowerStage() gives gm·RL/(1 + gm·RL) and 1/gm, and loses 1/(1 + χ) to the body", () => {
  const plain = sourceFollowerStage({ drainCurrent: 1e-3, overdrive: 0.2, loadResistance: 1e3 });
  assertClose(plain.smallSignal.transconductance, 10e-3, { rtol: 1e-12 }); // REFERENCE §2.2 gm = 2Id/Vov
  assertClose(plain.gain, 10 / 11, { rtol: 1e-12 }); // [SS7] ch. 7 Av = gm·RL/(1 + gm·RL)
  assertClose(plain.outputResistance, 100, { rtol: 1e-12 }); // [SS7] ch. 7 Rout = 1/gm
  assertEquals(plain.inputResistance, Infinity);
  const body = sourceFollowerStage({ drainCurrent: 1e-3, overdrive: 0.2, bodyEffectRatio: 0.2 });
  assertClose(body.openCircuitGain, 1 / 1.2, { rtol: 1e-12 }); // [Raz2] ch. 3 unloaded gain gm/(gm + gmb)
  assertClose(body.outputResistance, 1 / 12e-3, { rtol: 1e-12 }); // [Raz2] ch. 3 Rout = 1/(gm + gmb)
  const chain = cascade({ stages: [body.twoPort], loadResistance: 1e3 });
  const loaded = sourceFollowerStage({
    drainCurrent: 1e-3,
    overdrive: 0.2,
    bodyEffectRatio: 0.2,
    loadResistance: 1e3,
    minimumGain: 0.9,
  });
  assertClose(chain.gain, loaded.gain, { rtol: 1e-12 }); // closed form: gm·RL/(1 + (gm + gmb)RL) both ways
  assertClose(loaded.gain, 10 / 13, { rtol: 1e-12 }); // [Raz2] ch. 3 gm·RL/(1 + (gm + gmb)RL)
  assertEquals(loaded.checks.find((c) => c.name === "follower gain")!.pass, false);
  assertThrows(() => sourceFollowerStage({ drainCurrent: -1e-3, overdrive: 0.2 }), RangeError);
  assertThrows(() => emitterFollowerStage({ collectorCurrent: 1e-3, beta: 0 }), RangeError);
});
