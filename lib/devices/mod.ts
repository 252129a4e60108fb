/**
 * Devices: the BJT and MOSFET models every stage builds on, and compound pairs.
 *
 * @module
 */
export * from "./bjt.ts";
export * from "./mosfet.ts";
export * from "./compound_pair.ts";
