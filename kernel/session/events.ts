/**
 * The session's requests and events: the whole vocabulary a front-end (terminal, live
 * page, a Jupyter-protocol kernel) needs. Plain data, so any of them can be sent as JSON.
 *
 * @module
 */
import type { ProblemKind } from "../analysis/graph.ts";
import type { CellOutcome, StreamChunk } from "../sandbox/protocol.ts";

export type {
  AdjustableRecord,
  CellOutcome,
  CheckRecord,
  MimeBundle,
  NumberRecord,
  StreamChunk,
} from "../sandbox/protocol.ts";

/** Requests a front-end sends. */
export type SessionRequest =
  /** The whole notebook text (first load, or after the file changed). */
  | { type: "open"; text: string }
  /** New code for one cell. */
  | { type: "edit"; cell: string; code: string }
  /** Values for adjustable values, by name (the rest keep theirs). */
  | { type: "set"; values: Record<string, number> }
  /** Run cells again even though they are up to date (all when `cells` is missing). */
  | { type: "rerun"; cells?: string[] }
  /** Stop the run after the cell that is running. */
  | { type: "cancel" };

/** A problem with its place in the notebook (1-based line and column). */
export interface LocatedProblem {
  /** What kind of problem. */
  kind: ProblemKind;
  /** The message. */
  message: string;
  /** Notebook line. */
  line: number;
  /** Column on that line. */
  column: number;
}

/** Why a cell failed. */
export interface CellError {
  /**
   * `problem`: the analysis found problems, it never ran; `runtime`: its code threw;
   * `denied`: it tried something the sandbox does not allow; `timeout`: it ran past the
   * time limit; `crash`: the sandbox process died.
   */
  kind: "problem" | "runtime" | "denied" | "timeout" | "crash";
  /** One line, e.g. `TypeError: x is not a function`. */
  message: string;
  /** Notebook line, when known. */
  line?: number;
  /** Column, when known. */
  column?: number;
  /** All problems (for `problem`). */
  problems?: LocatedProblem[];
  /** Stack text (for `runtime`), module URLs replaced by `cell`. */
  stack?: string;
}

/** A cell as the session describes it after analysis. */
export interface CellSummary {
  /** Stable id. */
  id: string;
  /** Position, 0-based. */
  index: number;
  /** Notebook line (1-based) of its opening fence. */
  line: number;
  /** Names it defines. */
  defines: string[];
  /** Ids of the cells it needs. */
  dependencies: string[];
  /** Adjustable values it declares (names). */
  adjustables: string[];
  /** Problems that stop it. */
  problems: LocatedProblem[];
}

/** Events a session emits. */
export type SessionEvent =
  /** The notebook was (re-)analysed; cells in document order. */
  | { type: "analysed"; cells: CellSummary[] }
  /** A cell will run. */
  | { type: "queued"; cell: string }
  /** A cell started. */
  | { type: "running"; cell: string }
  /** A cell printed text. */
  | { type: "stream"; cell: string; chunk: StreamChunk }
  /** A cell finished. */
  | { type: "done"; cell: string; outcome: CellOutcome }
  /** A cell failed. */
  | { type: "failed"; cell: string; error: CellError }
  /** A cell could not run because cells it needs failed or were blocked. */
  | { type: "blocked"; cell: string; by: string[] }
  /** Nothing left to run. */
  | { type: "idle" };

/** The latest state of one cell, kept by the session. */
export interface CellState {
  /** Where it stands. */
  status: "waiting" | "queued" | "running" | "done" | "failed" | "blocked";
  /** What it produced (when done). */
  outcome?: CellOutcome;
  /** What it printed in its last run. */
  streams: StreamChunk[];
  /** Why it failed. */
  error?: CellError;
  /** Which cells blocked it. */
  blockedBy?: string[];
}
