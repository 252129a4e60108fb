/**
 * The long-tailed (differential) input pair, BJT and MOSFET: operating point, gains, CMRR,
 * offset, ranges, transfer curve, noise, slew, distortion, checks, and a Monte Carlo of its
 * CMRR and offset.
 *
 * @module
 */
export * from "./pair_types.ts";
export {
  bjtPair,
  type BjtPairDevice,
  type BjtPairEstimates,
  type BjtPairLoad,
  type BjtPairMismatch,
  type BjtPairOptions,
  type BjtPairResult,
  RELAXED_BASE_COLLECTOR_VOLTAGE,
} from "./bjt_pair.ts";
export {
  mosPair,
  type MosPairDevice,
  type MosPairEstimates,
  type MosPairLoad,
  type MosPairMismatch,
  type MosPairOptions,
  type MosPairResult,
} from "./mos_pair.ts";
export {
  bjtPairMonteCarlo,
  type BjtPairMonteCarloOptions,
  mosPairMonteCarlo,
  type MosPairMonteCarloOptions,
  type PairMonteCarloOptions,
  type PairMonteCarloResult,
} from "./pair_monte_carlo.ts";
export {
  resistorNoiseDensity,
  type ResistorNoiseOptions,
  sineSlewRate,
  slewLimitedFrequency,
} from "./slew_rate.ts";
