/**
 * longtail's notebook kernel: the notebook file, cell analysis and the dependency graph,
 * compilation, the sandbox, sessions, and recorded results. Front-ends (the command line
 * in cli/, the HTML report in report/) are built on these.
 *
 * @module
 */
export * from "./notebook/mod.ts";
export * from "./analysis/mod.ts";
export * from "./compile/mod.ts";
export * from "./sandbox/mod.ts";
export * from "./session/mod.ts";
export * from "./record/mod.ts";
export { parseValue, type ParseValueOptions } from "./adjustable/parse_value.ts";
export { LONGTAIL_VERSION } from "./version.ts";
