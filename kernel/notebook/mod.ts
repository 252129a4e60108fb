/**
 * The notebook file: splitting Markdown into prose and cells byte for byte, the recorded
 * results block, and writing results back without touching anything else.
 *
 * @module
 */
export * from "./format.ts";
export * from "./split.ts";
export * from "./recorded_block.ts";
export * from "./write_recorded.ts";
export * from "./locate.ts";
