/**
 * The MOSFET pair's large-signal operating point, small-signal network and offset, per device,
 * shared by {@linkcode mosPair} and its Monte Carlo run.
 *
 * Square law Id = ½·kn·Vov² (kn = k′·W/L). With Id1 = I(1 + y)/2, Id2 = I(1 − y)/2:
 *
 *   vid = √(I(1 + y)/kn1) − √(I(1 − y)/kn2) + RS·I·y + (Vt1 − Vt2),   −1 ≤ y ≤ 1
 *
 * increasing in y; beyond y = ±1 one device is off and the other carries the whole tail
 * (for a matched pair without RS that happens at |vid| = √2·Vov).
 *
 * @module
 */
import { _mosOutputResistance, _mosOverdrive, _mosTransconductance } from "./_devices.ts";
import type { _PairNetwork, _SmallDevice } from "./_network.ts";
import { _solveIncreasing } from "./_solve.ts";
import type { _Tail } from "./_pair_common.ts";

/** Normalised MOS pair design. */
export interface _MosCore {
  positiveRail: number;
  negativeRail: number;
  tail: _Tail;
  degeneration: number;
  transconductanceParameter: number;
  threshold: number;
  lambda: number;
  load:
    | { kind: "resistors"; resistance: number }
    | {
      kind: "mirror";
      transconductanceParameter: number;
      threshold: number;
      lambda: number;
      outputVoltage: number | undefined;
    };
}

/** Per-device values after mismatch. */
export interface _MosParts {
  rd1: number;
  rd2: number;
  kn1: number;
  kn2: number;
  vt1: number;
  vt2: number;
}

/** Operating point at vid = 0. */
export interface _MosPoint {
  current: number;
  id1: number;
  id2: number;
  vov1: number;
  vov2: number;
  sourceVoltage: number;
  vd1: number;
  vd2: number;
  mirror?: { id3: number; id4: number; vsg: number; ratio: number };
}

/** Tail current at a common-mode voltage (matched nominal devices). */
export function _mosTailCurrent(core: _MosCore, inputCommonMode: number): number {
  const tail = core.tail;
  if (tail.kind !== "resistor") return tail.current;
  const series = tail.resistance + core.degeneration / 2;
  const available = inputCommonMode - core.negativeRail - core.threshold;
  if (!(available > 0)) return 0;
  const kn = core.transconductanceParameter;
  // I·(R + RS/2) + √(I/kn) = Vicm − VSS − Vt: a quadratic in √I.
  const a = series;
  const b = 1 / Math.sqrt(kn);
  const root = (-b + Math.sqrt(b * b + 4 * a * available)) / (2 * a);
  return root * root;
}

function law(parts: _MosParts, current: number, rs: number, y: number): readonly [number, number] {
  const s1 = Math.sqrt((current * (1 + y)) / parts.kn1);
  const s2 = Math.sqrt((current * (1 - y)) / parts.kn2);
  const value = s1 - s2 + rs * current * y + (parts.vt1 - parts.vt2);
  const slope = 0.5 * (current / parts.kn1) / s1 + 0.5 * (current / parts.kn2) / s2 + rs * current;
  return [value, slope];
}

/** The input voltage that gives the split y. */
export function _mosInput(core: _MosCore, parts: _MosParts, current: number, y: number): number {
  return law(parts, current, core.degeneration, y)[0];
}

/** The split y ∈ [−1, 1] at a differential input. */
export function _mosSplit(core: _MosCore, parts: _MosParts, current: number, vid: number): number {
  const rs = core.degeneration;
  if (vid >= law(parts, current, rs, 1)[0]) return 1;
  if (vid <= law(parts, current, rs, -1)[0]) return -1;
  return _solveIncreasing((y) => law(parts, current, rs, y), vid, -1, 1);
}

/** Operating point at vid = 0. */
export function _mosOperatingPoint(
  core: _MosCore,
  parts: _MosParts,
  current: number,
  inputCommonMode: number,
): _MosPoint {
  const y = _mosSplit(core, parts, current, 0);
  const id1 = (current * (1 + y)) / 2;
  const id2 = (current * (1 - y)) / 2;
  const vov1 = _mosOverdrive(id1, parts.kn1);
  const vov2 = _mosOverdrive(id2, parts.kn2);
  const sourceVoltage = inputCommonMode - parts.vt1 - vov1 - id1 * core.degeneration;
  const load = core.load;
  if (load.kind === "resistors") {
    return {
      current,
      id1,
      id2,
      vov1,
      vov2,
      sourceVoltage,
      vd1: core.positiveRail - id1 * parts.rd1,
      vd2: core.positiveRail - id2 * parts.rd2,
    };
  }
  const id3 = id1;
  const vsg = load.threshold + _mosOverdrive(id3, load.transconductanceParameter);
  const vd1 = core.positiveRail - vsg;
  const vd2 = load.outputVoltage ?? vd1;
  const early = (1 + load.lambda * (core.positiveRail - vd2)) / (1 + load.lambda * vsg);
  const id4 = id3 * early;
  return {
    current,
    id1,
    id2,
    vov1,
    vov2,
    sourceVoltage,
    vd1,
    vd2,
    mirror: { id3, id4, vsg, ratio: id4 / id1 },
  };
}

function device(id: number, kn: number, lambda: number): _SmallDevice {
  return {
    gm: _mosTransconductance(id, kn),
    gpi: 0,
    go: 1 / _mosOutputResistance(id, lambda),
  };
}

/** The small-signal network at an operating point. */
export function _mosNetwork(core: _MosCore, parts: _MosParts, point: _MosPoint): _PairNetwork {
  const load = core.load;
  let small: _PairNetwork["load"];
  if (load.kind === "resistors") {
    small = { kind: "resistors", g1: 1 / parts.rd1, g2: 1 / parts.rd2 };
  } else {
    const q3 = device(point.mirror!.id3, load.transconductanceParameter, load.lambda);
    // M4 shares M3's VGS: its gm scales with its current (the Early factor), not as √Id.
    const scale = point.mirror!.id4 / point.mirror!.id3;
    const q4 = { gm: q3.gm * scale, gpi: 0, go: load.lambda * point.mirror!.id4 };
    small = { kind: "mirror", q3, q4 };
  }
  return {
    q1: device(point.id1, parts.kn1, core.lambda),
    q2: device(point.id2, parts.kn2, core.lambda),
    degeneration: core.degeneration,
    tailConductance: 1 / core.tail.resistance,
    load: small,
  };
}

/** Exact offset: minus the vid that nulls the output. */
export function _mosExactOffset(
  core: _MosCore,
  parts: _MosParts,
  point: _MosPoint,
): number {
  const [w1, w2] = core.load.kind === "resistors"
    ? [parts.rd1, parts.rd2]
    : [point.mirror!.ratio, 1];
  // Null when Id1·w1 = Id2·w2.
  const y = (w2 - w1) / (w2 + w1);
  return -_mosInput(core, parts, point.current, y);
}
