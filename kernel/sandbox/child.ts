/**
 * The sandbox process: runs compiled cells and keeps their values. Started by the host
 * (kernel/sandbox/sandbox.ts) as `deno run` with narrow permissions; talks over stdin and
 * stdout, one JSON message per line (kernel/sandbox/protocol.ts).
 *
 * A value that fails is stored as a failure, so a dependent sees the failure (and reports
 * itself blocked) instead of a stale number.
 *
 * The cells of a run are loaded a couple of hundred at a time as one module, one exported
 * function per cell, their imports hoisted once:
 *
 *     import { formatSi } from "longtail/lib";          ← every binding once
 *     export const __longtail_cell_0 = async function (…) {   ← line 1 of cell c4's module
 *     …c4's lines…
 *     export const __longtail_cell_1 = async function (…) {   ← line 1 of cell c7's module
 *
 * A stack frame in such a module is turned back into the cell's own module line through a
 * table of where each function starts. If the module cannot load (a missing file or
 * export), each of its cells runs as a module of its own and reports its own error.
 *
 * @module
 */
import { ADJUSTABLE_REGISTRY, type AdjustableRegistry } from "../adjustable/adjustable.ts";
import { describeValue } from "./describe_value.ts";
import {
  type ChildMessage,
  type ChildStep,
  decodeLine,
  encodeLine,
  type ErrorRecord,
  type HostMessage,
  type StreamChunk,
} from "./protocol.ts";

type Stored = { ok: true; names: Record<string, unknown> } | { ok: false };
type CellFunction = (
  inputs: Record<string, unknown>,
  meta: Record<string, unknown>,
) => Promise<{ value: unknown; names: Record<string, unknown> }>;

const stored = new Map<string, Stored>();
const counted = new WeakSet<object>();
const encoder = new TextEncoder();
// Keep our own handle on stdout before any cell can reach for it.
const stdout = Deno.stdout;
const registry: AdjustableRegistry = { values: {}, declared: [] };
(globalThis as Record<symbol, unknown>)[ADJUSTABLE_REGISTRY] = registry;

let current: { batch: number; cell: string } | undefined;
const cancelled = new Set<number>();
const queue: HostMessage[] = [];
let wake: (() => void) | undefined;

/** Set by the host's first message; every reply starts with it, so text a cell writes
 * to stdout itself can never pass for a reply. */
let token = "";

function send(message: ChildMessage): void {
  // The leading line break ends any partial line a cell wrote to stdout itself.
  const bytes = encoder.encode("\n" + token + encodeLine(message));
  let written = 0;
  while (written < bytes.length) written += stdout.writeSync(bytes.subarray(written));
}

/** Most characters one cell may print; the rest is dropped with a note. */
const MAX_PRINTED = 1_000_000;
let printed = 0;

function stream(name: StreamChunk["name"], args: unknown[]): void {
  if (printed > MAX_PRINTED) return;
  let text =
    args.map((arg) =>
      typeof arg === "string" ? arg : Deno.inspect(arg, { colors: false, depth: 4 })
    ).join(" ") + "\n";
  printed += text.length;
  if (printed > MAX_PRINTED) {
    text = `… (printing stopped: a cell may print at most ${MAX_PRINTED} characters)\n`;
  }
  if (current) {
    send({ type: "stream", batch: current.batch, cell: current.cell, chunk: { name, text } });
  }
}

// Cells' console output becomes stream messages on the cell that printed it.
for (const method of ["log", "info", "debug", "trace"] as const) {
  console[method] = (...args: unknown[]) => stream("out", args);
}
for (const method of ["warn", "error"] as const) {
  console[method] = (...args: unknown[]) => stream("err", args);
}
// The host's messages are ours alone: take stdin before any cell runs, then hide it.
const input = Deno.stdin.readable;
try {
  Object.defineProperty(Deno, "stdin", {
    get() {
      throw new Error("stdin is not available in a notebook cell");
    },
  });
} catch {
  // A frozen namespace: stdin stays locked by our reader, which is enough for streams.
}

// A cell must not end the sandbox: Deno.exit throws instead (the cell fails, others go on).
const exit = Deno.exit.bind(Deno);
try {
  Object.defineProperty(Deno, "exit", {
    value: (code?: number) => {
      throw new Error(`Deno.exit(${code ?? ""}) is not available in a notebook cell`);
    },
  });
} catch {
  // The namespace is frozen in this Deno: a cell calling Deno.exit is reported as a crash.
}

// A promise a cell forgot to await must not bring the sandbox down.
globalThis.addEventListener("unhandledrejection", (event) => {
  event.preventDefault();
  stream("err", ["Unhandled rejection:", event.reason]);
});
globalThis.addEventListener("error", (event) => {
  event.preventDefault();
  stream("err", ["Uncaught error:", event.error]);
});

/** Module source ends with this mark so stack frames can name the cell (V8 shortens data URLs). */
function cellMark(cell: string): string {
  return `\n//~${cell}~\n`;
}

/** Replaces cell module URLs (long `data:` URLs) with `cell:ID:LINE:COLUMN`. */
function nameCellFrames(text: string): string {
  return text.replace(
    /data:application\/typescript,.*?~([\w-]+)~(?:%0A)?:(\d+):(\d+)/g,
    "cell:$1:$2:$3",
  );
}

/**
 * Most cells put into one shared module. Deno gets slower with every module it has loaded
 * (a module per cell: 4,000 cells take seconds each run), so the cells of a run go into a
 * few modules, each still small enough to compile at once.
 */
const CELLS_PER_MODULE = 200;
/** Functions of the running batch's cells, loaded in shared modules. */
let prepared = new Map<ChildStep, CellFunction>();
/** Steps whose shared module failed to load: each runs as its own module, as it would alone. */
let unbatched = new Set<ChildStep>();
/** Per shared module, the module line where each cell's function starts (its own line 1). */
const sharedLines = new Map<string, Array<{ start: number; cell: string }>>();
let sharedCount = 0;
/** Shared module names by their cells and source. */
const sharedNames = new Map<string, string>();

/**
 * Loads the steps from `from` on (up to {@linkcode CELLS_PER_MODULE}) as one module: the
 * imports of all of them, each binding once, then one exported function per cell. A cell
 * that binds a name another cell binds to a different import ends the module early.
 */
async function loadShared(steps: readonly ChildStep[], from: number): Promise<void> {
  const chosen: ChildStep[] = [];
  const bound = new Map<string, string>();
  const statements = new Set<string>();
  for (let i = from; i < steps.length && chosen.length < CELLS_PER_MODULE; i++) {
    const step = steps[i];
    if (step.kind !== "run" || !step.batchable || unbatched.has(step) || prepared.has(step)) {
      continue;
    }
    const imports = step.batchable.imports;
    if (
      imports.some(({ statement, local }) =>
        local !== undefined && (bound.get(local) ?? statement) !== statement
      )
    ) {
      break;
    }
    for (const { statement, local } of imports) {
      statements.add(statement);
      if (local !== undefined) bound.set(local, statement);
    }
    chosen.push(step);
  }
  if (chosen.length === 0) return;
  let source = [...statements].map((statement) => statement + "\n").join("");
  const head = source;
  for (const [k, step] of chosen.entries()) {
    source += `export const ${SHARED_EXPORT}${k} = ${step.batchable!.body}`;
  }
  // The same cells again (a re-run) reuse their module, as a module per cell would.
  const key = chosen.map((step) => step.cell).join(" ") + "\n" + source;
  let name = sharedNames.get(key);
  if (name === undefined) {
    name = `shared-${++sharedCount}`;
    sharedNames.set(key, name);
    sharedLines.set(name, lineTable(chosen, head));
  }
  try {
    const module = await import(
      "data:application/typescript," + encodeURIComponent(source + cellMark(name))
    );
    chosen.forEach((step, k) => prepared.set(step, module[`${SHARED_EXPORT}${k}`]));
  } catch {
    // One cell's import or code spoils the module: every cell of it runs alone instead,
    // so each reports its own error, just as it would have on its own.
    for (const step of chosen) unbatched.add(step);
  }
}

/** Where each cell's function starts in a shared module whose imports are `head`. */
function lineTable(chosen: ChildStep[], head: string): Array<{ start: number; cell: string }> {
  const table: Array<{ start: number; cell: string }> = [];
  // An import's `with { … }` clause may span lines, so count them rather than statements.
  let line = lineBreaks(head) + 1;
  for (const step of chosen) {
    table.push({ start: line, cell: step.cell });
    line += lineBreaks(step.batchable!.body);
  }
  return table;
}

function lineBreaks(text: string): number {
  let count = 0;
  for (let at = text.indexOf("\n"); at >= 0; at = text.indexOf("\n", at + 1)) count++;
  return count;
}

/** Export names of the cells' functions in a shared module. */
const SHARED_EXPORT = "__longtail_cell_";

/** Turns `cell:shared-N:LINE:COLUMN` into the cell's own `cell:ID:LINE:COLUMN`. */
function nameSharedFrames(text: string): string {
  return text.replace(/cell:(shared-\d+):(\d+):(\d+)/g, (all, shared, line, column) => {
    const table = sharedLines.get(shared) ?? [];
    const at = Number(line);
    let found: { start: number; cell: string } | undefined;
    for (const entry of table) {
      if (entry.start > at) break;
      found = entry;
    }
    return found ? `cell:${found.cell}:${at - found.start + 1}:${column}` : all;
  });
}

function errorRecord(error: unknown): ErrorRecord {
  const name = error instanceof Error ? error.name : "Error";
  const frames = (text: string) => nameSharedFrames(nameCellFrames(text));
  const message = frames(error instanceof Error ? error.message : String(error));
  let stack = frames(error instanceof Error ? error.stack ?? "" : "");
  // Drop frames of the sandbox itself; they say nothing about the notebook.
  stack = stack.split("\n").filter((line) => !line.includes("/kernel/sandbox/")).join("\n");
  const frame = /cell:([\w-]+):(\d+):(\d+)/.exec(stack);
  const record: ErrorRecord = { name, message, stack };
  if (frame) record.at = { cell: frame[1], line: Number(frame[2]), column: Number(frame[3]) };
  if (error instanceof Deno.errors.NotCapable || error instanceof Deno.errors.PermissionDenied) {
    record.denied = true;
  }
  return record;
}

async function runStep(
  batch: number,
  steps: readonly ChildStep[],
  index: number,
  notebookUrl: string,
): Promise<void> {
  const step = steps[index];
  if (step.kind === "fail") {
    stored.set(step.cell, { ok: false });
    return;
  }
  const inputs: Record<string, unknown> = {};
  const blockers = new Set<string>();
  for (const input of step.inputs ?? []) {
    const provider = stored.get(input.from);
    if (provider?.ok) inputs[input.name] = provider.names[input.name];
    else blockers.add(input.from);
  }
  if (blockers.size > 0) {
    stored.set(step.cell, { ok: false });
    send({ type: "blocked", batch, cell: step.cell, by: [...blockers] });
    return;
  }
  current = { batch, cell: step.cell };
  printed = 0;
  send({ type: "started", batch, cell: step.cell });
  registry.declared = [];
  try {
    if (step.batchable && !prepared.has(step) && !unbatched.has(step)) {
      await loadShared(steps, index);
    }
    let cellFunction = prepared.get(step);
    if (!cellFunction) {
      const module = await import(
        "data:application/typescript," +
          encodeURIComponent((step.source ?? "") + cellMark(step.cell))
      );
      cellFunction = module.default as CellFunction;
    }
    const notebookPath = decodeURIComponent(new URL(notebookUrl).pathname);
    const meta = {
      url: notebookUrl,
      main: false,
      filename: notebookPath,
      dirname: notebookPath.replace(/\/[^/]*$/, ""),
      resolve: (specifier: string) => new URL(specifier, notebookUrl).href,
    };
    const started = performance.now();
    const { value, names } = await cellFunction(inputs, meta);
    const durationMs = performance.now() - started;
    stored.set(step.cell, { ok: true, names });
    const described = await describeValue(value, names, { label: step.label, counted });
    const adjustables = registry.declared.map((declaration) => ({ ...declaration }));
    send({
      type: "done",
      batch,
      cell: step.cell,
      outcome: { ...described, adjustables, durationMs },
    });
  } catch (error) {
    stored.set(step.cell, { ok: false });
    send({ type: "failed", batch, cell: step.cell, error: errorRecord(error) });
  } finally {
    current = undefined;
  }
}

async function runBatch(message: Extract<HostMessage, { type: "run" }>): Promise<void> {
  registry.values = message.values;
  prepared = new Map();
  unbatched = new Set();
  let stopped = false;
  for (let index = 0; index < message.steps.length; index++) {
    if (cancelled.has(message.batch)) {
      stopped = true;
      break;
    }
    await runStep(message.batch, message.steps, index, message.notebookUrl);
  }
  cancelled.delete(message.batch);
  send({ type: "batchEnd", batch: message.batch, cancelled: stopped });
}

async function readMessages(): Promise<void> {
  try {
    await readMessagesUntilEnd();
  } finally {
    // The host closed our stdin, or a reply could not be written (the host is gone).
    exit(0);
  }
}

async function readMessagesUntilEnd(): Promise<void> {
  const decoder = new TextDecoder();
  let buffer = "";
  for await (const chunk of input) {
    buffer += decoder.decode(chunk, { stream: true });
    let newline = buffer.indexOf("\n");
    while (newline >= 0) {
      const line = buffer.slice(0, newline);
      buffer = buffer.slice(newline + 1);
      newline = buffer.indexOf("\n");
      if (line.trim() === "") continue;
      const message = decodeLine(line) as HostMessage;
      if (message.type === "hello") {
        token = message.token;
        send({ type: "ready" });
        continue;
      }
      // A cancel must take effect while a batch is running, so it skips the queue.
      if (message.type === "cancel") cancelled.add(message.batch);
      else queue.push(message);
      wake?.();
    }
  }
}

/**
 * If the host dies, even by SIGKILL, while a cell loops, nothing in this thread could
 * notice, and the process would spin on as an orphan. A watchdog thread ends it once its
 * parent is gone. (A process may kill itself without permission, and the watchdog's code
 * is a data URL, so it needs no read permission either.)
 */
function startWatchdog(): void {
  // The host names itself: reading our parent now could be too late, if the host died
  // while this process was still starting.
  const host = Number(Deno.args[0]) || Deno.ppid;
  const code = `const host = ${host};\n` +
    'setInterval(() => { if (Deno.ppid !== host) Deno.kill(Deno.pid, "SIGKILL"); }, 500);\n' +
    'if (Deno.ppid !== host) Deno.kill(Deno.pid, "SIGKILL");';
  new Worker(`data:application/javascript,${encodeURIComponent(code)}`, { type: "module" });
}

async function main(): Promise<void> {
  startWatchdog();
  readMessages();
  for (;;) {
    const message = queue.shift();
    if (!message) {
      await new Promise<void>((resolve) => (wake = resolve));
      wake = undefined;
      continue;
    }
    if (message.type === "run") await runBatch(message);
  }
}

if (import.meta.main) await main();
