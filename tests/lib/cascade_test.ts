/**
 * Cascade composition with loading, complex arithmetic, negative feedback and loop margins.
 * Worked values: REFERENCE §6.2 (E6.1–E6.6). Cross-checks: complex.js (npm, tests only).
 */
import { Complex } from "complex.js";
import fc from "fast-check";
import { assert, assertClose, assertEquals, assertThrows } from "../_assert.ts";
import {
  cascade,
  complexAbs,
  complexAdd,
  complexArg,
  complexArgDegrees,
  complexDiv,
  complexFromPolar,
  complexMul,
  complexParallel,
  complexSub,
  dampingFactor,
  feedbackLoop,
  loadingFactor,
  loadingFactorAt,
  logFrequencies,
  loopMargins,
  negativeFeedback,
  parallelResistance,
  rcParallelImpedance,
  rcPoleFrequency,
  sweepResponse,
  type TwoPort,
} from "../../lib/cascade/mod.ts";

// ---------------------------------------------------------------------------------------------
// E6.1: three stages between a 600 Ω source and an 8 Ω load

function e61Stages(): TwoPort[] {
  return [
    { name: "stage 1", inputResistance: 10e3, openCircuitGain: 50, outputResistance: 10e3 },
    { name: "stage 2", inputResistance: 20e3, openCircuitGain: 200, outputResistance: 5e3 },
    { name: "stage 3", inputResistance: 100e3, openCircuitGain: 0.97, outputResistance: 0.3 },
  ];
}

Deno.test("cascade() gives every interface's loading factor and the overall gain (E6.1)", () => {
  const chain = cascade({ stages: e61Stages(), sourceResistance: 600, loadResistance: 8 });
  const [input, s12, s23, load] = chain.interfaces.map((x) => x.factor);
  assertClose(input, 0.94340, { rtol: 1e-4 }); // REFERENCE E6.1 / [SS7] ch. 1 (from memory)
  assertClose(s12, 0.66667, { rtol: 1e-4 }); // REFERENCE E6.1 / [SS7] ch. 1 (from memory)
  assertClose(s23, 0.95238, { rtol: 1e-4 }); // REFERENCE E6.1 / [SS7] ch. 1 (from memory)
  assertClose(load, 0.96386, { rtol: 1e-4 }); // REFERENCE E6.1 / [SS7] ch. 1 (from memory)
  assertClose(chain.unloadedGain, 9700.0, { rtol: 1e-4 }); // REFERENCE E6.1 / [SS7] ch. 1 (from memory)
  assertClose(chain.gain, 5600.1, { rtol: 1e-4 }); // REFERENCE E6.1 / [SS7] ch. 1 (from memory)
  assertClose(chain.gainDb, 74.96, { rtol: 1e-4 }); // REFERENCE E6.1 / [SS7] ch. 1 (from memory)
});

Deno.test("cascade() says which interface costs how many dB, and flags factors below 0.9", () => {
  const chain = cascade({ stages: e61Stages(), sourceResistance: 600, loadResistance: 8 });
  // −20·log10(2/3) = 3.5218 dB
  assertClose(chain.interfaces[1].lossDb, 3.5218, { rtol: 1e-4 }); // closed form from REFERENCE E6.1's 0.66667
  assertEquals(chain.interfaces[1].summary, "stage 2 costs stage 1 3.522 dB");
  // 0.9 threshold: common practice, no source (REFERENCE §6.3)
  assertEquals(chain.checks.map((c) => c.pass), [true, false, true, true]);
  assertEquals(chain.checks[1].name, "loading of stage 1 by stage 2");
});

Deno.test("cascade() gives the loaded gain of each stage: Avo times its output factor", () => {
  const chain = cascade({ stages: e61Stages(), sourceResistance: 600, loadResistance: 8 });
  assertClose(chain.stages[0].loadedGain, 50 * 0.66667, { rtol: 1e-4 }); // REFERENCE E6.1 factors
  assertClose(chain.stages[2].loadedGain, 0.97 * 0.96386, { rtol: 1e-4 }); // REFERENCE E6.1 factors
});

// ---------------------------------------------------------------------------------------------
// E6.2: a reactive interface at 50 kHz

Deno.test("rcParallelImpedance() and loadingFactorAt() give the reactive divider (E6.2)", () => {
  const zin = rcParallelImpedance(50e3, 100e-12, 50e3);
  assertClose(complexAbs(zin), 26.851e3, { rtol: 1e-4 }); // REFERENCE E6.2 / D
  assertClose(complexArgDegrees(zin), -57.52, { rtol: 1e-4 }); // REFERENCE E6.2 / D
  const k = loadingFactorAt({ re: 20e3, im: 0 }, zin);
  assertClose(complexAbs(k), 0.65167, { rtol: 1e-4 }); // REFERENCE E6.2 / D
  assertClose(complexArgDegrees(k), -24.17, { rtol: 1e-3 }); // REFERENCE E6.2 / D
  assertClose(loadingFactor(20e3, 50e3), 0.71429, { rtol: 1e-4 }); // REFERENCE E6.2 (DC) / D
  assertClose(rcPoleFrequency(parallelResistance(20e3, 50e3), 100e-12), 111.4e3, { rtol: 5e-4 }); // REFERENCE E6.2 / D
});

Deno.test("cascade().at() multiplies complex factors, so phases add across the chain (E6.2)", () => {
  const driver: TwoPort = {
    name: "driver",
    inputResistance: Infinity,
    openCircuitGain: 1,
    outputResistance: 20e3,
  };
  const next: TwoPort = {
    name: "next",
    inputResistance: 50e3,
    openCircuitGain: 1,
    outputResistance: 0,
    at: (f) => ({
      inputImpedance: rcParallelImpedance(50e3, 100e-12, f),
      openCircuitGain: { re: 1, im: 0 },
      outputImpedance: { re: 0, im: 0 },
    }),
  };
  const chain = cascade({ stages: [driver, next] });
  const at = chain.at(50e3);
  assertClose(complexAbs(at.factors[1]), 0.65167, { rtol: 1e-4 }); // REFERENCE E6.2 / D
  assertClose(at.phaseDegrees, -24.17, { rtol: 1e-3 }); // REFERENCE E6.2 / D
  assertClose(at.magnitudeDb, 20 * Math.log10(0.65167), { rtol: 1e-4 }); // REFERENCE E6.2 / D
  assertClose(chain.gain, 0.71429, { rtol: 1e-4 }); // REFERENCE E6.2 (DC) / D
});

// ---------------------------------------------------------------------------------------------
// E6.3–E6.6: negative feedback

Deno.test("negativeFeedback() gives A/(1 + Aβ) and desensitises a halved A (E6.3)", () => {
  const loop = negativeFeedback({ openLoopGain: 1e5, feedbackFactor: 0.05 });
  assertClose(loop.closedLoopGain, 19.9960, { rtol: 1e-5 }); // REFERENCE E6.3 / [Black34]
  assertClose(loop.loopGain, 5000, { rtol: 1e-9 }); // REFERENCE E6.3 / [Black34]
  assertClose(loop.desensitivity, 0.0002000, { rtol: 1e-3 }); // REFERENCE E6.3 / [SS7] ch. 11
  const halved = negativeFeedback({ openLoopGain: 0.5e5, feedbackFactor: 0.05 });
  assertClose(halved.closedLoopGain, 19.9920, { rtol: 1e-5 }); // REFERENCE E6.3 / [Black34]
});

Deno.test("negativeFeedback() divides output resistance and distortion by 1 + Aβ (E6.4)", () => {
  const loop = negativeFeedback({
    openLoopGain: 1e5,
    feedbackFactor: 0.05,
    openLoopOutputResistance: 0.579,
    openLoopDistortion: 0.01,
  });
  assertClose(loop.outputResistance!, 115.8e-6, { rtol: 1e-3 }); // REFERENCE E6.4 / [SS7] ch. 11
  assertClose(loop.distortion! * 100, 0.0002000, { rtol: 1e-3 }); // REFERENCE E6.4 / [SS7] ch. 11
  const df = dampingFactor({ loadResistance: 8, outputResistance: loop.outputResistance! });
  assertClose(df.theoretical, 69098, { rtol: 1e-4 }); // REFERENCE E6.4 / CP
  // REFERENCE §6.4 caution: the theoretical figure is meaningless, so the reported one is capped.
  assertEquals(df.capped, true);
  assert(df.reported <= 1000);
});

Deno.test("negativeFeedback() multiplies a single-pole bandwidth by 1 + A0β (E6.5)", () => {
  const loop = negativeFeedback({
    openLoopGain: 1e5,
    feedbackFactor: 0.05,
    openLoopBandwidth: 100,
  });
  assertClose(loop.gainBandwidth!, 10.00e6, { rtol: 1e-4 }); // REFERENCE E6.5 / [SS7] ch. 11
  assertClose(loop.bandwidth!, 500.1e3, { rtol: 1e-4 }); // REFERENCE E6.5 / [SS7] ch. 11
});

Deno.test("feedbackLoop() finds the single-pole closed-loop bandwidth numerically (E6.5)", () => {
  const a = (f: number) => {
    const x = f / 100;
    const d = 1 + x * x;
    return { re: 1e5 / d, im: (-1e5 * x) / d };
  };
  const loop = feedbackLoop(a, { feedbackFactor: 0.05 });
  assertClose(loop.closedLoopBandwidth, 500.1e3, { rtol: 1e-4 }); // REFERENCE E6.5 / [SS7] ch. 11
  assertClose(loop.lowFrequencyClosedLoopGain, 19.996, { rtol: 1e-4 }); // REFERENCE E6.3 / [Black34]
});

Deno.test("negativeFeedback() with A = 200, β = 0.1 (E6.6)", () => {
  const loop = negativeFeedback({ openLoopGain: 200, feedbackFactor: 0.1 });
  assertClose(loop.closedLoopGain, 9.5238, { rtol: 1e-4 }); // REFERENCE E6.6 / [Black34]
  assertClose(loop.desensitivity, 0.04762, { rtol: 1e-4 }); // REFERENCE E6.6 / [SS7] ch. 11
});

Deno.test("negativeFeedback() multiplies a series-mixing input resistance by 1 + Aβ", () => {
  const loop = negativeFeedback({
    openLoopGain: 200,
    feedbackFactor: 0.1,
    openLoopInputResistance: 10e3,
  });
  assertClose(loop.inputResistance!, 210e3, { rtol: 1e-12 }); // closed form, [SS7] ch. 11 Zin·(1 + Aβ)
});

// ---------------------------------------------------------------------------------------------
// Loop margins against closed forms

Deno.test("loopMargins() finds the gain margin of three equal poles: 20·log10(8/K) at √3·fp", () => {
  const k = 4;
  const fp = 1e4;
  const t = (f: number) => {
    const p = complexFromPolar(1 / (1 + (f / fp) ** 2) ** 1.5, -3 * Math.atan(f / fp));
    return { re: k * p.re, im: k * p.im };
  };
  const m = loopMargins(t, { minimumFrequency: 1, maximumFrequency: 1e8 });
  assertClose(m.phaseCrossoverFrequency, Math.sqrt(3) * fp, { rtol: 1e-9 }); // closed form: 3·atan(x) = 180°
  assertClose(m.gainMargin, 20 * Math.log10(8 / k), { rtol: 1e-9 }); // closed form: |1 + j√3|³ = 8
  // Crossover of K/(1 + x²)^1.5 = 1: x = √(K^(2/3) − 1)
  const x = Math.sqrt(k ** (2 / 3) - 1);
  assertClose(m.crossoverFrequency, x * fp, { rtol: 1e-9 }); // closed form
  assertClose(m.phaseMargin, 180 - 3 * Math.atan(x) * (180 / Math.PI), { rtol: 1e-9 }); // closed form
});

Deno.test("loopMargins() reports an unstable loop's negative phase margin past −180°", () => {
  // K = 20 with three equal poles: phase at crossover is beyond −180°.
  const t = (f: number) =>
    complexFromPolar(20 / (1 + (f / 1e3) ** 2) ** 1.5, -3 * Math.atan(f / 1e3));
  const m = loopMargins(t, { minimumFrequency: 1, maximumFrequency: 1e7 });
  const x = Math.sqrt(20 ** (2 / 3) - 1);
  assertClose(m.phaseMargin, 180 - 3 * Math.atan(x) * (180 / Math.PI), { rtol: 1e-9 }); // closed form
  assert(m.phaseMargin < 0);
  assert(m.gainMargin < 0);
});

Deno.test("loopMargins() gives infinite margins when |T| never reaches 1", () => {
  const m = loopMargins(() => ({ re: 0.5, im: 0 }));
  assertEquals(m.phaseMargin, Infinity);
  assertEquals(m.gainMargin, Infinity);
});

Deno.test("loopMargins() refuses a loop that starts at 180° (positive feedback)", () => {
  assertThrows(() => loopMargins(() => ({ re: -100, im: 0 })), RangeError);
});

// ---------------------------------------------------------------------------------------------
// A three-stage cascade with feedback, over frequency

function threePoleStages(): TwoPort[] {
  const pole = (gain: number, fp: number) => (f: number) => {
    const x = f / fp;
    const d = 1 + x * x;
    return { re: gain / d, im: (-gain * x) / d };
  };
  const inputPair: TwoPort = {
    name: "input pair",
    inputResistance: 1e6,
    openCircuitGain: 100,
    outputResistance: 10e3,
    at: (f) => ({
      inputImpedance: rcParallelImpedance(1e6, 10e-12, f),
      openCircuitGain: pole(100, 1e6)(f),
      outputImpedance: { re: 10e3, im: 0 },
    }),
  };
  const vas: TwoPort = {
    name: "VAS",
    inputResistance: 100e3,
    openCircuitGain: 1000,
    outputResistance: 20e3,
    at: (f) => ({
      inputImpedance: { re: 100e3, im: 0 },
      openCircuitGain: pole(1000, 1e3)(f),
      outputImpedance: rcParallelImpedance(20e3, 5e-12, f),
    }),
  };
  const output: TwoPort = {
    name: "output stage",
    inputResistance: 500e3,
    openCircuitGain: 0.95,
    outputResistance: 0.2,
  };
  return [inputPair, vas, output];
}

Deno.test("cascade().sweep() and feedbackLoop() agree with the closed loop at each point", () => {
  const chain = cascade({ stages: threePoleStages(), sourceResistance: 600, loadResistance: 8 });
  const loop = feedbackLoop(chain.gainAt, { feedbackFactor: 1 / 21 });
  const freqs = logFrequencies(10, 1e8, { points: 50 });
  const sweep = loop.sweep(freqs);
  for (let i = 0; i < freqs.length; i += 7) {
    const a = new Complex(chain.gainAt(freqs[i]));
    const af = a.div(a.mul(1 / 21).add(1));
    assertClose(sweep.closedLoop.re[i], af.re, { rtol: 1e-9, atol: 1e-12 }); // complex.js cross-check
    assertClose(sweep.closedLoop.im[i], af.im, { rtol: 1e-9, atol: 1e-12 }); // complex.js cross-check
  }
  // At low frequency the closed loop is close to 1/β = 21 (loop gain is large there).
  assertClose(sweep.closedLoop.magnitudeDb[0], 20 * Math.log10(21), { rtol: 1e-3 }); // closed form 1/β
});

Deno.test("feedbackLoop() closed-loop output impedance is Zout/(1 + T)", () => {
  const chain = cascade({ stages: threePoleStages(), loadResistance: 8 });
  const loop = feedbackLoop(chain.gainAt, {
    feedbackFactor: 1 / 21,
    openLoopOutputImpedance: chain.outputImpedanceAt,
  });
  const f = 1e3;
  const t = new Complex(loop.loopGainAt(f));
  const expected = new Complex(0.2, 0).div(t.add(1));
  const z = loop.outputImpedanceAt!(f);
  assertClose(z.re, expected.re, { rtol: 1e-12 }); // complex.js cross-check
  assertClose(z.im, expected.im, { rtol: 1e-12 }); // complex.js cross-check
});

Deno.test("feedbackLoop() checks phase margin against its requirement", () => {
  const chain = cascade({ stages: threePoleStages(), loadResistance: 8 });
  const loose = feedbackLoop(chain.gainAt, { feedbackFactor: 1 / 21, minimumPhaseMargin: 1 });
  const strict = feedbackLoop(chain.gainAt, { feedbackFactor: 1 / 21, minimumPhaseMargin: 89 });
  const pmCheck = (r: typeof loose) => r.checks.find((c) => c.name === "phase margin")!;
  assert(Number.isFinite(loose.phaseMargin));
  assertEquals(pmCheck(loose).pass, loose.phaseMargin >= 1);
  assertEquals(pmCheck(strict).pass, strict.phaseMargin >= 89);
  assertEquals(pmCheck(loose).value, strict.phaseMargin);
});

// ---------------------------------------------------------------------------------------------
// Cross-checks against complex.js on random inputs

const finite = fc.double({ min: -1e6, max: 1e6, noNaN: true, noDefaultInfinity: true });
const complexArb = fc.record({ re: finite, im: finite });
const nonZero = complexArb.filter((z) => Math.hypot(z.re, z.im) > 1e-3);

function close(actual: { re: number; im: number }, expected: Complex, scale: number): boolean {
  const tol = 1e-12 * Math.max(1, scale);
  return Math.abs(actual.re - expected.re) <= tol && Math.abs(actual.im - expected.im) <= tol;
}

Deno.test("complex helpers agree with complex.js on random inputs", () => {
  fc.assert(
    fc.property(complexArb, nonZero, (a, b) => {
      const ca = new Complex(a);
      const cb = new Complex(b);
      const scale = Math.max(ca.abs(), cb.abs());
      const quotientScale = ca.abs() / cb.abs();
      return close(complexAdd(a, b), ca.add(cb), scale) && // complex.js cross-check
        close(complexSub(a, b), ca.sub(cb), scale) && // complex.js cross-check
        close(complexMul(a, b), ca.mul(cb), scale * scale) && // complex.js cross-check
        close(complexDiv(a, b), ca.div(cb), quotientScale) && // complex.js cross-check
        Math.abs(complexAbs(a) - ca.abs()) <= 1e-12 * Math.max(1, scale) && // complex.js cross-check
        (ca.abs() === 0 || Math.abs(complexArg(a) - ca.arg()) <= 1e-12); // complex.js cross-check
    }),
    { numRuns: 500 },
  );
});

Deno.test("complexParallel() agrees with ab/(a + b) from complex.js", () => {
  fc.assert(
    fc.property(nonZero, nonZero, (a, b) => {
      const ca = new Complex(a);
      const cb = new Complex(b);
      const sum = ca.add(cb);
      fc.pre(sum.abs() > 1e-3 * Math.max(ca.abs(), cb.abs()));
      const expected = ca.mul(cb).div(sum);
      return close(complexParallel(a, b), expected, expected.abs() * 1e3); // complex.js cross-check
    }),
    { numRuns: 300 },
  );
});

Deno.test("complexFromPolar() agrees with complex.js polar construction", () => {
  fc.assert(
    fc.property(
      fc.double({ min: 0, max: 1e6, noNaN: true }),
      fc.double({ min: -10, max: 10, noNaN: true }),
      (magnitude, angle) => {
        const expected = new Complex({ abs: magnitude, arg: angle });
        const degrees = complexFromPolar(magnitude, (angle * 180) / Math.PI, { angleUnit: "deg" });
        return close(complexFromPolar(magnitude, angle), expected, magnitude) && // complex.js cross-check
          close(degrees, expected, magnitude * 1e3); // complex.js cross-check
      },
    ),
    { numRuns: 300 },
  );
});

Deno.test("cascade().gainAt() agrees with a complex.js product of dividers and gains", () => {
  const stageArb = fc.record({
    rin: fc.double({ min: 1e2, max: 1e7, noNaN: true }),
    cin: fc.double({ min: 0, max: 1e-9, noNaN: true }),
    gain: fc.double({ min: -1e4, max: 1e4, noNaN: true }).filter((g) => Math.abs(g) > 1e-3),
    pole: fc.double({ min: 10, max: 1e8, noNaN: true }),
    rout: fc.oneof(fc.constant(0), fc.double({ min: 1e-3, max: 1e5, noNaN: true })),
    cout: fc.double({ min: 0, max: 1e-9, noNaN: true }),
  });
  fc.assert(
    fc.property(
      fc.array(stageArb, { minLength: 1, maxLength: 4 }),
      fc.double({ min: 0, max: 1e5, noNaN: true }),
      fc.double({ min: 1, max: 1e6, noNaN: true }),
      fc.double({ min: 1, max: 1e8, noNaN: true }),
      (specs, rs, rl, f) => {
        const stages: TwoPort[] = specs.map((s, i) => ({
          name: `s${i}`,
          inputResistance: s.rin,
          openCircuitGain: s.gain,
          outputResistance: s.rout,
          at: (ff: number) => {
            const x = ff / s.pole;
            return {
              inputImpedance: rcParallelImpedance(s.rin, s.cin, ff),
              openCircuitGain: { re: s.gain / (1 + x * x), im: (-s.gain * x) / (1 + x * x) },
              outputImpedance: s.rout === 0
                ? { re: 0, im: 0 }
                : rcParallelImpedance(s.rout, s.cout, ff),
            };
          },
        }));
        // Reference: independent complex.js arithmetic, Zin = 1/(1/R + jωC).
        const w = 2 * Math.PI * f;
        const rc = (r: number, c: number) =>
          r === 0 ? new Complex(0, 0) : new Complex(1, 0).div(new Complex(1 / r, w * c));
        let expected = new Complex(1, 0);
        let zo = new Complex(rs, 0);
        for (const s of specs) {
          const zi = rc(s.rin, s.cin);
          expected = expected.mul(zi.div(zo.add(zi)));
          expected = expected.mul(new Complex(s.gain, 0).div(new Complex(1, f / s.pole)));
          zo = rc(s.rout, s.cout);
        }
        const zl = new Complex(rl, 0);
        expected = expected.mul(zl.div(zo.add(zl)));
        const g = cascade({ stages, sourceResistance: rs, loadResistance: rl }).gainAt(f);
        const scale = expected.abs();
        return Math.abs(g.re - expected.re) <= 1e-9 * scale + 1e-300 && // complex.js cross-check
          Math.abs(g.im - expected.im) <= 1e-9 * scale + 1e-300; // complex.js cross-check
      },
    ),
    { numRuns: 200 },
  );
});

Deno.test("cascade().sweep() phase matches complex.js arg modulo 360° and stays continuous", () => {
  const chain = cascade({ stages: threePoleStages(), sourceResistance: 600, loadResistance: 8 });
  const freqs = logFrequencies(1, 1e9, { pointsPerDecade: 20 });
  const sweep = chain.sweep(freqs);
  for (let i = 0; i < freqs.length; i++) {
    const expected = new Complex(chain.gainAt(freqs[i])).arg() * (180 / Math.PI);
    const diff = sweep.phaseDegrees[i] - expected;
    assertClose(diff - 360 * Math.round(diff / 360), 0, { rtol: 0, atol: 1e-9 }); // complex.js cross-check
    if (i > 0) assert(Math.abs(sweep.phaseDegrees[i] - sweep.phaseDegrees[i - 1]) < 90);
  }
  // Three poles and an inversion-free chain: the phase ends near −270°.
  assertClose(sweep.phaseDegrees[freqs.length - 1], -270, { rtol: 0, atol: 2 }); // closed form, three real poles
});

// ---------------------------------------------------------------------------------------------
// Property tests

Deno.test("closed-loop gain tends to 1/β as A grows", () => {
  fc.assert(
    fc.property(
      fc.double({ min: 1e-3, max: 1, noNaN: true }),
      fc.double({ min: 1, max: 1e3, noNaN: true }),
      (beta, a) => {
        const small = negativeFeedback({ openLoopGain: a, feedbackFactor: beta });
        const big = negativeFeedback({ openLoopGain: a * 1e3, feedbackFactor: beta });
        const errSmall = Math.abs(small.closedLoopGain - 1 / beta);
        const errBig = Math.abs(big.closedLoopGain - 1 / beta);
        // The relative error is exactly 1/(1 + Aβ) (closed form).
        return errBig < errSmall &&
          Math.abs(errBig * beta - 1 / (1 + a * 1e3 * beta)) <= 1e-9;
      },
    ),
    { numRuns: 200 },
  );
});

Deno.test("a passive resistive interface's loading factor lies in (0, 1]", () => {
  const r = fc.double({ min: 1e-3, max: 1e9, noNaN: true });
  fc.assert(
    fc.property(r, r, fc.double({ min: 0, max: 1e9, noNaN: true }), (rin, rl, rout) => {
      const k = loadingFactor(rout, rin);
      const chain = cascade({
        stages: [{ name: "a", inputResistance: rin, openCircuitGain: 1, outputResistance: rout }],
        sourceResistance: rout,
        loadResistance: rl,
      });
      return k > 0 && k <= 1 && chain.interfaces.every((x) => x.factor > 0 && x.factor <= 1);
    }),
    { numRuns: 300 },
  );
});

// ---------------------------------------------------------------------------------------------
// Sweeps and validation

Deno.test("logFrequencies() spaces points evenly in log f and keeps the exact ends", () => {
  const f = logFrequencies(20, 20e3, { points: 4 });
  assertEquals(f[0], 20);
  assertEquals(f[3], 20e3);
  assertClose(f[1], 200, { rtol: 1e-12 }); // closed form
  assertEquals(logFrequencies(1, 1e3, { pointsPerDecade: 10 }).length, 31);
});

Deno.test("sweepResponse() unwraps a phase that passes −180°", () => {
  const sweep = sweepResponse(
    (f) => complexFromPolar(1, -f, { angleUnit: "deg" }),
    [10, 100, 170, 190, 260, 350],
  );
  assertEquals(Array.from(sweep.phaseDegrees).map((p) => Math.round(p)), [
    -10,
    -100,
    -170,
    -190,
    -260,
    -350,
  ]);
});

Deno.test("cascade() rejects non-physical input with a RangeError naming the value", () => {
  assertThrows(
    () => cascade({ stages: e61Stages(), sourceResistance: -600 }),
    { name: "RangeError", message: "Expected sourceResistance to be at least 0 Ω, but found -600" },
  );
  assertThrows(
    () => cascade({ stages: e61Stages(), loadResistance: 0 }),
    { name: "RangeError", message: "Expected loadResistance to be greater than 0 Ω, but found 0" },
  );
  assertThrows(() => cascade({ stages: [] }), RangeError);
  assertThrows(
    () =>
      cascade({
        stages: [{ name: "x", inputResistance: -1, openCircuitGain: 1, outputResistance: 1 }],
      }),
    { message: "Expected stages[0].inputResistance to be greater than 0 Ω, but found -1" },
  );
  assertThrows(() => rcParallelImpedance(1e3, -1e-9, 1e3), RangeError);
  assertThrows(() => negativeFeedback({ openLoopGain: 100, feedbackFactor: -0.02 }), RangeError);
  assertThrows(() => logFrequencies(100, 10), RangeError);
  assertThrows(() => dampingFactor({ loadResistance: 0, outputResistance: 0.01 }), RangeError);
});
