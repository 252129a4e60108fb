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
export * from "./units/format.ts";
export * from "./physics/constants.ts";
export * from "./physics/thermal_voltage.ts";
