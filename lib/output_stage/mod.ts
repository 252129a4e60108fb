/**
 * The class-AB complementary emitter-follower output stage: the whole-stage design, class-B
 * power and dissipation, follower gain and gain-matching bias, the VBE-multiplier bias
 * spreader, the heat path and runaway loop, the computed transfer curve with its crossover
 * distortion, and generic safety cautions.
 *
 * @module
 */
export * from "./class_ab_stage.ts";
export * from "./power.ts";
export * from "./follower.ts";
export * from "./bias_spreader.ts";
export * from "./thermal.ts";
export * from "./transfer_curve.ts";
export * from "./safety.ts";
