/**
 * `longtail verify PATHS...`: rerun notebooks headlessly, type-check them in one batch,
 * compare every recorded result with the new one, enforce every design check, and say
 * per notebook what passed and what drifted. For people before a release and for CI.
 *
 * @module
 */
import { parseArgs } from "node:util";
import { analyseCell } from "../analysis/analyse_cell.ts";
import { buildGraph } from "../analysis/graph.ts";
import {
  typeCheckNotebooks,
  type TypeCheckResult,
  type TypeCheckTarget,
} from "../compile/type_check.ts";
import { splitNotebook } from "../notebook/split.ts";
import { DEFAULT_RTOL } from "../record/compare.ts";
import { type NotebookVerdict, verifyRun } from "../record/verify_notebook.ts";
import { runNotebook } from "../session/run_notebook.ts";
import { basename } from "../_paths.ts";
import { LONGTAIL_VERSION } from "../version.ts";
import { readNotebookFile, relativeToCwd, UnreadableError, UsageError } from "./_common.ts";
import { grantsLine, SANDBOX_ARGS, SANDBOX_HELP, sandboxSettings } from "./_sandbox_options.ts";
import { printVerdict } from "./_report.ts";
import { findNotebooks, pickShard } from "./find_notebooks.ts";
import { type JunitCase, junitXml } from "./junit.ts";
import { type CliIo, paint } from "./_terminal.ts";

/** Help text of `verify`. */
export const VERIFY_HELP = `Usage: longtail verify PATHS... [options]

Reruns each notebook (PATHS are files, folders or glob patterns such as
'notebooks/**/*.md'), type-checks all of them in one batch, compares every recorded
result with the new one, and enforces every design check. Prints per notebook what
passed and what drifted (cell, name, recorded value, value now), then
"N passed, M failed".

Options:
  --rtol NUMBER       relative tolerance for recorded numbers (default ${DEFAULT_RTOL})
  --junit FILE        also write a JUnit XML report to FILE
  --shard I/N         verify only the I-th of N equal shares (for CI matrices)
${SANDBOX_HELP}
  --no-type-check     skip the type check
  --timings           print where the time went
  -h, --help          show this help

Exit status: 0 all passed, 1 a cell, a check, a type check or a recorded number
failed, 2 bad usage or unreadable input.
`;

interface Entry {
  path: string;
  verdict?: NotebookVerdict;
  unreadable?: string;
  seconds: number;
}

/**
 * Runs the `verify` subcommand.
 *
 * @param args Arguments after `verify`.
 * @param io Where to print.
 * @returns The exit status.
 *
 * @example Help
 * ```ts
 * import { verifyCommand } from "./verify_command.ts";
 * import { bufferIo } from "./_terminal.ts";
 * import { equal, match } from "node:assert/strict";
 * const { io, output } = bufferIo();
 * equal(await verifyCommand(["--help"], io), 0);
 * match(output(), /^Usage: longtail verify/);
 * ```
 */
export async function verifyCommand(args: string[], io: CliIo): Promise<number> {
  const startedAt = performance.now();
  const { values, positionals } = parseArgs({
    args,
    allowPositionals: true,
    options: {
      rtol: { type: "string" },
      junit: { type: "string" },
      shard: { type: "string" },
      ...SANDBOX_ARGS,
      "no-type-check": { type: "boolean" },
      timings: { type: "boolean" },
      help: { type: "boolean", short: "h" },
    },
  });
  if (values.help) {
    io.out(VERIFY_HELP);
    return 0;
  }
  if (positionals.length === 0) {
    throw new UsageError(
      "Expected notebook files, folders or patterns, e.g. longtail verify notebooks/",
    );
  }
  const rtol = values.rtol === undefined ? DEFAULT_RTOL : Number(values.rtol);
  if (!(rtol >= 0) || !Number.isFinite(rtol)) {
    throw new UsageError(
      `Expected --rtol to be a number of at least 0, but found ${JSON.stringify(values.rtol)}`,
    );
  }
  const shard = parseShard(values.shard);
  const sandbox = sandboxSettings(values);
  io.out(grantsLine(sandbox));

  const found = findNotebooks(positionals);
  let usageTrouble = found.problems.length > 0;
  for (const problem of found.problems) io.err(paint(io, "red", `${problem}\n`));
  const files = shard ? pickShard(found.files, shard) : found.files;
  if (files.length === 0 && !usageTrouble) {
    io.err(
      paint(
        io,
        "red",
        shard ? `Shard ${shard.index}/${shard.count} has no notebooks\n` : "No notebooks found\n",
      ),
    );
    return shard ? 0 : 2;
  }

  // Read and analyse everything first, so one type check covers all notebooks.
  const analysisStarted = performance.now();
  const entries: Entry[] = [];
  const texts = new Map<string, string>();
  const targets: TypeCheckTarget[] = [];
  for (const path of files) {
    try {
      const { text } = await readNotebookFile(path);
      texts.set(path, text);
      targets.push(typeCheckTarget(path, text));
      entries.push({ path, seconds: 0 });
    } catch (error) {
      if (!(error instanceof UnreadableError)) throw error;
      entries.push({ path, unreadable: error.message, seconds: 0 });
      usageTrouble = true;
    }
  }
  const analysisMs = performance.now() - analysisStarted;
  const typeCheck: Promise<TypeCheckResult> = values["no-type-check"]
    ? Promise.resolve({ problems: [], unplaced: [], ms: 0 })
    : typeCheckNotebooks(targets);

  let runMs = 0;
  let done = 0;
  for (const entry of entries) {
    done++;
    const text = texts.get(entry.path);
    if (text === undefined) continue;
    if (io.progress) {
      io.err(`\r\x1b[2K[${done}/${entries.length}] verifying ${relativeToCwd(entry.path)} …`);
    }
    const started = performance.now();
    const run = await runNotebook(entry.path, text, sandbox);
    entry.verdict = verifyRun(run, { rtol });
    entry.seconds = (performance.now() - started) / 1000;
    runMs += run.timing.runMs + run.timing.analysisMs;
  }
  if (io.progress) io.err(`\r\x1b[2K${values["no-type-check"] ? "" : "type checking …"}`);
  const checked = await typeCheck;
  if (io.progress) io.err("\r\x1b[2K");

  let passed = 0;
  let failed = 0;
  const junit: JunitCase[] = [];
  const known = new Set(entries.map((entry) => entry.path));
  for (const entry of entries) {
    const name = relativeToCwd(entry.path);
    if (entry.unreadable !== undefined) {
      io.out(`${paint(io, "red", "✗")} ${name} — ${entry.unreadable}\n`);
      failed++;
      junit.push({ name, seconds: 0, failure: entry.unreadable, error: true });
      continue;
    }
    const verdict = entry.verdict!;
    const typeProblems = checked.problems.filter((problem) => problem.path === entry.path);
    printVerdict(io, verdict, typeProblems, name, LONGTAIL_VERSION);
    const ok = verdict.passed && typeProblems.length === 0;
    if (ok) passed++;
    else failed++;
    junit.push({
      name,
      seconds: entry.seconds,
      failure: ok ? undefined : failureText(verdict, typeProblems.length),
    });
  }
  const outside = checked.problems.filter((problem) => !known.has(problem.path));
  for (const problem of outside) {
    io.out(
      paint(
        io,
        "red",
        `type error in ${problem.path}:${problem.line}:${problem.column}: ${problem.message}\n`,
      ),
    );
  }
  for (const text of checked.unplaced) io.out(paint(io, "red", `type check: ${text}\n`));
  if (values.junit) {
    await Deno.writeTextFile(values.junit, junitXml("longtail verify", junit));
  }
  if (values.timings) {
    const total = performance.now() - startedAt;
    io.out(paint(
      io,
      "gray",
      `timing: start-up ${startedAt.toFixed(0)} ms, analysis ${analysisMs.toFixed(0)} ms, ` +
        `runs ${runMs.toFixed(0)} ms, type check ${
          checked.ms.toFixed(0)
        } ms (alongside the runs), ` +
        `verify ${total.toFixed(0)} ms\n`,
    ));
  }
  io.out(`${passed} passed, ${failed} failed\n`);
  if (usageTrouble) return 2;
  return failed > 0 || outside.length > 0 || checked.unplaced.length > 0 ? 1 : 0;
}

function parseShard(text: string | undefined): { index: number; count: number } | undefined {
  if (text === undefined) return undefined;
  const match = /^(\d+)\/(\d+)$/.exec(text.trim());
  const index = Number(match?.[1]);
  const count = Number(match?.[2]);
  if (!match || count < 1 || index < 1 || index > count) {
    throw new UsageError(
      `Expected --shard I/N with 1 ≤ I ≤ N (e.g. 2/4), but found ${JSON.stringify(text)}`,
    );
  }
  return { index, count };
}

/**
 * What the batch type check needs of one notebook: its cells, their analysis and the graph.
 *
 * @param path The notebook's path (errors are reported against it).
 * @param text The notebook's text.
 * @returns The type-check target.
 */
export function typeCheckTarget(path: string, text: string): TypeCheckTarget {
  const notebook = splitNotebook(text, { fileName: basename(path) });
  const cells = notebook.cells.map((cell) => ({
    id: `c${cell.index + 1}`,
    index: cell.index,
    code: cell.code,
    analysis: analyseCell(cell.code),
    codeLine: cell.codeLine,
    columnOffsets: cell.columnOffsets,
    fenceLine: cell.startLine + 1,
  }));
  const graph = buildGraph(cells.map((cell) => ({ id: cell.id, analysis: cell.analysis })));
  return { path, cells, graph };
}

function failureText(verdict: NotebookVerdict, typeErrors: number): string {
  const parts: string[] = [];
  for (const failure of verdict.failures) {
    parts.push(
      `cell ${failure.cell} (line ${failure.line}) ${failure.status}` +
        (failure.error ? `: ${failure.error.message}` : ""),
    );
  }
  for (const check of verdict.checks.filter((c) => !c.pass)) {
    parts.push(`check failed in cell ${check.cell}: ${check.reason}`);
  }
  for (const drift of verdict.drifts) {
    for (const item of drift.drifts) {
      parts.push(
        `cell ${drift.cell} (line ${drift.line}) drifted: ${item.name}: recorded ${item.recorded}, now ${item.now}`,
      );
    }
  }
  if (typeErrors > 0) parts.push(`${typeErrors} type error(s)`);
  return parts.join("\n");
}
