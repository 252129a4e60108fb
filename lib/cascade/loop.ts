/**
 * A feedback loop over frequency: loop gain T(f) = A(f)·β(f), its gain and phase margins
 * found numerically, and the closed-loop response A/(1 + Aβ).
 *
 * ```
 *  |T| dB                       phase of T
 *   │‾‾‾‾╲                        0 ─────╮
 *   │     ╲                              ╰╮
 *  0┼──────●───── crossover fc           │  PM = 180° + phase(fc)
 *   │       ╲                   −180 ┄┄┄┄┄┄●┄ phase crossover: GM = −|T| dB there
 *   └───────────▶ log f
 * ```
 *
 * The margins come from a log-spaced scan that brackets each crossing, then bisection on
 * log f. The phase is unwrapped from `minimumFrequency` upward, so a loop whose phase passes
 * −180° is not mistaken for one near 0°.
 *
 * @module
 */
import { requirePositive } from "../_validate.ts";
import { atLeast, type CheckResult } from "../checks/check.ts";
import { emptySweep, finishSweep, type FrequencyResponse, type FrequencySweep } from "./sweep.ts";
import type { Complex } from "./two_port.ts";

/** Options for {@linkcode loopMargins}. */
export interface LoopMarginOptions {
  /**
   * Lowest frequency of the search in Hz; the loop gain there sets the phase reference.
   * @default {1}
   */
  minimumFrequency?: number;
  /**
   * Highest frequency of the search in Hz.
   * @default {1e10}
   */
  maximumFrequency?: number;
  /**
   * Scan density before bisection; raise it for loops with sharp resonances.
   * @default {40}
   */
  pointsPerDecade?: number;
}

/** Gain and phase margins of a loop. */
export interface LoopMargins {
  /** Loop-gain crossover in Hz, where |T| falls through 1 (the highest such frequency); NaN when |T| never reaches 1, or stays above 1 at `maximumFrequency`. */
  crossoverFrequency: number;
  /** 180° + phase of T at the crossover, in °; Infinity when |T| < 1 everywhere, NaN when |T| > 1 at the top of the range. */
  phaseMargin: number;
  /** First frequency in Hz where the unwrapped phase of T reaches −180°; NaN when it never does. */
  phaseCrossoverFrequency: number;
  /** −20·log10|T| at the phase crossover, in dB; Infinity when the phase never reaches −180°. */
  gainMargin: number;
  /** |T| at `minimumFrequency`. */
  lowFrequencyLoopGain: number;
}

const RAD = 180 / Math.PI;

function argDegrees(z: Complex): number {
  return Math.atan2(z.im, z.re) * RAD;
}

function logMagnitude(z: Complex): number {
  return Math.log(Math.hypot(z.re, z.im));
}

function wrap180(degrees: number): number {
  return degrees - 360 * Math.round(degrees / 360);
}

/** Bisects g(log10 f) = 0 between two log-frequencies where g changes sign. */
function bisectLog(g: (f: number) => number, lo: number, hi: number, gLo: number): number {
  if (gLo === 0) return 10 ** lo;
  for (let i = 0; i < 60 && hi - lo > 1e-13; i++) {
    const mid = 0.5 * (lo + hi);
    const gm = g(10 ** mid);
    if ((gm > 0) === (gLo > 0)) {
      lo = mid;
      gLo = gm;
    } else {
      hi = mid;
    }
  }
  return 10 ** (0.5 * (lo + hi));
}

/**
 * Finds the gain and phase margins of a loop gain T(f) numerically.
 *
 * For negative feedback T must be positive (phase near 0°) at `minimumFrequency`; with an
 * inverting forward path, give β the same sign as A.
 *
 * @param loopGain T(f) = A(f)·β(f).
 * @param options Search range and density.
 * @returns Crossover frequency, phase margin, phase crossover and gain margin.
 * @throws {RangeError} If the range is not positive and increasing, or T at
 * `minimumFrequency` exceeds 1 with a phase beyond ±150° (positive feedback: check β's sign).
 *
 * @example An integrator with one extra pole at √3 times the crossover: 60°
 * ```ts
 * import { loopMargins } from "./loop.ts";
 * import { ok } from "node:assert/strict";
 * // Integrator gain chosen so that |T| = 1 exactly at 1 MHz, with the pole at √3 MHz.
 * const fu = 2e6 / Math.sqrt(3), fp = Math.sqrt(3) * 1e6;
 * const t = (f: number) => {
 *   // fu / (jf · (1 + jf/fp))
 *   const re = -f * f / fp, im = f, d = re * re + im * im;
 *   return { re: fu * re / d, im: -fu * im / d };
 * };
 * const m = loopMargins(t, { minimumFrequency: 10 });
 * ok(Math.abs(m.phaseMargin - 60) < 1e-6);
 * ok(Math.abs(m.crossoverFrequency - 1e6) < 1e-3);
 * ```
 */
export function loopMargins(
  loopGain: FrequencyResponse,
  options: LoopMarginOptions = {},
): LoopMargins {
  const fMin = options.minimumFrequency ?? 1;
  const fMax = options.maximumFrequency ?? 1e10;
  const perDecade = options.pointsPerDecade ?? 40;
  requirePositive("minimumFrequency", fMin, "Hz");
  requirePositive("maximumFrequency", fMax, "Hz");
  requirePositive("pointsPerDecade", perDecade);
  if (!(fMax > fMin)) {
    throw new RangeError(
      `Expected maximumFrequency to be above minimumFrequency (${fMin} Hz), but found ${fMax}`,
    );
  }
  const lo = Math.log10(fMin);
  const hi = Math.log10(fMax);
  const steps = Math.max(2, Math.ceil((hi - lo) * perDecade));

  const t = loopGain(fMin);
  let mag = Math.hypot(t.re, t.im);
  let wrapped = Math.atan2(t.im, t.re) * RAD;
  const lowFrequencyLoopGain = mag;
  // A sign error shows as about ±180° at the bottom of the range; an integrator sits at −90°.
  if (mag > 1 && Math.abs(wrapped) > 150) {
    throw new RangeError(
      `Expected the loop gain at minimumFrequency to have a phase within ±150° (negative feedback), but found ${
        wrapped.toFixed(1)
      }°: give feedbackFactor the sign of the forward gain`,
    );
  }
  let phase = wrapped;

  let crossoverFrequency = Number.NaN;
  let phaseAtCrossover = Number.NaN;
  let phaseCrossoverFrequency = Number.NaN;
  let magAtPhaseCrossover = Number.NaN;
  let everAboveOne = mag >= 1;

  for (let k = 1; k <= steps; k++) {
    const x0 = lo + ((k - 1) * (hi - lo)) / steps;
    const x1 = lo + (k * (hi - lo)) / steps;
    const t1 = loopGain(10 ** x1);
    const mag1 = Math.hypot(t1.re, t1.im);
    const wrapped1 = Math.atan2(t1.im, t1.re) * RAD;
    const phase1 = phase + wrap180(wrapped1 - wrapped);
    if (mag >= 1 && mag1 < 1) {
      // The highest fall through |T| = 1 wins: later brackets overwrite earlier ones.
      const f = bisectLog((ff) => logMagnitude(loopGain(ff)), x0, x1, Math.log(mag));
      crossoverFrequency = f;
      phaseAtCrossover = phase + wrap180(argDegrees(loopGain(f)) - wrapped);
    }
    if (mag1 >= 1) everAboveOne = true;
    if (Number.isNaN(phaseCrossoverFrequency) && phase > -180 && phase1 <= -180) {
      const base = phase + 180;
      const baseWrapped = wrapped;
      const f = bisectLog(
        (ff) => base + wrap180(argDegrees(loopGain(ff)) - baseWrapped),
        x0,
        x1,
        base,
      );
      phaseCrossoverFrequency = f;
      magAtPhaseCrossover = Math.exp(logMagnitude(loopGain(f)));
    }
    mag = mag1;
    wrapped = wrapped1;
    phase = phase1;
  }

  let phaseMargin: number;
  if (!everAboveOne) phaseMargin = Infinity;
  else if (mag >= 1 || Number.isNaN(crossoverFrequency)) phaseMargin = Number.NaN;
  else phaseMargin = 180 + phaseAtCrossover;
  if (mag >= 1) crossoverFrequency = Number.NaN;
  return {
    crossoverFrequency,
    phaseMargin,
    phaseCrossoverFrequency,
    gainMargin: Number.isNaN(phaseCrossoverFrequency)
      ? Infinity
      : -20 * Math.log10(magAtPhaseCrossover),
    lowFrequencyLoopGain,
  };
}

/** Options for {@linkcode feedbackLoop}. */
export interface FeedbackLoopOptions extends LoopMarginOptions {
  /** Feedback factor β: a number (resistive divider) or a function of frequency. */
  feedbackFactor: number | FrequencyResponse;
  /** Open-loop output impedance in Ω (number or function of frequency); enables `outputImpedanceAt`. */
  openLoopOutputImpedance?: number | FrequencyResponse;
  /**
   * Smallest acceptable phase margin in ° (at least 45°, 60° the usual target: [AH3] ch. 6, [GHLM5] ch. 9).
   * @default {45}
   */
  minimumPhaseMargin?: number;
  /**
   * Smallest acceptable gain margin in dB (common practice, no source).
   * @default {10}
   */
  minimumGainMargin?: number;
}

/** Closed-loop and loop-gain sweeps over the same frequencies. */
export interface FeedbackSweep {
  /** Loop gain T = Aβ. */
  loopGain: FrequencySweep;
  /** Closed-loop gain A/(1 + Aβ). */
  closedLoop: FrequencySweep;
}

/** The result of {@linkcode feedbackLoop}. */
export interface FeedbackLoopResult extends LoopMargins {
  /** |A/(1 + Aβ)| at `minimumFrequency`. */
  lowFrequencyClosedLoopGain: number;
  /** First frequency in Hz above `minimumFrequency` where the closed-loop gain is 3 dB below its low-frequency value; NaN when it stays within 3 dB. */
  closedLoopBandwidth: number;
  /** T(f) = A(f)·β(f). */
  loopGainAt(frequency: number): Complex;
  /** A(f)/(1 + A(f)β(f)). */
  closedLoopAt(frequency: number): Complex;
  /** Zout(f)/(1 + T(f)) in Ω; only when `openLoopOutputImpedance` was given. */
  outputImpedanceAt?: (frequency: number) => Complex;
  /** Loop gain and closed-loop gain over `frequencies` (Hz, ascending). */
  sweep(frequencies: ArrayLike<number>): FeedbackSweep;
  /** Phase margin and gain margin checks. */
  checks: CheckResult[];
}

/**
 * Closes a feedback loop over frequency around a forward gain A(f) (for example a
 * cascade's `gainAt`), and finds its margins, closed-loop bandwidth and response.
 *
 * @param forward A(f), the open-loop gain with its loading.
 * @param options β, search range and the margin requirements.
 * @returns Margins, closed-loop bandwidth, response functions, sweeps and checks.
 * @throws {RangeError} As {@linkcode loopMargins}, or if a requirement is not finite.
 *
 * @example A single pole at 100 Hz, A0 = 10⁵, β = 0.05: closed-loop bandwidth 500.1 kHz
 * ```ts
 * import { feedbackLoop } from "./loop.ts";
 * import { ok, equal } from "node:assert/strict";
 * const a = (f: number) => {
 *   const x = f / 100, d = 1 + x * x;
 *   return { re: 1e5 / d, im: -1e5 * x / d };
 * };
 * const loop = feedbackLoop(a, { feedbackFactor: 0.05 });
 * ok(Math.abs(loop.closedLoopBandwidth - 500.1e3) < 1);
 * ok(Math.abs(loop.phaseMargin - 90.01) < 0.01);
 * equal(loop.checks.every((c) => c.pass), true);
 * ```
 */
export function feedbackLoop(
  forward: FrequencyResponse,
  options: FeedbackLoopOptions,
): FeedbackLoopResult {
  const beta = options.feedbackFactor;
  const betaAt: FrequencyResponse = typeof beta === "number"
    ? (() => {
      if (!Number.isFinite(beta)) {
        throw new RangeError(`Expected feedbackFactor to be a finite number, but found ${beta}`);
      }
      const b = { re: beta, im: 0 };
      return () => b;
    })()
    : beta;
  const minimumPhaseMargin = options.minimumPhaseMargin ?? 45;
  const minimumGainMargin = options.minimumGainMargin ?? 10;
  if (!Number.isFinite(minimumPhaseMargin)) {
    throw new RangeError(
      `Expected minimumPhaseMargin to be finite, but found ${minimumPhaseMargin}`,
    );
  }
  if (!Number.isFinite(minimumGainMargin)) {
    throw new RangeError(`Expected minimumGainMargin to be finite, but found ${minimumGainMargin}`);
  }

  const loopGainAt = (f: number): Complex => {
    const a = forward(f);
    const b = betaAt(f);
    return { re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re };
  };
  const closedLoopAt = (f: number): Complex => {
    const a = forward(f);
    const b = betaAt(f);
    const dr = 1 + a.re * b.re - a.im * b.im;
    const di = a.re * b.im + a.im * b.re;
    const dd = dr * dr + di * di;
    return { re: (a.re * dr + a.im * di) / dd, im: (a.im * dr - a.re * di) / dd };
  };

  const margins = loopMargins(loopGainAt, options);
  const fMin = options.minimumFrequency ?? 1;
  const fMax = options.maximumFrequency ?? 1e10;
  const perDecade = options.pointsPerDecade ?? 40;
  const low = closedLoopAt(fMin);
  const lowMag = Math.hypot(low.re, low.im);
  const target = lowMag / Math.SQRT2;
  let closedLoopBandwidth = Number.NaN;
  {
    const lo = Math.log10(fMin);
    const hi = Math.log10(fMax);
    const steps = Math.max(2, Math.ceil((hi - lo) * perDecade));
    const g = (f: number) => {
      const z = closedLoopAt(f);
      return Math.log(Math.hypot(z.re, z.im) / target);
    };
    let g0 = g(fMin);
    for (let k = 1; k <= steps; k++) {
      const x0 = lo + ((k - 1) * (hi - lo)) / steps;
      const x1 = lo + (k * (hi - lo)) / steps;
      const g1 = g(10 ** x1);
      if (g0 > 0 && g1 <= 0) {
        closedLoopBandwidth = bisectLog(g, x0, x1, g0);
        break;
      }
      g0 = g1;
    }
  }

  const zOut = options.openLoopOutputImpedance;
  let outputImpedanceAt: ((frequency: number) => Complex) | undefined;
  if (zOut !== undefined) {
    if (typeof zOut === "number" && !(zOut >= 0 && Number.isFinite(zOut))) {
      throw new RangeError(
        `Expected openLoopOutputImpedance to be at least 0 Ω, but found ${zOut}`,
      );
    }
    const zAt: FrequencyResponse = typeof zOut === "number" ? () => ({ re: zOut, im: 0 }) : zOut;
    outputImpedanceAt = (f: number) => {
      const z = zAt(f);
      const t = loopGainAt(f);
      const dr = 1 + t.re;
      const di = t.im;
      const dd = dr * dr + di * di;
      return { re: (z.re * dr + z.im * di) / dd, im: (z.im * dr - z.re * di) / dd };
    };
  }

  const sweep = (frequencies: ArrayLike<number>): FeedbackSweep => {
    const loop = emptySweep(frequencies);
    const closed = emptySweep(frequencies);
    for (let i = 0; i < frequencies.length; i++) {
      const f = frequencies[i];
      const a = forward(f);
      const b = betaAt(f);
      const tr = a.re * b.re - a.im * b.im;
      const ti = a.re * b.im + a.im * b.re;
      loop.re[i] = tr;
      loop.im[i] = ti;
      const dr = 1 + tr;
      const dd = dr * dr + ti * ti;
      closed.re[i] = (a.re * dr + a.im * ti) / dd;
      closed.im[i] = (a.im * dr - a.re * ti) / dd;
    }
    finishSweep(loop);
    finishSweep(closed);
    return { loopGain: loop, closedLoop: closed };
  };

  const result: FeedbackLoopResult = {
    ...margins,
    lowFrequencyClosedLoopGain: lowMag,
    closedLoopBandwidth,
    loopGainAt,
    closedLoopAt,
    sweep,
    checks: loopChecks(margins, { minimumPhaseMargin, minimumGainMargin }),
  };
  if (outputImpedanceAt) result.outputImpedanceAt = outputImpedanceAt;
  return result;
}

/** Options for {@linkcode loopChecks}. */
export interface LoopCheckOptions {
  /**
   * Smallest acceptable phase margin in ° ([AH3] ch. 6, [GHLM5] ch. 9: 45° minimum, 60° usual target).
   * @default {45}
   */
  minimumPhaseMargin?: number;
  /**
   * Smallest acceptable gain margin in dB (common practice, no source).
   * @default {10}
   */
  minimumGainMargin?: number;
}

/**
 * Phase-margin and gain-margin checks for a loop.
 *
 * @param margins The margins of a loop.
 * @param options The requirements.
 * @returns A `"phase margin"` check in ° and a `"gain margin"` check in dB; a margin that is
 * infinite (|T| never reaches 1, or the phase never reaches −180°) gets no check.
 *
 * @example 61.1° passes a 60° requirement
 * ```ts
 * import { loopChecks } from "./loop.ts";
 * import { equal } from "node:assert/strict";
 * const checks = loopChecks({ phaseMargin: 61.1, gainMargin: Infinity }, { minimumPhaseMargin: 60 });
 * equal(checks.length, 1);
 * equal(checks[0].pass, true);
 * ```
 */
export function loopChecks(
  margins: Pick<LoopMargins, "phaseMargin" | "gainMargin">,
  options: LoopCheckOptions = {},
): CheckResult[] {
  const pm = options.minimumPhaseMargin ?? 45;
  const gm = options.minimumGainMargin ?? 10;
  // An infinite margin means the loop never reaches that limit: nothing to check there.
  const checks: CheckResult[] = [];
  if (margins.phaseMargin !== Infinity) {
    checks.push(atLeast("phase margin", margins.phaseMargin, pm, { unit: "°" }));
  }
  if (margins.gainMargin !== Infinity) {
    checks.push(atLeast("gain margin", margins.gainMargin, gm, { unit: "dB" }));
  }
  return checks;
}

/** Options for {@linkcode phaseMarginEstimate}. */
export interface PhaseMarginEstimateOptions {
  /** Non-dominant pole frequencies in Hz. */
  poleFrequencies?: number[];
  /** Right-half-plane zero frequencies in Hz (they lag, like poles). */
  rightHalfPlaneZeroFrequencies?: number[];
  /** Left-half-plane zero frequencies in Hz (they lead). */
  leftHalfPlaneZeroFrequencies?: number[];
}

/**
 * Dominant-pole estimate of phase margin at a crossover fc: 90° − Σ atan(fc/fp)
 * − Σ atan(fc/fz,RHP) + Σ atan(fc/fz,LHP) ([GHLM5] ch. 9, [AH3] ch. 6).
 *
 * It can be several degrees off the exact value; say which one a check uses.
 *
 * @param crossoverFrequency fc in Hz.
 * @param options The extra poles and zeros.
 * @returns The estimated phase margin in °.
 * @throws {RangeError} If a frequency is not above 0 Hz.
 *
 * @example 499.6 kHz crossover with an output-stage pole at 3 MHz
 * ```ts
 * import { phaseMarginEstimate } from "./loop.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(phaseMarginEstimate(499.6e3, { poleFrequencies: [3e6] }) - 80.545) < 1e-3);
 * ```
 */
export function phaseMarginEstimate(
  crossoverFrequency: number,
  options: PhaseMarginEstimateOptions = {},
): number {
  requirePositive("crossoverFrequency", crossoverFrequency, "Hz");
  let pm = 90;
  const lag = (list: number[] | undefined, name: string, sign: number) => {
    for (const f of list ?? []) {
      requirePositive(name, f, "Hz");
      pm -= sign * Math.atan(crossoverFrequency / f) * RAD;
    }
  };
  lag(options.poleFrequencies, "poleFrequencies[]", 1);
  lag(options.rightHalfPlaneZeroFrequencies, "rightHalfPlaneZeroFrequencies[]", 1);
  lag(options.leftHalfPlaneZeroFrequencies, "leftHalfPlaneZeroFrequencies[]", -1);
  return pm;
}
