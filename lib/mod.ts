/**
 * longtail's amplifier library: units and preferred values, physics, devices, stages,
 * cascade and feedback, analyses, design checks and chart helpers.
 *
 * Notebooks import it by name: `import { longTailedPair } from "longtail/lib";`.
 *
 * @module
 */
export * from "./_validate.ts";
export * from "./display.ts";
export * from "./checks/check.ts";
export * from "./units/mod.ts";
export * from "./physics/mod.ts";
export * from "./devices/mod.ts";
export * from "./analysis/mod.ts";
export * from "./output_stage/mod.ts";
export * from "./cascade/mod.ts";
export * from "./voltage_stage/mod.ts";
export * from "./input_pair/mod.ts";
