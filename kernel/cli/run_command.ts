/**
 * `longtail run NOTEBOOK`: run every cell and print headings, values, printed text,
 * errors and the design-check table. Writes nothing.
 *
 * @module
 */
import { parseArgs } from "node:util";
import { runNotebook } from "../session/run_notebook.ts";
import { relativeToCwd } from "./_common.ts";
import { grantsLine, NOTEBOOK_ARGS, openNotebook, SANDBOX_HELP } from "./_sandbox_options.ts";
import { printRun } from "./_report.ts";
import type { CliIo } from "./_terminal.ts";

/** Help text of `run`. */
export const RUN_HELP = `Usage: longtail run NOTEBOOK [options]

Runs every cell of a notebook in the sandbox and prints its headings, each cell's
shown value and printed text, errors with their notebook lines, and the design checks.
Nothing is written.

Options:
  --set NAME=VALUE    use another value for an adjustable value (repeatable);
                      VALUE may be 0.002, 2e-3, 2m, 4k7, 2mA
${SANDBOX_HELP}
  -h, --help          show this help

Exit status: 0 every cell ran and every check passed, 1 otherwise, 2 bad usage or
unreadable notebook.
`;

/**
 * Runs the `run` subcommand.
 *
 * @param args Arguments after `run`.
 * @param io Where to print.
 * @returns The exit status.
 *
 * @example Help
 * ```ts
 * import { runCommand } from "./run_command.ts";
 * import { bufferIo } from "./_terminal.ts";
 * import { equal, match } from "node:assert/strict";
 * const { io, output } = bufferIo();
 * equal(await runCommand(["--help"], io), 0);
 * match(output(), /^Usage: longtail run/);
 * ```
 */
export async function runCommand(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseArgs({
    args,
    allowPositionals: true,
    options: NOTEBOOK_ARGS,
  });
  if (values.help) {
    io.out(RUN_HELP);
    return 0;
  }
  const { path, text, values: settings, sandbox } = await openNotebook(
    positionals,
    values,
    "longtail run design.md",
  );
  const run = await runNotebook(path, text, { values: settings, ...sandbox });
  io.out(grantsLine(sandbox));
  printRun(io, run, relativeToCwd(path));
  const ok = run.states.every((state) => state.status === "done") &&
    run.states.every((state) => (state.outcome?.checks ?? []).every((check) => check.pass));
  return ok ? 0 : 1;
}
