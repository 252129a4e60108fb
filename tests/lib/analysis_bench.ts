/** Speed of the analyses: THD of one transfer curve, and a 10⁵-trial tolerance run. */
import { harmonics } from "../../lib/analysis/harmonics.ts";
import { differenceAmplifierCmrrMonteCarlo } from "../../lib/analysis/difference_amplifier_tolerance.ts";

Deno.bench("harmonics() of a tanh curve, 2048 points", () => {
  harmonics((x) => Math.tanh(2 * x), 1);
});

Deno.bench("difference-amplifier CMRR Monte Carlo, 100,000 trials", () => {
  differenceAmplifierCmrrMonteCarlo({ gain: 10, tolerance: 0.01, trials: 100_000 });
});
