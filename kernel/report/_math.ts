/**
 * Formulas in prose: `$...$` inline and `$$...$$` on lines of their own, typeset by KaTeX
 * as MathML.
 *
 * Why MathML and not KaTeX's HTML output: the HTML output needs KaTeX's style sheet and
 * about twenty web-font files. Embedding those as `data:` URLs would add several hundred
 * kilobytes to every report, and linking them would break "one file, opens from disk".
 * MathML is drawn by the browser itself (Chromium, Firefox and Safari all do), needs no
 * font files and no KaTeX style sheet, prints well, and keeps a report with a dozen
 * formulas a few kilobytes larger, not a few hundred.
 *
 * The delimiters follow the common rule of thumb that keeps prices apart from formulas:
 * an opening `$` is followed by a non-space, a closing `$` follows a non-space and is not
 * followed by a digit (so "$5 and $6" stays text).
 *
 * @module
 */
import katex from "katex";
import { escapeHtml } from "./_escape.ts";

/**
 * Typesets TeX as MathML. Bad TeX is shown as its source, marked, never thrown.
 *
 * @param tex The formula.
 * @param display True for a formula on its own line.
 * @returns `<span class="katex">…<math>…</math></span>`, without namespace declarations.
 *
 * @example
 * ```ts
 * import { typesetMath } from "./_math.ts";
 * import { ok } from "node:assert/strict";
 * const html = typesetMath("g_m = I_C / V_T", false);
 * ok(html.includes("<math") && html.includes("<msub>") && !html.includes("http"));
 * ```
 */
export function typesetMath(tex: string, display: boolean): string {
  try {
    const html = katex.renderToString(tex, {
      output: "mathml",
      displayMode: display,
      throwOnError: true,
      trust: false,
      strict: "ignore",
      maxExpand: 1000,
      maxSize: 20,
    });
    // The HTML parser puts <math> in the MathML namespace by itself; the declaration
    // would only be one more address-like string in a file that promises none.
    return html.replace(/ xmlns="http:\/\/www\.w3\.org\/1998\/Math\/MathML"/g, "");
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    return `<code class="lt-math-error" title="${escapeHtml(message)}">${
      escapeHtml(display ? `$$${tex}$$` : `$${tex}$`)
    }</code>`;
  }
}

// markdown-it ships no types: the few fields the rules touch.
interface InlineState {
  src: string;
  pos: number;
  posMax: number;
  push(type: string, tag: string, nesting: number): { content: string; markup: string };
}
interface BlockState {
  src: string;
  bMarks: number[];
  eMarks: number[];
  tShift: number[];
  sCount: number[];
  blkIndent: number;
  line: number;
  push(
    type: string,
    tag: string,
    nesting: number,
  ): { content: string; markup: string; map: [number, number] | null; block: boolean };
}
interface Token {
  type: string;
  content: string;
}
/** The part of a markdown-it instance the plugin needs. */
export interface MathHost {
  inline: {
    ruler: {
      after(name: string, rule: string, fn: (state: InlineState, silent: boolean) => boolean): void;
    };
  };
  block: {
    ruler: {
      before(
        name: string,
        rule: string,
        fn: (state: BlockState, start: number, end: number, silent: boolean) => boolean,
        options?: { alt: string[] },
      ): void;
    };
  };
  renderer: { rules: Record<string, (tokens: Token[], index: number) => string> };
}

/**
 * Adds the two math rules and their renderers to a markdown-it instance.
 *
 * @param md The markdown-it instance.
 *
 * @example
 * ```ts
 * import MarkdownIt from "markdown-it";
 * import { mathPlugin } from "./_math.ts";
 * import { ok } from "node:assert/strict";
 * const md = new MarkdownIt();
 * mathPlugin(md);
 * ok(md.render("costs $5 and $6").includes("$5 and $6"));
 * ok(md.render("gain $A_v$ here").includes("<math"));
 * ok(md.render("$$\nA = 1\n$$\n").includes('display="block"'));
 * ```
 */
export function mathPlugin(md: MathHost): void {
  md.inline.ruler.after("escape", "lt_math_inline", mathInline);
  md.block.ruler.before("fence", "lt_math_block", mathBlock, {
    alt: ["paragraph", "reference", "blockquote", "list"],
  });
  md.renderer.rules.lt_math_inline = (tokens, index) => {
    // Punctuation right after a formula stays on its line ("… (2πC), only" must not
    // start a line with the comma).
    const next = tokens[index + 1];
    const math = typesetMath(tokens[index].content, false);
    const stuck = next?.type === "text" ? /^[,.;:!?)\]]+/.exec(next.content)?.[0] : undefined;
    if (!stuck) return math;
    next!.content = next!.content.slice(stuck.length);
    return `<span class="lt-nowrap">${math}${escapeHtml(stuck)}</span>`;
  };
  md.renderer.rules.lt_math_inline_display = (tokens, index) =>
    `<span class="lt-math-inline-display">${typesetMath(tokens[index].content, true)}</span>`;
  md.renderer.rules.lt_math_block = (tokens, index) =>
    `<div class="lt-math-display">${typesetMath(tokens[index].content, true)}</div>\n`;
}

function mathInline(state: InlineState, silent: boolean): boolean {
  const src = state.src;
  const start = state.pos;
  if (src[start] !== "$") return false;
  if (src[start + 1] === "$") {
    const close = src.indexOf("$$", start + 2);
    if (close < 0 || close + 2 > state.posMax || src.slice(start + 2, close).trim() === "") {
      return false;
    }
    if (!silent) {
      state.push("lt_math_inline_display", "math", 0).content = src.slice(start + 2, close);
    }
    state.pos = close + 2;
    return true;
  }
  if (start + 1 >= state.posMax || /\s/.test(src[start + 1])) return false;
  let close = start + 1;
  for (;;) {
    close = src.indexOf("$", close);
    if (close < 0 || close >= state.posMax) return false;
    if (src[close - 1] === "\\" || /\s/.test(src[close - 1])) {
      close++;
      continue;
    }
    break;
  }
  if (/\d/.test(src[close + 1] ?? "")) return false;
  if (!silent) {
    const token = state.push("lt_math_inline", "math", 0);
    token.content = src.slice(start + 1, close);
    token.markup = "$";
  }
  state.pos = close + 1;
  return true;
}

function mathBlock(
  state: BlockState,
  startLine: number,
  endLine: number,
  silent: boolean,
): boolean {
  const lineText = (line: number) =>
    state.src.slice(state.bMarks[line] + state.tShift[line], state.eMarks[line]);
  if (state.sCount[startLine] - state.blkIndent >= 4) return false;
  const first = lineText(startLine);
  if (!first.startsWith("$$")) return false;
  let content: string;
  let last = startLine;
  const rest = first.slice(2);
  if (rest.trimEnd().endsWith("$$") && rest.trim().length >= 2) {
    content = rest.trimEnd().slice(0, -2);
  } else {
    const lines = [rest];
    let found = false;
    for (let line = startLine + 1; line < endLine; line++) {
      if (state.sCount[line] < state.blkIndent) break;
      const text = lineText(line);
      if (text.trimEnd().endsWith("$$")) {
        lines.push(text.trimEnd().slice(0, -2));
        last = line;
        found = true;
        break;
      }
      lines.push(text);
    }
    if (!found) return false;
    content = lines.join("\n");
  }
  if (silent) return true;
  state.line = last + 1;
  const token = state.push("lt_math_block", "math", 0);
  token.block = true;
  token.content = content.trim();
  token.markup = "$$";
  token.map = [startLine, last + 1];
  return true;
}
