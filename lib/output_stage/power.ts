/**
 * Power, efficiency and dissipation of an ideal class-B complementary follower driven with a
 * sine wave, for resistive and reactive loads.
 *
 * ```
 *  +VCC ──┐                  dissipation (both devices)
 *        NPN                    ▲      PD,max = 2VCC²/(π²|Z|cos φ)
 *         ├── out ── Z          │    ╭───╮
 *        PNP        |Z|∠φ       │  ╭─╯   ╰──╮
 *  −VCC ──┘                     │╭─╯        ╰─
 *                               └──────┼──────▶ V̂
 *                                 2VCC/(π cos φ)
 * ```
 *
 * Each device conducts for half a cycle of the load current, so the supply delivers
 * 2·VCC·Î/π in total and the devices share everything the load does not take. The totals
 * here are for BOTH devices; each device takes half (REFERENCE §5.7: the classic
 * 2VCC²/(π²RL) is the total, not the per-device figure).
 *
 * @module
 */
import { requireInRange, requireNonNegative, requirePositive } from "../_validate.ts";

/** The load a class-B stage drives: a magnitude and a phase angle. */
export interface ClassBLoadOptions {
  /** Supply voltage of each rail (VCC of ±VCC) in V. */
  supplyVoltage: number;
  /** Load impedance magnitude |Z| in Ω (RL for a resistive load). */
  loadImpedance: number;
  /**
   * Load phase angle φ in rad, between −π/2 and π/2 (0 = resistive).
   * @default {0}
   */
  loadAngle?: number;
}

/** Power figures of a class-B stage at one output level. */
export interface ClassBPower {
  /** Output peak voltage V̂ in V. */
  peak: number;
  /** Output peak current Î = V̂/|Z| in A. */
  peakCurrent: number;
  /** Real power into the load, V̂·Î·cos φ/2, in W. */
  outputPower: number;
  /** Power drawn from both rails together, 2·VCC·Î/π, in W. */
  supplyPower: number;
  /** Dissipation of both output devices together in W. */
  dissipationTotal: number;
  /** Dissipation of each output device (half the total) in W. */
  dissipationPerDevice: number;
  /** Efficiency Po/PS as a fraction (0 at zero output). */
  efficiency: number;
}

/** The worst-case (largest) dissipation over output level and where it occurs. */
export interface ClassBWorstCase extends ClassBPower {
  /** True when the unconstrained worst level 2VCC/(π cos φ) lies beyond VCC and was clipped. */
  limitedBySwing: boolean;
}

function normalise(options: ClassBLoadOptions): { vcc: number; z: number; cosPhi: number } {
  requirePositive("supplyVoltage", options.supplyVoltage, "V");
  requirePositive("loadImpedance", options.loadImpedance, "Ω");
  const angle = options.loadAngle ?? 0;
  requireInRange("loadAngle", angle, -Math.PI / 2, Math.PI / 2, "rad");
  return { vcc: options.supplyVoltage, z: options.loadImpedance, cosPhi: Math.cos(angle) };
}

function powerAt(peak: number, vcc: number, z: number, cosPhi: number): ClassBPower {
  const peakCurrent = peak / z;
  const outputPower = (peak * peakCurrent * cosPhi) / 2;
  const supplyPower = (2 * vcc * peakCurrent) / Math.PI;
  const dissipationTotal = supplyPower - outputPower;
  return {
    peak,
    peakCurrent,
    outputPower,
    supplyPower,
    dissipationTotal,
    dissipationPerDevice: dissipationTotal / 2,
    efficiency: supplyPower === 0 ? 0 : outputPower / supplyPower,
  };
}

/**
 * Power, efficiency and dissipation of an ideal class-B stage at output peak `peak`.
 *
 * @param peak Output peak voltage V̂ in V (0 … VCC).
 * @param options Rails and load.
 * @returns Output, supply and dissipated power, per device and in total.
 * @throws {RangeError} If a value is out of range or `peak` exceeds the rail.
 *
 * @example ±35 V into 8 Ω at half the rail (REFERENCE E5.1)
 * ```ts
 * import { classBPower } from "./power.ts";
 * import { ok } from "node:assert/strict";
 * const p = classBPower(17.5, { supplyVoltage: 35, loadImpedance: 8 });
 * ok(Math.abs(p.outputPower - 19.14) < 0.01);
 * ok(Math.abs(p.efficiency - Math.PI / 8) < 1e-12);
 * ```
 */
export function classBPower(peak: number, options: ClassBLoadOptions): ClassBPower {
  const { vcc, z, cosPhi } = normalise(options);
  requireInRange("peak", peak, 0, vcc, "V");
  return powerAt(peak, vcc, z, cosPhi);
}

/**
 * The largest device dissipation of an ideal class-B stage over all output levels.
 *
 * For a resistive load it is 2VCC²/(π²RL) for both devices together (VCC²/(π²RL) each) at
 * V̂ = 2VCC/π. A reactive load moves the worst level to 2VCC/(π cos φ) and raises it by
 * 1/cos φ; when that level lies beyond the rail the worst case is at full swing.
 *
 * @param options Rails and load.
 * @returns The power figures at the worst level, with `limitedBySwing`.
 * @throws {RangeError} If a value is out of range.
 *
 * @example Total versus per device (REFERENCE E5.1)
 * ```ts
 * import { classBWorstCaseDissipation } from "./power.ts";
 * import { ok } from "node:assert/strict";
 * const worst = classBWorstCaseDissipation({ supplyVoltage: 35, loadImpedance: 8 });
 * ok(Math.abs(worst.dissipationTotal - 31.03) < 0.01);
 * ok(Math.abs(worst.dissipationPerDevice - 15.51) < 0.01);
 * ok(Math.abs(worst.peak - 22.28) < 0.01);
 * ```
 */
export function classBWorstCaseDissipation(options: ClassBLoadOptions): ClassBWorstCase {
  const { vcc, z, cosPhi } = normalise(options);
  // dPD/dV̂ = 2VCC/(π|Z|) − V̂cos φ/|Z| = 0; for a purely reactive load PD only rises.
  const unconstrained = cosPhi <= 0 ? Infinity : (2 * vcc) / (Math.PI * cosPhi);
  const limitedBySwing = unconstrained > vcc;
  return { ...powerAt(Math.min(unconstrained, vcc), vcc, z, cosPhi), limitedBySwing };
}

/** Options for {@linkcode classBPowerTable}. */
export interface ClassBPowerTableOptions extends ClassBLoadOptions {
  /**
   * Largest output peak in the table in V.
   * @default {supplyVoltage}
   */
  maxPeak?: number;
  /**
   * Number of rows, evenly spaced from 0 to `maxPeak`.
   * @default {21}
   */
  points?: number;
}

/**
 * Samples {@linkcode classBPower} at evenly spaced output levels, for a table or a chart.
 *
 * @param options Rails, load, range and number of rows.
 * @returns One row per level, from 0 V to `maxPeak`.
 * @throws {RangeError} If a value is out of range or `points` is below 2.
 *
 * @example Efficiency rises linearly with level
 * ```ts
 * import { classBPowerTable } from "./power.ts";
 * import { equal, ok } from "node:assert/strict";
 * const rows = classBPowerTable({ supplyVoltage: 35, loadImpedance: 8, points: 5 });
 * equal(rows.length, 5);
 * ok(Math.abs(rows[4].efficiency - Math.PI / 4) < 1e-12);
 * ```
 */
export function classBPowerTable(options: ClassBPowerTableOptions): ClassBPower[] {
  const { vcc, z, cosPhi } = normalise(options);
  const maxPeak = options.maxPeak ?? vcc;
  requireNonNegative("maxPeak", maxPeak, "V");
  requireInRange("maxPeak", maxPeak, 0, vcc, "V");
  const points = options.points ?? 21;
  if (!Number.isInteger(points) || points < 2) {
    throw new RangeError(`Expected points to be an integer of at least 2, but found ${points}`);
  }
  const rows: ClassBPower[] = [];
  for (let i = 0; i < points; i++) {
    rows.push(powerAt((maxPeak * i) / (points - 1), vcc, z, cosPhi));
  }
  return rows;
}
