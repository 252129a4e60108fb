/**
 * Escaping text for HTML: every string that comes from a notebook passes through here
 * (or through the sanitiser) before it reaches the report.
 *
 * @module
 */

const ENTITIES: Record<string, string> = {
  "&": "&amp;",
  "<": "&lt;",
  ">": "&gt;",
  '"': "&quot;",
  "'": "&#39;",
};

/**
 * Escapes text for use in HTML content or a quoted attribute value.
 *
 * @param text Any text.
 * @returns The text with `& < > " '` replaced by character references.
 *
 * @example
 * ```ts
 * import { escapeHtml } from "./_escape.ts";
 * import { equal } from "node:assert/strict";
 * equal(escapeHtml(`<b title="x">&'</b>`), "&lt;b title=&quot;x&quot;&gt;&amp;&#39;&lt;/b&gt;");
 * ```
 */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (char) => ENTITIES[char]);
}
