/**
 * The messages between the host and the sandbox process: one JSON object per line on the
 * child's stdin (requests) and stdout (replies). Numbers that JSON cannot carry (NaN, ±∞)
 * travel as `{"$number": "NaN"}` and are restored on arrival.
 *
 *     host ──{ hello: token }────────────▶ child      (every reply starts with the token)
 *     host ◀─{ ready }
 *     host ──{ run: steps }──────────────▶ child      (one batch, in plan order)
 *     host ◀─{ started } { stream }* { done | failed | blocked } ── per step
 *     host ◀─{ batchEnd }                             (or the child is killed on a timeout)
 *     host ──{ cancel }──▶ child stops after the cell it is running
 *
 * @module
 */

/** MIME type → content; `text/plain` is always present. */
export type MimeBundle = Record<string, string>;

/** A named number from a cell (a top-level number, or a number field of its shown value). */
export interface NumberRecord {
  /** `tailCurrent`, or `pair.gm` for a field of the shown value `pair`. */
  name: string;
  /** The number, exactly. */
  value: number;
}

/** A design-check result as data (the library's check object without its marker). */
export interface CheckRecord {
  /** What was checked. */
  name: string;
  /** The checked value. */
  value: number;
  /** Unit symbol. */
  unit: string;
  /** The limit. */
  limit: { kind: string; min?: number; max?: number };
  /** Whether it passed. */
  pass: boolean;
  /** Distance to the nearest bound (negative when failing). */
  margin: number;
  /** Margin relative to the bound. */
  marginRatio: number;
  /** One line saying why. */
  reason: string;
}

/** An adjustable value a cell declared (see kernel/adjustable). */
export interface AdjustableRecord {
  /** Name. */
  name: string;
  /** Default. */
  defaultValue: number;
  /** Value used. */
  value: number;
  /** Unit symbol. */
  unit: string;
  /** Range and step. */
  min: number;
  /** Largest allowed value. */
  max: number;
  /** Step (0: any). */
  step: number;
  /** Label. */
  label: string;
}

/** Text a cell printed. */
export interface StreamChunk {
  /** `out` for console.log/info/debug, `err` for console.warn/error. */
  name: "out" | "err";
  /** The text, with a final line break. */
  text: string;
}

/** One step of a batch, as sent to the child. */
export interface ChildStep {
  /** Cell id. */
  cell: string;
  /** `run` a module; `fail`: forget the cell's value (it cannot run), so dependents block. */
  kind: "run" | "fail";
  /** Module source (for `run`). */
  source?: string;
  /**
   * The same cell as a function the sandbox may put into one module with other cells (a
   * module per cell gets slow when there are thousands): its imports, one binding each,
   * and the function's text, whose lines from the second on are lines of `source` too.
   * Without it the cell runs as its own module.
   */
  batchable?: { imports: Array<{ statement: string; local?: string }>; body: string };
  /** Names the cell needs, with the cells that define them. */
  inputs?: Array<{ name: string; from: string }>;
  /** How to name the shown value in records (`pair` for a last expression `pair`). */
  label?: string;
}

/** Requests from host to child. */
export type HostMessage =
  | { type: "hello"; token: string }
  | {
    type: "run";
    batch: number;
    steps: ChildStep[];
    values: Record<string, number>;
    notebookUrl: string;
  }
  | { type: "cancel"; batch: number };

/** Where an error happened in a compiled cell (module line and column, 1-based). */
export interface ModulePosition {
  /** Id of the cell whose module it is. */
  cell: string;
  /** Line in the module. */
  line: number;
  /** Column in the module. */
  column: number;
}

/** A thrown error, as data. */
export interface ErrorRecord {
  /** Error class name, e.g. `TypeError`. */
  name: string;
  /** Its message. */
  message: string;
  /** Stack text; frames in cell modules read `cell:ID:LINE:COLUMN`. */
  stack: string;
  /** The first stack frame inside a cell's module, if any. */
  at?: ModulePosition;
  /** True when a sandbox permission stopped it (reading, network, environment, …). */
  denied?: boolean;
}

/** What a cell produced. */
export interface CellOutcome {
  /** Rich outputs (the shown value; one per element for a list of displayable values). */
  outputs: MimeBundle[];
  /** Named numbers. */
  records: NumberRecord[];
  /** Design checks found in the shown value and the cell's top-level values. */
  checks: CheckRecord[];
  /** Adjustable values declared. */
  adjustables: AdjustableRecord[];
  /** Milliseconds the cell's own code took. */
  durationMs: number;
}

/** Replies from child to host. */
export type ChildMessage =
  | { type: "ready" }
  | { type: "started"; batch: number; cell: string }
  | { type: "stream"; batch: number; cell: string; chunk: StreamChunk }
  | { type: "done"; batch: number; cell: string; outcome: CellOutcome }
  | { type: "failed"; batch: number; cell: string; error: ErrorRecord }
  | { type: "blocked"; batch: number; cell: string; by: string[] }
  | { type: "batchEnd"; batch: number; cancelled: boolean };

/**
 * Encodes a message as one JSON line, carrying NaN and ±∞.
 *
 * @param message Any JSON-like value.
 * @returns One line of JSON, ending in `\n`.
 *
 * @example
 * ```ts
 * import { decodeLine, encodeLine } from "./protocol.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(decodeLine(encodeLine({ v: [NaN, -Infinity, 2] })), { v: [NaN, -Infinity, 2] });
 * ```
 */
export function encodeLine(message: unknown): string {
  return JSON.stringify(
    message,
    (_key, value) =>
      typeof value === "number" && !Number.isFinite(value) ? { $number: String(value) } : value,
  ) +
    "\n";
}

/**
 * Decodes one JSON line written by {@linkcode encodeLine}.
 *
 * @param line The line.
 * @returns The value.
 * @throws {SyntaxError} If the line is not JSON.
 *
 * @example
 * ```ts
 * import { decodeLine } from "./protocol.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(decodeLine('{"margin":{"$number":"NaN"}}'), { margin: NaN });
 * ```
 */
export function decodeLine(line: string): unknown {
  return JSON.parse(
    line,
    (_key, value) =>
      value !== null && typeof value === "object" && typeof value.$number === "string" &&
        Object.keys(value).length === 1
        ? Number(value.$number)
        : value,
  );
}
