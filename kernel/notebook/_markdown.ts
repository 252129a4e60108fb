/**
 * A typed face over `markdown-it` (which ships no types): only the token fields we read.
 *
 * @module
 */
import MarkdownIt from "markdown-it";

/** One token of markdown-it's block stream. */
export interface MarkdownToken {
  /** Token type, e.g. `"fence"`, `"paragraph_open"`, `"image"`. */
  type: string;
  /** `[firstLine, endLine)` (0-based) for block tokens; null for closing and inline tokens. */
  map: [number, number] | null;
  /** HTML tag, e.g. `"h2"` for a level-2 heading. */
  tag: string;
  /** Fence info string. */
  info: string;
  /** Fence markup, e.g. "```" or "~~~~". */
  markup: string;
  /** Code for fences, text for inline tokens. */
  content: string;
  /** Inline children (for `inline` tokens). */
  children: MarkdownToken[] | null;
  /** Attribute pairs (e.g. `src` of images). */
  attrs: [string, string][] | null;
}

interface Parser {
  parse(text: string, env: Record<string, unknown>): MarkdownToken[];
}

let parser: Parser | undefined;

/**
 * Parses CommonMark into markdown-it's token stream (one shared parser, created once).
 *
 * @param text Markdown text.
 * @returns The tokens, with 0-based line maps.
 *
 * @example
 * ```ts
 * import { markdownTokens } from "./_markdown.ts";
 * import { deepEqual } from "node:assert/strict";
 * const fence = markdownTokens("# A\n\n~~~ts\nx\n~~~\n").find((t) => t.type === "fence");
 * deepEqual(fence?.map, [2, 5]);
 * ```
 */
export function markdownTokens(text: string): MarkdownToken[] {
  // html: true so the version comment parses as an HTML block, not as a paragraph.
  parser ??= new (MarkdownIt as unknown as new (options: object) => Parser)({ html: true });
  return parser.parse(text, {});
}
