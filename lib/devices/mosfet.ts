/**
 * MOSFET (N or P channel), long-channel square law with channel-length modulation, plus the
 * weak-inversion estimate where the square law stops holding.
 *
 * Convention (state it, because books differ by a factor of 2): k′ = µ·Cox and
 *
 *   saturation (Vds ≥ Vov):  Id = ½·k′·(W/L)·Vov²·(1 + λ·Vds)
 *   triode     (Vds < Vov):  Id = k′·(W/L)·(Vov·Vds − Vds²/2)
 *
 * with Vov = Vgs − Vt. Texts that write Id = K·Vov² have K = ½·k′·(W/L). The triode law has
 * no λ term, as in the usual textbook form, so Id steps by the factor (1 + λ·Vov) at the
 * region boundary.
 *
 * Voltages and currents are in the forward direction, so N and P read alike: for a P-channel
 * device pass Vsg, Vsd, |Vt| and the current out of the drain.
 *
 * ```
 *   gm │      square law: gm = 2·Id/Vov   (grows without limit as Vov → 0)
 *      │ ─ ─ ─ ─ ─ ─ ─ ─  weak inversion: gm = Id/(n·VT)   (the ceiling)
 *      │        ╲
 *      └────┼──────── Vov
 *         2nVT  below here the square law overstates gm
 * ```
 *
 * @module
 */
import { requireFinite, requireNonNegative, requirePositive } from "../_validate.ts";
import { DEFAULT_TEMPERATURE } from "../physics/constants.ts";
import { thermalVoltage } from "../physics/thermal_voltage.ts";

/** Which carriers form the channel. */
export type MosfetPolarity = "n" | "p";

/** Parameters of a MOSFET, for {@linkcode mosfet}. */
export interface MosfetOptions {
  /**
   * N-channel or P-channel.
   * @default {"n"}
   */
  polarity?: MosfetPolarity;
  /** Process transconductance k′ = µ·Cox, in A/V² (200 µA/V² is `200e-6`). */
  processTransconductance: number;
  /** Aspect ratio W/L (dimensionless). */
  aspectRatio: number;
  /**
   * Threshold voltage magnitude |Vt| in V, used only to report Vgs. A typical value;
   * pass your process's.
   * @default {0.5}
   */
  thresholdVoltage?: number;
  /**
   * Channel-length modulation λ in 1/V (0 for an ideal current source, ro = ∞).
   * @default {0}
   */
  channelLengthModulation?: number;
  /**
   * Weak-inversion slope factor n (about 1.2 to 1.6).
   * @default {1.5}
   */
  slopeFactor?: number;
}

/** A MOSFET with every parameter filled in; build one with {@linkcode mosfet}. */
export interface Mosfet {
  /** N-channel or P-channel. */
  readonly polarity: MosfetPolarity;
  /** k′ = µ·Cox in A/V². */
  readonly processTransconductance: number;
  /** W/L. */
  readonly aspectRatio: number;
  /** |Vt| in V. */
  readonly thresholdVoltage: number;
  /** λ in 1/V. */
  readonly channelLengthModulation: number;
  /** Weak-inversion slope factor n. */
  readonly slopeFactor: number;
}

/**
 * Builds a MOSFET from its parameters, checking each once.
 *
 * @param options Polarity, k′, W/L, Vt, λ and n.
 * @returns The frozen device.
 * @throws {RangeError} If k′, W/L or n is not positive, or λ is negative.
 * @throws {TypeError} If `polarity` is neither "n" nor "p".
 *
 * @example An N-channel device with k′ = 200 µA/V² and W/L = 10
 * ```ts
 * import { mosfet } from "./mosfet.ts";
 * import { equal } from "node:assert/strict";
 * const m1 = mosfet({ processTransconductance: 200e-6, aspectRatio: 10 });
 * equal(m1.slopeFactor, 1.5);
 * ```
 */
export function mosfet(options: MosfetOptions): Mosfet {
  const polarity = options.polarity ?? "n";
  if (polarity !== "n" && polarity !== "p") {
    throw new TypeError(`Expected polarity to be "n" or "p", but found ${String(polarity)}`);
  }
  const device: Mosfet = {
    polarity,
    processTransconductance: options.processTransconductance,
    aspectRatio: options.aspectRatio,
    thresholdVoltage: options.thresholdVoltage ?? 0.5,
    channelLengthModulation: options.channelLengthModulation ?? 0,
    slopeFactor: options.slopeFactor ?? 1.5,
  };
  requirePositive("processTransconductance", device.processTransconductance, "A/V²");
  requirePositive("aspectRatio", device.aspectRatio);
  requireFinite("thresholdVoltage", device.thresholdVoltage);
  requireNonNegative("channelLengthModulation", device.channelLengthModulation, "1/V");
  requirePositive("slopeFactor", device.slopeFactor);
  return Object.freeze(device);
}

/** Operating region of the square-law model. */
export type MosfetRegion = "cutoff" | "triode" | "saturation";

/** Options for {@linkcode mosfetDrainCurrent}. */
export interface MosfetBiasOptions {
  /** Gate-source voltage (Vsg for a P-channel device), in V. */
  gateSourceVoltage: number;
  /** Drain-source voltage (Vsd for a P-channel device), in V, at least 0. */
  drainSourceVoltage: number;
}

/** Drain current and region at a bias point. */
export interface MosfetDrainCurrent {
  /** Drain current in A (0 in cutoff: the square law has no subthreshold current). */
  drainCurrent: number;
  /** Cutoff (Vov ≤ 0), triode (Vds < Vov) or saturation. */
  region: MosfetRegion;
  /** Overdrive Vov = Vgs − Vt, in V. */
  overdrive: number;
}

/**
 * Drain current from the square law at given terminal voltages.
 *
 * @param device The transistor.
 * @param options Vgs and Vds.
 * @returns Id, the region and Vov.
 * @throws {RangeError} If `drainSourceVoltage` is negative.
 * @throws {TypeError} If a voltage is not a finite number.
 *
 * @example Saturation at Vov = 0.2 V and triode at Vds = 0.1 V
 * ```ts
 * import { mosfet, mosfetDrainCurrent } from "./mosfet.ts";
 * import { equal, ok } from "node:assert/strict";
 * const m1 = mosfet({ processTransconductance: 200e-6, aspectRatio: 10 });
 * const sat = mosfetDrainCurrent(m1, { gateSourceVoltage: 0.7, drainSourceVoltage: 1 });
 * equal(sat.region, "saturation");
 * ok(Math.abs(sat.drainCurrent - 40e-6) < 1e-12);
 * const lin = mosfetDrainCurrent(m1, { gateSourceVoltage: 0.7, drainSourceVoltage: 0.1 });
 * equal(lin.region, "triode");
 * ok(Math.abs(lin.drainCurrent - 30e-6) < 1e-12);
 * ```
 */
export function mosfetDrainCurrent(device: Mosfet, options: MosfetBiasOptions): MosfetDrainCurrent {
  requireFinite("gateSourceVoltage", options.gateSourceVoltage);
  requireNonNegative("drainSourceVoltage", options.drainSourceVoltage, "V");
  const overdrive = options.gateSourceVoltage - device.thresholdVoltage;
  const vds = options.drainSourceVoltage;
  const k = device.processTransconductance * device.aspectRatio;
  if (overdrive <= 0) return { drainCurrent: 0, region: "cutoff", overdrive };
  if (vds < overdrive) {
    return { drainCurrent: k * (overdrive * vds - (vds * vds) / 2), region: "triode", overdrive };
  }
  return {
    drainCurrent: 0.5 * k * overdrive * overdrive * (1 + device.channelLengthModulation * vds),
    region: "saturation",
    overdrive,
  };
}

/** Options for {@linkcode mosfetOverdrive}. */
export interface MosfetOverdriveOptions {
  /**
   * Vds in V, to include the (1 + λ·Vds) factor; left out, the factor is 1.
   * @default {undefined}
   */
  drainSourceVoltage?: number;
}

/**
 * Overdrive needed for a drain current in saturation: Vov = √(2·Id / (k′·(W/L)·(1 + λ·Vds))).
 *
 * @param device The transistor.
 * @param drainCurrent Id in A (at least 0).
 * @param options Vds for the λ factor.
 * @returns Vov in V.
 * @throws {RangeError} If `drainCurrent` or `drainSourceVoltage` is negative.
 *
 * @example 250 µA with k′ = 120 µA/V², W/L = 20 needs 0.45644 V
 * ```ts
 * import { mosfet, mosfetOverdrive } from "./mosfet.ts";
 * import { ok } from "node:assert/strict";
 * const m1 = mosfet({ processTransconductance: 120e-6, aspectRatio: 20 });
 * ok(Math.abs(mosfetOverdrive(m1, 250e-6) - 0.45644) < 1e-5);
 * ```
 */
export function mosfetOverdrive(
  device: Mosfet,
  drainCurrent: number,
  options: MosfetOverdriveOptions = {},
): number {
  requireNonNegative("drainCurrent", drainCurrent, "A");
  let factor = 1;
  if (options.drainSourceVoltage !== undefined) {
    requireNonNegative("drainSourceVoltage", options.drainSourceVoltage, "V");
    factor += device.channelLengthModulation * options.drainSourceVoltage;
  }
  return Math.sqrt(
    (2 * drainCurrent) / (device.processTransconductance * device.aspectRatio * factor),
  );
}

/** Options for {@linkcode mosfetSmallSignal}: give the drain current or the overdrive. */
export interface MosfetSmallSignalOptions {
  /** Drain current Id in A (give this or `overdrive`). */
  drainCurrent?: number;
  /** Overdrive Vov in V (give this or `drainCurrent`). */
  overdrive?: number;
  /**
   * Vds in V, for the (1 + λ·Vds) factor and the saturation check; left out, the factor is
   * 1 and the check is skipped.
   * @default {undefined}
   */
  drainSourceVoltage?: number;
  /**
   * Temperature in K, for the weak-inversion estimate.
   * @default {300}
   */
  temperature?: number;
}

/** The small-signal model of a MOSFET in saturation. */
export interface MosfetSmallSignal {
  /** Drain current Id, in A. */
  drainCurrent: number;
  /** Overdrive Vov = Vgs − Vt, in V. */
  overdrive: number;
  /** Gate-source voltage Vt + Vov, in V. */
  gateSourceVoltage: number;
  /** Transconductance ∂Id/∂Vgs = 2·Id/Vov of the square law, in S. */
  gm: number;
  /** gm as k′·(W/L)·Vov (equal to `gm` when λ·Vds is left out), in S. */
  gmFromOverdrive: number;
  /** gm as 2·Id/Vov, in S. */
  gmFromCurrentAndOverdrive: number;
  /** gm as √(2·k′·(W/L)·Id) (equal to `gm` when λ·Vds is left out), in S. */
  gmFromCurrent: number;
  /** Output resistance ro = 1/(λ·Id), in Ω (`Infinity` when λ = 0). */
  ro: number;
  /** Intrinsic gain gm·ro (2/(λ·Vov) when λ·Vds is left out). */
  intrinsicGain: number;
  /** The weak-inversion transconductance Id/(n·VT): the most gm this current can give, in S. */
  weakInversionGm: number;
  /** Overdrive 2·n·VT where the two gm laws meet, in V. */
  weakInversionOverdrive: number;
  /** True when Vov < 2·n·VT: near weak inversion, the square law overstates gm. */
  nearWeakInversion: boolean;
  /** One sentence per problem found (near weak inversion, not in saturation). */
  warnings: string[];
}

/**
 * Small-signal parameters of a MOSFET in saturation, with gm computed three ways and a
 * warning when the overdrive is so small that the device is near weak inversion.
 *
 * @param device The transistor.
 * @param options The drain current or the overdrive, Vds and temperature.
 * @returns Id, Vov, Vgs, gm (three ways), ro, intrinsic gain and the weak-inversion view.
 * @throws {TypeError} If neither or both of `drainCurrent` and `overdrive` are given.
 * @throws {RangeError} If the given current or overdrive is not positive.
 *
 * @example k′ = 200 µA/V², W/L = 10, Vov = 0.2 V, λ = 0.1 /V
 * ```ts
 * import { mosfet, mosfetSmallSignal } from "./mosfet.ts";
 * import { equal, ok } from "node:assert/strict";
 * const m1 = mosfet({
 *   processTransconductance: 200e-6,
 *   aspectRatio: 10,
 *   channelLengthModulation: 0.1,
 * });
 * const model = mosfetSmallSignal(m1, { overdrive: 0.2 });
 * ok(Math.abs(model.drainCurrent - 40e-6) < 1e-12);
 * ok(Math.abs(model.gm - 0.4e-3) < 1e-12);
 * ok(Math.abs(model.ro - 250e3) < 1e-6);
 * equal(model.nearWeakInversion, false);
 * ```
 */
export function mosfetSmallSignal(
  device: Mosfet,
  options: MosfetSmallSignalOptions,
): MosfetSmallSignal {
  const hasCurrent = options.drainCurrent !== undefined;
  if (hasCurrent === (options.overdrive !== undefined)) {
    throw new TypeError(
      "Expected exactly one of drainCurrent and overdrive, but found " +
        (hasCurrent ? "both" : "neither"),
    );
  }
  const vds = options.drainSourceVoltage;
  if (vds !== undefined) requireNonNegative("drainSourceVoltage", vds, "V");
  const lambda = device.channelLengthModulation;
  const k = device.processTransconductance * device.aspectRatio;
  const lambdaFactor = vds === undefined ? 1 : 1 + lambda * vds;
  let drainCurrent: number;
  let overdrive: number;
  if (hasCurrent) {
    drainCurrent = options.drainCurrent!;
    requirePositive("drainCurrent", drainCurrent, "A");
    overdrive = mosfetOverdrive(device, drainCurrent, { drainSourceVoltage: vds });
  } else {
    overdrive = options.overdrive!;
    requirePositive("overdrive", overdrive, "V");
    drainCurrent = 0.5 * k * overdrive * overdrive * lambdaFactor;
  }
  const gm = (2 * drainCurrent) / overdrive;
  const ro = 1 / (lambda * drainCurrent);
  const weak = weakInversionGm(drainCurrent, {
    slopeFactor: device.slopeFactor,
    temperature: options.temperature,
  });
  const boundary = weakInversionOverdrive({
    slopeFactor: device.slopeFactor,
    temperature: options.temperature,
  });
  const warnings: string[] = [];
  const nearWeakInversion = overdrive < boundary;
  if (nearWeakInversion) {
    warnings.push(
      `Overdrive ${mv(overdrive)} is below 2nVT = ${mv(boundary)}: the device is near weak ` +
        `inversion, so the square-law gm (${gm.toPrecision(4)} S) overstates it; expect at most ` +
        `Id/(nVT) = ${weak.toPrecision(4)} S`,
    );
  }
  if (vds !== undefined && vds < overdrive) {
    warnings.push(
      `Vds ${mv(vds)} is below the overdrive ${mv(overdrive)}: the device is in triode, ` +
        "not saturation",
    );
  }
  return {
    drainCurrent,
    overdrive,
    gateSourceVoltage: device.thresholdVoltage + overdrive,
    gm,
    gmFromOverdrive: k * overdrive,
    gmFromCurrentAndOverdrive: gm,
    gmFromCurrent: Math.sqrt(2 * k * drainCurrent),
    ro,
    intrinsicGain: gm * ro,
    weakInversionGm: weak,
    weakInversionOverdrive: boundary,
    nearWeakInversion,
    warnings,
  };
}

function mv(volts: number): string {
  return `${(volts * 1e3).toPrecision(4)} mV`;
}

/** Options for the weak-inversion helpers. */
export interface WeakInversionOptions {
  /**
   * Slope factor n (about 1.2 to 1.6).
   * @default {1.5}
   */
  slopeFactor?: number;
  /**
   * Temperature in K.
   * @default {300}
   */
  temperature?: number;
}

/**
 * Transconductance in weak inversion: gm = Id/(n·VT), the ceiling a MOSFET's gm reaches
 * at a given current.
 *
 * @param drainCurrent Id in A (at least 0).
 * @param options Slope factor and temperature.
 * @returns gm in S.
 * @throws {RangeError} If `drainCurrent` is negative or the slope factor or temperature is
 *   not positive.
 *
 * @example 10 µA with n = 1.5 at 300 K gives 257.9 µS
 * ```ts
 * import { weakInversionGm } from "./mosfet.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(weakInversionGm(10e-6) - 257.9e-6) < 1e-7);
 * ```
 */
export function weakInversionGm(drainCurrent: number, options: WeakInversionOptions = {}): number {
  requireNonNegative("drainCurrent", drainCurrent, "A");
  const n = options.slopeFactor ?? 1.5;
  requirePositive("slopeFactor", n);
  return drainCurrent / (n * thermalVoltage(options.temperature ?? DEFAULT_TEMPERATURE));
}

/**
 * The overdrive 2·n·VT where the square-law gm (2·Id/Vov) meets the weak-inversion gm
 * (Id/(n·VT)): an estimate of where strong inversion ends; the real change is gradual.
 *
 * @param options Slope factor and temperature.
 * @returns The overdrive in V (77.56 mV for n = 1.5 at 300 K).
 * @throws {RangeError} If the slope factor or temperature is not positive.
 *
 * @example n = 1.5 at 300 K
 * ```ts
 * import { weakInversionOverdrive } from "./mosfet.ts";
 * import { ok } from "node:assert/strict";
 * ok(Math.abs(weakInversionOverdrive() - 77.56e-3) < 1e-5);
 * ```
 */
export function weakInversionOverdrive(options: WeakInversionOptions = {}): number {
  const n = options.slopeFactor ?? 1.5;
  requirePositive("slopeFactor", n);
  return 2 * n * thermalVoltage(options.temperature ?? DEFAULT_TEMPERATURE);
}
