/**
 * Generic safety cautions for a power amplifier design, as warnings. This is NOT a safety
 * assessment or a certification: it reminds the designer of hazards and defers to the
 * applicable product-safety standard, local electrical codes and licensed practice.
 *
 * @module
 */
import { requireNonNegative, requirePositive } from "../_validate.ts";
import { DISPLAY, type MimeBundle } from "../display.ts";
import { celsius } from "../physics/thermal_voltage.ts";
import { formatSi } from "../units/format.ts";

/**
 * The commonly quoted ES1 limit for DC voltage in IEC 62368-1, in V. Quoted from memory:
 * check the standard and its conditions before relying on it.
 */
export const ES1_DC_VOLTAGE_LIMIT = 60;

/** What a caution is about. */
export type SafetyTopic =
  | "mains"
  | "rail voltage"
  | "output voltage"
  | "stored energy"
  | "heat"
  | "speaker protection"
  | "instability"
  | "test practice";

/** One caution. */
export interface SafetyWarning {
  /** What it is about. */
  topic: SafetyTopic;
  /** One or two plain sentences. */
  message: string;
}

/** Options for {@linkcode amplifierSafetyCautions}. */
export interface AmplifierSafetyOptions {
  /** Each rail's voltage, VCC of ±VCC, in V. */
  supplyVoltage: number;
  /** Rated output power in W (with `loadResistance`, gives the terminal voltage). */
  outputPower?: number;
  /** Load resistance in Ω (with `outputPower`). */
  loadResistance?: number;
  /** Output peak voltage in V, if known directly. */
  outputPeakVoltage?: number;
  /** Reservoir capacitance on each rail in F. */
  reservoirCapacitance?: number;
  /** Bleeder resistor across each reservoir in Ω. */
  bleederResistance?: number;
  /** Expected heat-sink temperature in K. */
  heatSinkTemperature?: number;
  /**
   * Heat-sink temperature above which a touch warning is given, in K. A placeholder for the
   * applicable standard's touch-temperature limits (common practice, no source).
   * @default {333.15 (60 °C)}
   */
  touchTemperatureLimit?: number;
  /**
   * Whether the amplifier has its own mains supply.
   * @default {true}
   */
  mainsPowered?: boolean;
  /**
   * Whether the output is bridged (neither speaker terminal is ground).
   * @default {false}
   */
  bridged?: boolean;
}

/** The figures behind the cautions, and the cautions themselves. */
export interface AmplifierSafety {
  /** Voltage between the rails, 2·VCC, in V. */
  railToRailVoltage: number;
  /** True when the rail-to-rail voltage is above the commonly quoted ES1 DC limit. */
  aboveEs1: boolean;
  /** Output peak voltage in V, when known. */
  outputPeakVoltage?: number;
  /** Output RMS voltage (sine) in V, when known. */
  outputRmsVoltage?: number;
  /** Energy stored in each rail's reservoir, ½CV², in J. */
  storedEnergyPerRail?: number;
  /** Bleeder time constant RC in s. */
  bleederTimeConstant?: number;
  /** Time for the rail to fall to 10 %, ln(10)·RC, in s. */
  timeToTenPercent?: number;
  /** Bleeder dissipation at the full rail voltage, V²/R, in W. */
  bleederPower?: number;
  /** The cautions that apply. */
  warnings: SafetyWarning[];
  /** What these warnings are not. */
  disclaimer: string;
  /** Plain-text display for notebooks. */
  [DISPLAY](): MimeBundle;
}

/**
 * The safety cautions that apply to a power amplifier with the given rails, output and
 * reservoir: mains, rail voltage above the commonly quoted ES1 limit, stored energy and
 * bleeder time, hot heat sinks, speaker DC protection, instability and test practice.
 *
 * @param options Rails, output level, reservoir and heat-sink figures.
 * @returns The figures and the warnings, with a disclaimer.
 * @throws {RangeError} If a value is out of range.
 *
 * @example ±50 V rails with 10 000 µF and a 4.7 kΩ bleeder (REFERENCE §10)
 * ```ts
 * import { amplifierSafetyCautions } from "./safety.ts";
 * import { equal, ok } from "node:assert/strict";
 * const safety = amplifierSafetyCautions({
 *   supplyVoltage: 50, reservoirCapacitance: 0.01, bleederResistance: 4700,
 * });
 * ok(Math.abs(safety.storedEnergyPerRail! - 12.5) < 1e-12);
 * equal(safety.aboveEs1, true);
 * ok(safety.warnings.some((w) => w.topic === "rail voltage"));
 * ```
 */
export function amplifierSafetyCautions(options: AmplifierSafetyOptions): AmplifierSafety {
  const vcc = options.supplyVoltage;
  requirePositive("supplyVoltage", vcc, "V");
  const railToRailVoltage = 2 * vcc;
  const aboveEs1 = railToRailVoltage > ES1_DC_VOLTAGE_LIMIT;
  const v = (x: number, unit: string) => formatSi(x, unit, { digits: 4 });
  const warnings: SafetyWarning[] = [];

  if (options.mainsPowered ?? true) {
    warnings.push({
      topic: "mains",
      message: "The supply's primary side is hazardous: use a correctly rated fuse, protective " +
        "earth on exposed metal where the construction needs it, proper creepage and clearance, " +
        "and strain relief; follow the applicable product-safety standard (e.g. IEC 62368-1) " +
        "and local electrical codes.",
    });
  }
  if (aboveEs1) {
    warnings.push({
      topic: "rail voltage",
      message: `±${v(vcc, "V")} rails are ${v(railToRailVoltage, "V")} DC between the rails, ` +
        `above the commonly quoted ES1 limit of about ${ES1_DC_VOLTAGE_LIMIT} V DC (IEC 62368-1, ` +
        "from memory): treat the rails and output terminals as hazardous.",
    });
  }

  let outputPeakVoltage = options.outputPeakVoltage;
  if (outputPeakVoltage !== undefined) {
    requireNonNegative("outputPeakVoltage", outputPeakVoltage, "V");
  }
  if (options.outputPower !== undefined || options.loadResistance !== undefined) {
    requirePositive("outputPower", options.outputPower, "W");
    requirePositive("loadResistance", options.loadResistance, "Ω");
    outputPeakVoltage ??= Math.sqrt(2 * options.outputPower * options.loadResistance);
  }
  const outputRmsVoltage = outputPeakVoltage === undefined
    ? undefined
    : outputPeakVoltage / Math.SQRT2;
  if (outputPeakVoltage !== undefined && outputRmsVoltage !== undefined) {
    warnings.push({
      topic: "output voltage",
      message: `The speaker terminals carry up to ${v(outputRmsVoltage, "V")} RMS ` +
        `(${v(outputPeakVoltage, "V")} peak); do not touch them while the amplifier plays.`,
    });
  }

  let storedEnergyPerRail: number | undefined;
  let bleederTimeConstant: number | undefined;
  let timeToTenPercent: number | undefined;
  let bleederPower: number | undefined;
  if (options.reservoirCapacitance !== undefined) {
    const c = options.reservoirCapacitance;
    requirePositive("reservoirCapacitance", c, "F");
    storedEnergyPerRail = 0.5 * c * vcc * vcc;
    let message = `Each reservoir stores ${v(storedEnergyPerRail, "J")} at ${v(vcc, "V")}`;
    if (options.bleederResistance !== undefined) {
      const r = options.bleederResistance;
      requirePositive("bleederResistance", r, "Ω");
      bleederTimeConstant = r * c;
      timeToTenPercent = Math.LN10 * bleederTimeConstant;
      bleederPower = (vcc * vcc) / r;
      message += `; the ${v(r, "Ω")} bleeder (τ = ${v(bleederTimeConstant, "s")}, ` +
        `${v(bleederPower, "W")}) takes ${v(timeToTenPercent, "s")} to bring it to 10 %`;
    } else {
      message += " and there is no bleeder";
    }
    warnings.push({
      topic: "stored energy",
      message: `${message}. Measure the rail voltage before touching.`,
    });
  }

  const touchLimit = options.touchTemperatureLimit ?? 333.15;
  requirePositive("touchTemperatureLimit", touchLimit, "K");
  if (options.heatSinkTemperature !== undefined) {
    requirePositive("heatSinkTemperature", options.heatSinkTemperature, "K");
  }
  if (options.heatSinkTemperature === undefined || options.heatSinkTemperature > touchLimit) {
    const known = options.heatSinkTemperature === undefined
      ? "Heat sinks and device cases can exceed safe touch temperatures"
      : `The heat sink reaches about ${v(celsius(options.heatSinkTemperature), "°C")}, above ` +
        `${v(celsius(touchLimit), "°C")}`;
    warnings.push({
      topic: "heat",
      message: `${known}: check the touch-temperature limits of the applicable standard, ` +
        "guard or label hot parts, and derate the devices.",
    });
  }

  warnings.push(
    {
      topic: "speaker protection",
      message: "Protect the speaker against DC after a device failure (a typical scheme opens a " +
        "relay or crowbar when |DC| stays above about 1–2 V for about 0.1 s), delay the " +
        "connection at switch-on, and limit current or SOA against shorts.",
    },
    {
      topic: "instability",
      message: "An oscillating amplifier can destroy tweeters and output devices: check the " +
        "output network and the stability margins, and never run open-loop power tests into a " +
        "speaker.",
    },
    {
      topic: "test practice",
      message: "First power-up from a current-limited or variac-fed supply with a series lamp or " +
        "resistor; keep one hand away from the circuit" +
        (options.bridged
          ? "; the output is bridged, so never connect earthed test equipment across it."
          : "; never connect earthed test equipment to an output whose reference is not ground."),
    },
  );

  const disclaimer = "These are generic cautions, not a safety assessment or certification; " +
    "follow the applicable standards, local codes and licensed practice.";
  return {
    railToRailVoltage,
    aboveEs1,
    outputPeakVoltage,
    outputRmsVoltage,
    storedEnergyPerRail,
    bleederTimeConstant,
    timeToTenPercent,
    bleederPower,
    warnings,
    disclaimer,
    [DISPLAY]() {
      const lines = warnings.map((w) => `- ${w.topic}: ${w.message}`);
      return { "text/plain": [...lines, disclaimer].join("\n") };
    },
  };
}
