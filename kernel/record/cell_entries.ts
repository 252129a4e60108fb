/**
 * From a cell's latest state to what the notebook records about it: the shown value's
 * text, named numbers, design checks, a failure, and the charts (SVG outputs) to save.
 *
 * `record` writes these entries and `verify` builds them again from a fresh run, so both
 * sides of a comparison come from this one function.
 *
 * @module
 */
import { formatQuantity } from "../_format.ts";
import type { RecordedEntry } from "../notebook/recorded_block.ts";
import type { CellState } from "../session/events.ts";

/** A chart to save beside the notebook. */
export interface ChartFile {
  /** File name inside the chart folder, e.g. `cell-3.svg`. */
  fileName: string;
  /** Title for the image link. */
  title: string;
  /** The SVG text. */
  svg: string;
}

/** What one cell records. */
export interface CellEntries {
  /** The entries inside the `recorded` block. */
  entries: RecordedEntry[];
  /** Charts to save and link. */
  charts: ChartFile[];
}

/** Options for {@linkcode cellEntries}. */
export interface CellEntriesOptions {
  /** Names cells by their position (1-based), for problem texts: `cellLabel("c3")`. */
  cellLabel?: (id: string) => string;
}

/**
 * Builds the recorded entries of one cell from its state.
 *
 * @param state The cell's latest state.
 * @param cellNumber The cell's position, 1-based (names chart files).
 * @param options How to name other cells.
 * @returns Entries and charts.
 *
 * @example A finished cell with a value, a number and a check
 * ```ts
 * import { cellEntries } from "./cell_entries.ts";
 * import { deepEqual } from "node:assert/strict";
 * const { entries } = cellEntries({
 *   status: "done",
 *   streams: [],
 *   outcome: {
 *     outputs: [{ "text/plain": "38.6 mS" }],
 *     records: [{ name: "gm", value: 0.0386 }],
 *     checks: [{ name: "gm", value: 0.0386, unit: "S", limit: { kind: "atLeast", min: 0.01 },
 *       pass: true, margin: 0.0286, marginRatio: 2.86, reason: "gm = 38.6 mS is at least 10 mS" }],
 *     adjustables: [],
 *     durationMs: 0.1,
 *   },
 * }, 2);
 * deepEqual(entries, [
 *   { kind: "text", text: "38.6 mS" },
 *   { kind: "number", name: "gm", value: 0.0386 },
 *   { kind: "check", pass: true, text: "gm = 38.6 mS is at least 10 mS" },
 * ]);
 * ```
 */
export function cellEntries(
  state: CellState,
  cellNumber: number,
  options: CellEntriesOptions = {},
): CellEntries {
  const label = options.cellLabel ?? ((id: string) => id);
  const entries: RecordedEntry[] = [];
  const charts: ChartFile[] = [];
  if (state.status === "done" && state.outcome) {
    // A shown list of checks is recorded as check lines: this cell's own checks once (they
    // follow below), checks counted on an earlier cell as they are shown here.
    const ownLines = new Set(
      state.outcome.checks.map((c) => `${c.pass ? "✓" : "✗"} ${c.reason || c.name}`),
    );
    for (const output of state.outcome.outputs) {
      const text = output["text/plain"];
      const lines = text?.split("\n") ?? [];
      if (text !== undefined && text !== "" && lines.every((line) => /^[✓✗] /.test(line))) {
        for (const line of lines) {
          if (!ownLines.has(line)) {
            entries.push({ kind: "check", pass: line.startsWith("✓"), text: line.slice(2) });
          }
        }
      } else if (text !== undefined && text !== "") entries.push({ kind: "text", text });
      const svg = output["image/svg+xml"];
      if (svg !== undefined) {
        const k = charts.length + 1;
        charts.push({
          fileName: k === 1 ? `cell-${cellNumber}.svg` : `cell-${cellNumber}-${k}.svg`,
          title: k === 1 ? `chart from cell ${cellNumber}` : `chart ${k} from cell ${cellNumber}`,
          svg,
        });
      }
    }
    for (const record of state.outcome.records) {
      const unit = state.outcome.adjustables.find((a) => a.name === record.name)?.unit ?? "";
      entries.push(
        unit === "" ? { kind: "number", name: record.name, value: record.value } : {
          kind: "number",
          name: record.name,
          value: record.value,
          shown: formatQuantity(record.value, unit),
        },
      );
    }
    for (const check of state.outcome.checks) {
      entries.push({ kind: "check", pass: check.pass, text: check.reason || check.name });
    }
  } else if (state.status === "failed" && state.error) {
    const where = state.error.line === undefined ? "" : ` (line ${state.error.line})`;
    entries.push({
      kind: "problem",
      text: `failed: ${state.error.message.split("\n")[0]}${where}`,
    });
  } else if (state.status === "blocked") {
    const by = (state.blockedBy ?? []).map(label).join(", ");
    entries.push({ kind: "problem", text: `blocked: needs ${by}, which did not finish` });
  }
  return { entries, charts };
}
