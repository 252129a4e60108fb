/**
 * The voltage-amplifier stage: common-emitter (BJT) and common-source (MOS) gain stages with
 * degeneration, follower pre-driver or cascode, and Miller compensation of a two-stage
 * amplifier.
 *
 * @module
 */
export * from "./common_emitter.ts";
export * from "./common_source.ts";
export * from "./miller_compensation.ts";
export * from "./miller_voltage_stage.ts";
export * from "./follower_stage.ts";
