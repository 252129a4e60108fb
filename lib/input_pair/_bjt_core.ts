/**
 * The BJT pair's large-signal operating point, small-signal network and offset, per device,
 * shared by {@linkcode bjtPair} and its Monte Carlo run.
 *
 * Large-signal law (REFERENCE §3.1), with u = ln(IE1/IE2), IE1 + IE2 = I:
 *
 *   vid = VT·u + RE·I·tanh(u/2) + VT·ln(α1·Is2/(α2·Is1))
 *
 * which is increasing in u, so every operating point is one safeguarded Newton solve.
 *
 * @module
 */
import { _bjtBaseEmitterVoltage, _bjtOutputResistance, _bjtTransconductance } from "./_devices.ts";
import type { _PairNetwork, _SmallDevice } from "./_network.ts";
import { _solveIncreasing } from "./_solve.ts";
import type { _Tail } from "./_pair_common.ts";

/** Normalised BJT pair design (validated once). */
export interface _BjtCore {
  thermalVoltage: number;
  positiveRail: number;
  negativeRail: number;
  tail: _Tail;
  degeneration: number;
  beta: number;
  earlyVoltage: number;
  /** Fixed VBE (V) or undefined to compute it from `saturationCurrent`. */
  baseEmitterVoltage: number | undefined;
  saturationCurrent: number;
  load:
    | { kind: "resistors"; resistance: number }
    | {
      kind: "mirror";
      beta: number;
      earlyVoltage: number;
      baseEmitterVoltage: number | undefined;
      saturationCurrent: number;
      outputVoltage: number | undefined;
    };
}

/** Per-device values after mismatch. */
export interface _BjtParts {
  rc1: number;
  rc2: number;
  is1: number;
  is2: number;
  beta1: number;
  beta2: number;
}

/** Large-signal operating point at vid = 0. */
export interface _BjtPoint {
  current: number;
  alpha1: number;
  alpha2: number;
  ie1: number;
  ie2: number;
  ic1: number;
  ic2: number;
  ib1: number;
  ib2: number;
  vbe1: number;
  vbe2: number;
  emitterVoltage: number;
  vc1: number;
  vc2: number;
  /** Mirror devices (mirror load only). */
  mirror?: { ic3: number; ic4: number; veb: number; ratio: number };
}

export function _alpha(beta: number): number {
  return beta === Infinity ? 1 : beta / (beta + 1);
}

/** Tail current at a common-mode voltage (the nominal, matched devices). */
export function _bjtTailCurrent(core: _BjtCore, inputCommonMode: number): number {
  const tail = core.tail;
  if (tail.kind !== "resistor") return tail.current;
  const series = tail.resistance + core.degeneration / 2;
  const available = inputCommonMode - core.negativeRail;
  if (core.baseEmitterVoltage !== undefined) {
    return (available - core.baseEmitterVoltage) / series;
  }
  // I·(R + RE/2) + VT·ln(αI/(2Is)) = Vicm − VEE, increasing in I.
  const alpha = _alpha(core.beta);
  const vt = core.thermalVoltage;
  const f = (current: number) =>
    [
      current * series + vt * Math.log((alpha * current) / (2 * core.saturationCurrent) + 1),
      series + vt / (current + (2 * core.saturationCurrent) / alpha),
    ] as const;
  if (!(available > 0) || f(0)[0] >= available) return 0;
  return _solveIncreasing(f, available, 0, available / series);
}

/** Splits the tail at a differential input: returns u = ln(IE1/IE2). */
export function _bjtSplit(
  core: _BjtCore,
  parts: _BjtParts,
  current: number,
  vid: number,
): number {
  const vt = core.thermalVoltage;
  const re = core.degeneration;
  const target = vid -
    vt * Math.log((_alpha(parts.beta1) * parts.is2) / (_alpha(parts.beta2) * parts.is1));
  if (re === 0) return target / vt;
  if (target === 0) return 0;
  const f = (u: number) =>
    [
      vt * u + re * current * Math.tanh(u / 2),
      vt + (re * current) / (2 * Math.cosh(u / 2) ** 2),
    ] as const;
  // |f(u)| lies between VT·|u| and (VT + RE·I/2)·|u|.
  const a = target / vt;
  const b = target / (vt + (re * current) / 2);
  return _solveIncreasing(f, target, Math.min(a, b), Math.max(a, b));
}

/** Collector currents for a split u. */
export function _bjtCurrents(parts: _BjtParts, current: number, u: number): [number, number] {
  const ie1 = current / (1 + Math.exp(-u));
  const ie2 = current / (1 + Math.exp(u));
  return [_alpha(parts.beta1) * ie1, _alpha(parts.beta2) * ie2];
}

/** Operating point at vid = 0 and the given common-mode voltage. */
export function _bjtOperatingPoint(
  core: _BjtCore,
  parts: _BjtParts,
  current: number,
  inputCommonMode: number,
): _BjtPoint {
  const vt = core.thermalVoltage;
  const u = _bjtSplit(core, parts, current, 0);
  const ie1 = current / (1 + Math.exp(-u));
  const ie2 = current / (1 + Math.exp(u));
  const alpha1 = _alpha(parts.beta1);
  const alpha2 = _alpha(parts.beta2);
  const ic1 = alpha1 * ie1;
  const ic2 = alpha2 * ie2;
  const vbe1 = _bjtBaseEmitterVoltage(ic1, parts.is1, vt);
  const vbe2 = _bjtBaseEmitterVoltage(ic2, parts.is2, vt);
  const emitterVoltage = inputCommonMode - vbe1 - ie1 * core.degeneration;
  const load = core.load;
  let vc1: number;
  let vc2: number;
  let mirror: _BjtPoint["mirror"];
  if (load.kind === "resistors") {
    vc1 = core.positiveRail - ic1 * parts.rc1;
    vc2 = core.positiveRail - ic2 * parts.rc2;
  } else {
    // The diode node supplies Q3's collector and both mirror bases: Ic1 = Ic3·(1 + 2/βp).
    const ic3 = load.beta === Infinity ? ic1 : ic1 / (1 + 2 / load.beta);
    const veb = load.baseEmitterVoltage ??
      _bjtBaseEmitterVoltage(ic3, load.saturationCurrent, vt);
    vc1 = core.positiveRail - veb;
    vc2 = load.outputVoltage ?? vc1;
    const vec4 = core.positiveRail - vc2;
    const early = (1 + vec4 / load.earlyVoltage) / (1 + veb / load.earlyVoltage);
    const ic4 = ic3 * early;
    mirror = { ic3, ic4, veb, ratio: ic4 / ic1 };
  }
  return {
    current,
    alpha1,
    alpha2,
    ie1,
    ie2,
    ic1,
    ic2,
    ib1: ie1 - ic1,
    ib2: ie2 - ic2,
    vbe1,
    vbe2,
    emitterVoltage,
    vc1,
    vc2,
    mirror,
  };
}

function device(ic: number, vt: number, beta: number, earlyVoltage: number): _SmallDevice {
  const gm = _bjtTransconductance(ic, vt);
  return {
    gm,
    gpi: beta === Infinity ? 0 : gm / beta,
    go: 1 / _bjtOutputResistance(ic, earlyVoltage),
  };
}

/** The small-signal network at an operating point. */
export function _bjtNetwork(core: _BjtCore, parts: _BjtParts, point: _BjtPoint): _PairNetwork {
  const vt = core.thermalVoltage;
  const load = core.load;
  return {
    q1: device(point.ic1, vt, parts.beta1, core.earlyVoltage),
    q2: device(point.ic2, vt, parts.beta2, core.earlyVoltage),
    degeneration: core.degeneration,
    tailConductance: 1 / core.tail.resistance,
    load: load.kind === "resistors"
      ? { kind: "resistors", g1: 1 / parts.rc1, g2: 1 / parts.rc2 }
      : {
        kind: "mirror",
        q3: device(point.mirror!.ic3, vt, load.beta, load.earlyVoltage),
        q4: device(point.mirror!.ic4, vt, load.beta, load.earlyVoltage),
      },
  };
}

/**
 * The exact offset: minus the vid that nulls the output (equal collector voltages for
 * resistive loads, zero net output current for a mirror load).
 */
export function _bjtExactOffset(
  core: _BjtCore,
  parts: _BjtParts,
  point: _BjtPoint,
): number {
  const vt = core.thermalVoltage;
  const a1 = point.alpha1;
  const a2 = point.alpha2;
  // Null when α1·IE1·w1 = α2·IE2·w2.
  const [w1, w2] = core.load.kind === "resistors"
    ? [parts.rc1, parts.rc2]
    : [point.mirror!.ratio, 1];
  const u = Math.log((a2 * w2) / (a1 * w1));
  const vid = vt * u + core.degeneration * point.current * Math.tanh(u / 2) +
    vt * Math.log((a1 * parts.is2) / (a2 * parts.is1));
  return -vid;
}
