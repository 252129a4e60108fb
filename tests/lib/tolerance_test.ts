/**
 * Tolerance, worst case and Monte Carlo (REFERENCE §9): the difference amplifier's CMRR,
 * offset spread, and the statistics of the estimates themselves.
 */
import fc from "fast-check";
import { assert, assertClose, assertEquals, assertThrows } from "../_assert.ts";
import {
  differenceAmplifierCmrrMonteCarlo,
  differenceAmplifierFirstOrderCmrr,
  differenceAmplifierGains,
  differenceAmplifierStatisticalCmrr,
  differenceAmplifierWorstCaseCmrr,
} from "../../lib/analysis/difference_amplifier_tolerance.ts";
import {
  feedbackAmplifierOutputOffset,
  pelgromThresholdMismatch,
  saturationCurrentMismatchOffset,
} from "../../lib/analysis/offset_spread.ts";
import {
  estimateYield,
  monteCarlo,
  sdStandardError,
  summaryStatistics,
  yieldStandardError,
} from "../../lib/analysis/monte_carlo.ts";
import { createRandom, sampleTolerance, toleranceDeviation } from "../../lib/analysis/random.ts";

const db = (ratio: number) => 20 * Math.log10(ratio);

// ── §9.2 worst case ──────────────────────────────────────────────────────────────────────

Deno.test("differenceAmplifierWorstCaseCmrr() gives E9.1: K = 1, 1 % resistors, 50 (33.98 dB)", () => {
  const worst = differenceAmplifierWorstCaseCmrr({ gain: 1, tolerance: 0.01 });
  assertClose(worst.cmrr, 50.000, { atol: 5e-4, rtol: 0 }); // REFERENCE E9.1 exact corner analysis (3 decimals printed)
  assertClose(worst.cmrrDb, 33.98, { atol: 5e-3, rtol: 0 }); // REFERENCE E9.1 (2 decimals printed)
  assertClose(worst.approximateCmrr, 50.000, { atol: 5e-4, rtol: 0 }); // REFERENCE E9.1 (1+K)/(4ε) / [SS7] ch. 2, [Franco4] ch. 2 (from memory)
});

Deno.test("differenceAmplifierWorstCaseCmrr() gives E9.2: K = 10, 1 %, 274.98 against 275.00", () => {
  const worst = differenceAmplifierWorstCaseCmrr({ gain: 10, tolerance: 0.01 });
  assertClose(worst.cmrr, 274.98, { atol: 5e-3, rtol: 0 }); // REFERENCE E9.2 exact corner analysis (2 decimals printed)
  assertClose(worst.cmrrDb, 48.79, { atol: 5e-3, rtol: 0 }); // REFERENCE E9.2 (2 decimals printed)
  assertClose(worst.approximateCmrr, 275.00, { atol: 5e-3, rtol: 0 }); // REFERENCE E9.2 (1+K)/(4ε) / [SS7] ch. 2, [Franco4] ch. 2 (from memory)
  assertClose(worst.approximateCmrrDb, 48.79, { atol: 5e-3, rtol: 0 }); // REFERENCE E9.2 (2 decimals printed)
});

Deno.test("differenceAmplifierWorstCaseCmrr() gives E9.3: K = 100, 1 %, 2524.8 (68.04 dB)", () => {
  const worst = differenceAmplifierWorstCaseCmrr({ gain: 100, tolerance: 0.01 });
  assertClose(worst.cmrr, 2524.8, { atol: 0.05, rtol: 0 }); // REFERENCE E9.3 exact corner analysis (1 decimal printed)
  assertClose(worst.cmrrDb, 68.04, { atol: 5e-3, rtol: 0 }); // REFERENCE E9.3 (2 decimals printed)
  assertClose(worst.approximateCmrr, 2525.0, { atol: 0.05, rtol: 0 }); // REFERENCE E9.3 (1+K)/(4ε) / [SS7] ch. 2, [Franco4] ch. 2 (from memory)
  assertClose(worst.approximateCmrrDb, 68.05, { atol: 5e-3, rtol: 0 }); // REFERENCE E9.3 (2 decimals printed)
});

Deno.test("differenceAmplifierGains() matches the textbook's Acm = 0.04, CMRR ≈ 68 dB for 2 kΩ / 200 kΩ at 1 %", () => {
  // The worst corner: R1 and R4 low, R2 and R3 high.
  const gains = differenceAmplifierGains({ r1: 1980, r2: 202e3, r3: 2020, r4: 198e3 });
  assertClose(Math.abs(gains.commonModeGain), 0.04, { rtol: 0.05 }); // REFERENCE E9.3 / [SS7] exercise, public page: "Acm = 0.04" (1 digit printed)
  assertClose(gains.cmrrDb, 68, { atol: 0.5, rtol: 0 }); // REFERENCE E9.3 / [SS7] exercise, public page: "CMRR ≈ 68 dB" (whole dB printed)
});

Deno.test("differenceAmplifierWorstCaseCmrr() gives E9.4: K = 1, 0.1 %, 500 (53.98 dB)", () => {
  const worst = differenceAmplifierWorstCaseCmrr({ gain: 1, tolerance: 0.001 });
  assertClose(worst.cmrr, 500.00, { atol: 5e-3, rtol: 0 }); // REFERENCE E9.4 exact corner analysis (2 decimals printed)
  assertClose(worst.cmrrDb, 53.98, { atol: 5e-3, rtol: 0 }); // REFERENCE E9.4 (2 decimals printed)
  assertClose(worst.approximateCmrr, 500.00, { atol: 5e-3, rtol: 0 }); // REFERENCE E9.4 (1+K)/(4ε)
});

Deno.test("differenceAmplifierWorstCaseCmrr() finds the corner where the two ratios move apart", () => {
  const worst = differenceAmplifierWorstCaseCmrr({ gain: 10, tolerance: 0.01 });
  // δ1 − δ2 − δ3 + δ4 is largest in magnitude at (−, +, +, −) or (+, −, −, +).
  const s = worst.signs;
  assertEquals(Math.abs(s[0] - s[1] - s[2] + s[3]), 4);
  assertThrows(() => differenceAmplifierWorstCaseCmrr({ gain: 0, tolerance: 0.01 }), RangeError);
  assertThrows(() => differenceAmplifierWorstCaseCmrr({ gain: 1, tolerance: 1 }), RangeError);
});

// ── §9.1 first order ─────────────────────────────────────────────────────────────────────

Deno.test("differenceAmplifierFirstOrderCmrr() equals (1+K)/(4ε) at the worst corner", () => {
  for (const gain of [1, 10, 100]) {
    const cmrr = differenceAmplifierFirstOrderCmrr(gain, [-0.01, 0.01, 0.01, -0.01]);
    assertClose(cmrr, (1 + gain) / 0.04, { rtol: 1e-12 }); // REFERENCE §9.1 first-order CMRR (1+K)/|δ1 − δ2 − δ3 + δ4| / D
  }
  assertEquals(differenceAmplifierFirstOrderCmrr(1, [0.01, 0.01, 0.01, 0.01]), Infinity);
  assertThrows(() => differenceAmplifierFirstOrderCmrr(1, [0.01, 0.01, 0.01]), RangeError);
});

Deno.test("differenceAmplifierFirstOrderCmrr() agrees with the exact CMRR for small errors", () => {
  fc.assert(
    fc.property(
      fc.double({ min: 0.5, max: 200, noNaN: true }),
      fc.array(fc.double({ min: -1e-4, max: 1e-4, noNaN: true }), {
        minLength: 4,
        maxLength: 4,
      }),
      (gain, deltas) => {
        const sum = deltas[0] - deltas[1] - deltas[2] + deltas[3];
        fc.pre(Math.abs(sum) > 1e-5); // away from perfect cancellation, where both blow up
        const [d1, d2, d3, d4] = deltas;
        const exact = differenceAmplifierGains({
          r1: 1 + d1,
          r2: gain * (1 + d2),
          r3: 1 + d3,
          r4: gain * (1 + d4),
        }).cmrr;
        const first = differenceAmplifierFirstOrderCmrr(gain, deltas);
        // Second-order terms are O(δ) relative: δ ≤ 1e-4, over a sum ≥ 1e-5 → a few %.
        assertClose(first, exact, { rtol: 0.1 }); // REFERENCE §9.1 first-order expansion / D
      },
    ),
    { numRuns: 200 },
  );
});

Deno.test("differenceAmplifierGains() rejects a resistor that is not positive", () => {
  assertThrows(() => differenceAmplifierGains({ r1: 0, r2: 1, r3: 1, r4: 1 }), {
    message: "Expected r1 to be greater than 0 Ω, but found 0",
  });
});

// ── §9.3 statistical CMRR: closed form ───────────────────────────────────────────────────

Deno.test("differenceAmplifierStatisticalCmrr() gives E9.5 and E9.6 in closed form", () => {
  const at = (gain: number, probabilityWorse: number) =>
    differenceAmplifierStatisticalCmrr({ gain, tolerance: 0.01, probabilityWorse }).cmrrDb;
  assertClose(at(1, 0.5), 52.96, { atol: 5e-3, rtol: 0 }); // REFERENCE E9.5 median (2 decimals printed)
  assertClose(at(1, 0.05), 43.70, { atol: 5e-3, rtol: 0 }); // REFERENCE E9.5 5th percentile (2 decimals printed)
  assertClose(at(1, 0.01), 41.32, { atol: 5e-3, rtol: 0 }); // REFERENCE E9.5 1st percentile (2 decimals printed)
  assertClose(at(10, 0.5), 67.77, { atol: 5e-3, rtol: 0 }); // REFERENCE E9.6 median (2 decimals printed)
  assertClose(at(10, 0.05), 58.50, { atol: 5e-3, rtol: 0 }); // REFERENCE E9.6 5th percentile (2 decimals printed)
  assertClose(at(10, 0.01), 56.13, { atol: 5e-3, rtol: 0 }); // REFERENCE E9.6 1st percentile (2 decimals printed)
  const median = differenceAmplifierStatisticalCmrr({ gain: 1, sigma: 0.01 / 3 });
  assertClose(median.z, 0.6745, { rtol: 1e-4 }); // REFERENCE §9.1 "median uses z = 0.6745"
  assertClose(median.sumSigma, 0.02 / 3, { rtol: 1e-12 }); // REFERENCE §9.1 σ_S = 2σ
  assertThrows(() => differenceAmplifierStatisticalCmrr({ gain: 1 }), RangeError);
  assertThrows(
    () => differenceAmplifierStatisticalCmrr({ gain: 1, tolerance: 0.01, probabilityWorse: 1 }),
    RangeError,
  );
});

// ── §9.3 statistical CMRR: Monte Carlo ───────────────────────────────────────────────────

Deno.test("differenceAmplifierCmrrMonteCarlo() reproduces E9.5 with 2·10⁵ seeded trials", () => {
  const run = differenceAmplifierCmrrMonteCarlo({ gain: 1, tolerance: 0.01, seed: 95 });
  assertEquals(run.trials, 200_000);
  const [median, fifth, first] = run.percentiles.map((p) => p.cmrrDb);
  assertClose(median, 52.96, { atol: 0.3, rtol: 0 }); // REFERENCE E9.5 median, MC ±0.3 dB (REFERENCE §0.2)
  assertClose(fifth, 43.70, { atol: 0.3, rtol: 0 }); // REFERENCE E9.5 5th percentile, MC ±0.3 dB
  assertClose(first, 41.32, { atol: 0.3, rtol: 0 }); // REFERENCE E9.5 1st percentile, MC ±0.3 dB
});

Deno.test("differenceAmplifierCmrrMonteCarlo() reproduces E9.6 with 2·10⁵ seeded trials", () => {
  const run = differenceAmplifierCmrrMonteCarlo({ gain: 10, tolerance: 0.01, seed: 96 });
  const [median, fifth, first] = run.percentiles.map((p) => p.cmrrDb);
  assertClose(median, 67.77, { atol: 0.3, rtol: 0 }); // REFERENCE E9.6 median, MC ±0.3 dB
  assertClose(fifth, 58.50, { atol: 0.3, rtol: 0 }); // REFERENCE E9.6 5th percentile, MC ±0.3 dB
  assertClose(first, 56.13, { atol: 0.3, rtol: 0 }); // REFERENCE E9.6 1st percentile, MC ±0.3 dB
});

/** CDF of the sum of n independent U(0, 1) variables (Irwin–Hall), closed form. */
function irwinHallCdf(x: number, n: number): number {
  let factorial = 1;
  for (let k = 2; k <= n; k++) factorial *= k;
  let sum = 0;
  let binomial = 1;
  for (let k = 0; k <= Math.floor(x) && k <= n; k++) {
    sum += (k % 2 === 0 ? 1 : -1) * binomial * (x - k) ** n;
    binomial = (binomial * (n - k)) / (k + 1);
  }
  return sum / factorial;
}

Deno.test("differenceAmplifierCmrrMonteCarlo() reproduces E9.7 for uniform ±1 % resistors", () => {
  // Median of |S|, S a sum of four U(−ε, ε): S/ε = 2·IH₄ − 4, so P(|S| ≤ mε) = F(2 + m/2) − F(2 − m/2).
  let low = 0;
  let high = 4;
  for (let i = 0; i < 60; i++) {
    const m = (low + high) / 2;
    if (irwinHallCdf(2 + m / 2, 4) - irwinHallCdf(2 - m / 2, 4) < 0.5) low = m;
    else high = m;
  }
  assertClose(low, 0.80545, { rtol: 1e-4 }); // REFERENCE E9.7 Irwin–Hall median of |S| 0.80545·ε (5 digits printed) / closed form
  assertClose(db(2 / (low * 0.01)), 47.90, { atol: 5e-3, rtol: 0 }); // REFERENCE E9.7 median 47.90 dB (2 decimals printed)

  const run = differenceAmplifierCmrrMonteCarlo({
    gain: 1,
    tolerance: 0.01,
    distribution: "uniform",
    seed: 97,
    probabilitiesWorse: [0.5, 0.05],
  });
  assertClose(run.percentiles[0].cmrrDb, 47.90, { atol: 0.3, rtol: 0 }); // REFERENCE E9.7 median, MC ±0.3 dB
  assertClose(run.percentiles[1].cmrrDb, 39.02, { atol: 0.3, rtol: 0 }); // REFERENCE E9.7 MC 5th percentile, ±0.3 dB
});

Deno.test("differenceAmplifierCmrrMonteCarlo() passes 95 % of amplifiers at the closed-form 5th percentile", () => {
  const run = differenceAmplifierCmrrMonteCarlo({ gain: 1, tolerance: 0.01, seed: 5 });
  const limit = differenceAmplifierStatisticalCmrr({
    gain: 1,
    tolerance: 0.01,
    probabilityWorse: 0.05,
  }).cmrr;
  const estimate = estimateYield(run.cmrr, (cmrr) => cmrr >= limit);
  // First-order theory versus exact trials: they differ by O(ε), far below the 0.049 % SE.
  assertClose(estimate.fraction, 0.95, { atol: 4 * estimate.standardError, rtol: 0 }); // REFERENCE §9.1 fractile definition, ±4 standard errors (REFERENCE §9.5)
});

Deno.test("worst case is about 19 dB below the Gaussian median (E9.1 against E9.5)", () => {
  const worst = differenceAmplifierWorstCaseCmrr({ gain: 1, tolerance: 0.01 }).cmrrDb;
  const gaussian = differenceAmplifierStatisticalCmrr({ gain: 1, tolerance: 0.01 }).cmrrDb;
  assertClose(gaussian - worst, 18.98, { atol: 0.01, rtol: 0 }); // REFERENCE §9.6 (52.96 − 33.98 dB)
});

// ── tolerance distributions ──────────────────────────────────────────────────────────────

Deno.test("toleranceDeviation() treats a tolerance as 3σ by default", () => {
  const random = createRandom(31);
  const stats = summaryStatistics(
    Array.from({ length: 100_000 }, () => toleranceDeviation(random, 0.03)),
  );
  assertClose(stats.sd, 0.01, { atol: 4 * stats.sdStandardError, rtol: 0 }); // REFERENCE §9.3 tolerance = 3σ, ±4 standard errors of σ
  assertClose(stats.mean, 0, { atol: 4 * stats.meanStandardError, rtol: 0 }); // closed form, ±4 standard errors
});

Deno.test("toleranceDeviation() gives flat, corner and binned spreads on request", () => {
  const random = createRandom(32);
  const N = 100_000;
  const uniform = Array.from(
    { length: N },
    () => toleranceDeviation(random, 0.01, { distribution: "uniform" }),
  );
  const uniformStats = summaryStatistics(uniform);
  assert(uniformStats.min >= -0.01 && uniformStats.max <= 0.01);
  assertClose(uniformStats.sd, 0.01 / Math.sqrt(3), { rtol: 0.01 }); // closed form U(−ε, ε) σ = ε/√3; ±1 % is > 4 standard errors at N = 1e5

  const corners = Array.from(
    { length: N },
    () => toleranceDeviation(random, 0.01, { distribution: "corners" }),
  );
  assert(corners.every((d) => d === 0.01 || d === -0.01));
  const high = estimateYield(corners, (d) => d > 0);
  assertClose(high.fraction, 0.5, { atol: 4 * high.standardError, rtol: 0 }); // closed form ½, ±4 standard errors

  const binned = Array.from(
    { length: N },
    () => toleranceDeviation(random, 0.01, { distribution: "binned", innerTolerance: 0.005 }),
  );
  assert(binned.every((d) => Math.abs(d) >= 0.005 && Math.abs(d) <= 0.01));

  const screened = Array.from(
    { length: N },
    () => toleranceDeviation(random, 0.01, { truncate: true }),
  );
  assert(screened.every((d) => Math.abs(d) <= 0.01));

  assertThrows(
    () => toleranceDeviation(random, 0.01, { distribution: "binned" }),
    /innerTolerance/,
  );
  assertThrows(
    () => toleranceDeviation(random, 0.01, { distribution: "binned", innerTolerance: 0.01 }),
    RangeError,
  );
  assertThrows(
    // @ts-expect-error: an unknown distribution name is rejected at run time too.
    () => toleranceDeviation(random, 0.01, { distribution: "normal" }),
    /one of "gaussian3sigma", "uniform", "corners", "binned"/,
  );
  assertThrows(() => toleranceDeviation(random, -0.01), RangeError);
});

Deno.test("sampleTolerance() scales the deviation by the nominal value", () => {
  fc.assert(
    fc.property(
      fc.integer({ min: 0, max: 1e9 }),
      fc.double({ min: 1, max: 1e6, noNaN: true }),
      (seed, nominal) => {
        const value = sampleTolerance(createRandom(seed), { nominal, tolerance: 0.05 }, {
          distribution: "uniform",
        });
        assert(value >= nominal * 0.95 * (1 - 1e-15) && value <= nominal * 1.05 * (1 + 1e-15));
      },
    ),
    { numRuns: 100 },
  );
});

// ── §9.5 offset spread ───────────────────────────────────────────────────────────────────

Deno.test("saturationCurrentMismatchOffset() gives VT·ln 1.10 = 2.464 mV and VT·ln 1.20 = 4.713 mV at 300 K", () => {
  assertClose(saturationCurrentMismatchOffset(1.1), 2.464e-3, { rtol: 1e-3 }); // REFERENCE §9.5 / [SS7] ch. 9 (from memory)
  assertClose(saturationCurrentMismatchOffset(1.2), 4.713e-3, { rtol: 1e-3 }); // REFERENCE §9.5 / [SS7] ch. 9 (from memory)
  assertEquals(saturationCurrentMismatchOffset(1), 0);
  assertClose(saturationCurrentMismatchOffset(1 / 1.1), -2.464e-3, { rtol: 1e-3 }); // REFERENCE §9.5, sign follows the ratio
  const hot = saturationCurrentMismatchOffset(1.1, { temperature: 360 });
  assertClose(hot, saturationCurrentMismatchOffset(1.1) * 1.2, { rtol: 1e-12 }); // closed form: VT ∝ T
  assertThrows(() => saturationCurrentMismatchOffset(0), RangeError);
});

Deno.test("pelgromThresholdMismatch() gives 0.7906 mV and 1.107 mV", () => {
  const wide = pelgromThresholdMismatch({ coefficient: 5e-9, width: 20e-6, length: 2e-6 });
  assertClose(wide, 0.7906e-3, { rtol: 1e-3 }); // REFERENCE §9.5 / [Pelgrom89]
  const small = pelgromThresholdMismatch({ coefficient: 3.5e-9, width: 10e-6, length: 1e-6 });
  assertClose(small, 1.107e-3, { rtol: 1e-3 }); // REFERENCE §9.5 / [Pelgrom89]
  assertThrows(() => pelgromThresholdMismatch({ coefficient: 5e-9, width: 0, length: 1e-6 }), {
    message: "Expected width to be greater than 0 m, but found 0",
  });
});

Deno.test("feedbackAmplifierOutputOffset() gives 34.50 mV, 1.5 mV and 125.0 mV", () => {
  const noCap = feedbackAmplifierOutputOffset({
    inputOffset: 1.5e-3,
    plusResistance: 0,
    feedbackResistance: 22e3,
    groundResistance: 1e3,
  });
  assertClose(noCap.dcGain, 23, { rtol: 1e-12 }); // REFERENCE §9.5 DC gain 1 + Rf/Rg
  assertClose(noCap.outputOffset, 34.50e-3, { rtol: 1e-3 }); // REFERENCE §9.5 σ(VOS,out) / [SS7] ch. 2 (from memory)
  const withCap = feedbackAmplifierOutputOffset({
    inputOffset: 1.5e-3,
    plusResistance: 0,
    feedbackResistance: 22e3,
    groundResistance: 1e3,
    dcBlocking: true,
  });
  assertClose(withCap.outputOffset, 1.5e-3, { rtol: 1e-3 }); // REFERENCE §9.5 "with a blocking capacitor … 1.5 mV"
  const bias = feedbackAmplifierOutputOffset({
    biasCurrent: 5e-6,
    plusResistance: 47e3,
    feedbackResistance: 22e3,
    groundResistance: 1e3,
    dcBlocking: true,
  });
  assertEquals(bias.minusResistance, 22e3);
  assertClose(bias.outputOffset, 125.0e-3, { rtol: 1e-3 }); // REFERENCE §9.5 5 µA × (47 kΩ − 22 kΩ) / [SS7] ch. 2 (from memory)
  const matched = feedbackAmplifierOutputOffset({
    biasCurrent: 5e-6,
    plusResistance: 22e3,
    feedbackResistance: 22e3,
    groundResistance: 1e3,
    dcBlocking: true,
  });
  assertEquals(matched.outputOffset, 0);
});

Deno.test("feedbackAmplifierOutputOffset() carries a Monte Carlo input offset to σ = 34.5 mV", () => {
  const outputs = monteCarlo(20_000, (random) =>
    feedbackAmplifierOutputOffset({
      inputOffset: random.normal(0, 1.5e-3),
      plusResistance: 0,
      feedbackResistance: 22e3,
      groundResistance: 1e3,
    }).outputOffset, { seed: 23 });
  const stats = summaryStatistics(outputs);
  assertClose(stats.sd, 34.50e-3, { atol: 4 * stats.sdStandardError, rtol: 0 }); // REFERENCE §9.5 34.50 mV, ±4 standard errors of σ
});

// ── §9.5 statistics of the estimates ─────────────────────────────────────────────────────

Deno.test("sdStandardError() and yieldStandardError() give 2.24 % and 0.689 % at N = 1000", () => {
  assertClose(sdStandardError(1, 1000), 0.0224, { rtol: 2.5e-3 }); // REFERENCE §9.5 σ/√(2(N−1)), N = 1000 (3 digits printed)
  assertClose(yieldStandardError(0.95, 1000), 0.00689, { rtol: 1e-3 }); // REFERENCE §9.5 √(p(1−p)/N) (3 digits printed)
  assertThrows(() => sdStandardError(1, 1), RangeError);
  assertThrows(() => yieldStandardError(1.2, 10), RangeError);
});

Deno.test("repeated runs of N = 1000 scatter as the standard errors predict", () => {
  const runs = 2000;
  const sigmas: number[] = [];
  const yields: number[] = [];
  monteCarlo(runs, (random) => {
    const values = Array.from({ length: 1000 }, () => random.normal());
    sigmas.push(summaryStatistics(values).sd);
    yields.push(estimateYield(values, (z) => z < 1.6448536269514722).fraction);
  }, { seed: 1000 });
  const sigmaSpread = summaryStatistics(sigmas);
  const yieldSpread = summaryStatistics(yields);
  // The spread of 2000 estimates is itself known to ±4·σ/√(2·1999) ≈ ±6.3 %.
  assertClose(sigmaSpread.sd, sdStandardError(1, 1000), { rtol: 0.065 }); // REFERENCE §9.5 2.24 %, ±4 standard errors of the spread
  assertClose(yieldSpread.sd, 0.00689, { rtol: 0.065 }); // REFERENCE §9.5 0.689 %, ±4 standard errors of the spread
  assertClose(yieldSpread.mean, 0.95, { atol: 4 * yieldSpread.meanStandardError, rtol: 0 }); // closed form Φ(1.645) = 0.95, ±4 standard errors
});
