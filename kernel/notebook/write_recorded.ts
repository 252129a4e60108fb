/**
 * Writing recorded results into a notebook's text: only the recorded blocks (and the
 * version line) change; every other byte stays as it was.
 *
 * @module
 */
import { dominantNewline, stripTerminator } from "./_lines.ts";
import { RECORDED_TAG, versionLine } from "./format.ts";
import { type RecordedEntry, recordedLines } from "./recorded_block.ts";
import type { Notebook } from "./split.ts";

/** What to record after one cell. */
export interface CellRecord {
  /** Entries inside the `recorded` fence; empty with no charts removes the block. */
  entries: RecordedEntry[];
  /** Chart links (relative to the notebook, e.g. `amp_charts/cell-3.svg`) with their titles. */
  charts?: Array<{ path: string; title: string }>;
}

/**
 * Returns the notebook's text with new recorded blocks and version line.
 *
 * @param notebook The notebook as split from its current text.
 * @param records One record per cell index; a missing index leaves that cell's block as it is.
 * @param version The longtail version to name on the version line.
 * @returns The new text.
 *
 * @example Recording touches nothing but the block and the version line
 * ```ts
 * import { splitNotebook } from "./split.ts";
 * import { writeRecorded } from "./write_recorded.ts";
 * import { equal } from "node:assert/strict";
 * const fence = "`".repeat(3);
 * const text = `# Gain\n\n${fence}ts\n2 * 5\n${fence}\n\nMore prose.\n`;
 * const out = writeRecorded(splitNotebook(text), [{ entries: [{ kind: "text", text: "10" }] }], "0.1.0");
 * equal(
 *   out,
 *   `# Gain\n\n${fence}ts\n2 * 5\n${fence}\n\n${fence}recorded\n10\n${fence}\n\nMore prose.\n\n` +
 *     "<!-- results recorded by longtail 0.1.0 -->\n",
 * );
 * ```
 */
export function writeRecorded(
  notebook: Notebook,
  records: ReadonlyArray<CellRecord | undefined>,
  version: string,
): string {
  const lines = notebook.lines;
  const newline = dominantNewline(lines);
  // Each edit replaces whole lines [start, end) with new text; everything else is copied.
  const edits: Array<{ start: number; end: number; text: string }> = [];
  for (const cell of notebook.cells) {
    const record = records[cell.index];
    if (record === undefined || !cell.closed) continue;
    let text = renderBlock(record, cell.prefix, newline);
    const before = lines[cell.endLine - 1] ?? "";
    if (text !== "" && !/[\r\n]$/.test(before)) text = newline + text;
    edits.push({ start: cell.endLine, end: cell.recorded?.endLine ?? cell.endLine, text });
  }
  const mark = versionLine(version);
  if (notebook.version) {
    const old = lines[notebook.version.line];
    const terminator = old.slice(stripTerminator(old).length);
    edits.push({
      start: notebook.version.line,
      end: notebook.version.line + 1,
      text: mark + terminator,
    });
  }
  edits.sort((a, b) => a.start - b.start);
  const out: string[] = [];
  let line = 0;
  for (const edit of edits) {
    out.push(...lines.slice(line, edit.start), edit.text);
    line = edit.end;
  }
  out.push(...lines.slice(line));
  let text = out.join("");
  // Text appended after a fence that is never closed would become part of its cell.
  const endsInsideCell = notebook.cells.some((cell) => !cell.closed);
  if (!notebook.version && !endsInsideCell) {
    if (text !== "" && !/[\r\n]$/.test(text)) text += newline;
    if (text !== "" && !/(\r\n|\r|\n)(\r\n|\r|\n)$/.test(text)) text += newline;
    text += mark + newline;
  }
  return text;
}

function renderBlock(record: CellRecord, prefix: string, newline: string): string {
  const body = recordedLines(record.entries);
  const charts = record.charts ?? [];
  if (body.length === 0 && charts.length === 0) return "";
  const blank = prefix.trimEnd() + newline;
  const out: string[] = [];
  // The fence is written even when empty: the splitter finds chart links only right after
  // a recorded block, and links it did not find would be written again on every record.
  {
    const longest = Math.max(2, ...body.map((text) => longestRun(text, "`")));
    const fence = "`".repeat(longest + 1);
    out.push(blank, prefix + fence + RECORDED_TAG + newline);
    for (const text of body) out.push((text === "" ? prefix.trimEnd() : prefix + text) + newline);
    out.push(prefix + fence + newline);
  }
  if (charts.length > 0) {
    out.push(blank);
    for (const chart of charts) {
      out.push(`${prefix}![${escapeTitle(chart.title)}](${encodeURI(chart.path)})${newline}`);
    }
  }
  return out.join("");
}

function longestRun(text: string, char: string): number {
  let best = 0;
  let run = 0;
  for (const c of text) {
    run = c === char ? run + 1 : 0;
    best = Math.max(best, run);
  }
  return best;
}

function escapeTitle(title: string): string {
  return title.replace(/[[\]\\]/g, (c) => "\\" + c);
}
