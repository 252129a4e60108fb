/**
 * Cascade composition with loading, and negative feedback: complex arithmetic, impedances,
 * the two-port view every stage exposes, chains of stages, loops and their margins,
 * frequency sweeps.
 *
 * @module
 */
export * from "./two_port.ts";
export * from "./complex.ts";
export * from "./impedance.ts";
export * from "./sweep.ts";
export * from "./cascade.ts";
export * from "./feedback.ts";
export * from "./loop.ts";
