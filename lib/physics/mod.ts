/**
 * Physics: the exact SI constants, the thermal voltage, and the temperature laws of a pn
 * junction (Is, Vbe and Ic against temperature).
 *
 * @module
 */
export * from "./constants.ts";
export * from "./thermal_voltage.ts";
export * from "./junction.ts";
export * from "./noise.ts";
