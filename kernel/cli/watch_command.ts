/**
 * `longtail watch NOTEBOOK`: run a notebook, then keep it running. Each time the file is
 * saved, the cells whose code changed run again with everything that depends on them (each
 * once, in dependency order), and only those are printed, with the check summary.
 *
 * @module
 */
import { parseArgs } from "node:util";
import { Session } from "../session/session.ts";
import type { CellSummary, SessionEvent } from "../session/events.ts";
import { readNotebookFile, relativeToCwd } from "./_common.ts";
import { printCell } from "./_report.ts";
import {
  grantsLine,
  NOTEBOOK_ARGS,
  openNotebook,
  SANDBOX_HELP,
  type SandboxSettings,
} from "./_sandbox_options.ts";
import { type CliIo, paint } from "./_terminal.ts";

/** Help text of `watch`. */
export const WATCH_HELP = `Usage: longtail watch NOTEBOOK [options]

Runs a notebook and keeps its values in the sandbox. Each time you save the file,
the cells you changed run again, with every cell that depends on them, each once and
in dependency order; only those are printed, then the design-check summary. Stop it
with Ctrl-C.

Options:
  --set NAME=VALUE    use another value for an adjustable value (repeatable)
${SANDBOX_HELP}
  -h, --help          show this help
`;

/** Options for {@linkcode watchNotebook}. */
export interface WatchOptions {
  /** Stops watching when aborted. */
  signal: AbortSignal;
  /**
   * Adjustable values set from outside, by name.
   * @default {{}}
   */
  values?: Record<string, number>;
  /** Sandbox limits and grants (as `run` takes them). */
  sandbox?: SandboxSettings;
  /**
   * Milliseconds to wait after a change before rerunning, so one save is one rerun.
   * @default {150}
   */
  settleMs?: number;
  /** Called after each round (the first run, then each rerun) with the cells that ran. */
  onRound?: (ran: string[]) => void;
}

/**
 * Runs a notebook, then reruns what changed each time the file changes, until aborted.
 *
 * @param path The notebook's path.
 * @param io Where to print.
 * @param options The stop signal, values, sandbox settings.
 * @returns When the signal aborts and the sandbox is closed.
 */
export async function watchNotebook(path: string, io: CliIo, options: WatchOptions): Promise<void> {
  const name = relativeToCwd(path);
  const session = new Session({ path, values: options.values, ...options.sandbox });
  let cells: CellSummary[] = [];
  let ran: string[] = [];
  session.subscribe((event: SessionEvent) => {
    if (event.type === "analysed") cells = event.cells;
    if (event.type === "done" || event.type === "failed" || event.type === "blocked") {
      ran.push(event.cell);
    }
  });
  const round = async (text: string) => {
    ran = [];
    await session.send({ type: "open", text });
    report(io, session, cells, ran);
    options.onRound?.([...ran]);
  };
  const watcher = Deno.watchFs(path);
  const stop = () => watcher.close();
  options.signal.addEventListener("abort", stop, { once: true });
  try {
    let text = (await readNotebookFile(path)).text;
    io.out(paint(io, "gray", `${name}\n`));
    await round(text);
    io.out(paint(io, "gray", "Watching for changes (Ctrl-C stops).\n"));
    let timer: ReturnType<typeof setTimeout> | undefined;
    let pending = Promise.resolve();
    for await (const event of watcher) {
      if (event.kind !== "modify" && event.kind !== "create") continue;
      clearTimeout(timer);
      timer = setTimeout(() => {
        pending = pending.then(async () => {
          let next: string;
          try {
            next = (await readNotebookFile(path)).text;
          } catch (error) {
            io.err(paint(io, "yellow", `${(error as Error).message}; waiting for the next save\n`));
            return;
          }
          if (next === text) return;
          text = next;
          io.out(paint(io, "gray", `\n${name} changed\n`));
          await round(text);
        });
      }, options.settleMs ?? 150);
    }
    clearTimeout(timer);
    await pending;
  } finally {
    options.signal.removeEventListener("abort", stop);
    await session.close();
  }
}

function report(io: CliIo, session: Session, cells: CellSummary[], ran: string[]): void {
  const numberOf = new Map(cells.map((cell) => [cell.id, cell.index + 1]));
  const ranSet = new Set(ran);
  for (const cell of cells) {
    if (ranSet.has(cell.id)) printCell(io, cell, session.state(cell.id), numberOf);
  }
  const states = cells.map((cell) => session.state(cell.id));
  const checks = states.flatMap((state) => state.outcome?.checks ?? []);
  const failedChecks = checks.filter((check) => !check.pass).length;
  const failedCells = states.filter((s) => s.status === "failed" || s.status === "blocked").length;
  const verdict = failedChecks + failedCells === 0
    ? paint(io, "green", "✓")
    : paint(io, "red", "✗");
  io.out(
    `\n${verdict} ran ${ran.length} of ${cells.length} cells · ${failedCells} failed or blocked · ` +
      `checks: ${checks.length - failedChecks} passed, ${failedChecks} failed\n`,
  );
}

/**
 * Runs the `watch` subcommand until Ctrl-C.
 *
 * @param args Arguments after `watch`.
 * @param io Where to print.
 * @returns The exit status: 0 after Ctrl-C, 2 for bad usage or an unreadable notebook.
 * @throws {UsageError} If the arguments are wrong.
 *
 * @example Help
 * ```ts
 * import { watchCommand } from "./watch_command.ts";
 * import { bufferIo } from "./_terminal.ts";
 * import { equal, match } from "node:assert/strict";
 * const { io, output } = bufferIo();
 * equal(await watchCommand(["--help"], io), 0);
 * match(output(), /^Usage: longtail watch/);
 * ```
 */
export async function watchCommand(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseArgs({
    args,
    allowPositionals: true,
    options: NOTEBOOK_ARGS,
  });
  if (values.help) {
    io.out(WATCH_HELP);
    return 0;
  }
  const { path, values: settings, sandbox } = await openNotebook(
    positionals,
    values,
    "longtail watch design.md",
  );
  io.out(grantsLine(sandbox));
  const controller = new AbortController();
  const interrupt = () => controller.abort();
  Deno.addSignalListener("SIGINT", interrupt);
  try {
    await watchNotebook(path, io, {
      signal: controller.signal,
      values: settings,
      sandbox,
    });
  } finally {
    Deno.removeSignalListener("SIGINT", interrupt);
  }
  return 0;
}
