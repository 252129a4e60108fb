/**
 * Monte Carlo of a long-tailed pair's CMRR and input offset over random mismatch, with a seeded
 * generator, reusing the pair's validated design so each trial costs one small nodal solve.
 *
 * @module
 */
import { requireNonNegative } from "../_validate.ts";
import { monteCarlo, percentiles } from "../analysis/monte_carlo.ts";
import type { Random } from "../analysis/random.ts";
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
   * Tolerance of each load resistor, a fraction, treated as 3σ of a Gaussian
   * (0.01 = "1 %" ⇒ σ = 0.333 %). The two resistors vary independently.
   * @default {0}
   */
  loadTolerance?: number;
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
  cmrrDb: Float64Array,
  offset: Float64Array,
  definition: "differential" | "singleEnded",
): PairMonteCarloResult {
  const [p1, p5, median] = percentiles(cmrrDb, [0.01, 0.05, 0.5]);
  let sum = 0;
  for (const x of offset) sum += x;
  const mean = sum / offset.length;
  let squares = 0;
  for (const x of offset) squares += (x - mean) ** 2;
  return {
    trials: offset.length,
    cmrrDefinition: definition,
    cmrrDb,
    offset,
    cmrrDbMedian: median,
    cmrrDbPercentile5: p5,
    cmrrDbPercentile1: p1,
    offsetMean: mean,
    offsetSd: offset.length > 1 ? Math.sqrt(squares / (offset.length - 1)) : 0,
  };
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
  const tolerance = spread("loadTolerance", spreadOptions.loadTolerance) / 3;
  const isSpread = spread("saturationCurrentSpread", spreadOptions.saturationCurrentSpread);
  const betaSpread = spread("betaSpread", spreadOptions.betaSpread);
  const current = _bjtTailCurrent(core, inputCommonMode);
  const nominalIs = _bjtNominalIs(core, current);
  const rc = core.load.kind === "resistors" ? core.load.resistance : Number.NaN;
  const mirror = core.load.kind === "mirror";
  const trials = spreadOptions.trials;
  const cmrrDb = new Float64Array(Math.max(0, Math.floor(trials)) || 1);
  const offset = new Float64Array(cmrrDb.length);
  const sink = { cmrrDb: 0, offset: 0 };
  const fast = _bjtFastApplies(core);
  monteCarlo(trials, (random: Random, i: number) => {
    const dIs = draw(random, isSpread);
    const dBeta = draw(random, betaSpread);
    const parts: _BjtParts = {
      rc1: rc * (1 + draw(random, tolerance)),
      rc2: rc * (1 + draw(random, tolerance)),
      is1: nominalIs * (1 + dIs / 2),
      is2: nominalIs * (1 - dIs / 2),
      beta1: core.beta * (1 + dBeta / 2),
      beta2: core.beta * (1 - dBeta / 2),
    };
    if (fast) _bjtTrialFast(core, current, parts, sink);
    else _bjtTrialGeneral(core, current, inputCommonMode, parts, sink);
    cmrrDb[i] = sink.cmrrDb;
    offset[i] = sink.offset;
    return i;
  }, { seed: spreadOptions.seed });
  return summarise(cmrrDb, offset, mirror ? "singleEnded" : "differential");
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
  const tolerance = spread("loadTolerance", spreadOptions.loadTolerance) / 3;
  const vtSpread = spread("thresholdSpread", spreadOptions.thresholdSpread);
  const knSpread = spread("aspectRatioSpread", spreadOptions.aspectRatioSpread);
  const current = _mosTailCurrent(core, inputCommonMode);
  const rd = core.load.kind === "resistors" ? core.load.resistance : Number.NaN;
  const kn = core.transconductanceParameter;
  const mirror = core.load.kind === "mirror";
  const trials = spreadOptions.trials;
  const cmrrDb = new Float64Array(Math.max(0, Math.floor(trials)) || 1);
  const offset = new Float64Array(cmrrDb.length);
  const sink = { cmrrDb: 0, offset: 0 };
  monteCarlo(trials, (random: Random, i: number) => {
    const dVt = draw(random, vtSpread);
    const dKn = draw(random, knSpread);
    const parts: _MosParts = {
      rd1: rd * (1 + draw(random, tolerance)),
      rd2: rd * (1 + draw(random, tolerance)),
      kn1: kn * (1 + dKn / 2),
      kn2: kn * (1 - dKn / 2),
      vt1: core.threshold + dVt / 2,
      vt2: core.threshold - dVt / 2,
    };
    _mosTrial(core, current, inputCommonMode, parts, sink);
    cmrrDb[i] = sink.cmrrDb;
    offset[i] = sink.offset;
    return i;
  }, { seed: spreadOptions.seed });
  return summarise(cmrrDb, offset, mirror ? "singleEnded" : "differential");
}
