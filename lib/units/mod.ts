/**
 * Values and units: engineering-notation formatting, SI and RKM parsing, the colour code,
 * IEC 60063 preferred values, decibels and temperature drift.
 *
 * @module
 */
export * from "./format.ts";
export * from "./quantity_syntax_error.ts";
export * from "./parse_quantity.ts";
export * from "./rkm_code.ts";
export * from "./colour_code.ts";
export * from "./preferred_values.ts";
export * from "./decibels.ts";
export * from "./temperature_drift.ts";
