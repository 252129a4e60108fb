/**
 * Code highlighting with highlight.js, loading only the grammars a notebook needs (the
 * full bundle would add every language's parse cost to each render).
 *
 * @module
 */
import hljs from "highlight.js/lib/core";
import typescript from "highlight.js/lib/languages/typescript";
import javascript from "highlight.js/lib/languages/javascript";
import json from "highlight.js/lib/languages/json";
import bash from "highlight.js/lib/languages/bash";
import { escapeHtml } from "./_escape.ts";

hljs.registerLanguage("typescript", typescript);
hljs.registerLanguage("javascript", javascript);
hljs.registerLanguage("json", json);
hljs.registerLanguage("bash", bash);
hljs.registerAliases(["ts"], { languageName: "typescript" });
hljs.registerAliases(["js"], { languageName: "javascript" });
hljs.registerAliases(["sh", "shell", "console"], { languageName: "bash" });

/**
 * Highlights code as HTML spans (classes `hljs-…`); unknown languages are escaped only.
 *
 * @param code The source.
 * @param language A fence's language tag (`ts`, `typescript`, `json`, …).
 * @returns Escaped HTML, safe inside `<pre><code>`.
 *
 * @example
 * ```ts
 * import { highlightCode } from "./_highlight.ts";
 * import { equal } from "node:assert/strict";
 * equal(highlightCode("const a = 1;", "ts"), '<span class="hljs-keyword">const</span> a = <span class="hljs-number">1</span>;');
 * equal(highlightCode("<b>", "plain"), "&lt;b&gt;");
 * ```
 */
export function highlightCode(code: string, language: string): string {
  const name = language.trim().split(/\s+/)[0]?.toLowerCase() ?? "";
  if (name !== "" && hljs.getLanguage(name)) {
    return hljs.highlight(code, { language: name, ignoreIllegals: true }).value;
  }
  return escapeHtml(code);
}
