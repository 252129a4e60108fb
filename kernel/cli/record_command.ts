/**
 * `longtail record NOTEBOOK`: run the notebook and write each cell's results into it
 * (and its charts beside it). Refuses when a cell failed, unless `--force`.
 *
 * @module
 */
import { parseArgs } from "node:util";
import { NotebookChangedError, recordNotebook } from "../record/record_notebook.ts";
import { runNotebook } from "../session/run_notebook.ts";
import { LONGTAIL_VERSION } from "../version.ts";
import { relativeToCwd } from "./_common.ts";
import { grantsLine, NOTEBOOK_ARGS, openNotebook, SANDBOX_HELP } from "./_sandbox_options.ts";
import { printRun } from "./_report.ts";
import { type CliIo, paint } from "./_terminal.ts";

/** Help text of `record`. */
export const RECORD_HELP = `Usage: longtail record NOTEBOOK [options]

Runs every cell, then writes the results into the notebook: a \`recorded\` block after
each cell (its shown value, named numbers, design checks) and chart files in the
folder NAME_charts/ beside it, plus a last line naming this longtail version.
Nothing else in the file changes. The file is replaced atomically.

Options:
  --force             record even though a cell failed or was blocked
  --set NAME=VALUE    use another value for an adjustable value (repeatable)
${SANDBOX_HELP}
  --quiet             print only the summary
  -h, --help          show this help

Exit status: 0 recorded, 1 not recorded because a cell failed (or the file changed
meanwhile), 2 bad usage or unreadable notebook.
`;

/**
 * Runs the `record` subcommand.
 *
 * @param args Arguments after `record`.
 * @param io Where to print.
 * @returns The exit status.
 *
 * @example Help
 * ```ts
 * import { recordCommand } from "./record_command.ts";
 * import { bufferIo } from "./_terminal.ts";
 * import { equal, match } from "node:assert/strict";
 * const { io, output } = bufferIo();
 * equal(await recordCommand(["--help"], io), 0);
 * match(output(), /^Usage: longtail record/);
 * ```
 */
export async function recordCommand(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseArgs({
    args,
    allowPositionals: true,
    options: {
      force: { type: "boolean" },
      quiet: { type: "boolean", short: "q" },
      ...NOTEBOOK_ARGS,
    },
  });
  if (values.help) {
    io.out(RECORD_HELP);
    return 0;
  }
  const { path, bytes, text, values: settings, sandbox } = await openNotebook(
    positionals,
    values,
    "longtail record design.md",
  );
  const run = await runNotebook(path, text, {
    values: settings,
    ...sandbox,
  });
  const name = relativeToCwd(path);
  io.out(grantsLine(sandbox));
  if (!values.quiet) printRun(io, run, name);
  const unfinished = run.states.filter((state) => state.status !== "done").length;
  if (unfinished > 0 && !values.force) {
    io.err(
      paint(io, "red", `Not recorded: ${unfinished} cell(s) of ${name} did not finish. `) +
        "Fix them, or record anyway with --force.\n",
    );
    return 1;
  }
  try {
    const outcome = await recordNotebook(run, bytes);
    io.out(
      `Recorded ${outcome.recordedCells} cell result(s)` +
        (outcome.charts.length > 0 ? ` and ${outcome.charts.length} chart(s)` : "") +
        ` in ${name} (longtail ${LONGTAIL_VERSION})\n`,
    );
    return 0;
  } catch (error) {
    if (error instanceof NotebookChangedError) {
      io.err(paint(io, "red", error.message) + "\n");
      return 1;
    }
    throw error;
  }
}
