/**
 * Cell analysis and the dependency graph: names defined and used, problems with their
 * places, the run order, and the reactive plan of what must re-run.
 *
 * @module
 */
export * from "./analyse_cell.ts";
export * from "./closest_name.ts";
export * from "./globals.ts";
export * from "./graph.ts";
export * from "./plan.ts";
export * from "./adjustables.ts";
