/**
 * `longtail demo`: the flagship notebook, verified, summarised and rendered, from one run.
 *
 * @module
 */
import { typeCheckNotebooks } from "../compile/type_check.ts";
import { DEFAULT_RTOL } from "../record/compare.ts";
import { verifyRun } from "../record/verify_notebook.ts";
import { writeFileAtomic } from "../record/write_files.ts";
import { renderReport } from "../report/render_report.ts";
import { reportRunOf } from "../report/report_run.ts";
import { runNotebook } from "../session/run_notebook.ts";
import { dirname, joinPath, ROOT_DIR } from "../_paths.ts";
import { LONGTAIL_VERSION } from "../version.ts";
import { readNotebookFile, relativeToCwd } from "./_common.ts";
import { checkTable, printVerdict } from "./_report.ts";
import { type CliIo, paint } from "./_terminal.ts";
import { typeCheckTarget } from "./verify_command.ts";

/** The notebook `demo` verifies. */
export const FLAGSHIP_NOTEBOOK: string = joinPath(ROOT_DIR, "notebooks", "power_amplifier.md");

/** Where `demo` writes the flagship's report (out/ is git-ignored). */
export const DEMO_REPORT: string = joinPath(ROOT_DIR, "out", "power_amplifier.html");

/** The flagship's cell that defines this name shows the figures `demo` prints first. */
export const KEY_FIGURES = "keyFigures";

/** Help text of `demo`. */
export const DEMO_HELP = `Usage: longtail demo

Runs the flagship notebook, notebooks/power_amplifier.md (a three-stage power
amplifier), once: verifies it as \`longtail verify\` would (type check, recorded numbers,
design checks), prints its key figures (the cell that defines \`keyFigures\`) and its
design-check table, and writes its design report to out/power_amplifier.html.

Exit status: 0 all passed, 1 a check, a cell, a type check or a recorded number failed.
`;

/**
 * Runs the `demo` subcommand.
 *
 * @param args Arguments after `demo` (only `--help`).
 * @param io Where to print.
 * @returns The exit status.
 *
 * @example Help
 * ```ts
 * import { demoCommand } from "./demo_command.ts";
 * import { bufferIo } from "./_terminal.ts";
 * import { equal, match } from "node:assert/strict";
 * const { io, output } = bufferIo();
 * equal(await demoCommand(["--help"], io), 0);
 * match(output(), /^Usage: longtail demo/);
 * ```
 */
export async function demoCommand(args: string[], io: CliIo): Promise<number> {
  if (args.includes("--help") || args.includes("-h")) {
    io.out(DEMO_HELP);
    return 0;
  }
  const { text } = await readNotebookFile(FLAGSHIP_NOTEBOOK);
  const name = relativeToCwd(FLAGSHIP_NOTEBOOK);
  if (io.progress) io.err(`running ${name} …`);
  const typeCheck = typeCheckNotebooks([typeCheckTarget(FLAGSHIP_NOTEBOOK, text)]);
  const ranAt = new Date();
  const run = await runNotebook(FLAGSHIP_NOTEBOOK, text, {});
  const verdict = verifyRun(run, { rtol: DEFAULT_RTOL });
  const checked = await typeCheck;
  if (io.progress) io.err("\r\x1b[2K");

  const keyCell = run.summaries.findIndex((cell) => cell.defines.includes(KEY_FIGURES));
  const keyText = run.states[keyCell]?.outcome?.outputs[0]?.["text/plain"];
  if (keyText !== undefined) {
    io.out(`${paint(io, "bold", "Key figures")}\n${keyText.replace(/^/gm, "  ")}\n\n`);
  }
  const checks = run.states.flatMap((state, i) =>
    (state.outcome?.checks ?? []).map((check) => ({ ...check, cell: run.cells[i].index + 1 }))
  );
  io.out(`${paint(io, "bold", "Design checks of the flagship power amplifier")}\n`);
  for (const line of checkTable(io, checks)) io.out(`  ${line}\n`);
  io.out("\n");
  printVerdict(io, verdict, checked.problems, name, LONGTAIL_VERSION);

  const html = renderReport({ text, path: name }, reportRunOf(run, { ranAt }));
  await Deno.mkdir(dirname(DEMO_REPORT), { recursive: true });
  await writeFileAtomic(DEMO_REPORT, html);
  io.out(`${paint(io, "gray", "Design report:")} ${relativeToCwd(DEMO_REPORT)}\n`);
  const ok = verdict.passed && checked.problems.length === 0 && checked.unplaced.length === 0;
  return ok ? 0 : 1;
}
