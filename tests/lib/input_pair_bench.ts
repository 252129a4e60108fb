/**
 * Speed of the input pair's Monte Carlo. Issue 2 target: 100,000 trials of a long-tailed
 * pair's CMRR and offset in under 50 ms on one core. Each run includes drawing the normals,
 * the trials themselves and the percentiles (found by selection, not a full sort).
 */
import { bjtPairMonteCarlo, mosPairMonteCarlo } from "../../lib/input_pair/mod.ts";

const exampleA = {
  tail: { kind: "source" as const, current: 1e-3, outputResistance: 50e3 },
  load: { kind: "resistors" as const, resistance: 10e3 },
  positiveRail: 15,
  negativeRail: -15,
};

Deno.bench("bjtPairMonteCarlo(): 100,000 trials of CMRR and offset (1 % RC, 5 % Is)", () => {
  bjtPairMonteCarlo(exampleA, {
    trials: 100_000,
    loadTolerance: 0.01,
    saturationCurrentSpread: 0.05,
  });
});

Deno.bench("bjtPairMonteCarlo(): 100,000 trials, with a 10 % β spread as well", () => {
  bjtPairMonteCarlo(exampleA, {
    trials: 100_000,
    loadTolerance: 0.01,
    saturationCurrentSpread: 0.05,
    betaSpread: 0.1,
  });
});

Deno.bench("mosPairMonteCarlo(): 100,000 trials (1 % RD, 2 mV ΔVt, 1 % W/L)", () => {
  mosPairMonteCarlo({
    tail: { kind: "source", current: 200e-6, outputResistance: 100e3, compliance: 0.3 },
    load: { kind: "resistors", resistance: 10e3 },
    transconductanceParameter: 5e-3,
    threshold: 0.5,
    positiveRail: 3.3,
    negativeRail: 0,
  }, { trials: 100_000, loadTolerance: 0.01, thresholdSpread: 2e-3, aspectRatioSpread: 0.01 });
});
