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

function send(message: ChildMessage): void {
  const bytes = encoder.encode(encodeLine(message));
  let written = 0;
  while (written < bytes.length) written += stdout.writeSync(bytes.subarray(written));
}

function stream(name: StreamChunk["name"], args: unknown[]): void {
  const text = args.map((arg) =>
    typeof arg === "string" ? arg : Deno.inspect(arg, { colors: false, depth: 4 })
  ).join(" ") + "\n";
  if (current) send({ type: "stream", batch: current.batch, cell: current.cell, chunk: { name, text } });
}

// Cells' console output becomes stream messages on the cell that printed it.
for (const method of ["log", "info", "debug", "trace"] as const) {
  console[method] = (...args: unknown[]) => stream("out", args);
}
for (const method of ["warn", "error"] as const) {
  console[method] = (...args: unknown[]) => stream("err", args);
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

function errorRecord(error: unknown): ErrorRecord {
  const name = error instanceof Error ? error.name : "Error";
  const message = error instanceof Error ? error.message : String(error);
  let stack = error instanceof Error ? error.stack ?? "" : "";
  stack = stack.replace(/data:application\/typescript,.*?~([\w-]+)~(?:%0A)?:(\d+):(\d+)/g, "cell:$1:$2:$3");
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
  send({ type: "started", batch, cell: step.cell });
  registry.declared = [];
  try {
    const module = await import(moduleUrl);
    const meta = {
      url: notebookUrl,
      main: false,
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
  const decoder = new TextDecoder();
  let buffer = "";
  for await (const chunk of Deno.stdin.readable) {
    buffer += decoder.decode(chunk, { stream: true });
    let newline = buffer.indexOf("\n");
    while (newline >= 0) {
      const line = buffer.slice(0, newline);
      buffer = buffer.slice(newline + 1);
      newline = buffer.indexOf("\n");
      if (line.trim() === "") continue;
      const message = decodeLine(line) as HostMessage;
      // A cancel must take effect while a batch is running, so it skips the queue.
      if (message.type === "cancel") cancelled.add(message.batch);
      else queue.push(message);
      wake?.();
    }
  }
  Deno.exit(0);
}

async function main(): Promise<void> {
  readMessages();
  send({ type: "ready" });
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
