/**
 * Shared helpers for the report tests: run a fixture notebook once, render it, and walk
 * the HTML with a real parser.
 *
 * @module
 */
import { parse } from "parse5";
import { renderReport, type ReportRun, type ReportSource } from "../../kernel/report/mod.ts";
import { runNotebookForReport } from "../../kernel/report/report_run.ts";

/** A parsed HTML node (parse5's default tree, the fields the tests read). */
export interface HtmlNode {
  nodeName: string;
  tagName?: string;
  namespaceURI?: string;
  attrs?: Array<{ name: string; value: string; prefix?: string }>;
  childNodes?: HtmlNode[];
  parentNode?: HtmlNode | null;
  value?: string;
  content?: HtmlNode;
}

/** A rendered fixture. */
export interface RenderedFixture {
  source: ReportSource;
  run: ReportRun;
  html: string;
  document: HtmlNode;
}

const cache = new Map<string, Promise<RenderedFixture>>();

/** The absolute path of a fixture notebook. */
export function fixturePath(name: string): string {
  return new URL(`./fixtures/${name}`, import.meta.url).pathname;
}

/**
 * Runs a fixture notebook through a real session and renders its report (once per file).
 *
 * @param name File name under tests/report/fixtures/.
 * @returns Source, run, HTML and the parsed document.
 */
export function renderFixture(name: string): Promise<RenderedFixture> {
  let pending = cache.get(name);
  if (!pending) {
    pending = (async () => {
      const path = fixturePath(name);
      const { source, run } = await runNotebookForReport(path, await Deno.readTextFile(path));
      const html = renderReport(source, run);
      return { source, run, html, document: parse(html) as unknown as HtmlNode };
    })();
    cache.set(name, pending);
  }
  return pending;
}

/** Every element under a node, in document order (template contents included). */
export function* elements(node: HtmlNode): Generator<HtmlNode> {
  for (const child of [...(node.childNodes ?? []), ...(node.content?.childNodes ?? [])]) {
    if (child.tagName !== undefined) {
      yield child;
      yield* elements(child);
    }
  }
}

/** An attribute's value (prefixed names as `xlink:href`). */
export function attribute(node: HtmlNode, name: string): string | undefined {
  return node.attrs?.find((a) => (a.prefix ? `${a.prefix}:${a.name}` : a.name) === name)?.value;
}

/** Whether an element has a class. */
export function hasClass(node: HtmlNode, name: string): boolean {
  return (attribute(node, "class") ?? "").split(/\s+/).includes(name);
}

/** The text content of a node. */
export function textOf(node: HtmlNode): string {
  if (node.nodeName === "#text") return node.value ?? "";
  return (node.childNodes ?? []).map(textOf).join("");
}

/** Elements with a class, in document order. */
export function byClass(node: HtmlNode, name: string): HtmlNode[] {
  return [...elements(node)].filter((element) => hasClass(element, name));
}
