/**
 * The design report: one self-contained HTML file made from a notebook and a finished run.
 *
 * ```
 * <html>
 *   <head>  charset, content-security policy (no requests at all), title, <style>
 *   <body>
 *     <header class="lt-head">    kind, title, facts (notebook, run time, versions, cells),
 *                                 design-check summary table (links to each check),
 *                                 cells that failed or were blocked (links)
 *     <main class="lt-body">      the prose, and in place of each cell's fence:
 *       <section class="lt-cell" id="lt-cell-N" data-status="done|failed|blocked|…">
 *         cell head (number, lines, time), <details class="lt-code"> highlighted code,
 *         printed text, outputs (SVG figure | sanitised HTML | picture | text),
 *         the cell's checks (ids lt-check-K), error or "not run" note in place
 *     <footer class="lt-foot">
 *     <script>                    opens every code block while printing (hash-allowed)
 * ```
 *
 * Nothing in the file refers to another file or address: styles and pictures are inline,
 * formulas are MathML (no fonts), and the policy in the head forbids every request.
 *
 * @module
 */
import { createHash } from "node:crypto";
import { basename } from "../_paths.ts";
import { type NotebookCell, splitNotebook } from "../notebook/split.ts";
import type { CellError, CellState, CheckRecord, MimeBundle } from "../session/events.ts";
import { LONGTAIL_VERSION } from "../version.ts";
import { escapeHtml } from "./_escape.ts";
import { formatDuration, formatLimit, formatMargin, formatQuantity } from "../_format.ts";
import { highlightCode } from "./_highlight.ts";
import { renderInline, renderNotebookBody } from "./_prose.ts";
import { sanitizeMarkup } from "./_sanitize.ts";
import { REPORT_CSS } from "./_style.ts";

/** The notebook a report is made from. */
export interface ReportSource {
  /** The notebook's text, exactly as run. */
  text: string;
  /** Its path (shown in the header; its file name also names the chart folder). */
  path: string;
}

/** One cell's result: its final state in the session, with its id. */
export interface ReportCell extends CellState {
  /** The session's id for the cell (used to name the cells that blocked another). */
  id: string;
}

/** A finished run of a notebook. */
export interface ReportRun {
  /** When the run started. */
  ranAt: Date;
  /** One entry per cell of the notebook, in document order. */
  cells: ReportCell[];
  /** Wall-clock time of the whole run, in milliseconds, if known. */
  durationMs?: number;
  /** Adjustable values set for this run instead of their defaults (`--set`), by name. */
  values?: Record<string, number>;
  /** Extra permissions granted to the notebook for this run, in words. */
  granted?: string[];
}

/** Options for {@linkcode renderReport}. */
export interface ReportOptions {
  /**
   * The longtail version named in the header.
   * @default {LONGTAIL_VERSION}
   */
  longtailVersion?: string;
  /**
   * The Deno version named in the header.
   * @default {Deno.version.deno}
   */
  denoVersion?: string;
}

/** Opens every code block while printing, and closes again the ones that were closed. */
const PRINT_SCRIPT =
  'addEventListener("beforeprint",()=>{for(const d of document.querySelectorAll("details:not([open])")){d.open=true;d.dataset.ltReopened=""}});' +
  'addEventListener("afterprint",()=>{for(const d of document.querySelectorAll("details[data-lt-reopened]")){d.open=false;delete d.dataset.ltReopened}});';
const PRINT_SCRIPT_HASH = createHash("sha256").update(PRINT_SCRIPT).digest("base64");
/** No requests of any kind; inline styles; pictures only from `data:`; only our own script. */
const CONTENT_POLICY =
  `default-src 'none'; style-src 'unsafe-inline'; img-src data:; script-src 'sha256-${PRINT_SCRIPT_HASH}'; ` +
  "base-uri 'none'; form-action 'none'";

const STATUS_WORDS: Record<CellState["status"], string> = {
  waiting: "not run",
  queued: "not run",
  running: "did not finish",
  done: "ran",
  failed: "failed",
  blocked: "blocked",
};

/** A check with where it was computed. */
interface PlacedCheck {
  check: CheckRecord;
  /** 1-based cell number. */
  cell: number;
  /** Anchor id. */
  id: string;
}

/**
 * Renders a notebook and its finished run as one self-contained HTML document.
 *
 * @param source The notebook's text and path.
 * @param run The cells' final states, in document order, and when the run happened.
 * @param options Versions to name in the header.
 * @returns The HTML document.
 * @throws {RangeError} If the run does not have one entry per cell of the notebook.
 *
 * @example A cell with a passing check
 * ```ts
 * import { renderReport } from "./render_report.ts";
 * import { ok } from "node:assert/strict";
 * const text = "# Bias\n\nThe tail current $I_T$.\n\n~~~ts\nconst tail = 2e-3;\n~~~\n";
 * const check = { name: "tail current", value: 0.002, unit: "A", limit: { kind: "atLeast", min: 0.001 },
 *   pass: true, margin: 0.001, marginRatio: 1, reason: "tail current = 2 mA is at least 1 mA (margin 1 mA)" };
 * const html = renderReport({ text, path: "bias.md" }, {
 *   ranAt: new Date("2024-05-01T10:00:00Z"),
 *   cells: [{ id: "c1", status: "done", streams: [], outcome: {
 *     outputs: [{ "text/plain": "0.002" }], records: [], checks: [check], adjustables: [], durationMs: 1 } }],
 * });
 * ok(html.startsWith("<!DOCTYPE html>"));
 * ok(html.includes("<h1>Bias</h1>") && html.includes('href="#lt-check-1"') && html.includes("2 mA"));
 * ok(!/https?:/.test(html));
 * ```
 */
export function renderReport(
  source: ReportSource,
  run: ReportRun,
  options: ReportOptions = {},
): string {
  const notebook = splitNotebook(source.text, { fileName: basename(source.path) });
  if (run.cells.length !== notebook.cells.length) {
    throw new RangeError(
      `Expected one result per cell (${notebook.cells.length}), but found ${run.cells.length}`,
    );
  }
  const numberOf = new Map(run.cells.map((cell, i) => [cell.id, i + 1]));
  const placed: PlacedCheck[] = [];
  run.cells.forEach((cell, i) => {
    for (const check of cell.outcome?.checks ?? []) {
      placed.push({ check, cell: i + 1, id: `lt-check-${placed.length + 1}` });
    }
  });

  const firstHeading = notebook.headings[0];
  const titleHtml = firstHeading
    ? renderInline(firstHeading.text)
    : escapeHtml(basename(source.path));
  const titleText = titleHtml.replace(/<[^>]*>/g, "");

  const cellHtml = new Map<number, string>();
  notebook.cells.forEach((cell, i) => {
    const checks = placed.filter((p) => p.cell === i + 1);
    cellHtml.set(
      cell.startLine,
      renderCell(cell, run.cells[i], { checks, numberOf, lines: notebook.lines }),
    );
  });
  const skip: Array<[number, number]> = [];
  for (const cell of notebook.cells) {
    if (cell.recorded) skip.push([cell.recorded.startLine, cell.recorded.endLine]);
  }
  if (notebook.version) skip.push([notebook.version.line, notebook.version.line + 1]);
  const body = renderNotebookBody(source.text, {
    cellAt: (line) => cellHtml.get(line),
    skip,
    titleLine: firstHeading?.line,
  });

  const longtailVersion = options.longtailVersion ?? LONGTAIL_VERSION;
  const denoVersion = options.denoVersion ?? Deno.version.deno;
  return [
    "<!DOCTYPE html>",
    '<html lang="en">',
    "<head>",
    '<meta charset="utf-8">',
    `<meta http-equiv="Content-Security-Policy" content="${CONTENT_POLICY}">`,
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    '<meta name="color-scheme" content="light">',
    `<meta name="generator" content="longtail ${escapeHtml(longtailVersion)}">`,
    `<title>${titleText} · design report</title>`,
    `<style>${REPORT_CSS}</style>`,
    "</head>",
    "<body>",
    renderHead({ source, run, titleHtml, placed, numberOf, longtailVersion, denoVersion }),
    `<main class="lt-body">\n${body}</main>`,
    `<footer class="lt-foot">Made by longtail ${escapeHtml(longtailVersion)} from ${
      escapeHtml(source.path)
    }. Outputs are shown as the run produced them; markup from cells was cleaned of scripts and addresses.</footer>`,
    `<script>${PRINT_SCRIPT}</script>`,
    "</body>",
    "</html>",
    "",
  ].join("\n");
}

interface HeadParts {
  source: ReportSource;
  run: ReportRun;
  titleHtml: string;
  placed: PlacedCheck[];
  numberOf: Map<string, number>;
  longtailVersion: string;
  denoVersion: string;
}

function renderHead(parts: HeadParts): string {
  const { run, placed } = parts;
  const counts = { done: 0, failed: 0, blocked: 0, other: 0 };
  for (const cell of run.cells) {
    if (cell.status === "done" || cell.status === "failed" || cell.status === "blocked") {
      counts[cell.status]++;
    } else counts.other++;
  }
  const cellWords = [`${run.cells.length} ${run.cells.length === 1 ? "cell" : "cells"}`];
  cellWords.push(`${counts.done} ran`);
  if (counts.failed > 0) cellWords.push(`${counts.failed} failed`);
  if (counts.blocked > 0) cellWords.push(`${counts.blocked} blocked`);
  if (counts.other > 0) cellWords.push(`${counts.other} not run`);
  const iso = run.ranAt.toISOString();
  const facts: Array<[string, string]> = [
    ["Notebook", `<code>${escapeHtml(parts.source.path)}</code>`],
    [
      "Run",
      `<time datetime="${iso}">${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC</time>${
        run.durationMs !== undefined ? `, took ${formatDuration(run.durationMs)}` : ""
      }`,
    ],
    ["Cells", escapeHtml(cellWords.join(", "))],
    ["longtail", escapeHtml(parts.longtailVersion)],
    ["Deno", escapeHtml(parts.denoVersion)],
  ];
  const values = Object.entries(run.values ?? {});
  if (values.length > 0) {
    facts.push([
      "Values set",
      values.map(([name, value]) =>
        `<code>${escapeHtml(name)} = ${escapeHtml(String(value))}</code>`
      ).join(", "),
    ]);
  }
  if ((run.granted ?? []).length > 0) {
    facts.push(["Granted", run.granted!.map((grant) => escapeHtml(grant)).join("; ")]);
  }
  const failedChecks = placed.filter((p) => !p.check.pass).length;
  const tally = placed.length === 0
    ? ""
    : `<span class="lt-tally">${
      placed.length - failedChecks
    } passed, ${failedChecks} failed</span>`;
  // Failures first, so a reviewer sees them without scrolling; otherwise notebook order.
  const ordered = [...placed].sort((a, b) => Number(a.check.pass) - Number(b.check.pass));
  const rows = ordered.map(({ check, cell, id }) =>
    `<tr class="${check.pass ? "lt-row-pass" : "lt-row-fail"}" title="${
      escapeHtml(check.reason)
    }">` +
    `<td>${verdict(check.pass)}</td>` +
    `<td>${escapeHtml(check.name)}</td>` +
    `<td class="lt-num">${keepTogether(formatQuantity(check.value, check.unit))}</td>` +
    `<td class="lt-num">${keepTogether(formatLimit(check.limit, check.unit))}</td>` +
    `<td class="lt-num">${
      keepTogether(formatMargin(check.margin, check.marginRatio, check.unit))
    }</td>` +
    `<td><a href="#${id}">cell ${cell}</a></td></tr>`
  );
  const checksPanel = placed.length === 0
    ? `<section class="lt-panel" aria-labelledby="lt-checks-title"><h2 id="lt-checks-title">Design checks</h2>` +
      `<p class="lt-empty">This notebook computes no design checks.</p></section>`
    : `<section class="lt-panel" aria-labelledby="lt-checks-title"><h2 id="lt-checks-title">Design checks${tally}</h2>` +
      `<table class="lt-checks"><thead><tr><th>Result</th><th>Check</th><th class="lt-num">Value</th>` +
      `<th class="lt-num">Limit</th><th class="lt-num">Margin</th><th>Where</th></tr></thead>` +
      `<tbody>${rows.join("")}</tbody></table></section>`;
  const troubled = run.cells.map((cell, i) => ({ cell, n: i + 1 })).filter(({ cell }) =>
    cell.status !== "done"
  );
  const problemsPanel = troubled.length === 0
    ? ""
    : `<section class="lt-panel" aria-labelledby="lt-trouble-title">` +
      `<h2 id="lt-trouble-title">Cells that did not finish</h2><ul class="lt-problems">${
        troubled.map(({ cell, n }) =>
          `<li><a href="#lt-cell-${n}">Cell ${n}</a>: ${
            escapeHtml(troubleLine(cell, parts.numberOf))
          }</li>`
        ).join("")
      }</ul></section>`;
  return `<header class="lt-head">
<p class="lt-kicker">Design report</p>
<h1>${parts.titleHtml}</h1>
<dl class="lt-facts">${
    facts.map(([term, detail]) => `<dt>${term}</dt><dd>${detail}</dd>`).join("")
  }</dl>
${checksPanel}
${problemsPanel}
</header>`;
}

function troubleLine(cell: ReportCell, numberOf: Map<string, number>): string {
  if (cell.status === "failed" && cell.error) {
    return `${cell.error.message.split("\n")[0]}${
      cell.error.line ? ` (line ${cell.error.line})` : ""
    }`;
  }
  if (cell.status === "blocked") return `blocked by ${cellList(cell.blockedBy ?? [], numberOf)}`;
  return STATUS_WORDS[cell.status];
}

function cellList(ids: string[], numberOf: Map<string, number>): string {
  const names = ids.map((id) => (numberOf.has(id) ? `cell ${numberOf.get(id)}` : id));
  return names.length === 0 ? "an earlier cell" : names.join(", ");
}

/** Escapes a table entry and keeps each number with its unit (and a relation with its number) on one line. */
function keepTogether(text: string): string {
  return escapeHtml(text).replace(/([\d∞]) (?=[^\s…(+−\d])/g, "$1\u00a0").replace(
    /^([≥≤]) /,
    "$1\u00a0",
  )
    .replace(/(\d) %\)/g, "$1\u00a0%)").replace(
      / (\([^()]*%\))$/,
      ' <span class="lt-ratio">$1</span>',
    );
}

function verdict(pass: boolean): string {
  return pass
    ? '<span class="lt-verdict lt-verdict-pass">✓ pass</span>'
    : '<span class="lt-verdict lt-verdict-fail">✗ fail</span>';
}

interface CellParts {
  checks: PlacedCheck[];
  numberOf: Map<string, number>;
  lines: string[];
}

function renderCell(cell: NotebookCell, state: ReportCell, parts: CellParts): string {
  const n = cell.index + 1;
  const codeLines = cell.code.replace(/\n$/, "").split("\n").length;
  const head = [
    `<a class="lt-cell-number" href="#lt-cell-${n}">Cell ${n}</a>`,
    `<span>lines ${cell.startLine + 1}–${cell.endLine}</span>`,
  ];
  if (state.status === "done" && state.outcome) {
    head.push(`<span>${formatDuration(state.outcome.durationMs)}</span>`);
  }
  if (state.status === "failed") {
    head.push('<span class="lt-verdict lt-verdict-fail">✗ failed</span>');
  } else if (state.status !== "done") {
    head.push(
      `<span class="lt-verdict lt-verdict-hold">${escapeHtml(STATUS_WORDS[state.status])}</span>`,
    );
  }
  const pieces: string[] = [
    `<section class="lt-cell" id="lt-cell-${n}" data-status="${state.status}">`,
    `<div class="lt-cell-head">${head.join("")}</div>`,
    `<details class="lt-code"><summary>Code · ${codeLines} ${
      codeLines === 1 ? "line" : "lines"
    }</summary>` +
    `<pre><code class="hljs language-ts">${
      highlightCode(cell.code, "typescript")
    }</code></pre></details>`,
  ];
  for (const chunk of state.streams) {
    pieces.push(
      `<pre class="lt-stream${chunk.name === "err" ? " lt-stream-err" : ""}">${
        escapeHtml(chunk.text)
      }</pre>`,
    );
  }
  const checkList = parts.checks.length === 0
    ? ""
    : `<ul class="lt-cell-checks">${
      parts.checks.map(({ check, id }) =>
        `<li id="${id}">${verdict(check.pass)} ${escapeHtml(check.reason)}</li>`
      ).join("")
    }</ul>`;
  let listed = false;
  (state.outcome?.outputs ?? []).forEach((bundle, k) => {
    if (checkList !== "" && !listed && isCheckText(bundle)) {
      // The shown value is the cell's checks as text: show them once, with their verdicts.
      pieces.push(`<div class="lt-output lt-output-checks">${checkList}</div>`);
      listed = true;
    } else {
      pieces.push(renderBundle(bundle, `o${n}-${k + 1}-`));
    }
  });
  if (checkList !== "" && !listed) pieces.push(checkList);
  if (state.status === "failed" && state.error) pieces.push(renderError(state.error, parts.lines));
  if (state.status === "blocked") {
    pieces.push(
      `<p class="lt-note">Not run: it needs ${
        (state.blockedBy ?? []).map((id) =>
          parts.numberOf.has(id)
            ? `<a href="#lt-cell-${parts.numberOf.get(id)}">cell ${parts.numberOf.get(id)}</a>`
            : escapeHtml(id)
        ).join(", ") || "an earlier cell"
      }, which did not finish.</p>`,
    );
  } else if (state.status !== "done" && state.status !== "failed") {
    pieces.push(`<p class="lt-note">Not run: the run stopped before this cell.</p>`);
  }
  pieces.push("</section>\n");
  return pieces.join("\n");
}

/** A plain-text output made only of check lines (`✓ …` / `✗ …`), as the sandbox shows checks. */
function isCheckText(bundle: MimeBundle): boolean {
  if (Object.keys(bundle).some((type) => type !== "text/plain" && type !== "application/json")) {
    return false;
  }
  const lines = (bundle["text/plain"] ?? "").split("\n").filter((line) => line.trim() !== "");
  return lines.length > 0 && lines.every((line) => /^[✓✗] /.test(line));
}

/** The richest form of an output the report can show safely. */
function renderBundle(bundle: MimeBundle, idPrefix: string): string {
  const svg = bundle["image/svg+xml"];
  if (svg !== undefined) {
    return `<figure class="lt-output lt-figure">${sanitizeMarkup(svg, { idPrefix })}</figure>`;
  }
  const html = bundle["text/html"];
  if (html !== undefined) {
    return `<div class="lt-output lt-output-html">${sanitizeMarkup(html, { idPrefix })}</div>`;
  }
  for (const type of ["image/png", "image/jpeg", "image/gif", "image/webp"]) {
    const data = bundle[type]?.replace(/\s+/g, "");
    if (data !== undefined && /^[A-Za-z0-9+/]+=*$/.test(data)) {
      const alt = escapeHtml(bundle["text/plain"] ?? "");
      return `<figure class="lt-output lt-figure"><img src="data:${type};base64,${data}" alt="${alt}"></figure>`;
    }
  }
  const text = bundle["text/plain"] ?? bundle["application/json"] ?? "";
  return `<pre class="lt-output lt-output-text">${escapeHtml(text)}</pre>`;
}

const ERROR_TITLES: Record<CellError["kind"], string> = {
  problem: "Not run: the notebook has a problem here",
  runtime: "Error",
  denied: "Stopped by the sandbox",
  timeout: "Stopped: time limit",
  crash: "The sandbox process stopped",
};

function renderError(error: CellError, lines: string[]): string {
  const where = error.line
    ? ` at line ${error.line}${error.column ? `, column ${error.column}` : ""}`
    : "";
  const pieces = [
    `<div class="lt-error" role="note">`,
    `<p class="lt-error-title">${ERROR_TITLES[error.kind]}${where}</p>`,
  ];
  const problems = error.problems ?? [];
  if (problems.length > 1) {
    pieces.push(
      `<ul>${
        problems.map((p) => `<li>Line ${p.line}, column ${p.column}: ${escapeHtml(p.message)}</li>`)
          .join("")
      }</ul>`,
    );
  } else {
    pieces.push(`<pre>${escapeHtml(error.message)}</pre>`);
  }
  if (error.line !== undefined && error.line >= 1 && error.line <= lines.length) {
    const text = lines[error.line - 1].replace(/\r?\n$|\r$/, "");
    const caret = error.column
      ? "\n" + " ".repeat(String(error.line).length + 3 + error.column - 1) + "^"
      : "";
    pieces.push(`<pre class="lt-source">${escapeHtml(`${error.line} │ ${text}${caret}`)}</pre>`);
  }
  if (error.stack) {
    pieces.push(`<details><summary>Stack</summary><pre>${escapeHtml(error.stack)}</pre></details>`);
  }
  pieces.push("</div>");
  return pieces.join("");
}
