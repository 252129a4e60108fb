/**
 * One Monte Carlo trial of a pair: its CMRR (dB) and exact offset (V) for drawn per-device
 * values. A general path (operating point, network, nodal solve) and, for the common case of
 * a BJT pair with resistive loads and no Early effect, an allocation-free closed form that
 * gives the same numbers (tests compare the two).
 *
 * @module
 */
import {
  _alpha,
  type _BjtCore,
  _bjtExactOffset,
  _bjtNetwork,
  _bjtOperatingPoint,
  type _BjtParts,
  _bjtSplit,
} from "./_bjt_core.ts";
import {
  type _MosCore,
  _mosExactOffset,
  _mosNetwork,
  _mosOperatingPoint,
  type _MosParts,
} from "./_mos_core.ts";
import { type _PairResponse, _solvePair } from "./_network.ts";
import { _db } from "./_pair_common.ts";

/** Where a trial writes its results. */
export interface _TrialSink {
  /** The run's CMRR: differential output for resistive loads, single-ended for a mirror. */
  cmrrDb: number;
  /** Single-ended CMRR at c2. */
  cmrrSingleEndedDb: number;
  offset: number;
}

function writeCmrr(response: _PairResponse, mirror: boolean, sink: _TrialSink): void {
  const d = response.differential;
  const c = response.commonMode;
  sink.cmrrSingleEndedDb = _db(d.c2 / c.c2);
  sink.cmrrDb = mirror ? sink.cmrrSingleEndedDb : _db((d.c2 - d.c1) / (c.c2 - c.c1));
}

/** A BJT trial through the general path. */
export function _bjtTrialGeneral(
  core: _BjtCore,
  current: number,
  inputCommonMode: number,
  parts: _BjtParts,
  sink: _TrialSink,
): void {
  const point = _bjtOperatingPoint(core, parts, current, inputCommonMode);
  writeCmrr(_solvePair(_bjtNetwork(core, parts, point)), core.load.kind === "mirror", sink);
  sink.offset = _bjtExactOffset(core, parts, point);
}

/** True when {@linkcode _bjtTrialFast} applies: resistive loads, no Early effect. */
export function _bjtFastApplies(core: _BjtCore): boolean {
  return core.load.kind === "resistors" && core.earlyVoltage === Infinity;
}

/**
 * A BJT trial in closed form (resistive loads, VA = ∞). Each emitter branch conducts
 * y = 1/(VT/IE + RE) and passes α of it to the collector (gm + 1/rπ = IE/VT).
 */
export function _bjtTrialFast(
  core: _BjtCore,
  current: number,
  parts: _BjtParts,
  sink: _TrialSink,
): void {
  const vt = core.thermalVoltage;
  const re = core.degeneration;
  const a1 = _alpha(parts.beta1);
  const a2 = _alpha(parts.beta2);
  // Without degeneration the split is closed-form (the hot path of the Monte Carlo bench);
  // the same expression as _bjtSplit's, so both give the same bits.
  const isTerm = vt * Math.log((a1 * parts.is2) / (a2 * parts.is1));
  const u = re === 0 ? -isTerm / vt : _bjtSplit(core, parts, current, 0);
  const ie1 = current / (1 + Math.exp(-u));
  const ie2 = current - ie1;
  const y1 = 1 / (vt / ie1 + re);
  const y2 = 1 / (vt / ie2 + re);
  const total = y1 + y2 + 1 / core.tail.resistance;
  // Differential drive ±½: collector voltages −α·ie·RC, output vc2 − vc1.
  const ved = (0.5 * (y1 - y2)) / total;
  const vodDiff = -a2 * y2 * (-0.5 - ved) * parts.rc2 + a1 * y1 * (0.5 - ved) * parts.rc1;
  const vec = (y1 + y2) / total;
  const vodCm = (1 - vec) * (a1 * y1 * parts.rc1 - a2 * y2 * parts.rc2);
  sink.cmrrDb = _db(vodDiff / vodCm);
  // Single-ended at c2: vc2 = −α2·ie2·RC2 for each drive, so RC2 and α2 cancel.
  sink.cmrrSingleEndedDb = _db((-0.5 - ved) / (1 - vec));
  const u0 = Math.log((a2 * parts.rc2) / (a1 * parts.rc1));
  const degenerated = re === 0 ? 0 : re * current * Math.tanh(u0 / 2);
  sink.offset = -(vt * u0 + degenerated + isTerm);
}

/** A MOS trial through the general path. */
export function _mosTrial(
  core: _MosCore,
  current: number,
  inputCommonMode: number,
  parts: _MosParts,
  sink: _TrialSink,
): void {
  const point = _mosOperatingPoint(core, parts, current, inputCommonMode);
  writeCmrr(_solvePair(_mosNetwork(core, parts, point)), core.load.kind === "mirror", sink);
  sink.offset = _mosExactOffset(core, parts, point);
}
