/**
 * What notebooks import as `longtail/notebook`: the adjustable-value helper.
 *
 * @module
 */
export * from "./adjustable.ts";
