/**
 * The small-signal core shared by the common-emitter and common-source stages: degeneration,
 * cascode, emitter-follower pre-driver, Miller capacitance, input pole and the two-port view.
 * Inputs arrive validated; a MOS device is a BJT with rπ = β = ∞.
 *
 * ```
 *            RC ‖ (cascode)        ┌── out ── RL
 *   in ─[EF]─┤ B   C ├──────────────┤
 *            │  Q1   Cµ (Miller)    Cout
 *            └─ E ── RE ── ground
 * ```
 *
 * @module
 */
import { parallelRcUnchecked, parallelUnchecked } from "../cascade/_fast.ts";
import type { Complex, TwoPort, TwoPortAt } from "../cascade/two_port.ts";

/** Small-signal values of one device. */
export interface DeviceSmallSignal {
  gm: number;
  rpi: number;
  ro: number;
  beta: number;
}

/** Emitter-follower pre-driver, already reduced to small-signal values. */
export interface FollowerCore extends DeviceSmallSignal {
  /** Emitter resistance to the rail (or current-source output resistance); may be ∞. */
  emitterResistance: number;
}

export interface CoreInputs {
  name: string;
  device: DeviceSmallSignal;
  degeneration: number;
  loadResistor: number;
  loadResistance: number;
  cascode?: DeviceSmallSignal;
  follower?: FollowerCore;
  drivingResistance: number;
  feedbackCapacitance: number;
  inputCapacitance: number;
  outputCapacitance: number;
}

export interface CoreResult {
  /** Input resistance of the main device alone (rπ + (β+1)RE). */
  deviceInputResistance: number;
  /** Effective transconductance of the main device with degeneration (and cascode α). */
  transconductance: number;
  /** Resistance looking into the main device's collector/drain. */
  deviceOutputResistance: number;
  /** Resistance looking into the output node (cascode included), before RC. */
  outputNodeResistance: number;
  inputResistance: number;
  outputResistance: number;
  openCircuitGain: number;
  gain: number;
  followerGain: number;
  /** Gain from the main device's input to its own collector (sets the Miller multiplication). */
  millerGain: number;
  millerCapacitance: number;
  totalInputCapacitance: number;
  /** Resistance driving the main device's input (source, or the follower's output). */
  inputNodeDrivingResistance: number;
  /** Rdrive ‖ Rin of the main device: the resistance the input capacitance sees. */
  inputNodeResistance: number;
  inputPoleFrequency: number;
  twoPort: TwoPort;
}

export function gainStageCore(x: CoreInputs): CoreResult {
  const { gm, rpi, ro, beta } = x.device;
  const re = x.degeneration;
  const bjt = Number.isFinite(beta);
  // [SS7] ch. 7 / [GHLM5] ch. 3 exact forms (REFERENCE §4.1); MOS: rπ, β → ∞.
  const deviceInputResistance = bjt ? rpi + (beta + 1) * re : Infinity;
  const deviceTransconductance = bjt ? beta / (rpi + (beta + 1) * re) : gm / (1 + gm * re);
  let transconductance = deviceTransconductance;
  const deviceOutputResistance = re === 0 ? ro : ro * (1 + gm * parallelUnchecked(re, rpi));

  let outputNodeResistance = deviceOutputResistance;
  let millerNode = 0;
  if (x.cascode) {
    const c = x.cascode;
    outputNodeResistance = c.ro * (1 + c.gm * parallelUnchecked(deviceOutputResistance, c.rpi));
    // The cascode passes α of the signal current on to the output.
    if (Number.isFinite(c.beta)) transconductance *= c.beta / (c.beta + 1);
    // Common-base input resistance, (ro + RL')/(1 + gm·ro) ([SS7] ch. 7).
    const above = parallelUnchecked(x.loadResistor, x.loadResistance);
    millerNode = parallelUnchecked(
      deviceOutputResistance,
      above === Infinity ? Infinity : (c.ro + above) / (1 + c.gm * c.ro),
    );
  }
  const outputResistance = parallelUnchecked(x.loadResistor, outputNodeResistance);
  const loaded = parallelUnchecked(outputResistance, x.loadResistance);
  const coreOpen = -transconductance * outputResistance;
  const coreLoaded = -transconductance * loaded;
  const millerGain = x.cascode ? -deviceTransconductance * millerNode : coreLoaded;

  let inputResistance = deviceInputResistance;
  let followerGain = 1;
  let inputNodeDrivingResistance = x.drivingResistance;
  const f = x.follower;
  if (f) {
    const zLoad = parallelUnchecked(
      parallelUnchecked(f.emitterResistance, f.ro),
      deviceInputResistance,
    );
    // Beta multiplication: the follower's input sees (β+1) times what its emitter drives.
    inputResistance = zLoad === Infinity ? Infinity : f.rpi + (f.beta + 1) * zLoad;
    followerGain = zLoad === Infinity ? 1 : ((f.beta + 1) * zLoad) / inputResistance;
    inputNodeDrivingResistance = parallelUnchecked(
      parallelUnchecked(f.emitterResistance, f.ro),
      (x.drivingResistance + f.rpi) / (f.beta + 1),
    );
  }
  const millerCapacitance = x.feedbackCapacitance * (1 + Math.abs(millerGain));
  // Degeneration bootstraps Cπ: the base-emitter voltage is only 1/(1 + gm·RE) of the input.
  const piShare = x.inputCapacitance / (1 + gm * re);
  const totalInputCapacitance = piShare + millerCapacitance;
  const nodeR = parallelUnchecked(inputNodeDrivingResistance, deviceInputResistance);
  const inputPoleFrequency = totalInputCapacitance === 0 || nodeR === 0
    ? Infinity
    : 1 / (2 * Math.PI * nodeR * totalInputCapacitance);

  const twoPort: TwoPort = {
    name: x.name,
    inputResistance,
    openCircuitGain: followerGain * coreOpen,
    outputResistance,
  };
  const outputCapacitance = x.outputCapacitance + (x.cascode ? 0 : x.feedbackCapacitance);
  if (totalInputCapacitance > 0 || outputCapacitance > 0) {
    const cmu = x.cascode ? 0 : x.feedbackCapacitance;
    const gmEff = transconductance;
    twoPort.at = (frequency: number): TwoPortAt => {
      const w = 2 * Math.PI * frequency;
      const zMain = parallelRcUnchecked(deviceInputResistance, totalInputCapacitance, frequency);
      const zOut = parallelRcUnchecked(outputResistance, outputCapacitance, frequency);
      // Norton current −(Gm − jωCµ)·v into Zout: the Cµ feed-forward is the RHP zero.
      const gr = -(gmEff * zOut.re + w * cmu * zOut.im);
      const gi = -(gmEff * zOut.im - w * cmu * zOut.re);
      if (!f) {
        return {
          inputImpedance: zMain,
          openCircuitGain: { re: gr, im: gi },
          outputImpedance: zOut,
        };
      }
      const zFollowerLoad = complexParallelResistance(
        parallelUnchecked(f.emitterResistance, f.ro),
        zMain,
      );
      const k = f.beta + 1;
      const zinR = f.rpi + k * zFollowerLoad.re;
      const zinI = k * zFollowerLoad.im;
      // v(base of main) / v(in) = (β+1)Z' / (rπ + (β+1)Z').
      const nr = k * zFollowerLoad.re;
      const ni = k * zFollowerLoad.im;
      const dd = zinR * zinR + zinI * zinI;
      const hr = (nr * zinR + ni * zinI) / dd;
      const hi = (ni * zinR - nr * zinI) / dd;
      return {
        inputImpedance: { re: zinR, im: zinI },
        openCircuitGain: { re: hr * gr - hi * gi, im: hr * gi + hi * gr },
        outputImpedance: zOut,
      };
    };
  }

  return {
    deviceInputResistance,
    transconductance,
    deviceOutputResistance,
    outputNodeResistance,
    inputResistance,
    outputResistance,
    openCircuitGain: followerGain * coreOpen,
    gain: followerGain * coreLoaded,
    followerGain,
    millerGain,
    millerCapacitance,
    totalInputCapacitance,
    inputNodeDrivingResistance,
    inputNodeResistance: nodeR,
    inputPoleFrequency,
    twoPort,
  };
}

/** A resistance (may be ∞) in parallel with a complex impedance (may be infinite). */
function complexParallelResistance(r: number, z: Complex): Complex {
  if (r === Infinity) return z;
  if (!Number.isFinite(z.re) || !Number.isFinite(z.im)) return { re: r, im: 0 };
  // 1 / (1/r + 1/z)
  const dz = z.re * z.re + z.im * z.im;
  const yr = 1 / r + z.re / dz;
  const yi = -z.im / dz;
  const dy = yr * yr + yi * yi;
  return { re: yr / dy, im: -yi / dy };
}
