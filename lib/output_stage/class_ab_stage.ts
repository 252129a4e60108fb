/**
 * The class-AB complementary emitter-follower output stage as one design: swing from the
 * rails, output resistance and gain, power and dissipation against level, bias, heat, and the
 * checks a reviewer asks for.
 *
 * ```
 *   +VCC ─────────┬──────────────┐
 *          VAS    │ (headroom)   C
 *        current ─┤        ┌── driver/output ── RE ──┐
 *                 Vbias    │                         ├── out ── RL (or |Z|∠φ)
 *        (VBE mult.)       └── driver/output ── RE ──┘
 *   −VCC ─────────┴──────────────┘
 * ```
 *
 * Powers assume a sine output and the ideal class-B current waveform (each device conducts
 * one half-cycle); idle dissipation 2·VCC·Iq is reported beside them and added, per device,
 * to the worst case used by the rating and temperature checks (a deliberate over-estimate).
 *
 * @module
 */
import { requireInRange, requireNonNegative, requirePositive } from "../_validate.ts";
import type { TwoPort } from "../cascade/two_port.ts";
import { atLeast, atMost, type CheckResult, within } from "../checks/check.ts";
import { DEFAULT_TEMPERATURE } from "../physics/constants.ts";
import { celsius, thermalVoltage } from "../physics/thermal_voltage.ts";
import {
  compoundCurrentGain,
  followerPairBiasVoltage,
  type GainMatchedBias,
  gainMatchedBias,
  type OutputDeviceKind,
} from "./follower.ts";
import {
  type ClassBPower,
  classBPower,
  classBPowerTable,
  type ClassBWorstCase,
  classBWorstCaseDissipation,
} from "./power.ts";
import {
  type HeatSinkTemperatures,
  heatSinkTemperatures,
  type ThermalRunaway,
  thermalRunawayGain,
} from "./thermal.ts";

/** The devices in each half of the stage. */
export interface OutputStageDevices {
  /** Single device, Darlington, or complementary feedback pair. */
  kind: OutputDeviceKind;
  /** Current gain of the output device. */
  outputBeta: number;
  /**
   * Current gain of the driver (not used for `"single"`).
   * @default {100}
   */
  driverBeta?: number;
}

/** A reactive load, for the worst-case dissipation. */
export interface ReactiveLoad {
  /** Impedance magnitude |Z| in Ω. */
  magnitude: number;
  /** Phase angle φ in rad, −π/2 … π/2. */
  angle: number;
}

/** Heat path of the output devices, for the junction-temperature and runaway checks. */
export interface OutputStageThermalOptions {
  /** Junction to case θjc of each output device in K/W. */
  junctionToCase: number;
  /**
   * Case to sink θcs of each output device in K/W.
   * @default {0}
   */
  caseToSink?: number;
  /** Heat sink to ambient θsa in K/W. */
  sinkToAmbient: number;
  /** Ambient temperature in K. */
  ambientTemperature: number;
  /**
   * Junction temperature limit for the check, in K.
   * @default {398.15 (125 °C; common practice derating from 150 °C)}
   */
  maxJunctionTemperature?: number;
  /**
   * Output devices sharing the heat sink, each at the worst-case dissipation.
   * @default {2}
   */
  devicesOnSink?: number;
  /**
   * Temperature slope of the output devices' VBE in V/K.
   * @default {-0.0021}
   */
  vbeTemperatureCoefficient?: number;
}

/** Options for {@linkcode classAbOutputStage}. */
export interface ClassAbOutputStageOptions {
  /** Each rail's voltage, VCC of ±VCC, in V. */
  supplyVoltage: number;
  /** Load resistance RL in Ω. */
  loadResistance: number;
  /** Optional reactive load, for the worst-case dissipation. */
  reactiveLoad?: ReactiveLoad;
  /** Emitter resistor RE of each half in Ω. */
  emitterResistance: number;
  /**
   * Quiescent current Iq in A.
   * @default {VT/(RE + Rb/(β+1)), the gain-matching (Oliver) bias}
   */
  quiescentCurrent?: number;
  /**
   * The devices in each half.
   * @default {{ kind: "darlington", driverBeta: 100, outputBeta: 50 }}
   */
  devices?: OutputStageDevices;
  /**
   * Resistance driving both bases from one node (the VAS output), Rs, in Ω. It adds
   * Rs/(β+1) to the output resistance whether one or both halves conduct.
   * @default {0}
   */
  drivingResistance?: number;
  /**
   * Resistance in series with each half's input (a base stopper), Rb, in Ω. It is halved at
   * crossover like RE, so it counts in the gain-matching bias.
   * @default {0}
   */
  baseStopperResistance?: number;
  /**
   * How close the VAS output gets to each rail, in V.
   * @default {1}
   */
  vasHeadroom?: number;
  /**
   * VBE of the driver at peak current in V.
   * @default {0.7}
   */
  driverVbe?: number;
  /**
   * VBE of the output device at peak current in V.
   * @default {0.9}
   */
  outputVbe?: number;
  /**
   * Saturation voltage VCE,sat of the output device at peak current in V.
   * @default {1}
   */
  saturationVoltage?: number;
  /**
   * Saturation current Is of the output devices, for VBE at the quiescent current, in A.
   * @default {1e-12}
   */
  saturationCurrent?: number;
  /**
   * Junction temperature for VT in K.
   * @default {300}
   */
  temperature?: number;
  /** Output power the stage must reach at full swing, in W (adds a check). */
  targetPower?: number;
  /** Largest dissipation allowed per output device, in W (adds a check). */
  deviceMaxDissipation?: number;
  /** Heat path (adds the junction-temperature and runaway checks). */
  thermal?: OutputStageThermalOptions;
  /**
   * Allowed |crossover gain / large-signal gain − 1| for the gain-matching check.
   * @default {0.005}
   */
  gainMatchTolerance?: number;
  /**
   * Rows in the power table, from 0 V to the available swing.
   * @default {21}
   */
  tablePoints?: number;
}

/** Output swing and what limits it. */
export interface OutputSwing {
  /** Largest output peak V̂ in V. */
  peak: number;
  /** Output peak current Î = V̂/RL in A. */
  peakCurrent: number;
  /** Peak set by the drive chain: (VCC − headroom − ΣVBE)/(1 + RE/RL), in V. */
  driveLimit: number;
  /** Peak set by the output device saturating: (VCC − VCE,sat)/(1 + RE/RL), in V. */
  saturationLimit: number;
  /** Which limit sets the swing. */
  limitedBy: "drive" | "saturation";
  /** Sine power into RL at that peak, in W. */
  outputPower: number;
  /** Ideal class-B maximum VCC²/(2RL), in W. */
  idealOutputPower: number;
}

/** Results of {@linkcode classAbOutputStage}. */
export interface ClassAbOutputStage {
  /** The quiescent current used, in A. */
  quiescentCurrent: number;
  /** Whether Iq was given or chosen by the gain-matching criterion. */
  biasChoice: "given" | "gainMatched";
  /** Compound current gain of each half. */
  currentGain: number;
  /** Rs/(β+1), the shared driving resistance seen from the output, in Ω. */
  reflectedSourceResistance: number;
  /** Rb/(β+1), each half's base stopper seen from its emitter, in Ω. */
  reflectedStopperResistance: number;
  /**
   * Bias voltage the spreader must give between the two inputs, in V: 2·VBE(Iq) + 2·Iq·RE
   * from Is for single devices, plus 2·driverVbe for a Darlington, and 2·driverVbe + 2·Iq·RE
   * for a feedback pair (the compound cases are estimates).
   */
  biasVoltage: number;
  /** Output swing from the rails and headroom. */
  swing: OutputSwing;
  /** Output resistance in Ω. */
  outputResistance: {
    /** One device conducting at the peak current: RE + Rb/(β+1) + re + Rs/(β+1). */
    oneDevice: number;
    /** Both conducting at Iq: (RE + Rb/(β+1) + VT/Iq)/2 + Rs/(β+1). */
    bothDevices: number;
  };
  /** Voltage gain into RL from the driving source. */
  gain: {
    /** One device conducting at the peak current. */
    oneDevice: number;
    /** Incremental gain at crossover (both conducting). */
    crossover: number;
    /** Large-current limit (re → 0). */
    largeSignal: number;
  };
  /** The gain-matching bias assessment. */
  gainMatching: GainMatchedBias;
  /** Power and dissipation (ideal class-B waveforms; see the module notes). */
  power: {
    /** Figures at output peak V̂ (0 … VCC) into RL. */
    at: (peak: number) => ClassBPower;
    /** Figures from 0 V to the available swing. */
    table: ClassBPower[];
    /** Worst-case dissipation into RL, with the level where it occurs. */
    worstCase: ClassBWorstCase;
    /** Worst-case dissipation into the reactive load, when one is given. */
    worstCaseReactive?: ClassBWorstCase;
    /** Idle dissipation of both devices, 2·VCC·Iq, in W. */
    idleTotal: number;
    /** Idle dissipation of each device, VCC·Iq, in W. */
    idlePerDevice: number;
    /** Worst per-device dissipation used by the checks: worst case (any load) plus idle, in W. */
    designPerDevice: number;
  };
  /** Temperatures and the runaway loop, when a heat path is given. */
  thermal?: {
    /** Temperatures with every device on the sink at `power.designPerDevice`. */
    temperatures: HeatSinkTemperatures;
    /** Runaway loop with θ = θjc + θcs + N·θsa (every device's Iq rises together). */
    runaway: ThermalRunaway;
  };
  /** Two-port view at the quiescent point (both devices conducting) with the design load. */
  twoPort: TwoPort;
  /** Design checks. */
  checks: CheckResult[];
}

/**
 * Designs and checks a class-AB complementary emitter-follower output stage.
 *
 * The input resistance in `twoPort` assumes the design load RL; the output resistance there
 * leaves out the driving resistance, because a cascade's source divider already accounts
 * for it (Rin/(Rin + Rs) times RL/(RL + Rout) equals the follower gain with Rs/(β+1)).
 *
 * @param options Rails, load, emitter resistors, bias, devices, drive, heat path, targets.
 * @returns The stage's operating point, swing, gains, power, heat and checks.
 * @throws {RangeError} If a value is out of range.
 *
 * @example ±35 V into 8 Ω with 0.22 Ω emitter resistors, bias chosen by gain matching
 * ```ts
 * import { classAbOutputStage } from "./class_ab_stage.ts";
 * import { equal, ok } from "node:assert/strict";
 * const stage = classAbOutputStage({
 *   supplyVoltage: 35, loadResistance: 8, emitterResistance: 0.22, targetPower: 60,
 * });
 * ok(Math.abs(stage.swing.peak - 31.533) < 1e-3); // REFERENCE E5.6
 * ok(Math.abs(stage.power.worstCase.dissipationPerDevice - 15.51) < 0.01); // E5.1
 * equal(stage.checks.every((check) => check.pass), true);
 * ```
 */
export function classAbOutputStage(options: ClassAbOutputStageOptions): ClassAbOutputStage {
  const vcc = options.supplyVoltage;
  requirePositive("supplyVoltage", vcc, "V");
  const rl = options.loadResistance;
  requirePositive("loadResistance", rl, "Ω");
  const re = options.emitterResistance;
  requireNonNegative("emitterResistance", re, "Ω");
  const temperature = options.temperature ?? DEFAULT_TEMPERATURE;
  const vt = thermalVoltage(temperature);
  const devices = options.devices ?? { kind: "darlington", driverBeta: 100, outputBeta: 50 };
  const beta = compoundCurrentGain(devices.kind, devices);
  const rs = options.drivingResistance ?? 0;
  requireNonNegative("drivingResistance", rs, "Ω");
  const reflected = rs / (beta + 1);
  const rb = options.baseStopperResistance ?? 0;
  requireNonNegative("baseStopperResistance", rb, "Ω");
  const stopper = rb / (beta + 1);
  const headroom = options.vasHeadroom ?? 1;
  requireNonNegative("vasHeadroom", headroom, "V");
  const driverVbe = options.driverVbe ?? 0.7;
  requireNonNegative("driverVbe", driverVbe, "V");
  const outputVbe = options.outputVbe ?? 0.9;
  requireNonNegative("outputVbe", outputVbe, "V");
  const vceSat = options.saturationVoltage ?? 1;
  requireNonNegative("saturationVoltage", vceSat, "V");
  const is = options.saturationCurrent ?? 1e-12;
  requirePositive("saturationCurrent", is, "A");
  const tolerance = options.gainMatchTolerance ?? 0.005;
  requirePositive("gainMatchTolerance", tolerance);

  // Bias: Oliver's "RE" is the whole series resistance of each half (REFERENCE §5.7); the
  // shared driving resistance adds equally on both sides of crossover and drops out.
  const biasChoice = options.quiescentCurrent === undefined ? "gainMatched" : "given";
  if (options.quiescentCurrent === undefined) {
    requirePositive("emitterResistance + baseStopperResistance/(β+1)", re + stopper, "Ω");
  }
  const iq = options.quiescentCurrent ?? vt / (re + stopper);
  requirePositive("quiescentCurrent", iq, "A");
  const gainMatching = gainMatchedBias(re, {
    loadResistance: rl,
    quiescentCurrent: iq,
    perHalfSeriesResistance: stopper,
    sharedSeriesResistance: reflected,
    temperature,
  });

  // Swing. In a CFP the output device's VBE sits inside the local loop, so the drive chain
  // loses only the driver's VBE; a Darlington loses both.
  const vbeChain = devices.kind === "single"
    ? outputVbe
    : devices.kind === "darlington"
    ? driverVbe + outputVbe
    : driverVbe;
  const divider = 1 + re / rl;
  const driveLimit = Math.max(0, (vcc - headroom - vbeChain) / divider);
  const saturationLimit = Math.max(0, (vcc - vceSat) / divider);
  const peak = Math.min(driveLimit, saturationLimit);
  const peakCurrent = peak / rl;
  const swing: OutputSwing = {
    peak,
    peakCurrent,
    driveLimit,
    saturationLimit,
    limitedBy: driveLimit <= saturationLimit ? "drive" : "saturation",
    outputPower: (peak * peak) / (2 * rl),
    idealOutputPower: (vcc * vcc) / (2 * rl),
  };

  const oneDevice = re + stopper + (peakCurrent > 0 ? vt / peakCurrent : Infinity) + reflected;
  // Whether one or both halves conduct, the output current draws iL/(β+1) from the shared
  // drive, so Rs/(β+1) is not halved at crossover; RE, Rb/(β+1) and re are.
  const emitterSide = (re + stopper + vt / iq) / 2;
  const bothDevices = emitterSide + reflected;

  // Power.
  const load = { supplyVoltage: vcc, loadImpedance: rl };
  const worstCase = classBWorstCaseDissipation(load);
  let worstCaseReactive: ClassBWorstCase | undefined;
  if (options.reactiveLoad !== undefined) {
    requirePositive("reactiveLoad.magnitude", options.reactiveLoad.magnitude, "Ω");
    requireInRange("reactiveLoad.angle", options.reactiveLoad.angle, -Math.PI / 2, Math.PI / 2);
    worstCaseReactive = classBWorstCaseDissipation({
      supplyVoltage: vcc,
      loadImpedance: options.reactiveLoad.magnitude,
      loadAngle: options.reactiveLoad.angle,
    });
  }
  const idlePerDevice = vcc * iq;
  const designPerDevice = Math.max(
    worstCase.dissipationPerDevice,
    worstCaseReactive?.dissipationPerDevice ?? 0,
  ) + idlePerDevice;
  const table = classBPowerTable({
    ...load,
    maxPeak: Math.min(peak, vcc),
    points: options.tablePoints ?? 21,
  });

  const checks: CheckResult[] = [
    within(
      "crossover gain mismatch (gain matching)",
      gainMatching.gainMismatch,
      -tolerance,
      tolerance,
      { unit: "ratio" },
    ),
  ];
  if (options.targetPower !== undefined) {
    requirePositive("targetPower", options.targetPower, "W");
    checks.push(atLeast("output power at full swing", swing.outputPower, options.targetPower, {
      unit: "W",
    }));
  }
  if (options.deviceMaxDissipation !== undefined) {
    requirePositive("deviceMaxDissipation", options.deviceMaxDissipation, "W");
    checks.push(
      atMost(
        "dissipation per device (worst case + idle)",
        designPerDevice,
        options.deviceMaxDissipation,
        {
          unit: "W",
        },
      ),
    );
  }

  let thermal: ClassAbOutputStage["thermal"];
  if (options.thermal !== undefined) {
    const t = options.thermal;
    const count = t.devicesOnSink ?? 2;
    if (!Number.isInteger(count) || count < 1) {
      throw new RangeError(
        `Expected thermal.devicesOnSink to be a whole number of at least 1, but found ${count}`,
      );
    }
    const temperatures = heatSinkTemperatures(new Array(count).fill(designPerDevice), t);
    const runaway = thermalRunawayGain({
      collectorEmitterVoltage: vcc,
      quiescentCurrent: iq,
      emitterResistance: re,
      thermalResistance: t.junctionToCase + (t.caseToSink ?? 0) + count * t.sinkToAmbient,
      vbeTemperatureCoefficient: t.vbeTemperatureCoefficient,
      temperature,
    });
    thermal = { temperatures, runaway };
    const limit = t.maxJunctionTemperature ?? 398.15;
    requirePositive("thermal.maxJunctionTemperature", limit, "K");
    checks.push(
      atMost("junction temperature", celsius(temperatures.maxJunctionTemperature), celsius(limit), {
        unit: "°C",
      }),
      atMost("thermal-runaway loop gain", runaway.loopGain, 1, { unit: "ratio" }),
    );
  }

  const twoPort: TwoPort = {
    name: "output stage",
    inputResistance: (beta + 1) * (rl + emitterSide),
    openCircuitGain: 1,
    outputResistance: emitterSide,
  };

  return {
    quiescentCurrent: iq,
    biasChoice,
    currentGain: beta,
    reflectedSourceResistance: reflected,
    reflectedStopperResistance: stopper,
    biasVoltage:
      followerPairBiasVoltage(iq, { emitterResistance: re, saturationCurrent: is, temperature }) +
      (devices.kind === "darlington" ? 2 * driverVbe : 0) +
      (devices.kind === "feedbackPair" ? 2 * driverVbe - 2 * vt * Math.log(iq / is) : 0),
    swing,
    outputResistance: { oneDevice, bothDevices },
    gain: {
      oneDevice: rl / (rl + oneDevice),
      crossover: gainMatching.crossoverGain,
      largeSignal: gainMatching.largeSignalGain,
    },
    gainMatching,
    power: {
      at: (level: number) => classBPower(level, load),
      table,
      worstCase,
      worstCaseReactive,
      idleTotal: 2 * idlePerDevice,
      idlePerDevice,
      designPerDevice,
    },
    thermal,
    twoPort,
    checks,
  };
}
