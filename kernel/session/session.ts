/**
 * A notebook session: requests in, events out. It keeps the notebook's cells, their
 * analyses and graph, what each cell last produced, and one sandbox process that holds
 * the values. It knows nothing of any front-end.
 *
 *     request ─▶ update cells ─▶ analyse changed cells ─▶ graph ─▶ plan ─▶ sandbox
 *                                     "analysed" ◀──────────────┘        │
 *        "queued" "running" "stream" "done" "failed" "blocked" "idle" ◀──┘
 *
 * A new request while a run is going on cancels the rest of that run (the cell that is
 * running finishes); the next plan then covers whatever is still stale.
 *
 * @module
 */
import { analyseCell, type CallDeclaration, type CellAnalysis } from "../analysis/analyse_cell.ts";
import {
  buildGraph,
  type GraphCell,
  type GraphProblem,
  type NotebookGraph,
} from "../analysis/graph.ts";
import { planRun, type RunRecord } from "../analysis/plan.ts";
import { adjustableCalls } from "../analysis/adjustables.ts";
import { cellPosition, compileCell, type CompiledCell } from "../compile/compile_cell.ts";
import { type NotebookCell, splitNotebook } from "../notebook/split.ts";
import { locateInNotebook } from "../notebook/locate.ts";
import { absolutePath, basename, dirname, fileUrlFromPath, ROOT_DIR } from "../_paths.ts";
import type { ChildMessage, ChildStep } from "../sandbox/protocol.ts";
import { type BatchEnd, Sandbox } from "../sandbox/sandbox.ts";
import { explainDenial, parseDenial } from "../sandbox/denial.ts";
import { explainImportFailure, withoutModuleUrls } from "./import_failure.ts";
import type {
  CellError,
  CellState,
  CellSummary,
  LocatedProblem,
  SessionEvent,
  SessionRequest,
} from "./events.ts";

/** Options for {@linkcode Session}. */
export interface SessionOptions {
  /** Path of the notebook file: its folder is where the sandbox reads and runs. */
  path: string;
  /**
   * The longtail checkout whose lib/ notebooks import.
   * @default {the checkout this code runs from}
   */
  rootDir?: string;
  /**
   * Per-cell time limit in milliseconds.
   * @default {30000}
   */
  cellTimeoutMs?: number;
  /**
   * Adjustable values to use instead of their defaults, by name.
   * @default {{}}
   */
  values?: Record<string, number>;
  /**
   * Extra paths the sandbox may read.
   * @default {[]}
   */
  allowRead?: string[];
  /**
   * Hosts (`name` or `name:port`) the sandbox may reach.
   * @default {[]}
   */
  allowNet?: string[];
  /**
   * Environment variables passed to the sandbox, readable by cells.
   * @default {[]}
   */
  allowEnv?: string[];
  /**
   * Largest JavaScript heap of the sandbox process, in megabytes.
   * @default {4096}
   */
  memoryMb?: number;
}

/** One cell as the session holds it. */
export interface SessionCell {
  /** Stable id (`c1`, `c2`, … in order of first appearance). */
  id: string;
  /** Position, 0-based. */
  index: number;
  /** The code. */
  code: string;
  /** Where it sits in the notebook. */
  place: Pick<NotebookCell, "startLine" | "codeLine" | "columnOffsets">;
  /** Bumped whenever its code or one of its adjustable values changes. */
  version: number;
  /** Its analysis. */
  analysis: CellAnalysis;
}

/**
 * A notebook session.
 *
 * @example Two cells, one depending on the other
 * ```ts
 * import { Session } from "./session.ts";
 * import { deepEqual } from "node:assert/strict";
 * const dir = await Deno.makeTempDir();
 * const session = new Session({ path: `${dir}/design.md` });
 * const running: string[] = [];
 * session.subscribe((event) => event.type === "running" && running.push(event.cell));
 * await session.send({ type: "open", text: "~~~ts\na * 3\n~~~\n~~~ts\nconst a = 2\n~~~\n" });
 * deepEqual(running, ["c2", "c1"]); // dependency order, not document order
 * deepEqual(session.state("c1").outcome?.outputs, [{ "text/plain": "6" }]);
 * await session.close();
 * await Deno.remove(dir, { recursive: true });
 * ```
 */
export class Session {
  readonly #options: SessionOptions;
  readonly #path: string;
  readonly #notebookUrl: string;
  readonly #sandbox: Sandbox;
  readonly #listeners = new Set<(event: SessionEvent) => void>();
  #cells: SessionCell[] = [];
  #graph: NotebookGraph = buildGraph([]);
  #analyses = new Map<string, CellAnalysis>();
  #byId = new Map<string, SessionCell>();
  #compiled = new Map<string, CompiledCell>();
  #records = new Map<string, RunRecord>();
  #states = new Map<string, CellState>();
  #values: Record<string, number>;
  #nextId = 1;
  #resultCounter = 0;
  #force = new Set<string>();
  #dirty = false;
  #aborted: string | undefined;
  #loop: Promise<void> | undefined;
  #analysisCache = new Map<string, CellAnalysis>();

  /**
   * Creates a session (the sandbox starts with the first run).
   *
   * @param options Notebook path, time limit, adjustable values.
   */
  constructor(options: SessionOptions) {
    this.#options = options;
    this.#path = absolutePath(options.path);
    this.#notebookUrl = fileUrlFromPath(this.#path);
    this.#values = { ...options.values };
    this.#sandbox = new Sandbox({
      rootDir: options.rootDir ?? ROOT_DIR,
      notebookDir: dirname(this.#path),
      allowRead: options.allowRead,
      allowNet: options.allowNet,
      allowEnv: options.allowEnv,
      memoryMb: options.memoryMb,
      cellTimeoutMs: options.cellTimeoutMs,
    });
  }

  /** The cells in document order. */
  get cells(): readonly SessionCell[] {
    return this.#cells;
  }

  /** The current graph. */
  get graph(): NotebookGraph {
    return this.#graph;
  }

  /** The per-cell time limit, in milliseconds. */
  get cellTimeoutMs(): number {
    return this.#sandbox.cellTimeoutMs;
  }

  /**
   * The latest state of a cell.
   *
   * @param id Cell id.
   * @returns Its state (`waiting` before anything happened).
   */
  state(id: string): CellState {
    return this.#states.get(id) ?? { status: "waiting", streams: [] };
  }

  /**
   * Listens to events.
   *
   * @param listener Called for each event, in order.
   * @returns A function that stops listening.
   */
  subscribe(listener: (event: SessionEvent) => void): () => void {
    this.#listeners.add(listener);
    return () => this.#listeners.delete(listener);
  }

  /**
   * Handles a request; resolves when the runs it started are over (or superseded and over).
   *
   * @param request What to do.
   * @returns A promise that resolves when the session is idle again.
   */
  send(request: SessionRequest): Promise<void> {
    switch (request.type) {
      case "open":
        this.#open(request.text);
        break;
      case "edit": {
        const cell = this.#byId.get(request.cell);
        if (!cell) {
          throw new RangeError(
            `Expected the id of a cell, but found ${JSON.stringify(request.cell)}`,
          );
        }
        if (cell.code !== request.code) {
          cell.code = request.code;
          cell.version++;
          cell.analysis = this.#analyse(request.code);
        }
        this.#rebuild();
        break;
      }
      case "set": {
        const changed = Object.keys(request.values).filter((name) =>
          this.#values[name] !== request.values[name]
        );
        Object.assign(this.#values, request.values);
        for (const cell of this.#cells) {
          const names = this.#adjustableCalls(cell).map((call) => call.name);
          if (names.some((name) => changed.includes(name))) cell.version++;
        }
        break;
      }
      case "rerun":
        for (const id of request.cells ?? this.#cells.map((c) => c.id)) this.#force.add(id);
        break;
      case "cancel":
        this.#sandbox.cancel();
        return this.#loop ?? Promise.resolve();
    }
    return this.#schedule();
  }

  /**
   * Stops at once: kills the sandbox and fails every cell that had not finished, with the
   * reason given (for a time limit on the whole notebook).
   *
   * @param message Why, shown on each unfinished cell.
   * @returns When the run has stopped.
   */
  async abort(message: string): Promise<void> {
    this.#aborted = message;
    this.#sandbox.kill();
    await this.#loop?.catch(() => {});
  }

  /** Stops the sandbox. */
  async close(): Promise<void> {
    this.#sandbox.cancel();
    await this.#loop?.catch(() => {});
    await this.#sandbox.close();
  }

  /** Adjustable values declared by the notebook's cells (found by analysis), by cell id. */
  adjustableNames(): Map<string, string> {
    const names = new Map<string, string>();
    for (const cell of this.#cells) {
      for (const call of this.#adjustableCalls(cell)) names.set(call.name, cell.id);
    }
    return names;
  }

  /**
   * Places a problem or an error position in the notebook.
   *
   * @param id Cell id.
   * @param offset Offset in the cell's code.
   * @returns 1-based notebook line and column.
   */
  locate(id: string, offset: number): { line: number; column: number } {
    const cell = this.#byId.get(id)!;
    return locateInNotebook(cell.code, offset, cell.place);
  }

  // ── state changes ─────────────────────────────────────────────────────────────────

  #open(text: string): void {
    const notebook = splitNotebook(text, { fileName: basename(this.#path) });
    const old = [...this.#cells];
    const taken = new Set<SessionCell>();
    const next: SessionCell[] = [];
    // Keep identities: same code first (cells may have moved), then same position.
    const byCode = new Map<string, SessionCell[]>();
    for (const cell of old) byCode.set(cell.code, [...(byCode.get(cell.code) ?? []), cell]);
    const matches: Array<SessionCell | undefined> = notebook.cells.map((cell) => {
      const same = byCode.get(cell.code)?.shift();
      if (same) taken.add(same);
      return same;
    });
    notebook.cells.forEach((cell, i) => {
      let match = matches[i];
      if (!match) {
        const candidate = old[i];
        if (candidate && !taken.has(candidate)) {
          match = candidate;
          taken.add(candidate);
        }
      }
      const place = {
        startLine: cell.startLine,
        codeLine: cell.codeLine,
        columnOffsets: cell.columnOffsets,
      };
      if (match) {
        if (match.code !== cell.code) {
          match.code = cell.code;
          match.version++;
          match.analysis = this.#analyse(cell.code);
        }
        match.place = place;
        match.index = i;
        next.push(match);
      } else {
        next.push({
          id: `c${this.#nextId++}`,
          index: i,
          code: cell.code,
          place,
          version: 1,
          analysis: this.#analyse(cell.code),
        });
      }
    });
    const kept = new Set(next);
    for (const gone of old) {
      if (!kept.has(gone)) {
        this.#records.delete(gone.id);
        this.#states.delete(gone.id);
      }
    }
    this.#cells = next;
    // An unclosed fence runs to the end of the file: say so on that cell.
    notebook.cells.forEach((cell, i) => {
      if (!cell.closed) {
        next[i].analysis = {
          ...next[i].analysis,
          problems: [...next[i].analysis.problems, {
            kind: "syntax",
            message: `The fence opened on line ${cell.startLine + 1} is never closed; ` +
              "close it with a line of the same fence characters (such as ```)",
            offset: 0,
          }],
        };
      }
    });
    this.#rebuild();
  }

  #analyse(code: string): CellAnalysis {
    let analysis = this.#analysisCache.get(code);
    if (!analysis) {
      analysis = analyseCell(code);
      this.#analysisCache.set(code, analysis);
      if (this.#analysisCache.size > 5000) {
        this.#analysisCache.delete(this.#analysisCache.keys().next().value!);
      }
    }
    return analysis;
  }

  #rebuild(): void {
    this.#analyses = new Map(this.#cells.map((cell) => [cell.id, cell.analysis]));
    this.#byId = new Map(this.#cells.map((cell) => [cell.id, cell]));
    this.#graph = buildGraph(this.#cells.map((cell) => ({
      id: cell.id,
      analysis: cell.analysis,
      label: `cell ${cell.index + 1} (line ${cell.place.startLine + 1})`,
    })));
    this.#emit({ type: "analysed", cells: this.#cells.map((cell) => this.#summary(cell)) });
  }

  #summary(cell: SessionCell): CellSummary {
    const node = this.#graph.byId.get(cell.id)!;
    return {
      id: cell.id,
      index: cell.index,
      line: cell.place.startLine + 1,
      defines: [...new Set(cell.analysis.defines.map((d) => d.name))],
      dependencies: node.dependencies,
      adjustables: this.#adjustableCalls(cell).map((call) => call.name),
      problems: this.#locatedProblems(cell, node),
    };
  }

  #locatedProblems(cell: SessionCell, node: GraphCell): LocatedProblem[] {
    return node.problems.map((problem: GraphProblem) => {
      const place = problem.offset === undefined
        ? { line: cell.place.startLine + 1, column: 1 }
        : this.locate(cell.id, problem.offset);
      return { kind: problem.kind, message: problem.message, ...place };
    });
  }

  /** Calls to the adjustable helper in a cell. */
  #adjustableCalls(cell: SessionCell): CallDeclaration[] {
    if (cell.analysis.calls.length === 0) return [];
    return adjustableCalls(cell.id, this.#analyses, this.#graph);
  }

  // ── running ───────────────────────────────────────────────────────────────────────

  #schedule(): Promise<void> {
    this.#dirty = true;
    if (this.#loop) {
      this.#sandbox.cancel();
      return this.#loop;
    }
    this.#loop = (async () => {
      try {
        while (this.#dirty) {
          this.#dirty = false;
          await this.#runOnce();
        }
      } finally {
        this.#loop = undefined;
        this.#emit({ type: "idle" });
      }
    })();
    return this.#loop;
  }

  async #runOnce(): Promise<void> {
    if (this.#aborted !== undefined) return;
    const versions = new Map(this.#cells.map((cell) => [cell.id, cell.version]));
    const steps = planRun(this.#graph, versions, this.#records, { force: this.#force });
    this.#force.clear();
    if (steps.length === 0) return;
    const byId = new Map(this.#cells.map((cell) => [cell.id, cell]));
    const restoring = new Set(steps.filter((s) => s.restore).map((s) => s.id));
    for (const step of steps) {
      if (!step.restore) {
        this.#states.set(step.id, { status: "queued", streams: [] });
        this.#emit({ type: "queued", cell: step.id });
      }
    }
    const childSteps: ChildStep[] = [];
    for (const step of steps) {
      const cell = byId.get(step.id)!;
      const node = this.#graph.byId.get(step.id)!;
      if (node.problems.length > 0) {
        childSteps.push({ cell: step.id, kind: "fail" });
        const problems = this.#locatedProblems(cell, node);
        this.#finish(step.id, versions, false);
        this.#fail(step.id, {
          kind: "problem",
          message: problems[0].message,
          line: problems[0].line,
          column: problems[0].column,
          problems,
        });
        continue;
      }
      const compiled = compileCell(cell.code, cell.analysis, {
        notebookUrl: this.#notebookUrl,
        inputs: node.inputs.map((input) => input.name),
        adjustables: this.#adjustableCalls(cell),
      });
      this.#compiled.set(step.id, compiled);
      const last = cell.analysis.lastExpression;
      const lastText = last ? cell.code.slice(last.start, last.end) : "";
      childSteps.push({
        cell: step.id,
        kind: "run",
        source: compiled.source,
        batchable: { imports: compiled.imports, body: compiled.body },
        inputs: node.inputs,
        label: /^[\p{L}_$][\p{L}\p{N}_$]*(\.[\p{L}_$][\p{L}\p{N}_$]*)*$/u.test(lastText)
          ? lastText
          : "value",
      });
    }
    if (!childSteps.some((step) => step.kind === "run")) {
      // Only cells that cannot run: the sandbox still needs to forget their values.
      if (!this.#sandbox.alive) return;
    }
    const end = await this.#sandbox.runBatch(childSteps, {
      values: this.#values,
      notebookUrl: this.#notebookUrl,
      onMessage: (message) => this.#onChildMessage(message, versions, restoring),
    });
    this.#afterBatch(end, versions);
  }

  #onChildMessage(
    message: ChildMessage,
    versions: Map<string, number>,
    restoring: Set<string>,
  ): void {
    if (!("cell" in message)) return;
    const id = message.cell;
    if (!this.#byId.has(id)) return;
    const restore = restoring.has(id);
    const state = this.#states.get(id) ?? { status: "waiting" as const, streams: [] };
    switch (message.type) {
      case "started":
        if (restore) return;
        this.#states.set(id, { status: "running", streams: [] });
        this.#emit({ type: "running", cell: id });
        return;
      case "stream":
        if (restore) return;
        state.streams.push(message.chunk);
        this.#emit({ type: "stream", cell: id, chunk: message.chunk });
        return;
      case "done":
        this.#finish(id, versions, true, restore);
        if (restore) return;
        this.#states.set(id, { status: "done", outcome: message.outcome, streams: state.streams });
        this.#emit({ type: "done", cell: id, outcome: message.outcome });
        return;
      case "failed": {
        this.#finish(id, versions, false);
        const error = message.error;
        const place = error.at
          ? this.#modulePlace(error.at.cell, error.at.line, error.at.column)
          : {};
        const name = basename(this.#path);
        const rewrite = (text: string) =>
          text.replace(/cell:([\w-]+):(\d+):(\d+)/g, (_all, cell, line, column) => {
            const at = this.#modulePlace(cell, Number(line), Number(column));
            return `${name}:${at.line ?? "?"}${at.column === undefined ? "" : `:${at.column}`}`;
          });
        const stack = withoutModuleUrls(rewrite(error.stack), name);
        const text = withoutModuleUrls(rewrite(error.message), name);
        // Say what the cell tried and how to allow it; place import failures on their import.
        const denied = error.denied || parseDenial(error.message) !== undefined;
        const imports = this.#byId.get(id)?.analysis.imports ?? [];
        const failure = denied
          ? undefined
          : explainImportFailure(error.message, imports, this.#notebookUrl);
        const where = failure?.offset !== undefined ? this.locate(id, failure.offset) : place;
        this.#fail(id, {
          kind: denied ? "denied" : "runtime",
          message: denied
            ? explainDenial(error.message, { notebookDir: dirname(this.#path) })
            : failure
            ? failure.message
            : `${error.name}: ${text}`,
          ...where,
          stack,
        }, state.streams);
        return;
      }
      case "blocked":
        this.#finish(id, versions, false);
        this.#states.set(id, { status: "blocked", blockedBy: message.by, streams: [] });
        this.#emit({ type: "blocked", cell: id, by: message.by });
        return;
    }
  }

  /** Notebook line and column of a line and column in a cell's compiled module. */
  #modulePlace(id: string, line: number, column: number): { line?: number; column?: number } {
    const cell = this.#byId.get(id);
    const compiled = this.#compiled.get(id);
    if (!cell || !compiled) return {};
    const position = cellPosition(compiled, line, column);
    if (!position) return { line: cell.place.startLine + 1 };
    return {
      line: cell.place.codeLine + position.lineIndex,
      column: position.column + (cell.place.columnOffsets[position.lineIndex] ?? 0),
    };
  }

  /** Records a run of a cell: the versions it saw, and whether its value is held. */
  #finish(id: string, versions: Map<string, number>, held: boolean, restore = false): void {
    const node = this.#graph.byId.get(id);
    const old = this.#records.get(id);
    if (restore && old) {
      this.#records.set(id, { ...old, held: true });
      return;
    }
    const seen = new Map<string, number>();
    for (const dependency of node?.dependencies ?? []) {
      seen.set(dependency, this.#records.get(dependency)?.result ?? -1);
    }
    this.#records.set(id, {
      version: versions.get(id) ?? 0,
      result: ++this.#resultCounter,
      seen,
      succeeded: held,
      held,
    });
  }

  #fail(id: string, error: CellError, streams: CellState["streams"] = []): void {
    this.#states.set(id, { status: "failed", error, streams });
    this.#emit({ type: "failed", cell: id, error });
  }

  #afterBatch(end: BatchEnd, versions: Map<string, number>): void {
    if (end.kind === "finished") return;
    // The sandbox is gone and its values with it.
    for (const record of this.#records.values()) record.held = false;
    if (this.#aborted !== undefined) {
      for (const [id, state] of this.#states) {
        if (state.status !== "queued" && state.status !== "running") continue;
        const place = this.#byId.get(id)?.place;
        this.#finish(id, versions, false);
        this.#fail(id, {
          kind: "timeout",
          message: this.#aborted,
          line: place ? place.startLine + 1 : undefined,
        }, state.streams);
      }
      return;
    }
    const cell = end.kind === "timeout" ? end.cell : end.cell;
    if (cell !== undefined) {
      const place = this.#byId.get(cell)?.place;
      this.#finish(cell, versions, false);
      this.#fail(
        cell,
        end.kind === "timeout"
          ? {
            kind: "timeout",
            message: `Stopped after ${
              formatSeconds(end.limitMs)
            }: the cell ran longer than the time limit`,
            line: place ? place.startLine + 1 : undefined,
          }
          : { kind: "crash", message: end.detail, line: place ? place.startLine + 1 : undefined },
        this.state(cell).streams,
      );
      this.#dirty = true;
      return;
    }
    // The sandbox died outside any cell (it could not start): fail what was queued.
    for (const [id, state] of this.#states) {
      if (state.status === "queued" || state.status === "running") {
        this.#finish(id, versions, false);
        this.#fail(id, {
          kind: "crash",
          message: end.kind === "crashed" ? end.detail : "sandbox stopped",
        });
      }
    }
  }

  #emit(event: SessionEvent): void {
    for (const listener of this.#listeners) listener(event);
  }
}

function formatSeconds(ms: number): string {
  return ms % 1000 === 0 ? `${ms / 1000} s` : `${ms} ms`;
}
