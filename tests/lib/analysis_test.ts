/**
 * Harmonics and THD (REFERENCE §7), the seeded generator, Monte Carlo statistics, corners
 * and sweeps.
 */
import fc from "fast-check";
import FFT from "fft.js";
import { assert, assertClose, assertEquals, assertThrows } from "../_assert.ts";
import { harmonics, spectrum, thdDb } from "../../lib/analysis/harmonics.ts";
import { createRandom } from "../../lib/analysis/random.ts";
import {
  estimateYield,
  monteCarlo,
  percentile,
  percentiles,
  summaryStatistics,
  sweep,
  sweepValues,
  worstCaseCorners,
} from "../../lib/analysis/monte_carlo.ts";
import {
  standardNormalCdf,
  standardNormalQuantile,
} from "../../lib/analysis/normal_distribution.ts";

// ── helpers ──────────────────────────────────────────────────────────────────────────────

/**
 * A band-limited periodic record: Σ sine[h]·sin(hθ) + cosine[h]·cos(hθ) + dc, sampled at
 * θ = 2πn/N. Angles come from a table indexed by (h·n) mod N, so they are exact.
 */
function synthesize(
  size: number,
  terms: (order: number) => { sine?: number; cosine?: number },
  options: { dc?: number; maxOrder?: number; cycles?: number } = {},
): Float64Array {
  const cycles = options.cycles ?? 1;
  const maxOrder = options.maxOrder ?? Math.floor((size / 2 - 1) / cycles);
  const sines = Float64Array.from({ length: size }, (_, n) => Math.sin((2 * Math.PI * n) / size));
  const cosines = Float64Array.from(
    { length: size },
    (_, n) => Math.cos((2 * Math.PI * n) / size),
  );
  const record = new Float64Array(size).fill(options.dc ?? 0);
  for (let order = 1; order <= maxOrder; order++) {
    const { sine = 0, cosine = 0 } = terms(order);
    if (sine === 0 && cosine === 0) continue;
    const step = order * cycles;
    for (let n = 0; n < size; n++) {
      const index = (step * n) % size;
      record[n] += sine * sines[index] + cosine * cosines[index];
    }
  }
  return record;
}

/** A direct O(N²) DFT: peak amplitudes at bins 0 … N/2 with the REFERENCE §7.1 scaling. */
function directDftAmplitudes(record: ArrayLike<number>): number[] {
  const size = record.length;
  const amplitudes: number[] = [];
  for (let bin = 0; bin <= size / 2; bin++) {
    let re = 0;
    let im = 0;
    for (let n = 0; n < size; n++) {
      const angle = (2 * Math.PI * ((bin * n) % size)) / size;
      re += record[n] * Math.cos(angle);
      im -= record[n] * Math.sin(angle);
    }
    const scale = bin === 0 || bin === size / 2 ? 1 / size : 2 / size;
    amplitudes.push(Math.hypot(re, im) * scale);
  }
  return amplitudes;
}

const odd = (order: number) => order % 2 === 1;
const squareTerms = (order: number) => ({ sine: odd(order) ? 4 / (order * Math.PI) : 0 });
const triangleTerms = (order: number) => ({
  // A triangle ±1 in sine phase: 8/(π²n²) with alternating sign over odd n.
  sine: odd(order) ? ((order % 4 === 1 ? 1 : -1) * 8) / (Math.PI * Math.PI * order * order) : 0,
});
const sawtoothTerms = (order: number) => ({
  sine: ((order % 2 === 1 ? 1 : -1) * 2) / (order * Math.PI),
});
const halfWaveTerms = (order: number) =>
  order === 1
    ? { sine: 0.5 }
    : { cosine: order % 2 === 0 ? -2 / (Math.PI * (order * order - 1)) : 0 };

function rmsOf(result: { amplitudes: number[] }): number {
  let meanSquare = result.amplitudes[0] ** 2;
  for (let n = 1; n < result.amplitudes.length; n++) meanSquare += result.amplitudes[n] ** 2 / 2;
  return Math.sqrt(meanSquare);
}

// ── §7.2 closed forms ────────────────────────────────────────────────────────────────────

Deno.test("spectrum() of a band-limited square wave gives the closed-form THD", () => {
  const result = spectrum(synthesize(4096, squareTerms));
  assertClose(result.fundamental, 4 / Math.PI, { rtol: 1e-3 }); // REFERENCE §7.2 / [Kreyszig10] (from memory)
  assertClose(result.amplitudes[3], 4 / (3 * Math.PI), { rtol: 1e-3 }); // REFERENCE §7.2 / [Kreyszig10] (from memory)
  assertClose(result.thd, 0.48343, { rtol: 2e-3 }); // REFERENCE §7.2 square THD_F / [Kreyszig10] (from memory)
  assertClose(result.thdTotal, 0.43524, { rtol: 2e-3 }); // REFERENCE §7.2 square THD_R / [Kreyszig10] (from memory)
  assertClose(result.thd, Math.sqrt(Math.PI ** 2 / 8 - 1), { rtol: 2e-3 }); // closed form √(π²/8 − 1), band limit costs 5e-4
});

Deno.test("spectrum() of a band-limited triangle wave gives the closed-form THD", () => {
  const result = spectrum(synthesize(4096, triangleTerms));
  assertClose(result.fundamental, 8 / Math.PI ** 2, { rtol: 1e-3 }); // REFERENCE §7.2 / [Kreyszig10] (from memory)
  assertClose(result.thd, 0.12115, { rtol: 2e-3 }); // REFERENCE §7.2 triangle THD_F / [Kreyszig10] (from memory)
  assertClose(result.thdTotal, 0.12027, { rtol: 2e-3 }); // REFERENCE §7.2 triangle THD_R / [Kreyszig10] (from memory)
});

Deno.test("spectrum() of a band-limited sawtooth gives the closed-form THD", () => {
  const result = spectrum(synthesize(4096, sawtoothTerms));
  assertClose(result.amplitudes[2], 1 / Math.PI, { rtol: 1e-3 }); // REFERENCE §7.2 2/(nπ) / [Kreyszig10] (from memory)
  assertClose(result.thd, 0.80308, { rtol: 2e-3 }); // REFERENCE §7.2 sawtooth THD_F / [Kreyszig10] (from memory)
  assertClose(result.thdTotal, 0.62616, { rtol: 2e-3 }); // REFERENCE §7.2 sawtooth THD_R / [Kreyszig10] (from memory)
});

Deno.test("spectrum() leaves DC out of both THD figures of a half-wave rectified sine", () => {
  const result = spectrum(synthesize(4096, halfWaveTerms, { dc: 1 / Math.PI }));
  assertClose(result.amplitudes[0], 1 / Math.PI, { rtol: 1e-3 }); // REFERENCE §7.2 DC 1/π / [Kreyszig10] (from memory)
  assertClose(result.fundamental, 0.5, { rtol: 1e-3 }); // REFERENCE §7.2 V1 = 1/2 / [Kreyszig10] (from memory)
  assertClose(result.amplitudes[2], 2 / (3 * Math.PI), { rtol: 1e-3 }); // REFERENCE §7.2 2/(π(n²−1)) / [Kreyszig10] (from memory)
  assertClose(result.thd, 0.43524, { rtol: 2e-3 }); // REFERENCE §7.2 half-wave THD_F / [Kreyszig10] (from memory)
  assertClose(result.thdTotal, 0.39908, { rtol: 2e-3 }); // REFERENCE §7.2 half-wave THD_R, DC excluded / D
  // The trap: with DC wrongly kept in the denominator the same amplitudes give 0.30776.
  const harmonicRms = result.thd * result.fundamental / Math.SQRT2;
  const withDc = harmonicRms / rmsOf(result);
  assertClose(withDc, 0.30776, { rtol: 2e-3 }); // REFERENCE §7.2 half-wave "DC wrongly left in" / D
  assert(Math.abs(result.thdTotal - withDc) > 0.09, "thdTotal must exclude DC (0.399, not 0.308)");
});

Deno.test("harmonics() of a half-wave rectifier transfer matches the closed form", () => {
  // Direct sampling: the kink makes harmonics fall as 1/n², so aliasing at N = 65536 is tiny.
  const result = harmonics((x) => Math.max(x, 0), 1, { points: 65536 });
  assertClose(result.amplitudes[0], 1 / Math.PI, { rtol: 1e-3 }); // REFERENCE §7.2 DC 1/π / [Kreyszig10] (from memory)
  assertClose(result.thd, Math.sqrt(1 - 8 / Math.PI ** 2), { rtol: 2e-3 }); // REFERENCE §7.2 half-wave THD_F √(1 − 8/π²) / [Kreyszig10] (from memory)
  assertClose(result.thdTotal, 0.39908, { rtol: 2e-3 }); // REFERENCE §7.2 half-wave THD_R / D
});

const CLIPPED = [
  // c, V1, RMS, THD_F, THD_R: REFERENCE §7.2 clipped-sine table (D, direct Fourier integral)
  { c: 0.5, v1: 0.60900, rms: 0.44216, thd: 0.2329, thdTotal: 0.2269 },
  { c: Math.SQRT1_2, v1: 0.81831, rms: 0.58382, thd: 0.1342, thdTotal: 0.1330 },
  { c: 0.8, v1: 0.89591, rms: 0.63605, thd: 0.08979, thdTotal: 0.08943 },
  { c: 0.9, v1: 0.96261, rms: 0.68128, thd: 0.04220, thdTotal: 0.04216 },
];

for (const row of CLIPPED) {
  Deno.test(`harmonics() of a sine clipped at ±${row.c.toFixed(4)} matches the closed form`, () => {
    const { c } = row;
    const clip = (x: number) => Math.max(-c, Math.min(c, x));
    const result = harmonics(clip, 1, { points: 65536 });
    // Closed forms from the direct Fourier integral (REFERENCE §7.2, D).
    const thetaC = Math.asin(c);
    const v1 = (2 / Math.PI) * (thetaC + c * Math.sqrt(1 - c * c));
    const meanSquare = (thetaC - c * Math.sqrt(1 - c * c)) / Math.PI +
      c * c * (1 - (2 * thetaC) / Math.PI);
    const distortion = Math.sqrt(meanSquare - v1 * v1 / 2);
    assertClose(v1, row.v1, { rtol: 1e-4 }); // REFERENCE §7.2 clipped-sine V1 (5 digits printed) / D
    assertClose(Math.sqrt(meanSquare), row.rms, { rtol: 1e-4 }); // REFERENCE §7.2 clipped-sine RMS (5 digits printed) / D
    assertClose(result.fundamental, row.v1, { rtol: 1e-3 }); // REFERENCE §7.2 clipped-sine V1 / D
    assertClose(rmsOf(result), row.rms, { rtol: 1e-3 }); // REFERENCE §7.2 clipped-sine RMS / D
    assertClose(result.thd, row.thd, { rtol: 2e-3 }); // REFERENCE §7.2 clipped-sine THD_F / D
    assertClose(result.thdTotal, row.thdTotal, { rtol: 2e-3 }); // REFERENCE §7.2 clipped-sine THD_R / D
    assertClose(result.thd, distortion / (v1 / Math.SQRT2), { rtol: 2e-3 }); // closed form √(ms − V1²/2)/(V1/√2), REFERENCE §7.2
    assertClose(result.thdTotal, distortion / Math.sqrt(meanSquare), { rtol: 2e-3 }); // closed form √(ms − V1²/2)/√ms, REFERENCE §7.2
  });
}

Deno.test("harmonics() reproduces the recorded DFT of a sine clipped at 0.8 with 65536 points", () => {
  const result = harmonics((x) => Math.max(-0.8, Math.min(0.8, x)), 1, { points: 65536 });
  assertClose(result.thd, 0.0897858, { rtol: 1e-5 }); // REFERENCE §7.2 "DFT, N = 65536: 8.97858 %" (6 digits printed)
});

// ── §7.3 discrete test vectors ───────────────────────────────────────────────────────────

Deno.test("spectrum() reads E7.1: 1 % third harmonic is THD_F = 1 %", () => {
  const N = 1024;
  const record = Array.from(
    { length: N },
    (_, n) => Math.sin((2 * Math.PI * n) / N) + 0.01 * Math.sin((3 * 2 * Math.PI * n) / N),
  );
  const result = spectrum(record);
  assertClose(result.thd, 0.01, { rtol: 2e-3 }); // REFERENCE E7.1
  assertClose(result.thd, 0.01, { rtol: 1e-9 }); // closed form: exact to rounding for a coherent record
  assertClose(result.thdTotal, 0.01 / Math.sqrt(1 + 1e-4), { rtol: 1e-9 }); // closed form THD_F/√(1 + THD_F²), REFERENCE §7.1; 0.99995 % per §7.4
});

Deno.test("spectrum() reads E7.2: 1 % second and 0.5 % third harmonic", () => {
  const N = 1024;
  const record = Array.from({ length: N }, (_, n) => {
    const theta = (2 * Math.PI * n) / N;
    return Math.sin(theta) + 0.01 * Math.sin(2 * theta) + 0.005 * Math.sin(3 * theta);
  });
  const result = spectrum(record);
  assertClose(result.thd, 0.01118, { rtol: 2e-3 }); // REFERENCE E7.2 THD_F 1.118 %
  assertClose(thdDb(result.thd), -39.03, { atol: 0.005, rtol: 0 }); // REFERENCE E7.2 −39.03 dB (2 decimals printed)
  assertClose(result.thdTotal, 0.01118, { rtol: 2e-3 }); // REFERENCE E7.2 THD_R 1.118 %
});

function sampledSquare(size: number): number[] {
  return Array.from({ length: size }, (_, n) => (n < size / 2 ? 1 : -1));
}

Deno.test("spectrum() reads E7.3: a sampled square wave follows the discrete closed form", () => {
  const N = 64;
  const result = spectrum(sampledSquare(N), { maxOrder: N / 2 }); // every bin, Nyquist included
  const discrete = Math.sqrt((N * N * Math.sin(Math.PI / N) ** 2) / 8 - 1);
  assertClose(result.fundamental, 1.27375, { rtol: 1e-3 }); // REFERENCE E7.3 A1 = 4/(N·sin(π/N))
  assertClose(result.fundamental, 4 / (N * Math.sin(Math.PI / N)), { rtol: 1e-12 }); // closed form, REFERENCE E7.3
  assertClose(result.thd, 0.48240, { rtol: 2e-3 }); // REFERENCE E7.3 THD_F over all bins, N = 64
  assertClose(result.thd, discrete, { rtol: 1e-12 }); // closed form √(N²sin²(π/N)/8 − 1), REFERENCE E7.3
  // Aliasing makes it differ from the continuous-time value by more than the THD tolerance.
  assert(Math.abs(result.thd - 0.48343) / 0.48343 > 2e-3, "REFERENCE §7.4 aliasing caution");

  const large = spectrum(sampledSquare(1024), { maxOrder: 512 });
  assertClose(large.thd, 0.483422, { rtol: 2e-5 }); // REFERENCE E7.3 N = 1024 (6 digits printed)
  assertClose(large.thd, 0.48343, { rtol: 2e-3 }); // REFERENCE E7.3 limit √(π²/8 − 1)
});

Deno.test("spectrum() reads E7.4: counting fewer harmonics gives a smaller THD", () => {
  const record = synthesize(4096, squareTerms);
  const ninth = spectrum(record, { maxOrder: 9 });
  const thirtyNinth = spectrum(record, { maxOrder: 39 });
  assertEquals(ninth.maxOrder, 9);
  assertEquals(ninth.amplitudes.length, 10);
  assertClose(ninth.thd, 0.42879, { rtol: 2e-3 }); // REFERENCE E7.4 up to the 9th
  assertClose(thirtyNinth.thd, 0.47032, { rtol: 2e-3 }); // REFERENCE E7.4 up to the 39th
});

// ── FFT against a direct DFT, and the Nyquist bin ────────────────────────────────────────

Deno.test("spectrum() agrees with a direct DFT on random records of 4 to 256 samples", () => {
  const random = createRandom(2024);
  for (let size = 4; size <= 256; size *= 2) {
    const record = Array.from({ length: size }, () => random.normal());
    const direct = directDftAmplitudes(record);
    const result = spectrum(record, { maxOrder: size / 2 });
    for (let bin = 0; bin <= size / 2; bin++) {
      const [ours, theirs] = [result.amplitudes[bin], direct[bin]];
      assertClose(ours, theirs, { rtol: 1e-9, atol: 1e-12 }, `N ${size}, bin ${bin}`); // direct O(N²) DFT in this test
    }
  }
});

Deno.test("spectrum() reads harmonic h at bin h·cycles for a multi-cycle record", () => {
  const size = 128;
  const cycles = 5;
  const random = createRandom(11);
  const record = Array.from({ length: size }, () => random.uniform() - 0.5);
  const direct = directDftAmplitudes(record);
  const result = spectrum(record, { cycles });
  assertEquals(result.maxOrder, 12); // 12·5 = 60 < 64 and 13·5 = 65 > 64
  for (let order = 1; order <= result.maxOrder; order++) {
    assertClose(result.amplitudes[order], direct[order * cycles], { rtol: 1e-9, atol: 1e-12 }); // direct O(N²) DFT in this test
  }
});

Deno.test("spectrum() with every bin counted satisfies Parseval's identity", () => {
  const size = 256;
  const random = createRandom(5);
  const record = Array.from({ length: size }, () => random.normal(0.3, 1));
  const result = spectrum(record, { maxOrder: size / 2 });
  const mean = record.reduce((a, b) => a + b) / size;
  const acMeanSquare = record.reduce((a, v) => a + (v - mean) ** 2, 0) / size;
  const fundamentalPower = result.fundamental ** 2 / 2;
  const harmonicPower = (result.thd * result.fundamental) ** 2 / 2;
  assertClose(fundamentalPower + harmonicPower, acMeanSquare, { rtol: 1e-12 }); // closed form (Parseval)
});

Deno.test("fft.js agrees with our reading of its output layout (reference library)", () => {
  // A cosine of amplitude 3 at bin 5 of 32 samples: X[5] = 3·N/2 in the real part.
  const size = 32;
  const transform = new FFT(size);
  const out = transform.createComplexArray();
  const record = Array.from({ length: size }, (_, n) => 3 * Math.cos((2 * Math.PI * 5 * n) / size));
  transform.realTransform(out, record);
  assertClose(out[10], 3 * size / 2, { rtol: 1e-12 }); // fft.js reference library
  assertClose(spectrum(record, { cycles: 5 }).fundamental, 3, { rtol: 1e-12 }); // fft.js reference library / closed form
});

// ── validation ───────────────────────────────────────────────────────────────────────────

Deno.test("spectrum() rejects a record whose length is not a power of two, and says what to do", () => {
  assertThrows(
    () => spectrum(new Array(1000).fill(0)),
    (error: Error) =>
      error instanceof RangeError && /power of two/.test(error.message) &&
      /1000/.test(error.message) && /take a power-of-two number of samples/.test(error.message),
  );
  assertThrows(() => harmonics((x) => x, 1, { points: 1000 }), RangeError);
  assertThrows(() => harmonics((x) => x, 1, { points: 2 }), RangeError);
});

Deno.test("spectrum() names the index of a NaN sample", () => {
  const record = new Array(64).fill(0);
  record[17] = Number.NaN;
  assertThrows(() => spectrum(record), {
    name: "TypeError",
    message: "Expected samples[17] to be a finite number, but found NaN",
  });
});

Deno.test("harmonics() names the sample and input where the transfer returns NaN", () => {
  assertThrows(
    () => harmonics((x) => (x < 0 ? Math.sqrt(x) : x), 1, { points: 64 }),
    (error: Error) => error instanceof TypeError && /sample 33 \(x = -/.test(error.message),
  );
});

Deno.test("spectrum() rejects a harmonic count beyond the record and a cycle count at Nyquist", () => {
  assertThrows(() => spectrum(new Array(64).fill(0), { maxOrder: 33 }), RangeError);
  assertThrows(() => spectrum(new Array(64).fill(0), { cycles: 32 }), RangeError);
  assertThrows(() => spectrum(new Array(64).fill(0), { cycles: 1.5 }), RangeError);
  assertThrows(() => harmonics((x) => x, 0), RangeError);
  assertThrows(() => thdDb(-0.1), RangeError);
});

Deno.test("harmonics() uses points/2 − 1 harmonics by default and the offset it is given", () => {
  const result = harmonics((x) => x * x, 1, { points: 256, offset: 0.5 });
  assertEquals(result.maxOrder, 127);
  // (0.5 + sin θ)² = 0.75 + sin θ − ½cos 2θ
  assertClose(result.amplitudes[0], 0.75, { rtol: 1e-12 }); // closed form
  assertClose(result.fundamental, 1, { rtol: 1e-12 }); // closed form
  assertClose(result.thd, 0.5, { rtol: 1e-12 }); // closed form
});

// ── property tests ───────────────────────────────────────────────────────────────────────

Deno.test("spectrum() THD does not change with the phase of the harmonics or a DC offset", () => {
  fc.assert(
    fc.property(
      fc.array(fc.double({ min: 0, max: 0.5, noNaN: true }), { minLength: 4, maxLength: 4 }),
      fc.array(fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }), {
        minLength: 5,
        maxLength: 5,
      }),
      fc.double({ min: -10, max: 10, noNaN: true }),
      (levels, phases, dc) => {
        const amplitude = (order: number) => (order === 1 ? 1 : levels[order - 2]);
        const plain = synthesize(512, (h) => ({ sine: h <= 5 ? amplitude(h) : 0 }), {
          maxOrder: 5,
        });
        const shifted = synthesize(
          512,
          (h) =>
            h <= 5
              ? {
                sine: amplitude(h) * Math.cos(phases[h - 1]),
                cosine: amplitude(h) * Math.sin(phases[h - 1]),
              }
              : {},
          { dc, maxOrder: 5 },
        );
        const a = spectrum(plain);
        const b = spectrum(shifted);
        assertClose(b.thd, a.thd, { rtol: 1e-9, atol: 1e-12 }); // REFERENCE §7.4: phase and DC must not change THD_F
        assertClose(b.thdTotal, a.thdTotal, { rtol: 1e-9, atol: 1e-12 }); // REFERENCE §7.4
      },
    ),
    { numRuns: 50 },
  );
});

Deno.test("harmonics() THD does not change when the transfer adds a DC level", () => {
  fc.assert(
    fc.property(fc.double({ min: -5, max: 5, noNaN: true }), (level) => {
      const curve = (x: number) => Math.tanh(1.5 * x);
      const a = harmonics(curve, 1, { points: 1024 });
      const b = harmonics((x) => curve(x) + level, 1, { points: 1024 });
      assertClose(b.thd, a.thd, { rtol: 1e-9 }); // REFERENCE §7.4: DC offset must not change THD_F
    }),
    { numRuns: 30 },
  );
});

// ── normal distribution ──────────────────────────────────────────────────────────────────

Deno.test("standardNormalQuantile() gives the tabulated z values", () => {
  assertClose(standardNormalQuantile(0.75), 0.6745, { rtol: 1e-4 }); // REFERENCE §9.1 "median uses z = 0.6745" (4 digits printed)
  assertClose(standardNormalQuantile(0.975), 1.959964, { rtol: 1e-6 }); // Abramowitz & Stegun table 26.1 (from memory)
  assertClose(standardNormalQuantile(0.995), 2.575829, { rtol: 1e-6 }); // Abramowitz & Stegun table 26.1 (from memory)
  assertClose(standardNormalQuantile(1e-10), -6.361341, { rtol: 1e-6 }); // Abramowitz & Stegun table 26.1 (from memory)
  assertClose(standardNormalCdf(-3), 0.001349898, { rtol: 1e-6 }); // Abramowitz & Stegun table 26.1 (from memory)
});

Deno.test("standardNormalQuantile() inverts standardNormalCdf()", () => {
  fc.assert(
    fc.property(fc.double({ min: 1e-12, max: 1 - 1e-12, noNaN: true }), (p) => {
      const z = standardNormalQuantile(p);
      const back = p < 0.5 ? standardNormalCdf(z) : 1 - standardNormalCdf(z);
      assertClose(back, p < 0.5 ? p : 1 - p, { rtol: 1e-8 }); // closed form: Φ(Φ⁻¹(p)) = p
    }),
    { numRuns: 200 },
  );
});

// ── the generator ────────────────────────────────────────────────────────────────────────

/** xoshiro128** and its seeding, redone with BigInt arithmetic as an independent check. */
function referenceStream(seed: number, count: number): number[] {
  const mask = 0xffffffffn;
  const mul = (a: bigint, b: bigint) => (a * b) & mask;
  const rotl = (x: bigint, k: bigint) => ((x << k) | (x >> (32n - k))) & mask;
  const mix = (value: bigint) => {
    let h = value & mask;
    h = mul(h ^ (h >> 16n), 0x85ebca6bn);
    h = mul(h ^ (h >> 13n), 0xc2b2ae35n);
    return h ^ (h >> 16n);
  };
  const big = BigInt(seed);
  const low = big & mask;
  const high = (big >> 32n) & mask;
  const base = low ^ mix(high);
  const s = [0n, 1n, 2n, 3n].map((k) => mix(base + k * 0x9e3779b9n));
  const out: number[] = [];
  for (let i = 0; i < count; i++) {
    out.push(Number(mul(rotl(mul(s[1], 5n), 7n), 9n)));
    const t = (s[1] << 9n) & mask;
    s[2] ^= s[0];
    s[3] ^= s[1];
    s[1] ^= s[2];
    s[0] ^= s[3];
    s[2] ^= t;
    s[3] = rotl(s[3], 11n);
  }
  return out;
}

Deno.test("createRandom() follows xoshiro128** step for step (BigInt re-implementation)", () => {
  for (const seed of [0, 1, 42, -7, 2 ** 40 + 3, 0xffffffff]) {
    const random = createRandom(seed);
    const ours = Array.from({ length: 50 }, () => random.uint32());
    assertEquals(ours, referenceStream(seed, 50)); // xoshiro128** (Blackman & Vigna 2021), BigInt re-implementation in this test
  }
});

Deno.test("createRandom() gives uniform and normal numbers with the right moments", () => {
  const random = createRandom(9);
  const N = 200_000;
  const uniform = summaryStatistics(Array.from({ length: N }, () => random.uniform()));
  assertClose(uniform.mean, 0.5, { atol: 4 * Math.sqrt(1 / 12 / N), rtol: 0 }); // closed form U(0,1) mean ½, ±4 standard errors
  assertClose(uniform.sd, Math.sqrt(1 / 12), { rtol: 0.01 }); // closed form U(0,1) σ = 1/√12; ±1 % is > 4 standard errors
  assert(uniform.min >= 0 && uniform.max < 1);
  const normal = summaryStatistics(Array.from({ length: N }, () => random.normal(2, 3)));
  assertClose(normal.mean, 2, { atol: 4 * normal.meanStandardError, rtol: 0 }); // closed form, ±4 standard errors (REFERENCE §9.5)
  assertClose(normal.sd, 3, { atol: 4 * normal.sdStandardError, rtol: 0 }); // closed form, ±4 standard errors of σ (REFERENCE §9.5)
  // About 4.55 % of normals lie beyond ±2σ.
  const beyond = estimateYield(
    Array.from({ length: N }, () => random.normal()),
    (z) => Math.abs(z) > 2,
  );
  const expected = 2 * standardNormalCdf(-2);
  assertClose(beyond.fraction, expected, { atol: 4 * beyond.standardError, rtol: 0 }); // closed form 2Φ(−2), ±4 standard errors
});

Deno.test("createRandom() rejects a seed that is not a whole number", () => {
  assertThrows(() => createRandom(1.5), RangeError);
  assertThrows(() => createRandom(Number.NaN), TypeError);
});

Deno.test("createRandom() repeats its sequence for the same seed and not for another", () => {
  fc.assert(
    fc.property(fc.integer({ min: -(2 ** 31), max: 2 ** 31 }), (seed) => {
      const a = createRandom(seed);
      const b = createRandom(seed);
      const c = createRandom(seed + 1);
      const first = Array.from({ length: 20 }, () => a.normal());
      assertEquals(Array.from({ length: 20 }, () => b.normal()), first);
      assert(Array.from({ length: 20 }, () => c.normal()).some((v, i) => v !== first[i]));
    }),
    { numRuns: 100 },
  );
});

// ── Monte Carlo helpers ──────────────────────────────────────────────────────────────────

Deno.test("monteCarlo() is repeatable for a seed and passes the trial index", () => {
  const a = monteCarlo(100, (random, index) => random.uniform() + index, { seed: 4 });
  const b = monteCarlo(100, (random, index) => random.uniform() + index, { seed: 4 });
  assertEquals(a, b);
  assert(a[99] >= 99 && a[99] < 100);
  assertThrows(() => monteCarlo(0, () => 0), RangeError);
  assertThrows(() => monteCarlo(2.5, () => 0), RangeError);
});

Deno.test("percentile() interpolates between order statistics and rejects bad input", () => {
  assertEquals(percentile([3, 1, 2], 0), 1);
  assertEquals(percentile([3, 1, 2], 1), 3);
  assertEquals(percentile([10, 20], 0.25), 12.5);
  assertEquals(percentile([Infinity, 1, 2], 1), Infinity);
  assertEquals(percentiles([1, 2, 3, 4, 5], [0.5, 0.25]), [3, 2]);
  assertThrows(() => percentile([], 0.5), RangeError);
  assertThrows(() => percentile([1], 1.5), RangeError);
  assertThrows(() => percentile([1, Number.NaN], 0.5), {
    message: "Expected values[1] to be a number, but found NaN",
  });
});

Deno.test("percentile() never decreases as p grows", () => {
  fc.assert(
    fc.property(
      fc.array(fc.double({ noNaN: true, min: -1e6, max: 1e6 }), { minLength: 1, maxLength: 50 }),
      fc.double({ min: 0, max: 1, noNaN: true }),
      fc.double({ min: 0, max: 1, noNaN: true }),
      (values, p, q) => {
        const [low, high] = p <= q ? [p, q] : [q, p];
        assert(percentile(values, low) <= percentile(values, high));
        assert(percentile(values, low) >= Math.min(...values));
        assert(percentile(values, high) <= Math.max(...values));
      },
    ),
    { numRuns: 200 },
  );
});

Deno.test("summaryStatistics() rejects an empty sample and an infinite value", () => {
  assertThrows(() => summaryStatistics([]), RangeError);
  assertThrows(() => summaryStatistics([1, Infinity]), TypeError);
  const single = summaryStatistics([4]);
  assertEquals([single.mean, single.sd], [4, 0]);
});

Deno.test("worstCaseCorners() enumerates all 2^n corners and caps n with a clear error", () => {
  const parts = [1, 2, 3].map((nominal) => ({ nominal, tolerance: 0.1 }));
  const result = worstCaseCorners(parts, (values) => values[0] + values[1] - values[2]);
  assertEquals(result.corners.length, 8);
  assertEquals(new Set(result.corners.map((c) => c.signs.join())).size, 8);
  assertClose(result.highest.result, 1.1 + 2.2 - 2.7, { rtol: 1e-12 }); // closed form
  assertClose(result.lowest.result, 0.9 + 1.8 - 3.3, { rtol: 1e-12 }); // closed form
  const many = Array.from({ length: 17 }, () => ({ nominal: 1, tolerance: 0.01 }));
  assertThrows(
    () => worstCaseCorners(many, () => 0),
    (error: Error) =>
      error instanceof RangeError && /at most 16 parameters/.test(error.message) &&
      /131072 corners/.test(error.message),
  );
  assertThrows(() => worstCaseCorners([], () => 0), RangeError);
  assertThrows(() => worstCaseCorners([{ nominal: 1, tolerance: -0.1 }], () => 0), RangeError);
});

Deno.test("worstCaseCorners() bounds every Monte Carlo draw of a monotonic network", () => {
  // A divider's ratio is monotonic in each resistor, so its extremes lie at corners.
  const parts = [{ nominal: 10e3, tolerance: 0.05 }, { nominal: 4.7e3, tolerance: 0.05 }];
  const ratio = ([top, bottom]: number[]) => bottom / (top + bottom);
  const { lowest, highest } = worstCaseCorners(parts, ratio);
  fc.assert(
    fc.property(fc.integer({ min: 0, max: 1e6 }), (seed) => {
      const random = createRandom(seed);
      const values = parts.map((p) => p.nominal * (1 + p.tolerance * (2 * random.uniform() - 1)));
      const r = ratio(values);
      assert(r >= lowest.result - 1e-15 && r <= highest.result + 1e-15);
    }),
    { numRuns: 200 },
  );
});

Deno.test("sweep() returns rows over lists, linear and log ranges", () => {
  assertEquals(sweep([1, 2], (x) => x * 10), [
    { parameter: 1, value: 10 },
    { parameter: 2, value: 20 },
  ]);
  const log = sweepValues({ start: 1, stop: 1e6, points: 7, spacing: "log" });
  log.forEach((value, i) => assertClose(value, 10 ** i, { rtol: 1e-12 })); // closed form, decades
  assertEquals(sweepValues({ start: 5, stop: 5, points: 1 }), [5]);
  assertThrows(() => sweepValues({ start: -1, stop: 10, points: 3, spacing: "log" }), RangeError);
  assertThrows(() => sweepValues({ start: 0, stop: 1, points: 0 }), RangeError);
  assertThrows(() => sweep([1, Number.NaN], (x) => x), TypeError);
});

Deno.test("percentiles() by selection agree with sorting, for any sample and any p", () => {
  fc.assert(
    fc.property(
      fc.array(fc.double({ noNaN: true, min: -1e6, max: 1e6 }), { minLength: 1, maxLength: 300 }),
      fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1, maxLength: 5 }),
      (values, ps) => {
        const sorted = Float64Array.from(values).sort();
        const expected = ps.map((p) => {
          const rank = p * (sorted.length - 1);
          const below = Math.floor(rank);
          const above = Math.min(below + 1, sorted.length - 1);
          const fraction = rank - below;
          return fraction === 0
            ? sorted[below]
            : sorted[below] + fraction * (sorted[above] - sorted[below]);
        });
        const got = percentiles(values, ps);
        return got.every((x, i) => x === expected[i] || (x === 0 && expected[i] === 0));
      },
    ),
    { numRuns: 300 },
  );
});
