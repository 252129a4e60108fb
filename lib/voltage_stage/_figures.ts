/**
 * The fields and checks every gain stage shares.
 *
 * @module
 */
import { requirePositive } from "../_validate.ts";
import { atLeast, type CheckResult } from "../checks/check.ts";
import type { gainStageCore } from "./_gain_stage.ts";
import type { GainStageFigures } from "./common_emitter.ts";

/** The fields every gain stage shares, and its checks. */
export function figures(
  core: ReturnType<typeof gainStageCore>,
  options: { minimumGain?: number; minimumInputPoleFrequency?: number; loadResistance?: number },
  extraChecks: CheckResult[] = [],
): GainStageFigures {
  const checks: CheckResult[] = [];
  const rl = options.loadResistance ?? Infinity;
  // Same 0.9 rule as every cascade interface (common practice, no source).
  checks.push(
    atLeast(
      `loading of ${core.twoPort.name} by its load`,
      rl === Infinity ? 1 : rl / (core.outputResistance + rl),
      0.9,
    ),
  );
  if (options.minimumGain !== undefined) {
    requirePositive("minimumGain", options.minimumGain);
    checks.push(atLeast("voltage gain", Math.abs(core.gain), options.minimumGain));
  }
  if (options.minimumInputPoleFrequency !== undefined) {
    requirePositive("minimumInputPoleFrequency", options.minimumInputPoleFrequency, "Hz");
    checks.push(
      atLeast("input pole", core.inputPoleFrequency, options.minimumInputPoleFrequency, {
        unit: "Hz",
      }),
    );
  }
  checks.push(...extraChecks);
  return {
    inputResistance: core.inputResistance,
    outputResistance: core.outputResistance,
    openCircuitGain: core.openCircuitGain,
    gain: core.gain,
    gainDb: 20 * Math.log10(Math.abs(core.gain)),
    followerGain: core.followerGain,
    millerGain: core.millerGain,
    millerCapacitance: core.millerCapacitance,
    inputCapacitance: core.totalInputCapacitance,
    inputNodeDrivingResistance: core.inputNodeDrivingResistance,
    inputNodeResistance: core.inputNodeResistance,
    inputPoleFrequency: core.inputPoleFrequency,
    twoPort: core.twoPort,
    checks,
  };
}
