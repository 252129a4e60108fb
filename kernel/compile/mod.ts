/**
 * Compiling cells: to modules the sandbox runs, and to modules `deno check` type-checks.
 *
 * @module
 */
export * from "./compile_cell.ts";
export * from "./check_module.ts";
export * from "./type_check.ts";
