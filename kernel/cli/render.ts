/**
 * `longtail render NOTEBOOK -o FILE.html`: run a notebook and write its design report, one
 * self-contained HTML file (see kernel/report/).
 *
 * @module
 */
import { parseArgs } from "node:util";
import { renderReport } from "../report/render_report.ts";
import { runNotebookForReport } from "../report/report_run.ts";
import { writeFileAtomic } from "../record/write_files.ts";
import { absolutePath, basename, dirname } from "../_paths.ts";
import { relativeToCwd, UsageError } from "./_common.ts";
import { grantsLine, NOTEBOOK_ARGS, openNotebook, SANDBOX_HELP } from "./_sandbox_options.ts";
import type { CliIo } from "./_terminal.ts";

/** Help text of `render`. */
export const RENDER_HELP = `Usage: longtail render NOTEBOOK [-o FILE.html] [options]

Runs every cell of a notebook in the sandbox and writes a design report: one HTML file
with the prose, formulas, each cell's code and outputs, charts, errors in place and a
summary of the design checks. The file needs nothing else: it opens from disk, makes no
network requests, and prints cleanly to PDF from a browser. Prints the report's path.

Options:
  -o, --output FILE   where to write the report (default: NOTEBOOK's name with .html,
                      in the current folder)
  --set NAME=VALUE    use another value for an adjustable value (repeatable)
${SANDBOX_HELP}
  -h, --help          show this help

Exit status: 0 report written, every cell ran and every check passed; 1 report written
but a cell failed or a check failed; 2 bad usage or unreadable notebook.
`;

/**
 * Runs the `render` subcommand.
 *
 * @param args Arguments after `render`.
 * @param io Where to print.
 * @returns The exit status.
 * @throws {UsageError} If the arguments are wrong.
 */
export async function renderCommand(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseArgs({
    args,
    allowPositionals: true,
    options: {
      output: { type: "string", short: "o" },
      ...NOTEBOOK_ARGS,
    },
  });
  if (values.help) {
    io.out(RENDER_HELP);
    return 0;
  }
  const { path, text, values: settings, sandbox } = await openNotebook(
    positionals,
    values,
    "longtail render design.md -o design.html",
  );
  const output = absolutePath(
    values.output ?? basename(path).replace(/\.(md|markdown)$/i, "") + ".html",
  );
  if (output === path) {
    throw new UsageError("The report would overwrite the notebook; choose another -o FILE");
  }
  io.out(grantsLine(sandbox));
  const { source, run } = await runNotebookForReport(path, text, { values: settings, ...sandbox });
  const html = renderReport({ ...source, path: relativeToCwd(path) }, run);
  await Deno.mkdir(dirname(output), { recursive: true });
  await writeFileAtomic(output, html);
  io.out(`${relativeToCwd(output)}\n`);
  const failedCells = run.cells.filter((cell) => cell.status !== "done").length;
  const failedChecks =
    run.cells.flatMap((cell) => cell.outcome?.checks ?? []).filter((check) => !check.pass).length;
  if (failedCells > 0 || failedChecks > 0) {
    io.err(
      `The report shows ${failedCells} cell(s) that did not finish and ${failedChecks} failed check(s).\n`,
    );
    return 1;
  }
  return 0;
}
