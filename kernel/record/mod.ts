/**
 * Recorded results: what a cell records, comparing records with a fresh run, writing
 * notebooks and charts atomically, and the per-notebook verdict of `verify`.
 *
 * @module
 */
export * from "./cell_entries.ts";
export * from "./compare.ts";
export * from "./write_files.ts";
export * from "./record_notebook.ts";
export * from "./verify_notebook.ts";
