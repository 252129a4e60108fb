/**
 * Monte Carlo of a long-tailed pair's CMRR and input offset over random mismatch, with a seeded
 * generator, reusing the pair's validated design so each trial costs one small nodal solve.
 *
 * @module
 */
import { requireNonNegative } from "../_validate.ts";
import { monteCarlo, percentiles } from "../analysis/monte_carlo.ts";
import {
  DEFAULT_TOLERANCE_DISTRIBUTION,
  type Random,
  toleranceDeviation,
  type ToleranceOptions,
} from "../analysis/random.ts";
import type { _TrialSink } from "./_trials.ts";
import { type _BjtParts, _bjtTailCurrent } from "./_bjt_core.ts";
import { type _MosParts, _mosTailCurrent } from "./_mos_core.ts";
import { _bjtFastApplies, _bjtTrialFast, _bjtTrialGeneral, _mosTrial } from "./_trials.ts";
import { _bjtCore, _bjtNominalIs, bjtPair, type BjtPairOptions } from "./bjt_pair.ts";
import { _mosCore, mosPair, type MosPairOptions } from "./mos_pair.ts";

/** Options shared by both Monte Carlo runs. */
export interface PairMonteCarloOptions {
  /** Number of trials, a whole number ≥ 1 (use ≥ 2·10⁵ for percentiles to ±0.3 dB). */
  trials: number;
  /**
   * Seed of the generator; the same seed repeats the run exactly.
   * @default {1}
   */
  seed?: number;
  /**
   * Tolerance of each load resistor, a fraction (0.01 = "1 %"); how it spreads is set by
   * `loadDistribution` (by default a Gaussian with the tolerance as 3σ, so σ = 0.333 %).
   * The two resistors vary independently.
   * @default {0}
   */
  loadTolerance?: number;
  /**
   * How the load resistors spread inside `loadTolerance`: the distributions of
   * `sampleTolerance` in lib/analysis/random.ts (`"gaussian3sigma"`, `"uniform"`,
   * `"corners"`, `"binned"` with its `innerTolerance`, and `truncate`). REFERENCE §9.6: "a
   * 1 % tolerance is not a σ", so say which one a study assumes.
   * @default {{ distribution: "gaussian3sigma" }}
   */
  loadDistribution?: ToleranceOptions;
}

/** Spreads of a BJT pair's device mismatch. */
export interface BjtPairMonteCarloOptions extends PairMonteCarloOptions {
  /** Standard deviation of ΔIs/Is between the two input devices. @default {0} */
  saturationCurrentSpread?: number;
  /** Standard deviation of Δβ/β between the two input devices. @default {0} */
  betaSpread?: number;
}

/** Spreads of a MOS pair's device mismatch. */
export interface MosPairMonteCarloOptions extends PairMonteCarloOptions {
  /** Standard deviation of ΔVt between the two input devices, V (e.g. Pelgrom A_VT/√(WL)·√2). @default {0} */
  thresholdSpread?: number;
  /** Standard deviation of Δ(W/L)/(W/L). @default {0} */
  aspectRatioSpread?: number;
}

/** Result of a pair Monte Carlo run. */
export interface PairMonteCarloResult {
  /** Number of trials. */
  trials: number;
  /**
   * Which CMRR `cmrrDb` holds: the differential-output CMRR for resistive loads, the
   * single-ended CMRR for a mirror load (its only output).
   */
  cmrrDefinition: "differential" | "singleEnded";
  /** CMRR of each trial in dB (exact small-signal, all sampled mismatch at once). */
  cmrrDb: Float64Array;
  /**
   * Single-ended CMRR of each trial in dB, at the second output (c2): Ad,se/Acm,se. Barely
   * moved by load mismatch (REFERENCE §9.4); the same as `cmrrDb` for a mirror load.
   */
  cmrrSingleEndedDb: Float64Array;
  /** Exact input offset of each trial, V (see `PairOffset.exact`). */
  offset: Float64Array;
  /** Median CMRR, dB. */
  cmrrDbMedian: number;
  /** 5th percentile of CMRR (5 % of trials are worse), dB. */
  cmrrDbPercentile5: number;
  /** 1st percentile of CMRR, dB. */
  cmrrDbPercentile1: number;
  /** Mean offset, V. */
  offsetMean: number;
  /** Standard deviation of the offset, V. */
  offsetSd: number;
}

function summarise(
  run: TrialArrays,
  definition: "differential" | "singleEnded",
): PairMonteCarloResult {
  const { cmrrDb, cmrrSingleEndedDb, offset } = run;
  const [p1, p5, median] = percentiles(cmrrDb, [0.01, 0.05, 0.5]);
  let sum = 0;
  for (let i = 0; i < offset.length; i++) sum += offset[i];
  const mean = sum / offset.length;
  let squares = 0;
  for (let i = 0; i < offset.length; i++) squares += (offset[i] - mean) ** 2;
  return {
    trials: offset.length,
    cmrrDefinition: definition,
    cmrrDb,
    cmrrSingleEndedDb,
    offset,
    cmrrDbMedian: median,
    cmrrDbPercentile5: p5,
    cmrrDbPercentile1: p1,
    offsetMean: mean,
    offsetSd: offset.length > 1 ? Math.sqrt(squares / (offset.length - 1)) : 0,
  };
}

interface TrialArrays {
  cmrrDb: Float64Array;
  cmrrSingleEndedDb: Float64Array;
  offset: Float64Array;
}

/**
 * What the BJT and MOS runs share: the seeded loop, the per-trial arrays and the sink each
 * trial writes into (one object for the whole run, so the hot loop allocates nothing).
 */
function runTrials(
  spreadOptions: PairMonteCarloOptions,
  trial: (random: Random, sink: _TrialSink) => void,
): TrialArrays {
  const trials = spreadOptions.trials;
  const cmrrDb = new Float64Array(Math.max(0, Math.floor(trials)) || 1);
  const cmrrSingleEndedDb = new Float64Array(cmrrDb.length);
  const offset = new Float64Array(cmrrDb.length);
  const sink: _TrialSink = { cmrrDb: 0, cmrrSingleEndedDb: 0, offset: 0 };
  monteCarlo(trials, (random: Random, i: number) => {
    trial(random, sink);
    cmrrDb[i] = sink.cmrrDb;
    cmrrSingleEndedDb[i] = sink.cmrrSingleEndedDb;
    offset[i] = sink.offset;
    return i;
  }, { seed: spreadOptions.seed });
  return { cmrrDb, cmrrSingleEndedDb, offset };
}

function draw(random: Random, sd: number): number {
  return sd > 0 ? random.normal(0, sd) : 0;
}

function spread(name: string, value: number | undefined): number {
  const sd = value ?? 0;
  requireNonNegative(name, sd);
  return sd;
}

/**
 * A drawer of relative load deviations. The default (3σ Gaussian) draws exactly as
 * `toleranceDeviation` does, but skips its per-call option handling in the hot loop; a zero
 * tolerance draws nothing, so the other spreads keep their random stream.
 */
function loadDeviation(
  spreadOptions: PairMonteCarloOptions,
): (random: Random) => number {
  const tolerance = spread("loadTolerance", spreadOptions.loadTolerance);
  const shape = spreadOptions.loadDistribution ?? {};
  const distribution = shape.distribution ?? DEFAULT_TOLERANCE_DISTRIBUTION;
  if (tolerance === 0) return () => 0;
  // Any other shape goes through toleranceDeviation, which rejects a bad one on the first draw.
  if (distribution === "gaussian3sigma" && !shape.truncate) {
    const sd = tolerance / 3;
    return (random) => random.normal(0, sd);
  }
  return (random) => toleranceDeviation(random, tolerance, shape);
}

/**
 * Monte Carlo of a BJT pair's CMRR and offset: each trial draws both load resistors, the
 * ΔIs/Is and the Δβ/β of the input devices, then solves the pair exactly. The design's own
 * `mismatch` option is replaced by the drawn values.
 *
 * @param options The pair, as for {@linkcode bjtPair} (validated the same way).
 * @param spreadOptions Trials, seed and spreads.
 * @returns CMRR and offset of every trial, with their percentiles and moments.
 * @throws {RangeError} As {@linkcode bjtPair}, or for a negative spread or a bad trial count.
 *
 * @example 1 % collector resistors in Example A: median CMRR about 115.7 dB (REFERENCE §9.4)
 * ```ts
 * import { bjtPairMonteCarlo } from "./pair_monte_carlo.ts";
 * import { ok } from "node:assert/strict";
 * const run = bjtPairMonteCarlo({
 *   tail: { kind: "source", current: 1e-3, outputResistance: 50e3 },
 *   load: { kind: "resistors", resistance: 10e3 },
 *   positiveRail: 15,
 *   negativeRail: -15,
 * }, { trials: 20000, loadTolerance: 0.01, seed: 7 });
 * ok(Math.abs(run.cmrrDbMedian - 115.7) < 0.5);
 * ```
 */
export function bjtPairMonteCarlo(
  options: BjtPairOptions,
  spreadOptions: BjtPairMonteCarloOptions,
): PairMonteCarloResult {
  bjtPair({ ...options, mismatch: undefined }); // validates the nominal design and its bias
  const { core, inputCommonMode } = _bjtCore({ ...options, mismatch: undefined });
  const deviation = loadDeviation(spreadOptions);
  const isSpread = spread("saturationCurrentSpread", spreadOptions.saturationCurrentSpread);
  const betaSpread = spread("betaSpread", spreadOptions.betaSpread);
  const current = _bjtTailCurrent(core, inputCommonMode);
  const nominalIs = _bjtNominalIs(core, current);
  const rc = core.load.kind === "resistors" ? core.load.resistance : Number.NaN;
  const mirror = core.load.kind === "mirror";
  const fast = _bjtFastApplies(core);
  const parts: _BjtParts = { rc1: rc, rc2: rc, is1: 0, is2: 0, beta1: 0, beta2: 0 };
  const run = runTrials(spreadOptions, (random, sink) => {
    // The draw order (ΔIs, Δβ, RC1, RC2) is part of what a seed repeats.
    const dIs = draw(random, isSpread);
    const dBeta = draw(random, betaSpread);
    parts.rc1 = rc * (1 + deviation(random));
    parts.rc2 = rc * (1 + deviation(random));
    parts.is1 = nominalIs * (1 + dIs / 2);
    parts.is2 = nominalIs * (1 - dIs / 2);
    parts.beta1 = core.beta * (1 + dBeta / 2);
    parts.beta2 = core.beta * (1 - dBeta / 2);
    if (fast) _bjtTrialFast(core, current, parts, sink);
    else _bjtTrialGeneral(core, current, inputCommonMode, parts, sink);
  });
  return summarise(run, mirror ? "singleEnded" : "differential");
}

/**
 * Monte Carlo of a MOS pair's CMRR and offset: each trial draws both load resistors, ΔVt and
 * Δ(W/L)/(W/L), then solves the pair exactly. The design's own `mismatch` option is replaced.
 *
 * @param options The pair, as for {@linkcode mosPair}.
 * @param spreadOptions Trials, seed and spreads.
 * @returns CMRR and offset of every trial, with their percentiles and moments.
 * @throws {RangeError} As {@linkcode mosPair}, or for a negative spread or a bad trial count.
 *
 * @example Offset spread from a 1 mV σ threshold mismatch
 * ```ts
 * import { mosPairMonteCarlo } from "./pair_monte_carlo.ts";
 * import { ok } from "node:assert/strict";
 * const run = mosPairMonteCarlo({
 *   tail: { kind: "source", current: 200e-6, outputResistance: 100e3, compliance: 0.3 },
 *   load: { kind: "resistors", resistance: 10e3 },
 *   transconductanceParameter: 5e-3,
 *   threshold: 0.5,
 *   positiveRail: 3.3,
 *   negativeRail: 0,
 * }, { trials: 20000, thresholdSpread: 1e-3, seed: 3 });
 * ok(Math.abs(run.offsetSd - 1e-3) < 4 * 1e-3 / Math.sqrt(2 * 19999));
 * ```
 */
export function mosPairMonteCarlo(
  options: MosPairOptions,
  spreadOptions: MosPairMonteCarloOptions,
): PairMonteCarloResult {
  mosPair({ ...options, mismatch: undefined });
  const { core, inputCommonMode } = _mosCore({ ...options, mismatch: undefined });
  const deviation = loadDeviation(spreadOptions);
  const vtSpread = spread("thresholdSpread", spreadOptions.thresholdSpread);
  const knSpread = spread("aspectRatioSpread", spreadOptions.aspectRatioSpread);
  const current = _mosTailCurrent(core, inputCommonMode);
  const rd = core.load.kind === "resistors" ? core.load.resistance : Number.NaN;
  const kn = core.transconductanceParameter;
  const mirror = core.load.kind === "mirror";
  const parts: _MosParts = { rd1: rd, rd2: rd, kn1: kn, kn2: kn, vt1: 0, vt2: 0 };
  const run = runTrials(spreadOptions, (random, sink) => {
    // The draw order (ΔVt, Δ(W/L), RD1, RD2) is part of what a seed repeats.
    const dVt = draw(random, vtSpread);
    const dKn = draw(random, knSpread);
    parts.rd1 = rd * (1 + deviation(random));
    parts.rd2 = rd * (1 + deviation(random));
    parts.kn1 = kn * (1 + dKn / 2);
    parts.kn2 = kn * (1 - dKn / 2);
    parts.vt1 = core.threshold + dVt / 2;
    parts.vt2 = core.threshold - dVt / 2;
    _mosTrial(core, current, inputCommonMode, parts, sink);
  });
  return summarise(run, mirror ? "singleEnded" : "differential");
}
