/**
 * Types shared by the BJT and MOSFET long-tailed pairs: the tail, the design requirements and
 * the parts of the result that both pairs report the same way.
 *
 * Sign conventions (REFERENCE §0.1): vid = v1 − v2, vicm = (v1 + v2)/2, differential output
 * vod = v(out2) − v(out1), so the differential gain is positive. The single-ended output is
 * taken at device 2's collector (drain), the non-inverting side that an active load drives.
 *
 * @module
 */

/**
 * The tail that sets the pair's current.
 *
 * - `"source"`: an ideal current source with a finite output resistance (the small-signal REE).
 * - `"mirror"`: a current mirror: its current and its output resistance (e.g. VA/I).
 * - `"resistor"`: a resistor to the negative rail; the tail current then follows from the rails,
 *   the input common-mode voltage and VBE (VGS), and changes with the common-mode voltage.
 *
 * For a source or mirror, `current` is the current at the operating point; `outputResistance`
 * enters only the small-signal (common-mode) behaviour.
 */
export type PairTail =
  | {
    kind: "source";
    /** Tail current in A (> 0). */
    current: number;
    /**
     * Small-signal output resistance in Ω; `Infinity` for an ideal source.
     * @default {Infinity}
     */
    outputResistance?: number;
    /**
     * Smallest voltage across the source that keeps it working, in V.
     * @default {0.5}
     */
    compliance?: number;
  }
  | {
    kind: "mirror";
    /** Tail current in A (> 0). */
    current: number;
    /** The mirror's small-signal output resistance in Ω (e.g. VA/I of its output device). */
    outputResistance: number;
    /**
     * Smallest voltage across the mirror's output device that keeps it active, in V.
     * @default {0.5}
     */
    compliance?: number;
  }
  | {
    kind: "resistor";
    /** Resistance from the common emitter (source) node to the negative rail, Ω (> 0). */
    resistance: number;
  };

/**
 * What the designer asks of the pair; each entry given adds a design check.
 */
export interface PairRequirements {
  /**
   * Input common-mode range the pair must accept, [lowest, highest] in V. A check fails when
   * the pair's input common-mode range does not cover it.
   */
  inputCommonModeRange?: readonly [number, number];
  /** Smallest acceptable CMRR in dB, of the output selected by the `output` option. */
  cmrrDb?: number;
  /** Largest acceptable worst-case input offset (sum of magnitudes), V. */
  maxOffset?: number;
  /** Smallest acceptable slew rate in V/s (needs `compensationCapacitance`). */
  slewRate?: number;
  /** Smallest acceptable linear input range (1 % compression), V. */
  linearInputRange?: number;
  /**
   * Extra voltage each input device must keep between its collector (drain) and the limit of
   * the active region, V.
   * @default {0}
   */
  headroom?: number;
  /**
   * BJT only: let the collector-base junction be forward biased by up to 0.4 V (the relaxed
   * convention) instead of the strict Vbc ≤ 0.
   * @default {false}
   */
  relaxedSaturation?: boolean;
}

/** Which output the two-port view and the CMRR requirement use. */
export type PairOutput = "singleEnded" | "differential";

/** Small-signal gains, from an exact nodal solution of the hybrid-π model with all mismatch. */
export interface PairGain {
  /** Differential gain with differential output, vod/vid. NaN for a mirror load (one output). */
  differential: number;
  /** Differential gain to device 2's output alone, v(out2)/vid. */
  singleEnded: number;
  /** Common-mode gain to device 2's output, v(out2)/vicm (negative for resistive loads). */
  commonModeSingleEnded: number;
  /**
   * Common-mode gain with differential output, vod/vicm: zero for a matched pair, set by the
   * mismatch given. NaN for a mirror load.
   */
  commonModeDifferential: number;
}

/**
 * Common-mode rejection. Each field states its definition; the three classic forms differ by
 * factors of 2 and by 1/(ΔR/R) (REFERENCE §3.8).
 */
export interface PairCmrr {
  /**
   * Single-ended CMRR |singleEnded gain / commonModeSingleEnded gain| at device 2's output, with
   * all mismatch given (exact small-signal). Matched BJT pair: (re + 2REE)/(2re) ≈ gm·REE;
   * with a mirror load it is the CMRR of the one output.
   */
  singleEnded: number;
  /** `singleEnded` in dB (20·log10). */
  singleEndedDb: number;
  /**
   * Differential-output CMRR |differential gain / commonModeDifferential gain| with all the
   * mismatch given at once (exact small-signal). Infinity for a matched pair; NaN for a mirror
   * load.
   */
  differential: number;
  /** `differential` in dB. */
  differentialDb: number;
  /**
   * Differential-output CMRR from load-resistor mismatch alone, closed form
   * (1 + 2REE/(re + RE))/|ΔRC/RC| (BJT) or (1 + 2RSS/(1/gm + RS))/|ΔRD/RD| (MOS).
   * Infinity when the resistors match; NaN for a mirror load.
   */
  loadMismatch: number;
  /** `loadMismatch` in dB. */
  loadMismatchDb: number;
  /**
   * Differential-output CMRR from transconductance mismatch alone, closed form
   * (1 + 2REE/(re + RE))/|ΔGm/Gm|, where ΔGm/Gm is the relative difference of the two
   * devices' degenerated transconductances at the operating point (caused by Is, β, Vt or
   * W/L mismatch). Infinity when matched; NaN for a mirror load.
   */
  gmMismatch: number;
  /** `gmMismatch` in dB. */
  gmMismatchDb: number;
}

/** Input resistances (ro and rµ of the input devices included through the nodal solution). */
export interface PairInputResistance {
  /** Between the two inputs, for a differential signal, Ω (Infinity for MOSFETs or β → ∞). */
  differential: number;
  /** Of one input when both are driven by the same common-mode signal, Ω. */
  commonModePerInput: number;
  /** Of the two inputs tied together, Ω (about half of `commonModePerInput`). */
  commonModeTied: number;
}

/** Small-signal output resistances with the inputs at signal ground. */
export interface PairOutputResistance {
  /** At device 2's output to signal ground, Ω. */
  singleEnded: number;
  /** Between the two outputs, Ω (NaN for a mirror load). */
  differential: number;
}

/** Input-referred white noise densities. */
export interface PairNoise {
  /** One input device's input-referred voltage noise, V/√Hz. */
  deviceVoltageDensity: number;
  /** The pair's differential input voltage noise, √2 times one device's, V/√Hz. */
  voltageDensity: number;
  /** Shot noise of one input's bias current, √(2q·IB), A/√Hz (0 for MOSFETs). */
  currentDensity: number;
}

/** Slew rate and unity-gain frequency for a Miller capacitor driven by the pair. */
export interface PairSlew {
  /** The compensation capacitance Cc, F. */
  capacitance: number;
  /**
   * Slew rate, V/s: the whole steerable tail current over Cc with a mirror load (α·I/Cc for a
   * BJT pair); half of it with resistive loads, where the collector resistor keeps its
   * quiescent current while the output node is held by the Miller loop.
   */
  slewRate: number;
  /**
   * Unity-gain frequency Gm/(2π·Cc), Hz, with Gm the degenerated transconductance of one
   * device into the output (mirror load), or half of it with resistive loads.
   */
  unityGainFrequency: number;
  /** Slew rate over the unity-gain angular frequency, V: 2VT + I·RE (BJT), Vov + I·RS (MOS). */
  slewToUnityGainRatio: number;
}

/** Third-harmonic distortion of the difference current for a sine input of a given peak. */
export interface PairThirdHarmonic {
  /**
   * Leading term of the series, a fraction: (1/48)(V̂/VT)² for an undegenerated BJT pair,
   * (1/32)(V̂/Vov)² for an undegenerated MOS pair; degeneration included by series reversion.
   */
  leadingTerm: number;
  /** Ratio b3/b1 of the two-term series of the third and first harmonics, a fraction. */
  corrected: number;
  /** |A3|/|A1| from a DFT of the large-signal transfer function (`harmonics()`), a fraction. */
  exact: number;
  /** THD_F of the difference current from the same DFT (harmonics 2 to 15), a fraction. */
  thd: number;
}

/** Input common-mode range, V. */
export interface PairInputCommonModeRange {
  /** Lowest input common-mode voltage (tail at its compliance, or the pair just conducting). */
  min: number;
  /** Highest, by the strict convention: collector-base (or drain-side saturation) limit. */
  max: number;
  /**
   * Highest by the relaxed BJT convention (Vbc ≤ 0.4 V); equal to `max` for MOSFETs.
   */
  maxRelaxed: number;
}

/** Input offset voltages. */
export interface PairOffset {
  /**
   * Signed input-referred offsets of each mismatch source, linearised (first order), V. Positive
   * means the output at zero input equals the differential gain times a positive input.
   */
  sources: Record<string, number>;
  /** Root-sum-square of the random sources (the systematic term excluded), V. */
  rss: number;
  /** Sum of the magnitudes of every source including the systematic term, V. */
  worstCase: number;
  /**
   * Signed offset from the large-signal equations with every mismatch at once: minus the input
   * that nulls the output, V.
   */
  exact: number;
}
