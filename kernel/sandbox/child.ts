/**
 * The sandbox process: runs compiled cells and keeps their values. Started by the host
 * (kernel/sandbox/sandbox.ts) as `deno run` with narrow permissions; talks over stdin and
 * stdout, one JSON message per line (kernel/sandbox/protocol.ts).
 *
 * A value that fails is stored as a failure, so a dependent sees the failure (and reports
 * itself blocked) instead of a stale number.
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

function errorRecord(error: unknown): ErrorRecord {
  const name = error instanceof Error ? error.name : "Error";
  const message = nameCellFrames(error instanceof Error ? error.message : String(error));
  let stack = nameCellFrames(error instanceof Error ? error.stack ?? "" : "");
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

async function runStep(batch: number, step: ChildStep, notebookUrl: string): Promise<void> {
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
  const moduleUrl = "data:application/typescript," +
    encodeURIComponent((step.source ?? "") + cellMark(step.cell));
  current = { batch, cell: step.cell };
  printed = 0;
  send({ type: "started", batch, cell: step.cell });
  registry.declared = [];
  try {
    const module = await import(moduleUrl);
    const notebookPath = decodeURIComponent(new URL(notebookUrl).pathname);
    const meta = {
      url: notebookUrl,
      main: false,
      filename: notebookPath,
      dirname: notebookPath.replace(/\/[^/]*$/, ""),
      resolve: (specifier: string) => new URL(specifier, notebookUrl).href,
    };
    const started = performance.now();
    const { value, names } = await (module.default as CellFunction)(inputs, meta);
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
  let stopped = false;
  for (const step of message.steps) {
    if (cancelled.has(message.batch)) {
      stopped = true;
      break;
    }
    await runStep(message.batch, step, message.notebookUrl);
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
