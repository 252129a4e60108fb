/**
 * Running a whole notebook headlessly: open a session, run every cell, collect each
 * cell's final state, close. What `run`, `record` and `verify` share.
 *
 * @module
 */
import { type Notebook, splitNotebook } from "../notebook/split.ts";
import { basename } from "../_paths.ts";
import type { CellState, CellSummary, SessionEvent } from "./events.ts";
import { Session, type SessionCell, type SessionOptions } from "./session.ts";

/** Options for {@linkcode runNotebook}. */
export interface RunNotebookOptions extends Omit<SessionOptions, "path"> {
  /** Called with every event as it happens (progress, live output). */
  onEvent?: (event: SessionEvent) => void;
  /**
   * Time limit for the whole notebook in milliseconds; cells not finished by then fail.
   * @default {600000}
   */
  notebookTimeoutMs?: number;
}

/** Default time limit for a whole notebook, in milliseconds (ten minutes). */
export const DEFAULT_NOTEBOOK_TIMEOUT_MS = 600_000;

/** A finished headless run. */
export interface NotebookRun {
  /** The notebook file's path. */
  path: string;
  /** The notebook as split. */
  notebook: Notebook;
  /** The session's cells, in document order. */
  cells: SessionCell[];
  /** Each cell's analysis summary, in document order. */
  summaries: CellSummary[];
  /** Each cell's final state, in document order. */
  states: CellState[];
  /** Adjustable values the notebook declares, by name → cell id. */
  adjustables: Map<string, string>;
  /** Milliseconds spent analysing and running. */
  timing: { analysisMs: number; runMs: number };
}

/**
 * Runs a notebook from its text and returns every cell's final state.
 *
 * @param path The notebook's path (its folder is where the cells run and read).
 * @param text The notebook's text.
 * @param options Session options and an event callback.
 * @returns The run.
 *
 * @example Two cells, run in the sandbox
 * ```ts
 * import { runNotebook } from "./run_notebook.ts";
 * import { deepEqual } from "node:assert/strict";
 * const dir = await Deno.makeTempDir();
 * const run = await runNotebook(`${dir}/amp.md`, "~~~ts\nconst gain = 20;\n~~~\n~~~ts\ngain * 2\n~~~\n");
 * deepEqual(run.states.map((state) => state.status), ["done", "done"]);
 * deepEqual(run.states[1].outcome?.outputs, [{ "text/plain": "40" }]);
 * await Deno.remove(dir, { recursive: true });
 * ```
 */
export async function runNotebook(
  path: string,
  text: string,
  options: RunNotebookOptions = {},
): Promise<NotebookRun> {
  const session = new Session({ ...options, path });
  let summaries: CellSummary[] = [];
  let analysedAt = 0;
  const started = performance.now();
  session.subscribe((event) => {
    if (event.type === "analysed") {
      summaries = event.cells;
      analysedAt = performance.now();
    }
    options.onEvent?.(event);
  });
  try {
    const limitMs = options.notebookTimeoutMs ?? DEFAULT_NOTEBOOK_TIMEOUT_MS;
    const limit = setTimeout(() => {
      session.abort(`Not finished: the notebook time limit of ${limitMs / 1000} s was reached`);
    }, limitMs);
    try {
      await session.send({ type: "open", text });
    } finally {
      clearTimeout(limit);
    }
    const finished = performance.now();
    const cells = [...session.cells];
    return {
      path,
      notebook: splitNotebook(text, { fileName: basename(path) }),
      cells,
      summaries,
      states: cells.map((cell) => session.state(cell.id)),
      adjustables: session.adjustableNames(),
      timing: { analysisMs: analysedAt - started, runMs: finished - analysedAt },
    };
  } finally {
    await session.close();
  }
}
