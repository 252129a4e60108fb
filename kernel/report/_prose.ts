/**
 * The notebook's prose as HTML, with each cell's section put where its fence stands.
 *
 * The whole notebook is parsed once by markdown-it (so lists, quotes and reference links
 * that span a cell still hold together); the renderer swaps each cell's fence for the
 * cell's section. Policy for prose, which comes from the notebook:
 *
 * - raw HTML is off: `<b>` in prose shows as the text `<b>`;
 * - links to other places are not clickable: the report is a document to hand round and
 *   promises no addresses at all, so a link shows its text followed by its address in
 *   parentheses (which also survives printing); links to `#anchors` stay links;
 * - images are shown only when they are inline `data:` images; any other image shows its
 *   description and address instead of being fetched.
 *
 * @module
 */
import MarkdownIt from "markdown-it";
import { escapeHtml } from "./_escape.ts";
import { highlightCode } from "./_highlight.ts";
import { type MathHost, mathPlugin } from "./_math.ts";

interface Token {
  type: string;
  tag: string;
  info: string;
  content: string;
  map: [number, number] | null;
  children: Token[] | null;
  attrGet(name: string): string | null;
  attrSet(name: string, value: string): void;
}
type Rule = (
  tokens: Token[],
  index: number,
  options: unknown,
  env: ProseEnv,
  self: Renderer,
) => string;
interface Renderer {
  rules: Record<string, Rule | undefined>;
  renderToken(tokens: Token[], index: number, options: unknown): string;
  renderInlineAsText(tokens: Token[], options: unknown, env: ProseEnv): string;
  render(tokens: Token[], options: unknown, env: ProseEnv): string;
}
interface Markdown extends MathHost {
  options: unknown;
  renderer: Renderer & MathHost["renderer"];
  parse(text: string, env: ProseEnv): Token[];
}

/** What the renderer needs from the report while it walks the notebook. */
interface ProseEnv {
  /** HTML for the cell whose fence opens on this line (0-based), if it is a cell. */
  cellAt(line: number): string | undefined;
  /** Addresses of the links being rendered (null for an anchor link). */
  links: Array<string | null>;
  /** Heading ids used so far. */
  ids: Set<string>;
}

/** Options for {@linkcode renderNotebookBody}. */
export interface BodyOptions {
  /** HTML of the cell whose fence opens on a line (0-based), or undefined for other fences. */
  cellAt: (line: number) => string | undefined;
  /** Lines (0-based, end exclusive) to leave out: recorded results, the version line. */
  skip: Array<[number, number]>;
  /** The line of the heading used as the report's title (left out of the body). */
  titleLine?: number;
}

let shared: Markdown | undefined;

function markdown(): Markdown {
  if (shared) return shared;
  const md = new (MarkdownIt as unknown as new (options: object) => Markdown)({
    html: false,
    linkify: false,
    typographer: false,
    highlight: (code: string, language: string) => highlightCode(code, language),
  });
  mathPlugin(md);
  const rules = md.renderer.rules as Record<string, Rule | undefined>;
  const defaultFence = rules.fence!;
  rules.fence = (tokens, index, options, env, self) => {
    const map = tokens[index].map;
    const cell = map ? env.cellAt(map[0]) : undefined;
    return cell ?? defaultFence(tokens, index, options, env, self);
  };
  rules.link_open = (tokens, index, options, env, self) => {
    const href = tokens[index].attrGet("href") ?? "";
    if (href.startsWith("#")) {
      env.links.push(null);
      return self.renderToken(tokens, index, options);
    }
    env.links.push(href);
    return '<span class="lt-link">';
  };
  rules.link_close = (tokens, index, options, env, self) => {
    const href = env.links.pop();
    if (href === null || href === undefined) return self.renderToken(tokens, index, options);
    return `</span> <span class="lt-address">(${escapeHtml(href)})</span>`;
  };
  rules.image = (tokens, index, options, env, self) => {
    const token = tokens[index];
    const src = token.attrGet("src") ?? "";
    const alt = self.renderInlineAsText(token.children ?? [], options, env);
    if (/^data:image\/(png|jpeg|gif|webp);base64,[A-Za-z0-9+/=]+$/.test(src)) {
      return `<img src="${escapeHtml(src)}" alt="${escapeHtml(alt)}">`;
    }
    return `<span class="lt-missing-image">[picture not embedded: ${
      escapeHtml(alt || "no description")
    } (${escapeHtml(src)})]</span>`;
  };
  rules.heading_open = (tokens, index, options, env, self) => {
    const text = self.renderInlineAsText(tokens[index + 1]?.children ?? [], options, env);
    tokens[index].attrSet("id", uniqueId(slug(text), env.ids));
    return self.renderToken(tokens, index, options);
  };
  shared = md;
  return md;
}

/** A heading's anchor, in the usual lower-case-with-dashes form notebooks link to. */
function slug(text: string): string {
  const base = text.toLowerCase().trim().replace(/[^\p{L}\p{N}\s_-]/gu, "").replace(/\s+/g, "-");
  // Never one of the report's own ids, which all start with `lt-`.
  return base === "" || base.startsWith("lt-") ? `section-${base}` : base;
}

function uniqueId(base: string, ids: Set<string>): string {
  let id = base;
  for (let n = 2; ids.has(id); n++) id = `${base}-${n}`;
  ids.add(id);
  return id;
}

/**
 * Renders a notebook's prose to HTML with each cell's section in place of its fence.
 *
 * @param text The notebook's text.
 * @param options Cell sections, lines to skip, the title's line.
 * @returns The body HTML.
 *
 * @example Prose around a cell
 * ```ts
 * import { renderNotebookBody } from "./_prose.ts";
 * import { ok } from "node:assert/strict";
 * const html = renderNotebookBody("# T\n\nSee <b>this</b>.\n\n~~~ts\n1\n~~~\n", {
 *   cellAt: (line) => (line === 4 ? "<section>cell</section>" : undefined),
 *   skip: [],
 *   titleLine: 0,
 * });
 * ok(html.includes("&lt;b&gt;this&lt;/b&gt;") && html.includes("<section>cell</section>"));
 * ok(!html.includes("<h1"));
 * ```
 */
export function renderNotebookBody(text: string, options: BodyOptions): string {
  const md = markdown();
  // Blank out skipped lines (keeping the line count, so fence lines still match cells).
  let source = text;
  if (options.skip.length > 0) {
    const lines = text.split(/(?<=\r\n|\r(?!\n)|\n)/);
    for (const [start, end] of options.skip) {
      for (let line = start; line < end && line < lines.length; line++) {
        lines[line] = /\r\n$/.test(lines[line])
          ? "\r\n"
          : /[\r\n]$/.test(lines[line])
          ? lines[line].slice(-1)
          : "";
      }
    }
    source = lines.join("");
  }
  const env: ProseEnv = { cellAt: options.cellAt, links: [], ids: new Set() };
  let tokens = md.parse(source, env);
  if (options.titleLine !== undefined) {
    const at = tokens.findIndex((t) =>
      t.type === "heading_open" && t.map?.[0] === options.titleLine
    );
    if (at >= 0) tokens = [...tokens.slice(0, at), ...tokens.slice(at + 3)];
  }
  return md.renderer.render(tokens, md.options, env);
}

/**
 * Renders inline Markdown (a heading's text) as HTML, with the same policy as the body.
 *
 * @param text Inline Markdown.
 * @returns HTML without a wrapping paragraph.
 *
 * @example
 * ```ts
 * import { renderInline } from "./_prose.ts";
 * import { equal } from "node:assert/strict";
 * equal(renderInline("Class-AB *output* <i>"), "Class-AB <em>output</em> &lt;i&gt;");
 * ```
 */
export function renderInline(text: string): string {
  const md = markdown() as Markdown & { renderInline(text: string, env: ProseEnv): string };
  return md.renderInline(text, { cellAt: () => undefined, links: [], ids: new Set() });
}
