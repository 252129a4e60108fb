/**
 * Line splitting that keeps every byte: each line keeps its own terminator, so joining
 * the lines gives back the text exactly. Line breaks are the ones CommonMark knows
 * (`\n`, `\r\n`, `\r`), so line numbers agree with the Markdown parser's source maps.
 *
 * @module
 */

/**
 * Splits text into lines, each with its terminator; the last line may have none.
 *
 * @param text Any text.
 * @returns The lines; `lines.join("") === text`.
 *
 * @example Three kinds of line break survive a round trip
 * ```ts
 * import { splitLines } from "./_lines.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(splitLines("a\nb\r\nc\rd"), ["a\n", "b\r\n", "c\r", "d"]);
 * deepEqual(splitLines("a\n"), ["a\n"]);
 * deepEqual(splitLines(""), []);
 * ```
 */
export function splitLines(text: string): string[] {
  const lines: string[] = [];
  const pattern = /\r\n|\r|\n/g;
  let start = 0;
  for (let match = pattern.exec(text); match !== null; match = pattern.exec(text)) {
    const end = match.index + match[0].length;
    lines.push(text.slice(start, end));
    start = end;
  }
  if (start < text.length) lines.push(text.slice(start));
  return lines;
}

/**
 * Removes a line's terminator.
 *
 * @param line One line from {@linkcode splitLines}.
 * @returns The line without `\n`, `\r\n` or `\r`.
 *
 * @example
 * ```ts
 * import { stripTerminator } from "./_lines.ts";
 * import { equal } from "node:assert/strict";
 * equal(stripTerminator("const a = 1;\r\n"), "const a = 1;");
 * ```
 */
export function stripTerminator(line: string): string {
  return line.replace(/(\r\n|\r|\n)$/, "");
}

/**
 * The line break a file mostly uses, so inserted lines match their neighbours.
 *
 * @param lines Lines from {@linkcode splitLines}.
 * @returns `"\r\n"` or `"\r"` when most lines end that way, otherwise `"\n"`.
 *
 * @example
 * ```ts
 * import { dominantNewline } from "./_lines.ts";
 * import { equal } from "node:assert/strict";
 * equal(dominantNewline(["a\r\n", "b\r\n", "c\n"]), "\r\n");
 * ```
 */
export function dominantNewline(lines: readonly string[]): "\n" | "\r\n" | "\r" {
  let crlf = 0;
  let lf = 0;
  let cr = 0;
  for (const line of lines) {
    if (line.endsWith("\r\n")) crlf++;
    else if (line.endsWith("\n")) lf++;
    else if (line.endsWith("\r")) cr++;
  }
  // A "\n" written after a line that ends in a lone "\r" would merge into one "\r\n".
  if (cr > crlf && cr > lf) return "\r";
  return crlf > lf ? "\r\n" : "\n";
}
