/**
 * Placing an offset in a cell's code at its notebook line and column.
 *
 * @module
 */

/** Where a cell's code sits in the notebook. */
export interface CodePlace {
  /** 1-based notebook line of the code's first line. */
  codeLine: number;
  /** Columns the container indentation took off each code line. */
  columnOffsets: readonly number[];
}

/**
 * Converts an offset in a cell's code to a 1-based notebook line and column.
 *
 * @param code The cell's code.
 * @param offset Offset in `code` (UTF-16 units).
 * @param place Where the code sits.
 * @returns Line and column in the notebook.
 *
 * @example A cell inside a list, indented by two columns
 * ```ts
 * import { locateInNotebook } from "./locate.ts";
 * import { deepEqual } from "node:assert/strict";
 * const code = "const a = 1;\nconst b = c;\n";
 * deepEqual(locateInNotebook(code, code.indexOf("c;"), { codeLine: 10, columnOffsets: [2, 2] }), {
 *   line: 11,
 *   column: 13,
 * });
 * ```
 */
export function locateInNotebook(
  code: string,
  offset: number,
  place: CodePlace,
): { line: number; column: number } {
  const before = code.slice(0, Math.max(0, Math.min(offset, code.length)));
  const lineIndex = (before.match(/\r\n|\r|\n/g) ?? []).length;
  const lineStart = Math.max(before.lastIndexOf("\n"), before.lastIndexOf("\r")) + 1;
  const column = before.length - lineStart + 1 + (place.columnOffsets[lineIndex] ?? 0);
  return { line: place.codeLine + lineIndex, column };
}
