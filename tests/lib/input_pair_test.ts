/**
 * Tests of the long-tailed pair against REFERENCE §3.4–§3.8 and §9.4, plus invariants.
 */
import fc from "fast-check";
import { assert, assertClose, assertEquals, assertThrows } from "../_assert.ts";
import { harmonics } from "../../lib/analysis/harmonics.ts";
import { isCheck } from "../../lib/checks/check.ts";
import {
  bjtPair,
  bjtPairMonteCarlo,
  type BjtPairOptions,
  mosPair,
  mosPairMonteCarlo,
  type MosPairOptions,
  resistorNoiseDensity,
  sineSlewRate,
  slewLimitedFrequency,
} from "../../lib/input_pair/mod.ts";
import { _bjtCore, _bjtNominalIs, _bjtParts } from "../../lib/input_pair/bjt_pair.ts";
import { _bjtTailCurrent } from "../../lib/input_pair/_bjt_core.ts";
import { _bjtTrialFast, _bjtTrialGeneral } from "../../lib/input_pair/_trials.ts";
import { thermalVoltage } from "../../lib/physics/thermal_voltage.ts";

const VT = thermalVoltage(300);
const db = (x: number) => 20 * Math.log10(Math.abs(x));

/** Example A of REFERENCE §3.4. */
function exampleA(extra: Partial<BjtPairOptions> = {}): BjtPairOptions {
  return {
    tail: { kind: "source", current: 1e-3, outputResistance: 50e3, compliance: 0.5 },
    load: { kind: "resistors", resistance: 10e3 },
    positiveRail: 15,
    negativeRail: -15,
    baseEmitterVoltage: 0.7,
    beta: 100,
    ...extra,
  };
}

/** Example B of REFERENCE §3.5. */
function exampleB(extra: Partial<MosPairOptions> = {}): MosPairOptions {
  return {
    tail: { kind: "source", current: 200e-6, outputResistance: 100e3, compliance: 0.3 },
    load: { kind: "resistors", resistance: 10e3 },
    transconductanceParameter: 5e-3,
    threshold: 0.5,
    positiveRail: 3.3,
    negativeRail: 0,
    ...extra,
  };
}

// ---------------------------------------------------------------- §3.4 Example A, β = 100

Deno.test("bjtPair() reproduces Example A with β = 100 (α used)", () => {
  const pair = bjtPair(exampleA());
  assertClose(pair.emitterResistance, 51.704, { rtol: 1e-3 }); // REFERENCE §3.4 re = 2VT/I / Sedra & Smith 7th ed. ch. 9 (from memory)
  assertClose(pair.devices[0].collectorCurrent / pair.devices[0].emitterCurrent, 0.990099, {
    rtol: 1e-6,
  }); // REFERENCE §3.4 α / closed form
  assertClose(pair.transconductance, 19.149e-3, { rtol: 1e-3 }); // REFERENCE §3.4 gm = α/re / SS7 ch. 9 (from memory)
  assertClose(pair.gain.differential, 191.49, { rtol: 1e-3 }); // REFERENCE §3.4 Ad = αRC/re / SS7 ch. 9 (from memory)
  assertClose(pair.gain.singleEnded, 95.747, { rtol: 1e-3 }); // REFERENCE §3.4 Ad,se / SS7 ch. 9 (from memory)
  assertClose(pair.gain.commonModeSingleEnded, -0.098959, { rtol: 1e-3 }); // REFERENCE §3.4 Acm,se = −αRC/(re + 2REE) / SS7 ch. 9 (from memory)
  assertClose(pair.cmrr.singleEnded, 967.54, { rtol: 1e-3 }); // REFERENCE §3.4 CMRR_se = (re + 2REE)/(2re) / SS7 ch. 9 (from memory)
  assertClose(pair.cmrr.singleEndedDb, 59.71, { atol: 0.005 }); // REFERENCE §3.4 59.71 dB / SS7 ch. 9 (from memory)
  assertClose(pair.inputResistance.differential, 10.444e3, { rtol: 1e-3 }); // REFERENCE §3.4 Rid = 2(β+1)re / SS7 ch. 9 (from memory)
  assertClose(pair.inputResistance.commonModePerInput, 10.11e6, { rtol: 5e-3 }); // REFERENCE §3.4 Ricm per input (3 figures) / D
  assertClose(pair.inputResistance.commonModeTied, 5.053e6, { rtol: 1e-3 }); // REFERENCE §3.4 Ricm both tied / D
  assertClose(pair.inputBiasCurrent, 4.950e-6, { rtol: 1e-3 }); // REFERENCE §3.4 IB = IE/(β+1) / SS7 ch. 9 (from memory)
  assertClose(pair.devices[0].collectorVoltage, 10.050, { rtol: 1e-3 }); // REFERENCE §3.4 VC = VCC − αIE·RC / closed form
  assertClose(pair.inputCommonModeRange.maxRelaxed, 10.45, { rtol: 1e-3 }); // REFERENCE §3.4 VICM,max (Vbc ≤ 0.4 V) / SS7 ch. 9 (from memory)
  assertClose(pair.inputCommonModeRange.max, 10.05, { rtol: 1e-3 }); // REFERENCE §3.1 strict convention Vbc ≤ 0 / SS7 ch. 9 (from memory)
  assertClose(pair.inputCommonModeRange.min, -13.80, { rtol: 1e-3 }); // REFERENCE §3.4 VICM,min = −15 + 0.5 + 0.7 / SS7 ch. 9 (from memory)
  assertClose(pair.differenceCurrent(0.02), 364.96e-6, { rtol: 1e-3 }); // REFERENCE §3.4 ΔIc = αI·tanh(vid/(2VT)) / SS7 ch. 9 (from memory)
});

Deno.test("bjtPair() reproduces Example A with β → ∞ (α = 1)", () => {
  const pair = bjtPair(exampleA({ beta: Infinity }));
  assertClose(pair.transconductance, 19.341e-3, { rtol: 1e-3 }); // REFERENCE §3.4 gm, α = 1 / SS7 ch. 9 (from memory)
  assertClose(pair.gain.differential, 193.41, { rtol: 1e-3 }); // REFERENCE §3.4 Ad, α = 1 / SS7 ch. 9 (from memory)
  assertClose(pair.gain.singleEnded, 96.704, { rtol: 1e-3 }); // REFERENCE §3.4 Ad,se, α = 1 / SS7 ch. 9 (from memory)
  assertClose(pair.gain.commonModeSingleEnded, -0.099948, { rtol: 1e-3 }); // REFERENCE §3.4 Acm,se, α = 1 / SS7 ch. 9 (from memory)
  assertClose(pair.gain.commonModeSingleEnded, -0.1, { rtol: 1e-3 }); // REFERENCE §3.4 ≈ −RC/(2REE) / SS7 ch. 9 (from memory)
  assertClose(pair.cmrr.singleEnded, 967.54, { rtol: 1e-3 }); // REFERENCE §3.4 CMRR_se independent of α / D
  assertClose(pair.transconductance * 50e3, 967.04, { rtol: 1e-3 }); // REFERENCE §3.4 gm·REE alone / D
  assert(pair.inputResistance.differential === Infinity); // REFERENCE §3.4 Rid = ∞ for β → ∞ / closed form
  assert(pair.inputResistance.commonModePerInput === Infinity); // REFERENCE §3.4 Ricm = ∞ for β → ∞ / closed form
  assert(pair.inputBiasCurrent === 0); // REFERENCE §3.4 IB = 0 for β → ∞ / closed form
  assertClose(pair.devices[0].collectorVoltage, 10.000, { rtol: 1e-3 }); // REFERENCE §3.4 VC, α = 1 / closed form
  assertClose(pair.inputCommonModeRange.maxRelaxed, 10.40, { rtol: 1e-3 }); // REFERENCE §3.4 VICM,max, α = 1 / SS7 ch. 9 (from memory)
  assertClose(pair.inputCommonModeRange.min, -13.80, { rtol: 1e-3 }); // REFERENCE §3.4 VICM,min / SS7 ch. 9 (from memory)
  assertClose(pair.differenceCurrent(0.02), 368.61e-6, { rtol: 1e-3 }); // REFERENCE §3.4 ΔIc at 20 mV, α = 1 / SS7 ch. 9 (from memory)
  assertClose(pair.transconductance * 0.02, 386.8e-6, { rtol: 1e-3 }); // REFERENCE §3.4 linear estimate gm·vid / closed form
});

Deno.test("bjtPair() reproduces Example A's mismatch rows: CMRR_d, offsets, offset current", () => {
  for (const beta of [100, Infinity]) {
    const rc = bjtPair(exampleA({ beta, mismatch: { loadResistance: 0.01 } }));
    assertClose(rc.cmrr.differential, 193509, { rtol: 1e-3 }); // REFERENCE §3.4 CMRR_d = (1 + 2REE/re)/0.01, both columns / SS7 ch. 9 (from memory)
    assertClose(rc.cmrr.loadMismatch, 193509, { rtol: 1e-3 }); // REFERENCE §3.4 closed form of the same / SS7 ch. 9 (from memory)
    assertClose(rc.cmrr.differentialDb, 105.7, { atol: 0.05 }); // REFERENCE §3.4 105.7 dB / SS7 ch. 9 (from memory)
    assertClose(db((2 * rc.transconductance * 50e3) / 0.01), 105.7, { atol: 0.05 }); // REFERENCE §3.4 2gm·REE/0.01 approximation / SS7 ch. 9 (from memory)
    assertClose(rc.offset.sources.loadResistance, 0.2585e-3, { rtol: 1e-3 }); // REFERENCE §3.4 VOS = VT·ΔRC/RC / SS7 ch. 9 (from memory)
  }
  // Is1/Is2 = 1.05 exactly: with the even split that is δ = 2·0.05/2.05.
  const ratio = bjtPair(exampleA({ mismatch: { saturationCurrent: 0.1 / 2.05 } }));
  assertClose(Math.abs(ratio.offset.exact), 1.261e-3, { rtol: 1e-3 }); // REFERENCE §3.4 VOS = VT·ln 1.05 / SS7 ch. 9, GHLM5 ch. 3 (from memory)
  const linear = bjtPair(exampleA({ mismatch: { saturationCurrent: 0.05 } }));
  assertClose(linear.offset.sources.saturationCurrent, 1.293e-3, { rtol: 1e-3 }); // REFERENCE §3.4 linearised VT·0.05 / SS7 ch. 9 (from memory)
  const both = bjtPair(exampleA({ mismatch: { loadResistance: 0.01, saturationCurrent: 0.05 } }));
  assertClose(both.offset.rss, 1.318e-3, { rtol: 1e-3 }); // REFERENCE §3.4 RSS VT·√(0.01² + 0.05²) / SS7 ch. 9 (from memory)
  assertClose(both.offset.worstCase, VT * 0.06, { rtol: 1e-9 }); // REFERENCE §3.1 worst case = sum of magnitudes / GHLM5 ch. 3 (from memory)
  const current = bjtPair(exampleA({ mismatch: { beta: 0.1 } }));
  assertClose(current.inputOffsetCurrent, 0.4950e-6, { rtol: 1e-3 }); // REFERENCE §3.4 IOS = IB·Δβ/β / SS7 ch. 9 (from memory)
  assert(bjtPair(exampleA({ beta: Infinity, mismatch: { beta: 0.1 } })).inputOffsetCurrent === 0); // REFERENCE §3.4 IOS = 0 for β → ∞ / closed form
});

Deno.test("bjtPair() reproduces Example A with RE = 100 Ω per emitter", () => {
  const degenerated = bjtPair(exampleA({ degeneration: 100 }));
  assertClose(degenerated.gain.differential, 65.27, { rtol: 1e-3 }); // REFERENCE §3.4 Ad = αRC/(re + RE) / SS7 ch. 9 (from memory)
  assertClose(degenerated.effectiveTransconductance, 6.527e-3, { rtol: 1e-3 }); // REFERENCE §3.4 Gm = α/(re + RE) / SS7 ch. 9 (from memory)
  assertClose(degenerated.inputResistance.differential, 30.644e3, { rtol: 1e-3 }); // REFERENCE §3.4 Rid = 2(β+1)(re + RE) / SS7 ch. 9 (from memory)
  const ideal = bjtPair(exampleA({ degeneration: 100, beta: Infinity }));
  assertClose(ideal.gain.differential, 65.92, { rtol: 1e-3 }); // REFERENCE §3.4 Ad, α = 1 / SS7 ch. 9 (from memory)
  assertClose(ideal.effectiveTransconductance, 6.592e-3, { rtol: 1e-3 }); // REFERENCE §3.4 Gm, α = 1 / SS7 ch. 9 (from memory)
  assert(ideal.inputResistance.differential === Infinity); // REFERENCE §3.4 Rid = ∞ / closed form
});

Deno.test("bjtPair() needs 4VT without RE and 4VT + ΔI·RE with RE for iC1/iC2 = e⁴", () => {
  const plain = bjtPair(exampleA({ beta: Infinity }));
  const target = 1e-3 * Math.tanh(2); // iC1/iC2 = e⁴ ⇔ ΔI = I·tanh(2)
  assertClose(plain.inputForDifferenceCurrent(target), 103.4e-3, { rtol: 1e-3 }); // REFERENCE §3.4 4VT / D
  const degenerated = bjtPair(exampleA({ beta: Infinity, degeneration: 100 }));
  assertClose(degenerated.inputForDifferenceCurrent(target), 199.8e-3, { rtol: 1e-3 }); // REFERENCE §3.4 4VT + ΔI·RE / D
  const roundTrip = degenerated.differenceCurrent(degenerated.inputForDifferenceCurrent(target));
  assertClose(roundTrip, target, { rtol: 1e-9 }); // closed form: inverse of the numeric solve
  assertClose((1 + plain.differenceCurrent(4 * VT) / 1e-3) / 2, 0.9820, { rtol: 1e-3 }); // REFERENCE §3.1 one side carries 98.20 % at 4VT / D
});

Deno.test("bjtPair() switches 90 % and 99 % of the current at 76.12 mV and 136.8 mV", () => {
  const pair = bjtPair(exampleA({ beta: Infinity }));
  assertClose(pair.inputForDifferenceCurrent(0.9e-3), 76.12e-3, { rtol: 1e-3 }); // REFERENCE §3.1 2·atanh(0.9)·VT / D
  assertClose(pair.inputForDifferenceCurrent(0.99e-3), 136.8e-3, { rtol: 1e-3 }); // REFERENCE §3.1 99 % switching / D
  assertClose(pair.linearInputRange, 9.010e-3, { rtol: 1e-3 }); // REFERENCE §3.1 1 % compression at 0.3485·VT / D
});

// ---------------------------------------------------------------- §3.5 Example B

Deno.test("mosPair() reproduces Example B", () => {
  const pair = mosPair(exampleB());
  assertClose(pair.overdrive, 0.2, { rtol: 1e-3 }); // REFERENCE §3.5 Vov = √(Iss/kn) / SS7 ch. 9 (from memory)
  assertClose(pair.transconductance, 1e-3, { rtol: 1e-3 }); // REFERENCE §3.5 gm = Iss/Vov / SS7 ch. 9 (from memory)
  assertClose(pair.gain.differential, 10.0, { rtol: 1e-3 }); // REFERENCE §3.5 Ad = gm·RD / SS7 ch. 9 (from memory)
  assertClose(pair.gain.singleEnded, 5.0, { rtol: 1e-3 }); // REFERENCE §3.5 Ad,se / SS7 ch. 9 (from memory)
  assertClose(pair.fullSwitchingInput, 0.28284, { rtol: 1e-3 }); // REFERENCE §3.5 √2·Vov / SS7 ch. 9, Razavi 2nd ed. ch. 4 (from memory)
  assertClose(pair.differenceCurrent(0.1), 96.825e-6, { rtol: 1e-3 }); // REFERENCE §3.5 ΔId at 0.1 V / SS7 ch. 9 (from memory)
  assertClose(pair.transconductance * 0.1, 100e-6, { rtol: 1e-3 }); // REFERENCE §3.5 linear estimate / closed form
  assertClose(pair.gain.commonModeSingleEnded, -0.049751, { rtol: 1e-3 }); // REFERENCE §3.5 Acm,se = −gmRD/(1 + 2gmRSS) / SS7 ch. 9 (from memory)
  assertClose(pair.cmrr.singleEnded, 100.50, { rtol: 1e-3 }); // REFERENCE §3.5 CMRR_se / SS7 ch. 9 (from memory)
  assertClose(pair.cmrr.singleEndedDb, 40.04, { atol: 0.005 }); // REFERENCE §3.5 40.04 dB / SS7 ch. 9 (from memory)
  assertClose(pair.inputCommonModeRange.max, 2.800, { rtol: 1e-3 }); // REFERENCE §3.5 VDD − RD·Iss/2 + Vt / SS7 ch. 9 (from memory)
  assertClose(pair.inputCommonModeRange.min, 1.000, { rtol: 1e-3 }); // REFERENCE §3.5 VSS + VCS + Vt + Vov / SS7 ch. 9 (from memory)
  assertClose(pair.linearInputRange, 0.2821 * 0.2, { rtol: 1e-3 }); // REFERENCE §3.2 1 % compression at 0.2821·Vov / D
  assert(pair.inputResistance.differential === Infinity); // REFERENCE §3.2 gate input / SS7 (from memory)
});

Deno.test("mosPair() reproduces Example B's offsets for 2 % RD, 2 % W/L and 3 mV Vt mismatch", () => {
  const pair = mosPair(
    exampleB({ mismatch: { loadResistance: 0.02, aspectRatio: 0.02, threshold: 3e-3 } }),
  );
  assertClose(Math.abs(pair.offset.sources.loadResistance), 2.000e-3, { rtol: 1e-3 }); // REFERENCE §3.5 (Vov/2)(ΔRD/RD) / SS7 ch. 9 (from memory)
  assertClose(Math.abs(pair.offset.sources.aspectRatio), 2.000e-3, { rtol: 1e-3 }); // REFERENCE §3.5 (Vov/2)(Δ(W/L)/(W/L)) / SS7 ch. 9 (from memory)
  assertClose(Math.abs(pair.offset.sources.threshold), 3.000e-3, { rtol: 1e-3 }); // REFERENCE §3.5 ΔVt / SS7 ch. 9 (from memory)
  assertClose(pair.offset.rss, 4.123e-3, { rtol: 1e-3 }); // REFERENCE §3.5 RSS / SS7 ch. 9 (from memory)
});

// ---------------------------------------------------------------- §3.6 active load, slew, noise, HD3

Deno.test("bjtPair() with a mirror load gives Ad = gm(ro2 ‖ ro4) = 1289.4 (E3.1)", () => {
  const pair = bjtPair({
    tail: { kind: "source", current: 200e-6 },
    load: { kind: "mirror", earlyVoltage: 50, beta: Infinity },
    positiveRail: 15,
    negativeRail: -15,
    beta: Infinity,
    earlyVoltage: 100,
  });
  const ro2 = pair.devices[1].outputResistance;
  const ro4 = pair.mirror!.outputResistance;
  assertClose(pair.transconductance, 3.8682e-3, { rtol: 1e-3 }); // REFERENCE E3.1 gm / SS7 ch. 9 (from memory)
  assertClose((ro2 * ro4) / (ro2 + ro4), 333.33e3, { rtol: 1e-3 }); // REFERENCE E3.1 ro2 ‖ ro4 / SS7 ch. 9 (from memory)
  assertClose(pair.estimates.activeLoadGain, 1289.4, { rtol: 1e-3 }); // REFERENCE E3.1 Ad / SS7 ch. 9, Razavi ch. 5 (from memory)
  assertClose(db(pair.estimates.activeLoadGain), 62.21, { atol: 0.005 }); // REFERENCE E3.1 62.21 dB / SS7 ch. 9 (from memory)
  assertClose(pair.gain.singleEnded, 1289.4, { rtol: 2e-3 }); // REFERENCE E3.1 exact nodal solution agrees with β = ∞, ideal tail / D
});

Deno.test("mosPair() with a mirror load gives Ad = 50 (E3.2) and the exact 5-transistor OTA (E3.3)", () => {
  const ota = (tailResistance: number) =>
    mosPair({
      tail: { kind: "source", current: 100e-6, outputResistance: tailResistance },
      load: { kind: "mirror", transconductanceParameter: 2.5e-3, threshold: 0.5, lambda: 0.1 },
      transconductanceParameter: 2.5e-3,
      threshold: 0.5,
      lambda: 0.1,
      positiveRail: 3.3,
      negativeRail: 0,
    });
  const ideal = ota(Infinity);
  assertClose(ideal.transconductance, 0.5e-3, { rtol: 1e-3 }); // REFERENCE E3.2 gm / SS7 ch. 9 (from memory)
  assertClose(ideal.devices[1].outputResistance, 200e3, { rtol: 1e-3 }); // REFERENCE E3.2 ro2 / SS7 ch. 9 (from memory)
  assertClose(ideal.mirror!.outputResistance, 200e3, { rtol: 1e-3 }); // REFERENCE E3.2 ro4 / SS7 ch. 9 (from memory)
  assertClose(ideal.estimates.activeLoadGain, 50.0, { rtol: 1e-3 }); // REFERENCE E3.2 Ad = gm(ro2 ‖ ro4) / SS7 ch. 9, Razavi ch. 5 (from memory)
  assertClose(db(ideal.estimates.activeLoadGain), 33.98, { atol: 0.005 }); // REFERENCE E3.2 33.98 dB / SS7 ch. 9 (from memory)
  const pair = ota(100e3);
  assertClose(pair.gain.commonModeSingleEnded, -0.0097059, { rtol: 1e-3 }); // REFERENCE E3.3 exact nodal Acm / D
  assertClose(pair.gain.singleEnded, 49.750, { rtol: 1e-3 }); // REFERENCE E3.3 exact nodal Ad / D
  assertClose(pair.cmrr.singleEnded, 5125.7, { rtol: 1e-3 }); // REFERENCE E3.3 exact CMRR / D
  assertClose(pair.cmrr.singleEndedDb, 74.20, { atol: 0.005 }); // REFERENCE E3.3 74.20 dB / D
  assertClose(pair.estimates.activeLoadCommonModeGain, 0.01, { rtol: 1e-3 }); // REFERENCE E3.3 |Acm| ≈ 1/(2gm3RSS) / Razavi ch. 5 (from memory)
  assertClose(pair.estimates.activeLoadCmrr, 5050, { rtol: 1e-3 }); // REFERENCE E3.3 (1 + 2gm1RSS)gm3(ro2 ‖ ro4) / Razavi ch. 5 (from memory)
  assertClose(db(pair.estimates.activeLoadCmrr), 74.07, { atol: 0.005 }); // REFERENCE E3.3 74.07 dB / Razavi ch. 5 (from memory)
  assertClose(pair.estimates.activeLoadCmrr, pair.cmrr.singleEnded, { rtol: 0.03 }); // REFERENCE E3.3 approximation within 3 % of exact / D
  assertClose(Math.abs(pair.gain.commonModeSingleEnded), pair.estimates.activeLoadCommonModeGain, {
    rtol: 0.03,
  }); // REFERENCE E3.3 approximation within 3 % of exact / D
});

Deno.test("bjtPair() with a βp = 50 mirror has a systematic offset of 2VT/βp = 1.034 mV (E3.4)", () => {
  const pair = bjtPair({
    tail: { kind: "source", current: 1e-3 },
    load: { kind: "mirror", earlyVoltage: 50, beta: 50 },
    positiveRail: 15,
    negativeRail: -15,
    earlyVoltage: 100,
  });
  assertClose(Math.abs(pair.offset.sources.systematic), 1.034e-3, { rtol: 1e-3 }); // REFERENCE E3.4 2VT/βp / D, GHLM5 ch. 4/6 (from memory)
  assertClose(pair.estimates.systematicOffset, 1.034e-3, { rtol: 1e-3 }); // REFERENCE E3.4 2VT/βp / D
  assertClose(Math.abs(pair.offset.exact), VT * Math.log(1.04), { rtol: 1e-6 }); // closed form: the exact null needs Ic1/Ic2 = 1 + 2/βp
});

Deno.test("bjtPair() slews at I/Cc = 10 V/µs with fu = 30.78 MHz, 10.49 MHz with RE (E3.5, E3.6)", () => {
  const options = {
    tail: { kind: "source" as const, current: 1e-3 },
    load: { kind: "mirror" as const, earlyVoltage: 50 },
    positiveRail: 15,
    negativeRail: -15,
    beta: Infinity,
    earlyVoltage: 100,
    compensationCapacitance: 100e-12,
  };
  const plain = bjtPair(options);
  assertClose(plain.slew!.slewRate, 10.00e6, { rtol: 1e-3 }); // REFERENCE E3.5 SR = I/Cc / SS7 ch. 13, GHLM5 ch. 9 (from memory)
  assertClose(plain.slew!.unityGainFrequency, 30.78e6, { rtol: 1e-3 }); // REFERENCE E3.5 fu = gm1/(2πCc) / GHLM5 ch. 9 (from memory)
  const degenerated = bjtPair({ ...options, degeneration: 100 });
  assertClose(degenerated.effectiveTransconductance, 6.592e-3, { rtol: 1e-3 }); // REFERENCE E3.6 Gm = gm/(1 + gm·RE) / GHLM5 ch. 9 (from memory)
  assertClose(degenerated.slew!.unityGainFrequency, 10.49e6, { rtol: 1e-3 }); // REFERENCE E3.6 fu / GHLM5 ch. 9 (from memory)
  assertClose(degenerated.slew!.slewToUnityGainRatio, 0.1517, { rtol: 1e-3 }); // REFERENCE E3.6 SR/ωu = 2VT + I·RE / GHLM5 ch. 9 (from memory)
  assertClose(degenerated.slew!.slewRate, 10.00e6, { rtol: 1e-3 }); // REFERENCE E3.6 SR unchanged / GHLM5 ch. 9 (from memory)
  const s = degenerated.slew!;
  assertClose(s.slewRate / (2 * Math.PI * s.unityGainFrequency), s.slewToUnityGainRatio, {
    rtol: 1e-9,
  }); // closed form: SR/ωu consistency
});

Deno.test("mosPair() slews at 40 V/µs with fu = 31.83 MHz and SR/ωu = Vov (E3.7)", () => {
  const pair = mosPair({
    ...exampleB(),
    load: { kind: "mirror", transconductanceParameter: 5e-3, threshold: 0.5, lambda: 0.1 },
    compensationCapacitance: 5e-12,
  });
  assertClose(pair.slew!.slewRate, 40.00e6, { rtol: 1e-3 }); // REFERENCE E3.7 SR = I/Cc / SS7 ch. 13 (from memory)
  assertClose(pair.slew!.unityGainFrequency, 31.83e6, { rtol: 1e-3 }); // REFERENCE E3.7 fu = gm1/(2πCc) / SS7 ch. 13 (from memory)
  assertClose(pair.slew!.slewToUnityGainRatio, 0.2, { rtol: 1e-3 }); // REFERENCE E3.7 SR/ωu = Vov / GHLM5 ch. 9 (from memory)
});

Deno.test("sineSlewRate() and slewLimitedFrequency() give the full-power bandwidth (E3.8)", () => {
  assertClose(slewLimitedFrequency(10e6, 40), 39.79e3, { rtol: 1e-3 }); // REFERENCE E3.8 SR/(2πV̂) / closed form
  assertClose(sineSlewRate(40, 20e3), 5.027e6, { rtol: 1e-3 }); // REFERENCE E3.8 2πfV̂ / closed form
  assertThrows(() => sineSlewRate(-1, 20e3), RangeError);
});

Deno.test("bjtPair() input noise matches E3.9 and E3.10", () => {
  const e39 = bjtPair({
    ...exampleA(),
    tail: { kind: "source", current: (2 * 0.5e-3 * 101) / 100 }, // Ic = 0.5 mA per device at β = 100
    baseResistance: 100,
  });
  assertClose(e39.devices[0].collectorCurrent, 0.5e-3, { rtol: 1e-12 }); // closed form: the set-up above
  assertClose(e39.noise.deviceVoltageDensity, 1.444e-9, { rtol: 1e-3 }); // REFERENCE E3.9 √(4kT(rb + 1/(2gm))) / GHLM5 ch. 11 (from memory)
  assertClose(e39.noise.voltageDensity, 2.042e-9, { rtol: 1e-3 }); // REFERENCE E3.9 pair = √2 × one device / GHLM5 ch. 11 (from memory)
  assertClose(e39.inputBiasCurrent, 5e-6, { rtol: 1e-3 }); // REFERENCE E3.9 IB = 5 µA / closed form
  assertClose(e39.noise.currentDensity, 1.266e-12, { rtol: 1e-3 }); // REFERENCE E3.9 √(2qIB) / Schottky 1918
  const e310 = bjtPair({
    ...exampleA({ beta: Infinity }),
    tail: { kind: "source", current: 100e-6 },
    baseResistance: 200,
  });
  assertClose(1 / (2 * e310.transconductance), 258.52, { rtol: 1e-3 }); // REFERENCE E3.10 1/(2gm) / closed form
  assertClose(e310.noise.deviceVoltageDensity, 2.756e-9, { rtol: 1e-3 }); // REFERENCE E3.10 one device / GHLM5 ch. 11 (from memory)
  assertClose(e310.noise.voltageDensity, 3.898e-9, { rtol: 1e-3 }); // REFERENCE E3.10 pair / GHLM5 ch. 11 (from memory)
});

Deno.test("resistorNoiseDensity() gives 4.070 nV/√Hz for 1 kΩ at 300 K (E3.11)", () => {
  assertClose(resistorNoiseDensity(1e3), 4.070e-9, { rtol: 1e-3 }); // REFERENCE E3.11 √(4kTR) / Johnson 1928, Nyquist 1928
  assertClose(resistorNoiseDensity(1e3, { temperature: 290 }), 4.002e-9, { rtol: 1e-3 }); // REFERENCE E3.11 290 K / Johnson 1928, Nyquist 1928
  assertClose(resistorNoiseDensity(1) ** 2, 1.6568e-20, { rtol: 1e-3 }); // REFERENCE E3.11 4kT at 300 K / CODATA 2018
  assertThrows(() => resistorNoiseDensity(-1), RangeError);
});

Deno.test("bjtPair() HD3 leading term, corrected series and exact DFT match E3.12–E3.14", () => {
  const pair = bjtPair(exampleA({ beta: Infinity }));
  const rows = [
    // [V̂, x, exact, x²/12, corrected, rtol of the exact value]
    [5e-3, 0.096704, 0.07775e-2, 0.07793e-2, 0.07775e-2],
    [10e-3, 0.19341, 0.3088e-2, 0.3117e-2, 0.3087e-2],
    [20e-3, 0.38682, 1.202e-2, 1.247e-2, 1.196e-2],
  ];
  for (const [amplitude, x, exact, leading, corrected] of rows) {
    const hd3 = pair.thirdHarmonic(amplitude);
    assertClose(amplitude / (2 * VT), x, { rtol: 1e-3 }); // REFERENCE E3.12–E3.14 x = V̂/(2VT) / D
    assertClose(hd3.exact, exact, { rtol: 1e-3 }); // REFERENCE E3.12–E3.14 exact DFT of tanh / D, GHLM5 ch. 3 (from memory)
    assertClose(hd3.leadingTerm, leading, { rtol: 1e-3 }); // REFERENCE E3.12–E3.14 x²/12 = (1/48)(V̂/VT)² / GHLM5 (from memory)
    assertClose(hd3.corrected, corrected, { rtol: 1e-3 }); // REFERENCE E3.12–E3.14 two-term series ratio / D
  }
  assertClose(pair.thirdHarmonic(10e-3).thd, 0.3088e-2, { rtol: 2e-3 }); // REFERENCE E3.13 THD = 0.3088 % (DFT) / D
  const direct = harmonics((v) => 1e-3 * Math.tanh(v / (2 * VT)), 20e-3); // REFERENCE §3.1 tanh law, fed straight to harmonics()
  assertClose(pair.thirdHarmonic(20e-3).exact, direct.amplitudes[3] / direct.amplitudes[1], {
    rtol: 1e-9,
  }); // closed form: same transfer curve
  assertClose(pair.thirdHarmonic(20e-3).leadingTerm / 1.202e-2, 1.037, { rtol: 2e-3 }); // REFERENCE §3.8 leading term 3.7 % high at 20 mV / D
});

Deno.test("mosPair() HD3 exact DFT matches E3.15 and the leading term (1/32)(V̂/Vov)²", () => {
  const pair = mosPair(exampleB());
  for (
    const [ratio, exact, leading] of [[0.25, 0.1974e-2, 0.1953e-2], [0.5, 0.8164e-2, 0.7812e-2]]
  ) {
    const hd3 = pair.thirdHarmonic(ratio * 0.2);
    assertClose(hd3.exact, exact, { rtol: 1e-3 }); // REFERENCE E3.15 exact DFT of the square-law pair / D
    assertClose(hd3.leadingTerm, leading, { rtol: 1e-3 }); // REFERENCE E3.15 (1/32)(V̂/Vov)² / D
    assertClose(hd3.corrected, exact, { rtol: 2e-3 }); // D: the two-term series is within 0.1 % of the DFT here
  }
});

// ---------------------------------------------------------------- §9.4 LTP with 1 % collector resistors

Deno.test("bjtPair() worst-case CMRR_d with 1 % collector resistors is 99.71 dB (§9.4)", () => {
  const worst = bjtPair(exampleA({ mismatch: { loadResistance: 0.02 } }));
  assertClose(worst.cmrr.differentialDb, 99.71, { atol: 0.005 }); // REFERENCE §9.4 (1 + 2REE/re)/0.02 / D from §3
  assertClose(worst.cmrr.singleEndedDb, 59.71, { atol: 0.005 }); // REFERENCE §9.4 single-ended unaffected to first order / D
});

Deno.test("bjtPairMonteCarlo() gives a median CMRR_d of 115.7 dB and a 5th percentile of 106.4 dB (§9.4)", () => {
  const run = bjtPairMonteCarlo(exampleA(), { trials: 200_000, loadTolerance: 0.01, seed: 2024 });
  assert(run.cmrrDefinition === "differential");
  assertClose(run.cmrrDbMedian, 115.7, { atol: 0.3 }); // REFERENCE §9.4 median, seeded MC N = 2e5, ±0.3 dB per §0.2 / D
  assertClose(run.cmrrDbPercentile5, 106.4, { atol: 0.3 }); // REFERENCE §9.4 5th percentile, ±0.3 dB per §0.2 / D
  assert(run.offset.every((x) => Math.abs(x) < 5e-3)); // resistor-only offsets stay within VT·ΔR/R of a few ‰
});

Deno.test("bjtPairMonteCarlo() returns each trial's single-ended CMRR, untouched by RC mismatch (§9.4)", () => {
  const run = bjtPairMonteCarlo(exampleA(), { trials: 20_000, loadTolerance: 0.01, seed: 11 });
  assertEquals(run.cmrrSingleEndedDb.length, 20_000);
  const sorted = Float64Array.from(run.cmrrSingleEndedDb).sort();
  assertClose(sorted[0], 59.71, { atol: 0.005 }); // REFERENCE §9.4 single-ended unaffected by RC mismatch / E3.4 59.71 dB
  assertClose(sorted[sorted.length - 1], 59.71, { atol: 0.005 }); // REFERENCE §9.4 single-ended unaffected by RC mismatch / E3.4 59.71 dB
  // With a mirror load the run's only CMRR is the single-ended one.
  const mirrored = bjtPairMonteCarlo(
    { ...exampleA(), load: { kind: "mirror", earlyVoltage: 50 }, earlyVoltage: 100 },
    { trials: 200, saturationCurrentSpread: 0.05, seed: 3 },
  );
  assertEquals(mirrored.cmrrDefinition, "singleEnded");
  assertEquals(Array.from(mirrored.cmrrSingleEndedDb), Array.from(mirrored.cmrrDb));
});

Deno.test("bjtPairMonteCarlo() spreads the load resistors by the chosen tolerance distribution", () => {
  const trials = 200_000;
  const same = bjtPairMonteCarlo(exampleA(), { trials: 5000, loadTolerance: 0.01, seed: 8 });
  const explicit = bjtPairMonteCarlo(exampleA(), {
    trials: 5000,
    loadTolerance: 0.01,
    seed: 8,
    loadDistribution: { distribution: "gaussian3sigma" },
  });
  assertEquals(Array.from(explicit.cmrrDb), Array.from(same.cmrrDb)); // the default is unchanged
  // Uniform ±1 %: δ1 − δ2 is triangular on ±2 %, so the median |ΔRC/RC| is 2ε(1 − 1/√2).
  const uniform = bjtPairMonteCarlo(exampleA(), {
    trials,
    loadTolerance: 0.01,
    seed: 21,
    loadDistribution: { distribution: "uniform" },
  });
  const medianMismatch = 0.02 * (1 - Math.SQRT1_2);
  assertClose(uniform.cmrrDbMedian, db(193509 * 0.01 / medianMismatch), { atol: 0.3 }); // REFERENCE E3.4 CMRR_d at 1 % scaled to the closed-form triangular median, ±0.3 dB per §0.2 / D
  // Corners: the two resistors agree (infinite CMRR) or differ by 2ε (the §9.4 worst case).
  const corners = bjtPairMonteCarlo(exampleA(), {
    trials,
    loadTolerance: 0.01,
    seed: 22,
    loadDistribution: { distribution: "corners" },
  });
  const finite = corners.cmrrDb.filter((x) => x < 150);
  assertClose(finite.length / trials, 0.5, { atol: 4 * Math.sqrt(0.25 / trials) }); // closed form P = ½, 4 standard errors per REFERENCE §9.5
  assertClose(Math.max(...finite), 99.71, { atol: 0.01 }); // REFERENCE §9.4 worst case ΔRC/RC = 2 % / D
  assertThrows(
    () =>
      bjtPairMonteCarlo(exampleA(), {
        trials: 10,
        loadTolerance: 0.01,
        loadDistribution: { distribution: "binned" },
      }),
    RangeError,
  );
});

Deno.test("bjtPairMonteCarlo() offset spread follows σ(VOS) = VT·σ(ΔIs/Is)", () => {
  const trials = 200_000;
  const run = bjtPairMonteCarlo(exampleA(), { trials, saturationCurrentSpread: 0.05, seed: 5 });
  const sigma = VT * 0.05; // first order; ln(Is1/Is2) of an even split differs by O(δ³)
  const standardError = sigma / Math.sqrt(2 * (trials - 1));
  assertClose(run.offsetSd, sigma, { atol: 4 * standardError + 1e-3 * sigma }); // REFERENCE §9.1 VOS = VT·ln(Is1/Is2), 4 standard errors per §9.5 / SS7 ch. 9 (from memory)
  assertClose(run.offsetMean, 0, { atol: 4 * sigma / Math.sqrt(trials) }); // REFERENCE §9.5 zero-mean spread, 4 standard errors / D
});

Deno.test("the Monte Carlo fast path matches the general nodal path trial by trial", () => {
  const { core, inputCommonMode } = _bjtCore(exampleA({ degeneration: 47 }));
  const current = _bjtTailCurrent(core, inputCommonMode);
  const nominal = _bjtNominalIs(core, current);
  fc.assert(
    fc.property(
      fc.double({ min: -0.05, max: 0.05, noNaN: true }),
      fc.double({ min: -0.2, max: 0.2, noNaN: true }),
      fc.double({ min: -0.3, max: 0.3, noNaN: true }),
      (dr, dIs, dBeta) => {
        const parts = _bjtParts(core, nominal, {
          loadResistance: dr,
          saturationCurrent: dIs,
          beta: dBeta,
        });
        const fast = { cmrrDb: 0, cmrrSingleEndedDb: 0, offset: 0 };
        const general = { cmrrDb: 0, cmrrSingleEndedDb: 0, offset: 0 };
        _bjtTrialFast(core, current, parts, fast);
        _bjtTrialGeneral(core, current, inputCommonMode, parts, general);
        // Near a perfect match the CMRR is a ratio of rounding errors: both paths must then
        // simply report it as enormous.
        const cmrrAgrees = general.cmrrDb > 200
          ? fast.cmrrDb > 180
          : Math.abs(fast.cmrrDb - general.cmrrDb) <= 1e-6;
        const singleEndedAgrees =
          Math.abs(fast.cmrrSingleEndedDb - general.cmrrSingleEndedDb) <= 1e-6;
        return cmrrAgrees && singleEndedAgrees &&
          Math.abs(fast.offset - general.offset) <= 1e-15 + 1e-9 * Math.abs(general.offset);
      },
    ),
    { numRuns: 200 },
  );
});

Deno.test("mosPairMonteCarlo() offset spread follows σ(VOS) = σ(ΔVt)", () => {
  const trials = 200_000;
  const run = mosPairMonteCarlo(exampleB(), { trials, thresholdSpread: 2e-3, seed: 9 });
  assertClose(run.offsetSd, 2e-3, { atol: 4 * 2e-3 / Math.sqrt(2 * (trials - 1)) }); // REFERENCE §3.2 VOS = ΔVt, 4 standard errors per §9.5 / SS7 ch. 9 (from memory)
  // ΔVt unbalances the currents, so gm1 ≠ gm2 with Δgm/gm ≈ ΔVt/Vov; median |ΔVt| = 0.6745σ.
  const expected = db((1 + 2 * 1e-3 * 100e3) / ((0.67449 * 2e-3) / 0.2));
  assertClose(run.cmrrDbMedian, expected, { atol: 0.3 }); // REFERENCE §3.1 CMRR_d ≈ 2gm·REE/(Δgm/gm), median per §9.1, ±0.3 dB per §0.2 / D
});

// ---------------------------------------------------------------- §3.8 traps

Deno.test("bjtPair() uses vid/(2VT) in the tanh, not vid/VT (§3.8)", () => {
  const pair = bjtPair(exampleA({ beta: Infinity }));
  const vid = 0.02;
  assertClose(pair.differenceCurrent(vid), 1e-3 * Math.tanh(vid / (2 * VT)), { rtol: 1e-12 }); // REFERENCE §3.8 tanh(vid/(2VT)) / SS7 ch. 9 (from memory)
  assert(Math.abs(pair.differenceCurrent(vid) - 1e-3 * Math.tanh(vid / VT)) > 1e-4); // REFERENCE §3.8 the vid/VT form is 0.28 mA away
});

Deno.test("bjtPair() puts 2REE in the common-mode half circuit, not REE (§3.8)", () => {
  const pair = bjtPair(exampleA({ beta: Infinity }));
  assertClose(pair.gain.commonModeSingleEnded, -10e3 / (2 * 50e3), { rtol: 1e-3 }); // REFERENCE §3.8 Acm,se ≈ −RC/(2REE) / SS7 ch. 9 (from memory)
  assert(Math.abs(pair.gain.commonModeSingleEnded + 10e3 / 50e3) > 0.09); // REFERENCE §3.8 −RC/REE would be twice as large
  assertClose(pair.cmrr.singleEnded, pair.transconductance * 50e3, { rtol: 1e-3 }); // REFERENCE §3.8 CMRR_se ≈ gm·REE / SS7 ch. 9 (from memory)
  const mismatched = bjtPair(exampleA({ beta: Infinity, mismatch: { loadResistance: 0.01 } }));
  assertClose(mismatched.cmrr.differential, (2 * pair.transconductance * 50e3) / 0.01, {
    rtol: 1e-3,
  }); // REFERENCE §3.8 CMRR_d ≈ 2gm·REE/(ΔRC/RC) / SS7 ch. 9 (from memory)
});

Deno.test("bjtPair() reports gm of one device, I/(2VT), not I/VT (§3.8)", () => {
  const pair = bjtPair(exampleA({ beta: Infinity }));
  assertClose(pair.transconductance, 1e-3 / (2 * VT), { rtol: 1e-12 }); // REFERENCE §3.8 gm = I/(2VT) / SS7 ch. 9 (from memory)
  assertClose(pair.gain.differential, pair.transconductance * 10e3, { rtol: 1e-12 }); // REFERENCE §3.8 Ad = gm·RC with one device's gm / SS7 ch. 9 (from memory)
});

// ---------------------------------------------------------------- errors and checks

Deno.test("bjtPair() rejects non-physical input with a RangeError naming the parameter", () => {
  assertThrows(
    () => bjtPair(exampleA({ tail: { kind: "source", current: -0.001 } })),
    {
      name: "RangeError",
      message: "Expected tail.current to be greater than 0 A, but found -0.001",
    },
  );
  assertThrows(() => bjtPair(exampleA({ positiveRail: -15, negativeRail: 15 })), /negativeRail/);
  assertThrows(() => bjtPair(exampleA({ inputCommonMode: 20 })), /inputCommonMode/);
  assertThrows(
    () => bjtPair(exampleA({ load: { kind: "resistors", resistance: 0 } })),
    /load\.resistance/,
  );
  assertThrows(() => bjtPair(exampleA({ degeneration: -1 })), /degeneration/);
  // 1 mA into 40 kΩ would put Q1's collector below its emitter: impossible, not just bad.
  assertThrows(
    () => bjtPair(exampleA({ load: { kind: "resistors", resistance: 40e3 } })),
    /load\.resistance to be below/,
  );
  // The tail source would sit below the negative rail.
  assertThrows(() => bjtPair(exampleA({ inputCommonMode: -14.5 })), /inputCommonMode to be above/);
  assertThrows(
    () =>
      bjtPair(exampleA({ tail: { kind: "resistor", resistance: 14.3e3 }, inputCommonMode: -14.5 })),
    /inputCommonMode/,
  );
});

Deno.test("bjtPair() turns a possible but bad bias into failing checks with a reason", () => {
  const pair = bjtPair(
    exampleA({
      inputCommonMode: 10.3,
      requirements: { inputCommonModeRange: [-12, 12], cmrrDb: 80 },
    }),
  );
  const failing = pair.checks.filter((check) => !check.pass);
  assert(pair.checks.every(isCheck));
  assert(failing.some((check) => check.name.startsWith("Q1 active")), "Q1 saturates at 10.3 V");
  assert(failing.some((check) => check.name === "input common-mode range, high end"));
  assert(failing.some((check) => check.name === "CMRR (single-ended output)"));
  assert(failing.every((check) => check.reason.includes("is not")));
  const relaxed = bjtPair(
    exampleA({ inputCommonMode: 10.3, requirements: { relaxedSaturation: true } }),
  );
  assert(
    relaxed.checks.every((check) => check.pass),
    "10.3 V is within the relaxed 0.4 V convention",
  );
});

Deno.test("bjtPair() with a resistor tail draws its current from the rails and VBE", () => {
  const pair = bjtPair(exampleA({ tail: { kind: "resistor", resistance: 14.3e3 } }));
  assertClose(pair.tailCurrent, (0 - 0.7 + 15) / 14.3e3, { rtol: 1e-12 }); // closed form: (vicm − VBE − VEE)/REE
  const higher = bjtPair(
    exampleA({ tail: { kind: "resistor", resistance: 14.3e3 }, inputCommonMode: 2 }),
  );
  assert(higher.tailCurrent > pair.tailCurrent);
  assertClose(pair.inputCommonModeRange.min, -15 + 0.7, { rtol: 1e-12 }); // closed form: the pair turns on at VEE + VBE
  const fromIs = bjtPair({
    ...exampleA(),
    baseEmitterVoltage: undefined,
    tail: { kind: "resistor", resistance: 14.3e3 },
  });
  const vbe = fromIs.devices[0].baseEmitterVoltage;
  assertClose(fromIs.tailCurrent, (15 - vbe) / 14.3e3, { rtol: 1e-9 }); // closed form: consistent with the solved VBE
});

Deno.test("mosPair() rejects impossible biases and flags weak inversion", () => {
  assertThrows(
    () => mosPair(exampleB({ transconductanceParameter: -1 })),
    /transconductanceParameter/,
  );
  assertThrows(() => mosPair(exampleB({ inputCommonMode: 0.6 })), /inputCommonMode to be above/);
  assertThrows(
    () => mosPair(exampleB({ load: { kind: "resistors", resistance: 40e3 } })),
    /load\.resistance/,
  );
  const weak = mosPair(exampleB({ transconductanceParameter: 0.2 }));
  const check = weak.checks.find((c) => c.name.startsWith("overdrive above weak inversion"))!;
  assert(!check.pass, "Vov = 31.6 mV is below 2n·VT = 77.6 mV");
});

// ---------------------------------------------------------------- properties

Deno.test("bjtPair() CMRR grows with tail resistance (property)", () => {
  fc.assert(
    fc.property(
      fc.double({ min: 1e3, max: 1e7, noNaN: true }),
      fc.double({ min: 1.01, max: 10, noNaN: true }),
      fc.double({ min: -0.05, max: 0.05, noNaN: true }),
      (ree, factor, mismatch) => {
        const at = (r: number) =>
          bjtPair(exampleA({
            tail: { kind: "source", current: 1e-3, outputResistance: r },
            mismatch: { loadResistance: mismatch, saturationCurrent: 0.02 },
          })).cmrr;
        const low = at(ree);
        const high = at(ree * factor);
        return high.singleEnded > low.singleEnded && high.differential > low.differential;
      },
    ),
    { numRuns: 60 },
  );
});

Deno.test("bjtPair() halves CMRR when the tail resistance halves (for large REE)", () => {
  const at = (r: number) =>
    bjtPair(exampleA({ tail: { kind: "source", current: 1e-3, outputResistance: r } }));
  assertClose(at(5e6).cmrr.singleEnded / at(10e6).cmrr.singleEnded, 0.5, { rtol: 1e-4 }); // closed form: CMRR_se = ½ + REE/re
});

Deno.test("input pairs have zero offset when matched (property)", () => {
  fc.assert(
    fc.property(
      fc.double({ min: 1e-5, max: 5e-3, noNaN: true }),
      fc.double({ min: 0, max: 500, noNaN: true }),
      fc.double({ min: 20, max: 1000, noNaN: true }),
      (current, re, beta) => {
        const bjt = bjtPair(exampleA({
          tail: { kind: "source", current, outputResistance: 1e5 },
          load: { kind: "resistors", resistance: 1 / current },
          degeneration: re,
          beta,
        }));
        const mos = mosPair(exampleB({
          tail: { kind: "source", current: current / 10, compliance: 0.3 },
          load: { kind: "resistors", resistance: 0.5 / current },
          degeneration: re,
        }));
        return [bjt.offset, mos.offset].every((o) =>
          Math.abs(o.exact) < 1e-15 && o.rss === 0 && o.worstCase === 0
        );
      },
    ),
    { numRuns: 50 },
  );
});

Deno.test("a matched pair's transfer curve is odd, bounded by αI, with no even harmonics (property)", () => {
  fc.assert(
    fc.property(
      fc.double({ min: 0, max: 300, noNaN: true }),
      fc.double({ min: 1e-4, max: 0.5, noNaN: true }),
      fc.boolean(),
      (re, vid, isMos) => {
        const pair = isMos
          ? mosPair(exampleB({ degeneration: re }))
          : bjtPair(exampleA({ degeneration: re }));
        const full = isMos ? 200e-6 : (1e-3 * 100) / 101;
        const a = pair.differenceCurrent(vid);
        const b = pair.differenceCurrent(-vid);
        const odd = Math.abs(a + b) <= 1e-12 * full;
        const bounded = Math.abs(a) <= full * (1 + 1e-12);
        const spectrum = harmonics(pair.differenceCurrent, Math.min(vid, 0.1));
        const even = spectrum.amplitudes[2] <= 1e-9 * spectrum.amplitudes[1] &&
          spectrum.amplitudes[4] <= 1e-9 * spectrum.amplitudes[1];
        return odd && bounded && even;
      },
    ),
    { numRuns: 40 },
  );
});

Deno.test("a mismatched pair does have even harmonics", () => {
  const pair = bjtPair(exampleA({ mismatch: { saturationCurrent: 0.2 } }));
  const spectrum = harmonics(pair.differenceCurrent, 20e-3);
  assert(spectrum.amplitudes[2] > 1e-4 * spectrum.amplitudes[1]);
});

Deno.test("bjtPair() exposes its two-port view from Rid, the single-ended gain and RC", () => {
  const pair = bjtPair(exampleA());
  assertClose(pair.twoPort.inputResistance, 10.444e3, { rtol: 1e-3 }); // REFERENCE §3.4 Rid / SS7 ch. 9 (from memory)
  assertClose(pair.twoPort.openCircuitGain, 95.747, { rtol: 1e-3 }); // REFERENCE §3.4 Ad,se / SS7 ch. 9 (from memory)
  assertClose(pair.twoPort.outputResistance, 10e3, { rtol: 1e-12 }); // closed form: RC with ro = ∞
  const differential = bjtPair(exampleA({ output: "differential" }));
  assertClose(differential.twoPort.openCircuitGain, 191.49, { rtol: 1e-3 }); // REFERENCE §3.4 Ad / SS7 ch. 9 (from memory)
  assertClose(differential.twoPort.outputResistance, 20e3, { rtol: 1e-12 }); // closed form: 2RC
});

Deno.test("mosPair() with a resistor tail solves Iss·R + Vt + √(Iss/kn) = vicm − VSS", () => {
  const pair = mosPair(exampleB({ tail: { kind: "resistor", resistance: 5e3 } }));
  const iss = pair.tailCurrent;
  assertClose(iss * 5e3 + 0.5 + Math.sqrt(iss / 5e-3), 1.65, { rtol: 1e-12 }); // closed form: the tail equation at vicm = 1.65 V
  assertClose(pair.tailVoltage, iss * 5e3, { rtol: 1e-9 }); // closed form: Ohm's law across the tail resistor
  assertClose(pair.inputCommonModeRange.min, 0.5, { rtol: 1e-12 }); // closed form: the pair turns on at VSS + Vt
});

Deno.test("a mirror-loaded pair's Monte Carlo reports its single-ended CMRR", () => {
  const options: BjtPairOptions = {
    tail: { kind: "mirror", current: 1e-3, outputResistance: 100e3 },
    load: { kind: "mirror", earlyVoltage: 50, beta: 50 },
    positiveRail: 15,
    negativeRail: -15,
    earlyVoltage: 100,
  };
  const run = bjtPairMonteCarlo(options, { trials: 2000, saturationCurrentSpread: 0.05, seed: 4 });
  const nominal = bjtPair(options);
  assert(run.cmrrDefinition === "singleEnded");
  assert(run.cmrrDbMedian < nominal.cmrr.singleEndedDb); // D: the matched pair is the best case, mismatch lowers the median
  assertClose(run.cmrrDbMedian, nominal.cmrr.singleEndedDb, { atol: 2 }); // D: a 5 % Is spread costs the mirror-loaded CMRR about 1 dB (2·10⁵ trials: 1.1 dB)
  assertClose(run.offsetMean, nominal.offset.exact, { atol: 4 * VT * 0.05 / Math.sqrt(2000) }); // D: the systematic offset is the mean, 4 standard errors
});
