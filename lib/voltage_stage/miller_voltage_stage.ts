/**
 * The two-port views of a Miller-compensated two-stage amplifier: the input stage as a
 * transconductor into its node impedance, and the compensated voltage stage (VAS) with its
 * Miller feedback kept exact, so that a cascade of the two reproduces the full two-pole
 * A(s) of [GHLM5] ch. 9 / [SS7] ch. 10 (REFERENCE §4.1), pole splitting included.
 *
 * ```
 *                      ┌──Rz──Cc──┐         Y  = sCc/(1 + sCcRz)
 *   v1 ──┬─────────────┤          │         Yo = 1/R2 + sC2
 *        │            −gm2·v1 ──▶─┴── vout  Avo = vout/v1 = (Y − gm2)/(Yo + Y)
 *     (driven by                  R2  C2    Zin = 1/[Y·(1 − Avo)] = (Yo + Y)/[Y·(Yo + gm2)]
 *      the input stage)           ┴   ┴
 * ```
 *
 * Why not a grounded Miller capacitance: Cc(1 + |A0|) at the input with a constant gain and
 * a grounded C at the output gives two real poles in the wrong places (the Miller
 * multiplication collapses as the gain falls with frequency, and the output side loses the
 * shunt feedback that splits the poles). Keeping Y in Zin and Avo at every frequency makes
 * the cascade exact: v1 = −gm1·(Z1 ‖ Zin)·vin and vout = Avo·v1.
 *
 * @module
 */
import { requireNonNegative, requirePositive } from "../_validate.ts";
import { requirePositiveOrInfinite } from "../cascade/_require.ts";
import type { TwoPort, TwoPortAt } from "../cascade/two_port.ts";

const TWO_PI = 2 * Math.PI;

/** Options for {@linkcode millerVoltageStage}. */
export interface MillerVoltageStageOptions {
  /** gm2 in S: the voltage stage's transconductance. */
  transconductance: number;
  /** R2 in Ω: all the resistance at the output node, the next stage's input included. */
  outputResistance: number;
  /**
   * C2 in F: all the capacitance at the output node to ground, the load included.
   * @default {0}
   */
  outputCapacitance?: number;
  /** Cc in F: the compensation capacitor from the output back to the stage's input. */
  compensationCapacitance: number;
  /**
   * Nulling resistor Rz in series with Cc, in Ω.
   * @default {0}
   */
  nullingResistance?: number;
  /**
   * Resistance of the node that drives the stage (R1 of the input stage), in Ω; used only
   * for the output impedance (`0` = the input held by an ideal source).
   * @default {0}
   */
  drivingResistance?: number;
  /**
   * Capacitance of the driving node to ground (C1), in F; used only for the output impedance.
   * @default {0}
   */
  drivingCapacitance?: number;
  /**
   * Label in cascade tables.
   * @default {"compensated VAS"}
   */
  name?: string;
}

/**
 * The compensated voltage stage as a two-port whose `at(f)` keeps the Miller feedback exact:
 * input impedance 1/[Y(1 − Avo)], open-circuit gain (Y − gm2)/(Yo + Y) and the output
 * impedance 1/[Yo + Y(gm2 + Ya)/(Ya + Y)] seen from the output with the input node's own
 * admittance Ya = 1/R1 + sC1 (falls to about 1/gm2 above the dominant pole: pole splitting).
 *
 * R2 and C2 already hold the load, so put the stage last (or before a buffer whose input is
 * counted in R2 and which shows an infinite input resistance) and leave the cascade's load
 * open; a finite load would be counted twice. Mid-band: input resistance ∞ (Cc is open at
 * DC; the device's own input resistance belongs in R1), gain −gm2·R2, output resistance R2.
 *
 * @param options gm2, R2, C2, Cc and optional Rz and driving node.
 * @returns The two-port view, with `at()`.
 * @throws {RangeError} If gm2, R2 or Cc is not above 0, or C2, Rz, R1 or C1 is negative.
 *
 * @example Cascaded with the input stage's transconductance it gives A(s) at any frequency
 * ```ts
 * import { millerVoltageStage } from "./miller_voltage_stage.ts";
 * import { ok } from "node:assert/strict";
 * const vas = millerVoltageStage({
 *   transconductance: 10e-3, outputResistance: 100e3, outputCapacitance: 10e-12,
 *   compensationCapacitance: 3e-12,
 * });
 * ok(Math.abs(vas.openCircuitGain + 1000) < 1e-9);
 * // Above the dominant pole the input looks like Cc·(1 + gm2·R2) ≈ 3 nF.
 * const zin = vas.at!(1e3).inputImpedance;
 * const miller = 1 / (2 * Math.PI * 1e3 * 3e-12 * 1001);
 * ok(Math.abs(Math.hypot(zin.re, zin.im) / miller - 1) < 1e-3);
 * ```
 */
export function millerVoltageStage(options: MillerVoltageStageOptions): TwoPort {
  const gm2 = options.transconductance;
  const r2 = options.outputResistance;
  const c2 = options.outputCapacitance ?? 0;
  const cc = options.compensationCapacitance;
  const rz = options.nullingResistance ?? 0;
  const rd = options.drivingResistance ?? 0;
  const cd = options.drivingCapacitance ?? 0;
  requirePositive("transconductance", gm2, "S");
  requirePositiveOrInfinite("outputResistance", r2, "Ω");
  requireNonNegative("outputCapacitance", c2, "F");
  requirePositive("compensationCapacitance", cc, "F");
  requireNonNegative("nullingResistance", rz, "Ω");
  requireNonNegative("drivingResistance", rd, "Ω");
  requireNonNegative("drivingCapacitance", cd, "F");
  const g2 = 1 / r2;
  const ga = rd === 0 ? Infinity : 1 / rd;

  const at = (frequency: number): TwoPortAt => {
    const w = TWO_PI * frequency;
    if (w === 0) {
      return {
        inputImpedance: { re: Infinity, im: 0 },
        openCircuitGain: { re: -gm2 * r2, im: 0 },
        outputImpedance: { re: r2, im: 0 },
      };
    }
    // Y = jωCc/(1 + jωCcRz)
    const x = w * cc * rz;
    const yd = 1 + x * x;
    const yr = (w * cc * x) / yd;
    const yi = (w * cc) / yd;
    const oi = w * c2; // Yo = g2 + j·oi
    // Avo = (Y − gm2)/(Yo + Y)
    const gain = divide(yr - gm2, yi, g2 + yr, oi + yi);
    // Zin = (Yo + Y)/[Y·(Yo + gm2)]
    const ar = g2 + gm2;
    const den = { re: yr * ar - yi * oi, im: yr * oi + yi * ar };
    const zin = divide(g2 + yr, oi + yi, den.re, den.im);
    // Yout = Yo + Y·(gm2 + Ya)/(Ya + Y); with Ya = ∞ (input held) it is Yo + Y.
    let outR: number;
    let outI: number;
    if (ga === Infinity) {
      outR = g2 + yr;
      outI = oi + yi;
    } else {
      const ai = w * cd;
      const ratio = divide(gm2 + ga, ai, ga + yr, ai + yi);
      outR = g2 + yr * ratio.re - yi * ratio.im;
      outI = oi + yr * ratio.im + yi * ratio.re;
    }
    return {
      inputImpedance: zin,
      openCircuitGain: gain,
      outputImpedance: divide(1, 0, outR, outI),
    };
  };

  return {
    name: options.name ?? "compensated VAS",
    inputResistance: Infinity,
    openCircuitGain: -gm2 * r2,
    outputResistance: r2,
    at,
  };
}

/** Options for {@linkcode transconductanceStage}. */
export interface TransconductanceStageOptions {
  /** Gm in S: output current per input volt (one input device's gm for a pair). */
  transconductance: number;
  /** Resistance at the output node in Ω (R1 without the next stage). */
  outputResistance: number;
  /**
   * Capacitance at the output node to ground in F (C1 without Cc).
   * @default {0}
   */
  outputCapacitance?: number;
  /**
   * Input resistance in Ω (`Infinity` for a gate input).
   * @default {Infinity}
   */
  inputResistance?: number;
  /**
   * Sign of the gain: −1 when the output current leaves the node for a positive input
   * (the sign convention of the two-stage A(s), which makes A0 positive after an inverting
   * VAS).
   * @default {-1}
   */
  polarity?: 1 | -1;
  /**
   * Label in cascade tables.
   * @default {"input stage"}
   */
  name?: string;
}

/**
 * A transconductor into its own node impedance as a voltage two-port: open-circuit gain
 * ±Gm·Z1(f) with Z1 = R1 ‖ 1/(jωC1), output impedance Z1 (the Thevenin form of a Norton
 * source Gm·vin in parallel with Z1).
 *
 * @param options Gm, R1, C1, input resistance and polarity.
 * @returns The two-port view, with `at()` when C1 > 0.
 * @throws {RangeError} If Gm or R1 is not above 0, C1 is negative, or the input resistance
 * is not above 0.
 *
 * @example 1 mS into 1 MΩ: an open-circuit gain of −1000
 * ```ts
 * import { transconductanceStage } from "./miller_voltage_stage.ts";
 * import { equal } from "node:assert/strict";
 * const stage = transconductanceStage({ transconductance: 1e-3, outputResistance: 1e6 });
 * equal(stage.openCircuitGain, -1000);
 * ```
 */
export function transconductanceStage(options: TransconductanceStageOptions): TwoPort {
  const gm = options.transconductance;
  const r1 = options.outputResistance;
  const c1 = options.outputCapacitance ?? 0;
  const rin = options.inputResistance ?? Infinity;
  const sign = options.polarity ?? -1;
  requirePositive("transconductance", gm, "S");
  requirePositive("outputResistance", r1, "Ω");
  requireNonNegative("outputCapacitance", c1, "F");
  requirePositiveOrInfinite("inputResistance", rin, "Ω");
  if (sign !== 1 && sign !== -1) {
    throw new RangeError(`Expected polarity to be 1 or -1, but found ${sign}`);
  }
  const stage: TwoPort = {
    name: options.name ?? "input stage",
    inputResistance: rin,
    openCircuitGain: sign * gm * r1,
    outputResistance: r1,
  };
  if (c1 > 0) {
    stage.at = (frequency: number): TwoPortAt => {
      const b = TWO_PI * frequency * c1 * r1;
      const d = 1 + b * b;
      const z = { re: r1 / d, im: (-r1 * b) / d };
      return {
        inputImpedance: { re: rin, im: 0 },
        openCircuitGain: { re: sign * gm * z.re, im: sign * gm * z.im },
        outputImpedance: z,
      };
    };
  }
  return stage;
}

function divide(ar: number, ai: number, br: number, bi: number): { re: number; im: number } {
  const d = br * br + bi * bi;
  return { re: (ar * br + ai * bi) / d, im: (ai * br - ar * bi) / d };
}
