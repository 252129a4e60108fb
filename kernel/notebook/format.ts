/**
 * The notebook file format in one place: which fences are cells, how the recorded-results
 * block is tagged, where chart files go, and the line that names the recording version.
 *
 *     ## Tail current            ← prose (any Markdown)
 *
 *     ```ts                      ← a cell: fence tagged `ts` or `typescript`
 *     const tail = 2e-3;
 *     tail * 2
 *     ```
 *
 *     ```recorded                ← written by `longtail record`, after its cell
 *     0.004
 *     · tail = 0.002
 *     ✓ phase margin = 61.1° is at least 45° (margin 16.1°)
 *     ```
 *
 *     ![chart from cell 1](design_charts/cell-1.svg)   ← chart files beside the notebook
 *
 *     <!-- results recorded by longtail 0.1.0 -->     ← last line of the file
 *
 * @module
 */

/** Fence tags (first word of the info string, any case) that make a fenced block a cell. */
export const CELL_TAGS: readonly string[] = ["ts", "typescript"];

/** Fence tag of the block that holds a cell's recorded results. */
export const RECORDED_TAG = "recorded";

/** Suffix of the folder beside a notebook that holds its chart files. */
export const CHARTS_FOLDER_SUFFIX = "_charts";

/** Matches the version line; group 1 is the version. */
export const VERSION_LINE_PATTERN: RegExp =
  /^<!--\s*results recorded by longtail\s+(\S+)\s*-->\s*$/;

/**
 * Whether a fence's info string makes it a cell.
 *
 * @param info The info string after the opening fence, e.g. `"ts"` or `"typescript title"`.
 * @returns True for cells.
 *
 * @example
 * ```ts
 * import { isCellInfo } from "./format.ts";
 * import { equal } from "node:assert/strict";
 * equal(isCellInfo("ts"), true);
 * equal(isCellInfo("TypeScript"), true);
 * equal(isCellInfo("tsx"), false);
 * equal(isCellInfo("recorded"), false);
 * ```
 */
export function isCellInfo(info: string): boolean {
  const word = info.trim().split(/\s+/)[0]?.toLowerCase() ?? "";
  return CELL_TAGS.includes(word);
}

/**
 * Whether a fence's info string marks a recorded-results block.
 *
 * @param info The info string.
 * @returns True for `recorded` blocks.
 *
 * @example
 * ```ts
 * import { isRecordedInfo } from "./format.ts";
 * import { equal } from "node:assert/strict";
 * equal(isRecordedInfo("recorded"), true);
 * equal(isRecordedInfo("text"), false);
 * ```
 */
export function isRecordedInfo(info: string): boolean {
  return info.trim().split(/\s+/)[0] === RECORDED_TAG;
}

/**
 * Name of the chart folder for a notebook: its file name without `.md`, plus `_charts`.
 *
 * @param notebookFileName The notebook's file name (a path works too; only the last part counts).
 * @returns The folder name, relative to the notebook's folder.
 *
 * @example
 * ```ts
 * import { chartsFolderName } from "./format.ts";
 * import { equal } from "node:assert/strict";
 * equal(chartsFolderName("notebooks/power_amplifier.md"), "power_amplifier_charts");
 * equal(chartsFolderName("notes.markdown"), "notes_charts");
 * ```
 */
export function chartsFolderName(notebookFileName: string): string {
  const base = notebookFileName.split(/[\\/]/).pop() ?? notebookFileName;
  return base.replace(/\.(md|markdown)$/i, "") + CHARTS_FOLDER_SUFFIX;
}

/**
 * The version line written at the end of a recorded notebook.
 *
 * @param version The longtail version that recorded the results.
 * @returns The line, without a line break.
 *
 * @example
 * ```ts
 * import { versionLine, VERSION_LINE_PATTERN } from "./format.ts";
 * import { equal } from "node:assert/strict";
 * equal(versionLine("0.1.0"), "<!-- results recorded by longtail 0.1.0 -->");
 * equal(VERSION_LINE_PATTERN.exec(versionLine("0.1.0"))?.[1], "0.1.0");
 * ```
 */
export function versionLine(version: string): string {
  return `<!-- results recorded by longtail ${version} -->`;
}
