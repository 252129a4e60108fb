/**
 * `verify` for one notebook: compare a fresh run with what the notebook recorded, and
 * collect every reason it does not pass (failed cells, failed design checks, drifts,
 * type errors).
 *
 * @module
 */
import { parseRecorded } from "../notebook/recorded_block.ts";
import type { CellError } from "../session/events.ts";
import type { NotebookRun } from "../session/run_notebook.ts";
import { LONGTAIL_VERSION } from "../version.ts";
import { cellEntries } from "./cell_entries.ts";
import { compareEntries, type Drift } from "./compare.ts";
import type { CheckRecord } from "../sandbox/protocol.ts";

/** One cell's drifts. */
export interface CellDrift {
  /** Cell number, 1-based. */
  cell: number;
  /** Notebook line of its fence. */
  line: number;
  /** What drifted. */
  drifts: Drift[];
}

/** A cell that did not finish. */
export interface CellFailure {
  /** Cell number, 1-based. */
  cell: number;
  /** Notebook line of its fence. */
  line: number;
  /** `failed` or `blocked`. */
  status: "failed" | "blocked";
  /** The error (failed) or the cells it waited for (blocked). */
  error?: CellError;
  /** Numbers of the cells that blocked it. */
  blockedBy?: number[];
}

/** A design check with its cell. */
export interface PlacedCheck extends CheckRecord {
  /** Cell number, 1-based. */
  cell: number;
  /** Notebook line of its fence. */
  line: number;
}

/** The verdict on one notebook. */
export interface NotebookVerdict {
  /** Path. */
  path: string;
  /** True when nothing failed and nothing drifted. */
  passed: boolean;
  /** Number of cells. */
  cells: number;
  /** Every design check. */
  checks: PlacedCheck[];
  /** Cells that failed or were blocked. */
  failures: CellFailure[];
  /** Cells whose results differ from the recorded ones. */
  drifts: CellDrift[];
  /** Recorded entries that agreed. */
  agreed: number;
  /** Cells without a recorded block in a notebook never recorded. */
  notRecorded: boolean;
  /** The version that recorded the results, when it differs from this one. */
  recordedWith?: string;
}

/** Options for {@linkcode verifyRun}. */
export interface VerifyOptions {
  /**
   * Relative tolerance for numbers.
   * @default {1e-5}
   */
  rtol?: number;
}

/**
 * Judges a finished run against the notebook's recorded results.
 *
 * @param run The run.
 * @param options Tolerance.
 * @returns The verdict.
 *
 * @example A recorded value that changed
 * ```ts
 * import { runNotebook } from "../session/run_notebook.ts";
 * import { verifyRun } from "./verify_notebook.ts";
 * import { deepEqual, equal } from "node:assert/strict";
 * const dir = await Deno.makeTempDir();
 * const fence = "`".repeat(3);
 * const text = `~~~ts\nconst r1 = 5100;\n~~~\n\n${fence}recorded\n· r1 = 4700\n${fence}\n`;
 * const verdict = verifyRun(await runNotebook(`${dir}/amp.md`, text));
 * equal(verdict.passed, false);
 * deepEqual(verdict.drifts[0].drifts, [{ name: "r1", recorded: "4700", now: "5100" }]);
 * await Deno.remove(dir, { recursive: true });
 * ```
 */
export function verifyRun(run: NotebookRun, options: VerifyOptions = {}): NotebookVerdict {
  const numberOf = new Map(run.cells.map((cell) => [cell.id, cell.index + 1]));
  const checks: PlacedCheck[] = [];
  const failures: CellFailure[] = [];
  const drifts: CellDrift[] = [];
  let agreed = 0;
  const recorded = run.notebook.version !== undefined ||
    run.notebook.cells.some((cell) => cell.recorded !== undefined);
  for (const [i, cell] of run.cells.entries()) {
    const state = run.states[i];
    const number = cell.index + 1;
    const line = cell.place.startLine + 1;
    if (state.status === "failed") {
      failures.push({ cell: number, line, status: "failed", error: state.error });
    }
    if (state.status === "blocked") {
      failures.push({
        cell: number,
        line,
        status: "blocked",
        blockedBy: (state.blockedBy ?? []).map((id) => numberOf.get(id) ?? 0),
      });
    }
    for (const check of state.outcome?.checks ?? []) checks.push({ ...check, cell: number, line });
    if (!recorded) continue;
    const notebookCell = run.notebook.cells[i];
    const before = notebookCell?.recorded ? parseRecorded(notebookCell.recorded.content) : [];
    const now = cellEntries(state, number, {
      cellLabel: (id) => `cell ${numberOf.get(id) ?? "?"}`,
    }).entries;
    const found = compareEntries(before, now, options);
    if (found.length > 0) drifts.push({ cell: number, line, drifts: found });
    else agreed += before.length;
  }
  const passed = failures.length === 0 && drifts.length === 0 &&
    checks.every((check) => check.pass);
  const version = run.notebook.version?.version;
  return {
    path: run.path,
    passed,
    cells: run.cells.length,
    checks,
    failures,
    drifts,
    agreed,
    notRecorded: !recorded,
    recordedWith: version !== undefined && version !== LONGTAIL_VERSION ? version : undefined,
  };
}
