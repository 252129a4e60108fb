/**
 * A chain of voltage-amplifier stages between a source and a load, with the loading at every
 * interface.
 *
 * ```
 *   vs ─Rs─┬─[stage 1]─Zout1─┬─[stage 2]─Zout2─┬─ … ─Zout,n─┬─ load
 *          Zin1              Zin2              Zin3          ZL
 *
 *   Av = k0 · Avo1 · k1 · Avo2 · k2 · … · Avo,n · kn,   ki = Zin,i+1 / (Zout,i + Zin,i+1)
 * ```
 *
 * Every factor is complex over frequency, so phases add along the chain (multiply complex
 * numbers, never magnitudes, once anything is reactive).
 *
 * @module
 */
import { requireFinite, requireNonNegative } from "../_validate.ts";
import { atLeast, type CheckResult } from "../checks/check.ts";
import { requirePositiveOrInfinite } from "./_require.ts";
import { emptySweep, finishSweep, type FrequencySweep } from "./sweep.ts";
import type { Complex, TwoPort, TwoPortAt } from "./two_port.ts";

/** Options for {@linkcode cascade}. */
export interface CascadeOptions {
  /** The stages, first (driven by the source) to last (driving the load). */
  stages: TwoPort[];
  /**
   * Source resistance Rs in Ω.
   * @default {0}
   */
  sourceResistance?: number;
  /**
   * Load resistance RL in Ω (`Infinity` for an open output).
   * @default {Infinity}
   */
  loadResistance?: number;
  /**
   * Capacitance across the load in F (cable, next input); used over frequency only.
   * @default {0}
   */
  loadCapacitance?: number;
}

/** The loading at one interface: how much of a driver's open-circuit voltage arrives. */
export interface InterfaceLoading {
  /** Driving side: `"source"` or a stage name. */
  from: string;
  /** Driven side: a stage name or `"load"`. */
  to: string;
  /** Driving resistance (Rs or Zout) in Ω. */
  drivingResistance: number;
  /** Driven resistance (Zin or RL) in Ω. */
  drivenResistance: number;
  /** Loading factor Zin/(Zout + Zin) at mid-band, in (0, 1]. */
  factor: number;
  /** Gain lost to the loading in dB, −20·log10(factor) (positive: a loss). */
  lossDb: number;
  /** One line for a notebook, e.g. `"VAS costs input pair 6.02 dB"`. */
  summary: string;
}

/** One stage's gain inside the chain. */
export interface CascadeStageGain {
  /** Stage name. */
  name: string;
  /** Open-circuit gain Avo (unloaded). */
  openCircuitGain: number;
  /** Gain into what it actually drives: Avo times the factor of its output interface. */
  loadedGain: number;
}

/** The chain's values at one frequency. */
export interface CascadeAt {
  /** Frequency in Hz. */
  frequency: number;
  /** Overall gain from source voltage to load voltage. */
  gain: Complex;
  /** |gain| in dB. */
  magnitudeDb: number;
  /** Phase of the gain in degrees, in (−180°, 180°]. */
  phaseDegrees: number;
  /** Loading factor of each interface (source → stage 1, …, last stage → load). */
  factors: Complex[];
  /** Each stage's loaded gain. */
  loadedGains: Complex[];
}

/** The result of {@linkcode cascade}. */
export interface CascadeResult {
  /** Per-stage gains at mid-band. */
  stages: CascadeStageGain[];
  /** Every interface at mid-band, source first and load last (stages + 1 entries). */
  interfaces: InterfaceLoading[];
  /** Product of the open-circuit gains, ΠAvo (what the chain would give with no loading). */
  unloadedGain: number;
  /** Overall mid-band gain from source voltage to load voltage. */
  gain: number;
  /** |gain| in dB. */
  gainDb: number;
  /** Input resistance of the first stage in Ω. */
  inputResistance: number;
  /** Output resistance of the last stage in Ω. */
  outputResistance: number;
  /** Overall gain at `frequency` in Hz (fast: for sweeps and loop analysis). */
  gainAt(frequency: number): Complex;
  /** Output impedance of the last stage at `frequency` in Hz. */
  outputImpedanceAt(frequency: number): Complex;
  /** Everything at one frequency: gain, dB, phase, each factor and each loaded gain. */
  at(frequency: number): CascadeAt;
  /** Overall gain over `frequencies` (Hz, ascending), phase unwrapped. */
  sweep(frequencies: ArrayLike<number>): FrequencySweep;
  /** Loading checks: every factor at least 0.9 (common practice, no source). */
  checks: CheckResult[];
}

function flat(stage: TwoPort): TwoPortAt {
  return {
    inputImpedance: { re: stage.inputResistance, im: 0 },
    openCircuitGain: { re: stage.openCircuitGain, im: 0 },
    outputImpedance: { re: stage.outputResistance, im: 0 },
  };
}

/**
 * Joins a source, a list of stages and a load, and works out the loading at every interface,
 * the loaded gain of every stage and the overall gain, at mid-band and over frequency.
 *
 * Each stage's `openCircuitGain` must be its unloaded gain: the cascade applies the loading,
 * so a gain that already assumes a load would count it twice.
 *
 * @param options Stages, source and load.
 * @returns Gains, interface losses, frequency-response functions and loading checks.
 * @throws {RangeError} If there are no stages, a resistance is out of range (Rs or a stage's
 * output resistance negative or infinite, an input resistance or RL not above 0 Ω), the load
 * capacitance is negative, or a gain is not finite.
 *
 * @example A second stage that halves the first one's output
 * ```ts
 * import { cascade } from "./cascade.ts";
 * import { ok, equal } from "node:assert/strict";
 * const chain = cascade({
 *   stages: [
 *     { name: "input pair", inputResistance: 1e6, openCircuitGain: 40, outputResistance: 10e3 },
 *     { name: "VAS", inputResistance: 10e3, openCircuitGain: -500, outputResistance: 1e3 },
 *   ],
 * });
 * equal(chain.interfaces[1].summary, "VAS costs input pair 6.021 dB");
 * ok(Math.abs(chain.gain + 10000) < 1e-9);
 * equal(chain.checks[1].pass, false);
 * ```
 */
export function cascade(options: CascadeOptions): CascadeResult {
  const stages = options.stages;
  if (!Array.isArray(stages) || stages.length === 0) {
    throw new RangeError(
      `Expected stages to hold at least one stage, but found ${
        Array.isArray(stages) ? 0 : String(stages)
      }`,
    );
  }
  const sourceResistance = options.sourceResistance ?? 0;
  const loadResistance = options.loadResistance ?? Infinity;
  const loadCapacitance = options.loadCapacitance ?? 0;
  requireNonNegative("sourceResistance", sourceResistance, "Ω");
  requirePositiveOrInfinite("loadResistance", loadResistance, "Ω");
  requireNonNegative("loadCapacitance", loadCapacitance, "F");
  const names = stages.map((s, i) => s.name || `stage ${i + 1}`);
  stages.forEach((s, i) => {
    requirePositiveOrInfinite(`stages[${i}].inputResistance`, s.inputResistance, "Ω");
    requireFinite(`stages[${i}].openCircuitGain`, s.openCircuitGain);
    requireNonNegative(`stages[${i}].outputResistance`, s.outputResistance, "Ω");
  });

  const interfaces: InterfaceLoading[] = [];
  const addInterface = (from: string, to: string, driving: number, driven: number) => {
    const factor = driven === Infinity ? 1 : driven / (driving + driven);
    const lossDb = -20 * Math.log10(factor);
    const summary = from === "source"
      ? `${to} costs the source ${lossDb.toPrecision(4)} dB`
      : to === "load"
      ? `the load costs ${from} ${lossDb.toPrecision(4)} dB`
      : `${to} costs ${from} ${lossDb.toPrecision(4)} dB`;
    interfaces.push({
      from,
      to,
      drivingResistance: driving,
      drivenResistance: driven,
      factor,
      lossDb,
      summary,
    });
  };
  addInterface("source", names[0], sourceResistance, stages[0].inputResistance);
  for (let i = 0; i < stages.length; i++) {
    const next = i + 1 < stages.length ? stages[i + 1].inputResistance : loadResistance;
    addInterface(
      names[i],
      i + 1 < stages.length ? names[i + 1] : "load",
      stages[i].outputResistance,
      next,
    );
  }

  const stageGains: CascadeStageGain[] = stages.map((s, i) => ({
    name: names[i],
    openCircuitGain: s.openCircuitGain,
    loadedGain: s.openCircuitGain * interfaces[i + 1].factor,
  }));
  const gain = stageGains.reduce((g, s) => g * s.loadedGain, interfaces[0].factor);
  const unloadedGain = stages.reduce((g, s) => g * s.openCircuitGain, 1);

  // Flat stages get their complex view once, so sweeps allocate only inside stages' at().
  const flats = stages.map((s) => (s.at ? undefined : flat(s)));
  const view = (i: number, f: number): TwoPortAt => flats[i] ?? stages[i].at!(f);
  const twoPi = 2 * Math.PI;
  const loadConductance = 1 / loadResistance;

  // Multiplies the running gain (gr, gi) by Zin/(Zo + Zin), then by Avo; all inline.
  const gainAt = (frequency: number): Complex => {
    let gr = 1;
    let gi = 0;
    let zoR = sourceResistance;
    let zoI = 0;
    for (let i = 0; i <= stages.length; i++) {
      let ziR: number;
      let ziI: number;
      let last: TwoPortAt | undefined;
      if (i < stages.length) {
        last = view(i, frequency);
        ziR = last.inputImpedance.re;
        ziI = last.inputImpedance.im;
      } else {
        const b = twoPi * frequency * loadCapacitance;
        const d = loadConductance * loadConductance + b * b;
        ziR = d === 0 ? Infinity : loadConductance / d;
        ziI = d === 0 ? 0 : -b / d;
      }
      if (Number.isFinite(ziR) && Number.isFinite(ziI)) {
        const dr = zoR + ziR;
        const di = zoI + ziI;
        const dd = dr * dr + di * di;
        const kr = (ziR * dr + ziI * di) / dd;
        const ki = (ziI * dr - ziR * di) / dd;
        const t = gr * kr - gi * ki;
        gi = gr * ki + gi * kr;
        gr = t;
      }
      if (last) {
        const a = last.openCircuitGain;
        const t = gr * a.re - gi * a.im;
        gi = gr * a.im + gi * a.re;
        gr = t;
        zoR = last.outputImpedance.re;
        zoI = last.outputImpedance.im;
      }
    }
    return { re: gr, im: gi };
  };

  const at = (frequency: number): CascadeAt => {
    requireNonNegative("frequency", frequency, "Hz");
    const factors: Complex[] = [];
    const loadedGains: Complex[] = [];
    let zo: Complex = { re: sourceResistance, im: 0 };
    let g: Complex = { re: 1, im: 0 };
    const views = stages.map((_, i) => view(i, frequency));
    for (let i = 0; i <= stages.length; i++) {
      let zi: Complex;
      if (i < stages.length) {
        zi = views[i].inputImpedance;
      } else {
        const b = twoPi * frequency * loadCapacitance;
        const d = loadConductance * loadConductance + b * b;
        zi = d === 0 ? { re: Infinity, im: 0 } : { re: loadConductance / d, im: -b / d };
      }
      const k = dividerRatio(zo, zi);
      factors.push(k);
      if (i > 0) {
        const a = views[i - 1].openCircuitGain;
        loadedGains.push(multiply(a, k));
      }
      if (i < stages.length) zo = views[i].outputImpedance;
    }
    g = multiply(g, factors[0]);
    for (const lg of loadedGains) g = multiply(g, lg);
    return {
      frequency,
      gain: g,
      magnitudeDb: 20 * Math.log10(Math.hypot(g.re, g.im)),
      phaseDegrees: Math.atan2(g.im, g.re) * (180 / Math.PI),
      factors,
      loadedGains,
    };
  };

  const sweep = (frequencies: ArrayLike<number>): FrequencySweep => {
    const out = emptySweep(frequencies);
    for (let i = 0; i < frequencies.length; i++) {
      const g = gainAt(frequencies[i]);
      out.re[i] = g.re;
      out.im[i] = g.im;
    }
    finishSweep(out);
    return out;
  };

  const lastStage = stages.length - 1;
  return {
    stages: stageGains,
    interfaces,
    unloadedGain,
    gain,
    gainDb: 20 * Math.log10(Math.abs(gain)),
    inputResistance: stages[0].inputResistance,
    outputResistance: stages[lastStage].outputResistance,
    gainAt,
    outputImpedanceAt: (frequency: number) => {
      const z = view(lastStage, frequency).outputImpedance;
      return { re: z.re, im: z.im };
    },
    at,
    sweep,
    checks: loadingChecks(interfaces),
  };
}

function multiply(a: Complex, b: Complex): Complex {
  return { re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re };
}

function dividerRatio(zo: Complex, zi: Complex): Complex {
  if (!Number.isFinite(zi.re) || !Number.isFinite(zi.im)) return { re: 1, im: 0 };
  const dr = zo.re + zi.re;
  const di = zo.im + zi.im;
  const dd = dr * dr + di * di;
  return { re: (zi.re * dr + zi.im * di) / dd, im: (zi.im * dr - zi.re * di) / dd };
}

/** Options for {@linkcode loadingChecks}. */
export interface LoadingCheckOptions {
  /**
   * Smallest acceptable loading factor (common practice, no source).
   * @default {0.9}
   */
  minimumFactor?: number;
}

/**
 * One design check per interface: the loading factor must be at least `minimumFactor`
 * (0.9 unless given: common practice, no source). A failing check says which stage to
 * buffer.
 *
 * @param interfaces The interfaces of a {@linkcode CascadeResult}.
 * @param options The limit.
 * @returns One check per interface, named like `"loading of input pair by VAS"`.
 * @throws {RangeError} If `minimumFactor` is not in [0, 1].
 *
 * @example A 0.95 factor passes, a 0.6667 one fails
 * ```ts
 * import { cascade, loadingChecks } from "./cascade.ts";
 * import { deepEqual } from "node:assert/strict";
 * const chain = cascade({
 *   stages: [{ name: "VAS", inputResistance: 1e5, openCircuitGain: -1000, outputResistance: 10e3 }],
 *   sourceResistance: 5e3,
 *   loadResistance: 20e3,
 * });
 * deepEqual(loadingChecks(chain.interfaces).map((c) => c.pass), [true, false]);
 * deepEqual(loadingChecks(chain.interfaces, { minimumFactor: 0.5 }).map((c) => c.pass), [true, true]);
 * ```
 */
export function loadingChecks(
  interfaces: InterfaceLoading[],
  options: LoadingCheckOptions = {},
): CheckResult[] {
  const minimum = options.minimumFactor ?? 0.9;
  if (!(minimum >= 0 && minimum <= 1)) {
    throw new RangeError(`Expected minimumFactor to be between 0 and 1, but found ${minimum}`);
  }
  const label = (name: string) => name === "source" || name === "load" ? `the ${name}` : name;
  return interfaces.map((x) =>
    atLeast(`loading of ${label(x.from)} by ${label(x.to)}`, x.factor, minimum)
  );
}
