/**
 * Bipolar junction transistor (NPN or PNP): forward-active law, small-signal model,
 * Ebers–Moll transport currents, saturation voltage and temperature.
 *
 * Sign convention: every voltage and current here is given in the device's forward
 * direction, so NPN and PNP read alike. For an NPN that is Vbe, Vbc, Vce and the current
 * into the collector; for a PNP it is Veb, Vcb, Vec and the current out of the collector.
 * `polarity` tells a stage which way round to wire the numbers.
 *
 * ```
 *          C                 small-signal model (hybrid-π)
 *          │               B ──┬──────────┬── C
 *     B ──┤                    rπ   gm·vbe ↓   ro
 *          │↘                E ──┴──────────┴── E
 *          E
 * ```
 *
 * @module
 */
import { requireFinite, requireNonNegative, requirePositive } from "../_validate.ts";
import { DEFAULT_TEMPERATURE } from "../physics/constants.ts";
import {
  DEFAULT_BANDGAP_VOLTAGE,
  DEFAULT_TEMPERATURE_EXPONENT,
  saturationCurrentAtTemperature,
} from "../physics/junction.ts";
import { thermalVoltage } from "../physics/thermal_voltage.ts";

/** Which way the transistor conducts. */
export type BjtPolarity = "npn" | "pnp";

/** Parameters of a BJT, for {@linkcode bjt}. */
export interface BjtOptions {
  /**
   * NPN or PNP.
   * @default {"npn"}
   */
  polarity?: BjtPolarity;
  /**
   * Saturation current Is at `referenceTemperature`, in A (a typical small-signal part).
   * @default {1e-14}
   */
  saturationCurrent?: number;
  /**
   * Forward current gain βF = Ic/IB, held constant over current and temperature.
   * @default {100}
   */
  beta?: number;
  /**
   * Reverse current gain βR, used by the Ebers–Moll and saturation helpers.
   * @default {1}
   */
  reverseBeta?: number;
  /**
   * Early voltage VA in V; `Infinity` leaves out base-width modulation (ro = ∞).
   * @default {Infinity}
   */
  earlyVoltage?: number;
  /**
   * Temperature at which `saturationCurrent` holds, in K.
   * @default {300}
   */
  referenceTemperature?: number;
  /**
   * Extrapolated bandgap VG0 of the Is temperature law, in V.
   * @default {1.205}
   */
  bandgapVoltage?: number;
  /**
   * Temperature exponent η of the Is law.
   * @default {3}
   */
  temperatureExponent?: number;
}

/** A BJT with every parameter filled in; build one with {@linkcode bjt}. */
export interface Bjt {
  /** NPN or PNP. */
  readonly polarity: BjtPolarity;
  /** Is at `referenceTemperature`, in A. */
  readonly saturationCurrent: number;
  /** Forward current gain βF. */
  readonly beta: number;
  /** Reverse current gain βR. */
  readonly reverseBeta: number;
  /** Early voltage VA in V (may be `Infinity`). */
  readonly earlyVoltage: number;
  /** Temperature at which `saturationCurrent` holds, in K. */
  readonly referenceTemperature: number;
  /** VG0 of the Is temperature law, in V. */
  readonly bandgapVoltage: number;
  /** η of the Is temperature law. */
  readonly temperatureExponent: number;
}

/** Options for the helpers that need a temperature and, optionally, Vce. */
export interface BjtBiasOptions {
  /**
   * Junction temperature in K.
   * @default {300}
   */
  temperature?: number;
  /**
   * Collector-emitter voltage (forward direction) in V, for the Early factor (1 + Vce/VA).
   * @default {0}
   */
  collectorEmitterVoltage?: number;
}

/**
 * Builds a BJT from its parameters, checking each once.
 *
 * @param options Polarity, Is, βF, βR, VA and the Is temperature law.
 * @returns The frozen device.
 * @throws {RangeError} If Is, a gain, VA, a temperature or VG0 is not positive.
 * @throws {TypeError} If `polarity` is neither "npn" nor "pnp".
 *
 * @example A small-signal NPN
 * ```ts
 * import { bjt } from "./bjt.ts";
 * import { equal } from "node:assert/strict";
 * const q1 = bjt({ beta: 250, earlyVoltage: 75 });
 * equal(q1.polarity, "npn");
 * equal(q1.saturationCurrent, 1e-14);
 * ```
 */
export function bjt(options: BjtOptions = {}): Bjt {
  const polarity = options.polarity ?? "npn";
  if (polarity !== "npn" && polarity !== "pnp") {
    throw new TypeError(`Expected polarity to be "npn" or "pnp", but found ${String(polarity)}`);
  }
  const device: Bjt = {
    polarity,
    saturationCurrent: options.saturationCurrent ?? 1e-14,
    beta: options.beta ?? 100,
    reverseBeta: options.reverseBeta ?? 1,
    earlyVoltage: options.earlyVoltage ?? Infinity,
    referenceTemperature: options.referenceTemperature ?? DEFAULT_TEMPERATURE,
    bandgapVoltage: options.bandgapVoltage ?? DEFAULT_BANDGAP_VOLTAGE,
    temperatureExponent: options.temperatureExponent ?? DEFAULT_TEMPERATURE_EXPONENT,
  };
  requirePositive("saturationCurrent", device.saturationCurrent, "A");
  requirePositive("beta", device.beta);
  requirePositive("reverseBeta", device.reverseBeta);
  if (!(device.earlyVoltage > 0)) {
    throw new RangeError(
      `Expected earlyVoltage to be greater than 0 V, but found ${device.earlyVoltage}`,
    );
  }
  requirePositive("referenceTemperature", device.referenceTemperature, "K");
  requirePositive("bandgapVoltage", device.bandgapVoltage, "V");
  requireFinite("temperatureExponent", device.temperatureExponent);
  return Object.freeze(device);
}

/**
 * The device's saturation current at a temperature, from its Is temperature law.
 *
 * @param device The transistor.
 * @param options Temperature.
 * @returns Is in A.
 * @throws {RangeError} If the temperature is not positive.
 *
 * @example Is grows about 5 times from 300 K to 310 K
 * ```ts
 * import { bjt, bjtSaturationCurrent } from "./bjt.ts";
 * import { ok } from "node:assert/strict";
 * const is310 = bjtSaturationCurrent(bjt(), { temperature: 310 });
 * ok(Math.abs(is310 / 1e-14 - 4.963) < 1e-3);
 * ```
 */
export function bjtSaturationCurrent(device: Bjt, options: BjtBiasOptions = {}): number {
  return saturationCurrentAtTemperature(device.saturationCurrent, {
    temperature: options.temperature ?? DEFAULT_TEMPERATURE,
    referenceTemperature: device.referenceTemperature,
    bandgapVoltage: device.bandgapVoltage,
    temperatureExponent: device.temperatureExponent,
  });
}

function earlyFactor(device: Bjt, options: BjtBiasOptions): number {
  const vce = options.collectorEmitterVoltage ?? 0;
  requireFinite("collectorEmitterVoltage", vce);
  return 1 + vce / device.earlyVoltage;
}

/**
 * Collector current in the forward-active region: Ic = Is·(e^(Vbe/VT) − 1)·(1 + Vce/VA).
 *
 * @param device The transistor.
 * @param vbe Base-emitter voltage (Veb for a PNP), in V.
 * @param options Temperature and Vce.
 * @returns Ic in A.
 * @throws {RangeError} If the temperature is not positive.
 * @throws {TypeError} If `vbe` is not a finite number.
 *
 * @example 0.65479 V drives 1 mA through Is = 1e-14 A
 * ```ts
 * import { bjt, bjtCollectorCurrent } from "./bjt.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(bjtCollectorCurrent(bjt(), 0.65479) - 1e-3) < 1e-7);
 * ```
 */
export function bjtCollectorCurrent(
  device: Bjt,
  vbe: number,
  options: BjtBiasOptions = {},
): number {
  requireFinite("vbe", vbe);
  const vt = thermalVoltage(options.temperature ?? DEFAULT_TEMPERATURE);
  return bjtSaturationCurrent(device, options) * Math.expm1(vbe / vt) *
    earlyFactor(device, options);
}

/**
 * Base-emitter voltage at a collector current: Vbe = VT·ln(Ic/(Is·(1 + Vce/VA)) + 1).
 *
 * @param device The transistor.
 * @param collectorCurrent Ic in A (at least 0).
 * @param options Temperature and Vce.
 * @returns Vbe (Veb for a PNP) in V.
 * @throws {RangeError} If `collectorCurrent` is negative or the temperature not positive.
 *
 * @example 1 mA at 300 K with Is = 1e-14 A
 * ```ts
 * import { bjt, bjtVbe } from "./bjt.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(bjtVbe(bjt(), 1e-3) - 0.65479) < 1e-5);
 * ```
 */
export function bjtVbe(
  device: Bjt,
  collectorCurrent: number,
  options: BjtBiasOptions = {},
): number {
  requireNonNegative("collectorCurrent", collectorCurrent, "A");
  const vt = thermalVoltage(options.temperature ?? DEFAULT_TEMPERATURE);
  const is = bjtSaturationCurrent(device, options) * earlyFactor(device, options);
  return vt * Math.log1p(collectorCurrent / is);
}

/** How {@linkcode bjtSmallSignal} computes ro. */
export type OutputResistanceRule = "earlyVoltage" | "earlyVoltagePlusVce";

/** Options for {@linkcode bjtSmallSignal}. */
export interface BjtSmallSignalOptions {
  /** Collector current Ic at the operating point, in A. */
  collectorCurrent: number;
  /**
   * Junction temperature in K.
   * @default {300}
   */
  temperature?: number;
  /**
   * Collector-emitter voltage in V; needed only for `"earlyVoltagePlusVce"`.
   * @default {undefined}
   */
  collectorEmitterVoltage?: number;
  /**
   * ro = VA/Ic (`"earlyVoltage"`, the usual textbook form, with Ic the actual operating
   * current) or ro = (VA + Vce)/Ic (`"earlyVoltagePlusVce"`, the slope of the Early line
   * through the operating point). They differ by Vce/VA: 13 % at VA = 75 V, Vce = 10 V.
   * @default {"earlyVoltage"}
   */
  outputResistanceRule?: OutputResistanceRule;
}

/** The hybrid-π model of a BJT at its operating point. */
export interface BjtSmallSignal {
  /** Collector current Ic, in A. */
  collectorCurrent: number;
  /** Base current IB = Ic/β, in A. */
  baseCurrent: number;
  /** Emitter current IE = Ic/α, in A. */
  emitterCurrent: number;
  /** Common-base current gain α = β/(β + 1). */
  alpha: number;
  /** Common-emitter current gain β. */
  beta: number;
  /** Thermal voltage at the junction temperature, in V. */
  thermalVoltage: number;
  /** Transconductance gm = Ic/VT, in S. */
  gm: number;
  /** Base input resistance rπ = β/gm = (β + 1)·re, in Ω. */
  rPi: number;
  /** Emitter resistance re = VT/IE = α/gm (not 1/gm), in Ω. */
  re: number;
  /** Output resistance per `outputResistanceRule`, in Ω (`Infinity` without VA). */
  ro: number;
  /** Intrinsic gain gm·ro (VA/VT with the default rule). */
  intrinsicGain: number;
}

/**
 * Small-signal (hybrid-π) parameters at a collector current.
 *
 * @param device The transistor.
 * @param options Ic, temperature, Vce and the ro rule.
 * @returns gm, rπ, re, ro and the intrinsic gain, with the currents they came from.
 * @throws {RangeError} If `collectorCurrent` or the temperature is not positive.
 * @throws {TypeError} If the `"earlyVoltagePlusVce"` rule is asked for without
 *   `collectorEmitterVoltage`.
 *
 * @example 1 mA, β = 100, VA = 100 V at 300 K
 * ```ts
 * import { bjt, bjtSmallSignal } from "./bjt.ts";
 * import { ok } from "node:assert/strict";
 * const model = bjtSmallSignal(bjt({ earlyVoltage: 100 }), { collectorCurrent: 1e-3 });
 * ok(Math.abs(model.gm - 38.682e-3) < 1e-6);
 * ok(Math.abs(model.re - 25.596) < 1e-3); // α/gm, not 1/gm = 25.852 Ω
 * ok(Math.abs(model.ro - 100e3) < 1e-6);
 * ```
 */
export function bjtSmallSignal(device: Bjt, options: BjtSmallSignalOptions): BjtSmallSignal {
  const ic = options.collectorCurrent;
  requirePositive("collectorCurrent", ic, "A");
  const vt = thermalVoltage(options.temperature ?? DEFAULT_TEMPERATURE);
  const rule = options.outputResistanceRule ?? "earlyVoltage";
  let roVoltage = device.earlyVoltage;
  if (rule === "earlyVoltagePlusVce") {
    const vce = options.collectorEmitterVoltage;
    if (vce === undefined) {
      throw new TypeError(
        'Expected collectorEmitterVoltage for outputResistanceRule "earlyVoltagePlusVce", ' +
          "but found undefined",
      );
    }
    requireFinite("collectorEmitterVoltage", vce);
    roVoltage += vce;
  } else if (rule !== "earlyVoltage") {
    throw new TypeError(
      `Expected outputResistanceRule to be "earlyVoltage" or "earlyVoltagePlusVce", but found ${
        String(rule)
      }`,
    );
  }
  const beta = device.beta;
  const alpha = beta / (beta + 1);
  const gm = ic / vt;
  const ro = roVoltage / ic;
  return {
    collectorCurrent: ic,
    baseCurrent: ic / beta,
    emitterCurrent: ic / alpha,
    alpha,
    beta,
    thermalVoltage: vt,
    gm,
    rPi: beta / gm,
    re: alpha / gm,
    ro,
    intrinsicGain: gm * ro,
  };
}

/** Options for {@linkcode bjtTransportCurrents}. */
export interface BjtTransportOptions {
  /** Base-emitter voltage (Veb for a PNP), in V. */
  vbe: number;
  /** Base-collector voltage (Vcb for a PNP), in V; negative in the forward-active region. */
  vbc: number;
  /**
   * Junction temperature in K.
   * @default {300}
   */
  temperature?: number;
}

/** Terminal currents of the Ebers–Moll model, in the forward direction. */
export interface BjtTerminalCurrents {
  /** Collector current (into an NPN's collector, out of a PNP's), in A. */
  collectorCurrent: number;
  /** Base current (into an NPN's base, out of a PNP's), in A. */
  baseCurrent: number;
  /** Emitter current Ic + IB (out of an NPN's emitter, into a PNP's), in A. */
  emitterCurrent: number;
}

/**
 * Terminal currents from the Ebers–Moll transport model, valid in every region:
 *
 * Ic = Is(e^(Vbe/VT) − e^(Vbc/VT)) − (Is/βR)(e^(Vbc/VT) − 1)
 * IB = (Is/βF)(e^(Vbe/VT) − 1) + (Is/βR)(e^(Vbc/VT) − 1)
 *
 * Leaves out the Early effect, high injection and ohmic rb, re and rc, so real saturation
 * voltages are larger than it predicts.
 *
 * @param device The transistor.
 * @param options Both junction voltages and the temperature.
 * @returns Collector, base and emitter currents.
 * @throws {RangeError} If the temperature is not positive.
 * @throws {TypeError} If a voltage is not a finite number.
 *
 * @example Forward-active at Vbe = 0.65 V, Vbc = -5 V
 * ```ts
 * import { bjt, bjtTransportCurrents } from "./bjt.ts";
 * import { ok } from "node:assert/strict";
 * const { collectorCurrent, baseCurrent } = bjtTransportCurrents(bjt(), { vbe: 0.65, vbc: -5 });
 * ok(Math.abs(collectorCurrent - 830.84e-6) < 1e-8);
 * ok(Math.abs(collectorCurrent / baseCurrent - 100) < 1e-6);
 * ```
 */
export function bjtTransportCurrents(
  device: Bjt,
  options: BjtTransportOptions,
): BjtTerminalCurrents {
  requireFinite("vbe", options.vbe);
  requireFinite("vbc", options.vbc);
  const vt = thermalVoltage(options.temperature ?? DEFAULT_TEMPERATURE);
  const is = bjtSaturationCurrent(device, options);
  const forward = Math.expm1(options.vbe / vt);
  const reverse = Math.expm1(options.vbc / vt);
  // e^(Vbe/VT) − e^(Vbc/VT) written with expm1 so it stays exact when both are tiny.
  const collectorCurrent = is * (forward - reverse) - (is / device.reverseBeta) * reverse;
  const baseCurrent = (is / device.beta) * forward + (is / device.reverseBeta) * reverse;
  return { collectorCurrent, baseCurrent, emitterCurrent: collectorCurrent + baseCurrent };
}

/**
 * Collector-emitter saturation voltage for a forced gain βf = Ic/IB below βF, from the
 * transport model: Vce,sat = VT·ln{[1 + (βf + 1)/βR] / [1 − βf/βF]}.
 *
 * @param device The transistor (βF and βR are used).
 * @param forcedBeta The ratio Ic/IB the circuit imposes, above 0 and below βF.
 * @param options Temperature.
 * @returns Vce,sat in V (Vec,sat for a PNP).
 * @throws {RangeError} If `forcedBeta` is not positive or not below βF (then the transistor
 *   is not saturated).
 *
 * @example βF = 100, βR = 1, forced β of 10
 * ```ts
 * import { bjt, bjtSaturationVoltage } from "./bjt.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(bjtSaturationVoltage(bjt(), 10) - 66.96e-3) < 1e-5);
 * ```
 */
export function bjtSaturationVoltage(
  device: Bjt,
  forcedBeta: number,
  options: BjtBiasOptions = {},
): number {
  requirePositive("forcedBeta", forcedBeta);
  if (!(forcedBeta < device.beta)) {
    throw new RangeError(
      `Expected forcedBeta to be below the device's beta (${device.beta}) for saturation, ` +
        `but found ${forcedBeta}`,
    );
  }
  const vt = thermalVoltage(options.temperature ?? DEFAULT_TEMPERATURE);
  return vt *
    Math.log((1 + (forcedBeta + 1) / device.reverseBeta) / (1 - forcedBeta / device.beta));
}
