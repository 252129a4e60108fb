/**
 * Pieces shared by the BJT and MOSFET pairs: validation, tail normalisation, bias-room errors,
 * gains, decibels, offset totals, distortion series, linear range, slew rate, the two-port view
 * and the checks both pairs offer.
 *
 * @module
 */
import { requireBelow, requireFinite, requireInRange, requirePositive } from "../_validate.ts";
import { harmonics } from "../analysis/harmonics.ts";
import { atLeast, atMost, type CheckResult } from "../checks/check.ts";
import type { TwoPort } from "../cascade/two_port.ts";
import type { _PairResponse } from "./_network.ts";
import type {
  PairCmrr,
  PairGain,
  PairInputCommonModeRange,
  PairNoise,
  PairOffset,
  PairOutput,
  PairOutputResistance,
  PairRequirements,
  PairSlew,
  PairTail,
  PairThirdHarmonic,
} from "./pair_types.ts";

/** Default voltage a tail source needs across it, V (common practice, no source). */
export const _DEFAULT_COMPLIANCE = 0.5;

/** Like requirePositive, but `Infinity` is allowed (an ideal source, β → ∞, no Early effect). */
export function _requirePositiveOrInfinite(name: string, value: unknown, unit: string): number {
  if (value === Infinity) return Infinity;
  requirePositive(name, value, unit);
  return value;
}

/** A value in an error message: six significant digits, no trailing zeros. */
export function _show(value: number): string {
  return String(Number(value.toPrecision(6)));
}

/** Throws unless the options argument is an object at all. */
export function _requireOptionsObject(options: unknown): void {
  if (options === null || typeof options !== "object") {
    throw new TypeError(`Expected options to be an object, but found ${options}`);
  }
}

/** The error for a load whose kind is neither "resistors" nor "mirror". */
export function _unknownLoadKind(load: unknown): TypeError {
  return new TypeError(
    `Expected load.kind to be "resistors" or "mirror", but found ${
      JSON.stringify((load as { kind?: unknown } | undefined)?.kind)
    }`,
  );
}

/** Normalised tail. */
export interface _Tail {
  kind: PairTail["kind"];
  /** Current in A, NaN for a resistor tail (it follows from the bias). */
  current: number;
  /** Small-signal resistance REE, Ω. */
  resistance: number;
  /** Voltage the source needs across it, V (0 for a resistor). */
  compliance: number;
}

export function _normalizeTail(tail: PairTail): _Tail {
  if (tail === null || typeof tail !== "object") {
    throw new TypeError(`Expected tail to be an object with a kind, but found ${tail}`);
  }
  switch (tail.kind) {
    case "source":
    case "mirror": {
      requirePositive("tail.current", tail.current, "A");
      const resistance = tail.kind === "source"
        ? _requirePositiveOrInfinite(
          "tail.outputResistance",
          tail.outputResistance ?? Infinity,
          "Ω",
        )
        : _requirePositiveOrInfinite("tail.outputResistance", tail.outputResistance, "Ω");
      const compliance = tail.compliance ?? _DEFAULT_COMPLIANCE;
      requireFinite("tail.compliance", compliance);
      if (compliance < 0) {
        throw new RangeError(
          `Expected tail.compliance to be at least 0 V, but found ${compliance}`,
        );
      }
      return { kind: tail.kind, current: tail.current, resistance, compliance };
    }
    case "resistor":
      requirePositive("tail.resistance", tail.resistance, "Ω");
      return { kind: "resistor", current: Number.NaN, resistance: tail.resistance, compliance: 0 };
    default:
      throw new TypeError(
        `Expected tail.kind to be "source", "mirror" or "resistor", but found ${
          JSON.stringify((tail as { kind: unknown }).kind)
        }`,
      );
  }
}

/** Validated rails and common-mode voltage. */
export function _rails(
  positiveRail: number,
  negativeRail: number,
  inputCommonMode: number | undefined,
): { positiveRail: number; negativeRail: number; inputCommonMode: number } {
  requireFinite("positiveRail", positiveRail);
  requireBelow("negativeRail", negativeRail, positiveRail, "positiveRail", "V");
  const vicm = inputCommonMode ?? 0.5 * (positiveRail + negativeRail);
  requireInRange("inputCommonMode", vicm, negativeRail, positiveRail, "V");
  return { positiveRail, negativeRail, inputCommonMode: vicm };
}

/** A relative mismatch ΔX/X: device 1 = X·(1 + δ/2), device 2 = X·(1 − δ/2). */
export function _mismatch(name: string, value: number | undefined): number {
  const delta = value ?? 0;
  requireInRange(name, delta, -1, 1);
  return delta;
}

/** The words that name a pair's devices and nodes in its bias errors. */
export interface _PairWords {
  /** Device letter before the index: "Q" or "M". */
  device: string;
  /** Terminal at the load: "collector" or "drain". */
  output: string;
  /** Terminal at the tail: "emitter" or "source". */
  common: string;
  /** What lies between an input and the tail node: "VBE + IE·RE" or "VGS + Id·RS". */
  inputDrop: string;
  /** Why a mirror load caps the common-mode input, in parentheses after the limit. */
  mirrorLimit: string;
}

/** The operating point {@linkcode _requireBiasRoom} judges. */
export interface _PairBias {
  tail: _Tail;
  positiveRail: number;
  negativeRail: number;
  inputCommonMode: number;
  /** Voltage of the tail node (the joined emitters or sources), V. */
  tailVoltage: number;
  /** The load, with its nominal resistance when it is a pair of resistors. */
  load: { kind: "resistors"; resistance: number } | { kind: "mirror" };
  /** Current through each side's load, A. */
  currents: [number, number];
  /** Each side's load resistor after mismatch, Ω (NaN for a mirror). */
  resistors: [number, number];
  /** Voltage of device 1's output node, V. */
  firstOutputVoltage: number;
}

/**
 * Throws for a bias that cannot work (a tail source with no voltage across it, a load that
 * pulls an output below the tail node); a bias that works badly is left to the checks.
 */
export function _requireBiasRoom(bias: _PairBias, words: _PairWords): void {
  const vicm = bias.inputCommonMode;
  if (bias.tail.kind !== "resistor" && !(bias.tailVoltage > bias.negativeRail)) {
    throw new RangeError(
      `Expected inputCommonMode to be above ${
        _show(vicm - bias.tailVoltage + bias.negativeRail)
      } V (the negative rail plus ${words.inputDrop}, so the tail has voltage across it), but found ${vicm}`,
    );
  }
  if (bias.load.kind === "resistors") {
    const nominal = bias.load.resistance;
    for (const index of [1, 2]) {
      const r = bias.resistors[index - 1];
      const largest = (bias.positiveRail - bias.tailVoltage) / bias.currents[index - 1];
      if (!(r < largest)) {
        throw new RangeError(
          `Expected load.resistance to be below ${_show(largest / (r / nominal))} Ω ` +
            `(the largest that keeps ${words.device}${index}'s ${words.output} above its ` +
            `${words.common} at inputCommonMode = ${vicm} V), but found ${nominal}`,
        );
      }
    }
  } else if (!(bias.firstOutputVoltage > bias.tailVoltage)) {
    throw new RangeError(
      `Expected inputCommonMode to be below ${
        _show(bias.firstOutputVoltage + vicm - bias.tailVoltage)
      } V (${words.mirrorLimit}), but found ${vicm}`,
    );
  }
}

/** The gains read off the solved network; a mirror load has no differential output. */
export function _pairGain(response: _PairResponse, mirrorLoad: boolean): PairGain {
  const diff = response.differential;
  const cm = response.commonMode;
  return {
    differential: mirrorLoad ? Number.NaN : diff.c2 - diff.c1,
    singleEnded: diff.c2,
    commonModeSingleEnded: cm.c2,
    commonModeDifferential: mirrorLoad ? Number.NaN : cm.c2 - cm.c1,
  };
}

/**
 * Offset totals from the first-order sources: `random` lists the random ones (RSS'd), and the
 * worst case adds their magnitudes to the systematic term's.
 */
export function _pairOffset(
  sources: Record<string, number> & { systematic: number },
  random: number[],
  exact: number,
): PairOffset {
  return {
    sources,
    rss: Math.hypot(...random),
    worstCase: random.reduce((sum, x) => sum + Math.abs(x), Math.abs(sources.systematic)),
    exact,
  };
}

/** Input-referred noise of the pair: two devices' voltage noise add in power. */
export function _pairNoise(deviceVoltageDensity: number, currentDensity: number): PairNoise {
  return {
    deviceVoltageDensity,
    voltageDensity: Math.SQRT2 * deviceVoltageDensity,
    currentDensity,
  };
}

/** Validated `output` option: a mirror load has only the single-ended output. */
export function _pairOutput(output: PairOutput | undefined, mirrorLoad: boolean): PairOutput {
  const chosen = output ?? "singleEnded";
  if (chosen !== "singleEnded" && chosen !== "differential") {
    throw new TypeError(
      `Expected output to be "singleEnded" or "differential", but found ${JSON.stringify(chosen)}`,
    );
  }
  if (chosen === "differential" && mirrorLoad) {
    throw new RangeError(
      `Expected output to be "singleEnded" with a mirror load (it has one output), but found "differential"`,
    );
  }
  return chosen;
}

/** Output resistances and the two-port view of the chosen output. */
export function _pairPorts(
  response: _PairResponse,
  view: {
    name: string;
    output: PairOutput;
    mirrorLoad: boolean;
    gain: PairGain;
    inputResistance: number;
  },
): { outputResistance: PairOutputResistance; twoPort: TwoPort } {
  const differential = view.output === "differential";
  const outputResistance: PairOutputResistance = {
    singleEnded: response.outputResistance,
    differential: view.mirrorLoad ? Number.NaN : response.differentialOutputResistance,
  };
  const twoPort: TwoPort = {
    name: view.name,
    inputResistance: view.inputResistance,
    openCircuitGain: differential ? view.gain.differential : view.gain.singleEnded,
    outputResistance: differential ? outputResistance.differential : outputResistance.singleEnded,
  };
  return { outputResistance, twoPort };
}

/** Voltage across a tail source beyond its compliance, V (NaN for a resistor tail). */
export function _tailHeadroom(tail: _Tail, tailVoltage: number, negativeRail: number): number {
  return tail.kind === "resistor" ? Number.NaN : tailVoltage - negativeRail - tail.compliance;
}

/** 20·log10 of a magnitude. */
export function _db(ratio: number): number {
  return 20 * Math.log10(Math.abs(ratio));
}

/** |a/b| with 0/0 → NaN and x/0 → Infinity. */
export function _ratio(a: number, b: number): number {
  return Math.abs(a) / Math.abs(b);
}

/**
 * CMRR fields from the exact gains and the closed forms.
 *
 * `reTotal` = re + RE (BJT) or 1/gm + RS (MOS); `loadDelta` = ΔR/R; `gmDelta` = ΔGm/Gm.
 */
export function _cmrr(
  gain: PairGain,
  tailResistance: number,
  reTotal: number,
  loadDelta: number,
  gmDelta: number,
  mirrorLoad: boolean,
): PairCmrr {
  const singleEnded = _ratio(gain.singleEnded, gain.commonModeSingleEnded);
  const differential = mirrorLoad
    ? Number.NaN
    : _ratio(gain.differential, gain.commonModeDifferential);
  const base = 1 + (2 * tailResistance) / reTotal;
  const loadMismatch = mirrorLoad ? Number.NaN : _ratio(base, loadDelta);
  const gmMismatch = mirrorLoad ? Number.NaN : _ratio(base, gmDelta);
  return {
    singleEnded,
    singleEndedDb: _db(singleEnded),
    differential,
    differentialDb: _db(differential),
    loadMismatch,
    loadMismatchDb: _db(loadMismatch),
    gmMismatch,
    gmMismatchDb: _db(gmMismatch),
  };
}

/**
 * HD3 estimates from the odd series of the normalised input law
 * vid/D = t + a·t³ + b·t⁵ (t = difference current over its full-scale value):
 * reversion gives t = w − a·w³ + (3a² − b)·w⁵ with w = vid/D, and a sine of peak W = V̂/D then
 * gives b1 = W + ¾k3W³ + ⅝k5W⁵ and b3 = −¼k3W³ − (5/16)k5W⁵.
 */
export function _thirdHarmonic(
  transfer: (vid: number) => number,
  amplitude: number,
  scale: number,
  a: number,
  b: number,
): PairThirdHarmonic {
  requirePositive("amplitude", amplitude, "V");
  const w = amplitude / scale;
  const k3 = -a;
  const k5 = 3 * a * a - b;
  const b1 = w + 0.75 * k3 * w ** 3 + 0.625 * k5 * w ** 5;
  const b3 = -0.25 * k3 * w ** 3 - 0.3125 * k5 * w ** 5;
  const spectrum = harmonics(transfer, amplitude, { maxOrder: 15 });
  return {
    leadingTerm: (a * w * w) / 4,
    corrected: Math.abs(b3 / b1),
    exact: spectrum.amplitudes[3] / spectrum.amplitudes[1],
    thd: spectrum.thd,
  };
}

/**
 * Input amplitude at which the chord gain (T(v) − T(−v))/(2v) has fallen 1 % below the
 * small-signal slope at zero: the 1 % compression point.
 */
export function _linearRange(transfer: (vid: number) => number, scale: number): number {
  const h = scale * 1e-5;
  const slope = (transfer(h) - transfer(-h)) / (2 * h);
  const ratio = (v: number) => (transfer(v) - transfer(-v)) / (2 * v * slope);
  let lo = h;
  let hi = scale * 0.1;
  while (ratio(hi) > 0.99) {
    lo = hi;
    hi *= 2;
    if (hi > scale * 1e6) return Number.NaN;
  }
  for (let i = 0; i < 200 && hi - lo > 1e-15 * hi; i++) {
    const mid = 0.5 * (lo + hi);
    if (ratio(mid) > 0.99) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/** Slew rate and unity-gain frequency (see {@linkcode PairSlew}). */
export function _slew(
  capacitance: number | undefined,
  steerableCurrent: number,
  effectiveTransconductance: number,
  mirrorLoad: boolean,
): PairSlew | undefined {
  if (capacitance === undefined) return undefined;
  requirePositive("compensationCapacitance", capacitance, "F");
  const share = mirrorLoad ? 1 : 0.5;
  const slewRate = (share * steerableCurrent) / capacitance;
  const gm = share * effectiveTransconductance;
  return {
    capacitance,
    slewRate,
    unityGainFrequency: gm / (2 * Math.PI * capacitance),
    slewToUnityGainRatio: steerableCurrent / effectiveTransconductance,
  };
}

/** The requirement checks both pairs share. */
export function _requirementChecks(
  requirements: PairRequirements,
  values: {
    range: PairInputCommonModeRange;
    cmrr: PairCmrr;
    /** The output the CMRR requirement is judged on. */
    output: PairOutput;
    worstCaseOffset: number;
    slew: PairSlew | undefined;
    linearInputRange: number;
    relaxed: boolean;
  },
): CheckResult[] {
  const checks: CheckResult[] = [];
  const wanted = requirements.inputCommonModeRange;
  if (wanted !== undefined) {
    const [low, high] = wanted;
    requireFinite("requirements.inputCommonModeRange[0]", low);
    requireFinite("requirements.inputCommonModeRange[1]", high);
    if (!(low <= high)) {
      throw new RangeError(
        `Expected requirements.inputCommonModeRange to run from low to high, but found [${low}, ${high}]`,
      );
    }
    const top = values.relaxed ? values.range.maxRelaxed : values.range.max;
    checks.push(
      atMost("input common-mode range, low end", values.range.min, low, { unit: "V" }),
      atLeast("input common-mode range, high end", top, high, { unit: "V" }),
    );
  }
  if (requirements.cmrrDb !== undefined) {
    requireFinite("requirements.cmrrDb", requirements.cmrrDb);
    const differential = values.output === "differential";
    checks.push(
      atLeast(
        differential ? "CMRR (differential output)" : "CMRR (single-ended output)",
        differential ? values.cmrr.differentialDb : values.cmrr.singleEndedDb,
        requirements.cmrrDb,
        { unit: "dB" },
      ),
    );
  }
  if (requirements.maxOffset !== undefined) {
    requireFinite("requirements.maxOffset", requirements.maxOffset);
    checks.push(
      atMost("worst-case input offset", values.worstCaseOffset, requirements.maxOffset, {
        unit: "V",
      }),
    );
  }
  if (requirements.slewRate !== undefined) {
    requireFinite("requirements.slewRate", requirements.slewRate);
    if (values.slew === undefined) {
      throw new TypeError(
        "Expected compensationCapacitance to be given when requirements.slewRate is, but found undefined",
      );
    }
    checks.push(
      atLeast("slew rate", values.slew.slewRate, requirements.slewRate, {
        unit: "V/s",
        displayUnit: "V/µs",
      }),
    );
  }
  if (requirements.linearInputRange !== undefined) {
    requireFinite("requirements.linearInputRange", requirements.linearInputRange);
    checks.push(
      atLeast(
        "linear input range (1 % compression)",
        values.linearInputRange,
        requirements.linearInputRange,
        {
          unit: "V",
        },
      ),
    );
  }
  return checks;
}
