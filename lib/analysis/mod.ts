/**
 * Analyses: harmonics and THD by FFT, a seeded random generator with part-tolerance
 * distributions, Monte Carlo statistics, worst-case corners and sweeps.
 *
 * @module
 */
export * from "./harmonics.ts";
export * from "./random.ts";
export * from "./monte_carlo.ts";
export * from "./normal_distribution.ts";
export * from "./difference_amplifier_tolerance.ts";
export * from "./offset_spread.ts";
