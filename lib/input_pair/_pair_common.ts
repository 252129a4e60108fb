/**
 * Pieces shared by the BJT and MOSFET pairs: validation, tail normalisation, decibels,
 * distortion series, linear range, slew rate and the checks both pairs offer.
 *
 * @module
 */
import { requireBelow, requireFinite, requireInRange, requirePositive } from "../_validate.ts";
import { harmonics } from "../analysis/harmonics.ts";
import { atLeast, atMost, type CheckResult } from "../checks/check.ts";
import type {
  PairCmrr,
  PairInputCommonModeRange,
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
  gains: { differential: number; singleEnded: number; cmSingle: number; cmDiff: number },
  tailResistance: number,
  reTotal: number,
  loadDelta: number,
  gmDelta: number,
  mirrorLoad: boolean,
): PairCmrr {
  const singleEnded = _ratio(gains.singleEnded, gains.cmSingle);
  const differential = mirrorLoad ? Number.NaN : _ratio(gains.differential, gains.cmDiff);
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
    cmrrDb: number;
    cmrrName: string;
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
    checks.push(atLeast(values.cmrrName, values.cmrrDb, requirements.cmrrDb, { unit: "dB" }));
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
