/**
 * How runs and verdicts read in the terminal.
 *
 * @module
 */
import type { NotebookRun } from "../session/run_notebook.ts";
import type { CellState } from "../session/events.ts";
import type { CheckRecord } from "../sandbox/protocol.ts";
import type { NotebookVerdict } from "../record/verify_notebook.ts";
import type { TypeProblem } from "../compile/type_check.ts";
import { type CliIo, paint, table } from "./_terminal.ts";
import { formatQuantity } from "../_format.ts";

/**
 * Prints a run: headings, each cell's outcome (values, printed text, errors), then the
 * design-check table and a summary line.
 *
 * @param io Where to print.
 * @param run The run.
 * @param relativePath How to name the notebook.
 */
export function printRun(io: CliIo, run: NotebookRun, relativePath: string): void {
  const numberOf = new Map(run.cells.map((cell) => [cell.id, cell.index + 1]));
  const headings = [...run.notebook.headings];
  io.out(paint(io, "gray", `${relativePath}\n`));
  for (const [i, cell] of run.cells.entries()) {
    while (headings.length > 0 && headings[0].line < cell.place.startLine) {
      const heading = headings.shift()!;
      io.out(`\n${paint(io, "bold", `${"#".repeat(heading.level)} ${heading.text}`)}\n`);
    }
    printCell(io, { index: cell.index, line: cell.place.startLine + 1 }, run.states[i], numberOf);
  }
  for (const heading of headings) {
    io.out(`\n${paint(io, "bold", `${"#".repeat(heading.level)} ${heading.text}`)}\n`);
  }
  const checks = run.states.flatMap((state, i) =>
    (state.outcome?.checks ?? []).map((check) => ({ ...check, cell: run.cells[i].index + 1 }))
  );
  if (checks.length > 0) {
    io.out(`\n${paint(io, "bold", "Design checks")}\n`);
    for (const line of checkTable(io, checks)) io.out(`  ${line}\n`);
  }
  io.out(`\n${runSummary(io, run)}\n`);
}

/**
 * Prints one cell's outcome: its status line, printed text, adjustable values, shown values
 * and error.
 *
 * @param io Where to print.
 * @param cell The cell's number (0-based index) and the notebook line of its fence.
 * @param state Its latest state.
 * @param numberOf Cell ids to cell numbers, for "blocked: needs cell N".
 */
export function printCell(
  io: CliIo,
  cell: { index: number; line: number },
  state: CellState,
  numberOf: ReadonlyMap<string, number>,
): void {
  const where = `cell ${cell.index + 1} · line ${cell.line}`;
  if (state.status === "done") {
    const ms = state.outcome ? ` · ${formatMs(state.outcome.durationMs)}` : "";
    io.out(`\n${paint(io, "green", "✓")} ${paint(io, "gray", where + ms)}\n`);
  } else if (state.status === "failed") {
    io.out(
      `\n${paint(io, "red", "✗")} ${paint(io, "gray", where)} ${paint(io, "red", "failed")}\n`,
    );
  } else if (state.status === "blocked") {
    const by = (state.blockedBy ?? []).map((id) => `cell ${numberOf.get(id)}`).join(", ");
    io.out(`\n${paint(io, "yellow", "⊘")} ${paint(io, "gray", where)} blocked: needs ${by}\n`);
  } else {
    io.out(`\n${paint(io, "gray", `· ${where} ${state.status}`)}\n`);
  }
  for (const chunk of state.streams) {
    for (const line of chunk.text.replace(/\n$/, "").split("\n")) {
      io.out(
        `  ${paint(io, "gray", "│")} ${chunk.name === "err" ? paint(io, "yellow", line) : line}\n`,
      );
    }
  }
  for (const adjustable of state.outcome?.adjustables ?? []) {
    const range = Number.isFinite(adjustable.min) || Number.isFinite(adjustable.max)
      ? `, ${formatQuantity(adjustable.min, adjustable.unit)} … ${
        formatQuantity(adjustable.max, adjustable.unit)
      }`
      : "";
    const changed = adjustable.value !== adjustable.defaultValue
      ? paint(io, "yellow", " (set)")
      : "";
    io.out(
      `  adjustable ${adjustable.name} = ${
        formatQuantity(adjustable.value, adjustable.unit)
      }${changed}` +
        paint(
          io,
          "gray",
          ` (default ${formatQuantity(adjustable.defaultValue, adjustable.unit)}${range})`,
        ) + "\n",
    );
  }
  for (const output of state.outcome?.outputs ?? []) {
    const text = output["text/plain"] ?? "";
    for (const line of text.split("\n")) io.out(`  ${line}\n`);
    if (output["image/svg+xml"]) {
      io.out(paint(io, "gray", "  (chart: saved by `longtail record`)\n"));
    }
  }
  if (state.error) {
    const place = state.error.line === undefined
      ? ""
      : ` (line ${state.error.line}${
        state.error.column === undefined ? "" : `, column ${state.error.column}`
      })`;
    const problems = state.error.problems ?? [];
    if (problems.length > 0) {
      for (const problem of problems) {
        io.out(
          `  ${paint(io, "red", problem.message)} ${
            paint(io, "gray", `(line ${problem.line}, column ${problem.column})`)
          }\n`,
        );
      }
    } else io.out(`  ${paint(io, "red", state.error.message)}${paint(io, "gray", place)}\n`);
  }
}

/** Failed and passed counts, in one line. */
export function runSummary(io: CliIo, run: NotebookRun): string {
  const count = (status: string) => run.states.filter((state) => state.status === status).length;
  const checks = run.states.flatMap((state) => state.outcome?.checks ?? []);
  const failedChecks = checks.filter((check) => !check.pass).length;
  const parts = [
    `${run.cells.length} cells: ${count("done")} done`,
    count("failed") > 0 ? paint(io, "red", `${count("failed")} failed`) : "0 failed",
    count("blocked") > 0 ? paint(io, "yellow", `${count("blocked")} blocked`) : "0 blocked",
  ];
  const checkText = `checks: ${checks.length - failedChecks} passed, ` +
    (failedChecks > 0 ? paint(io, "red", `${failedChecks} failed`) : "0 failed");
  return `${parts.join(", ")} · ${checkText}`;
}

/**
 * The design-check table: verdict, name, value, limit, margin, cell.
 *
 * @param io For colours.
 * @param checks Checks with their cell numbers.
 * @returns The table's lines.
 */
export function checkTable(io: CliIo, checks: Array<CheckRecord & { cell: number }>): string[] {
  const rows = checks.map((check) => [
    check.pass ? "✓" : "✗",
    check.name,
    formatQuantity(check.value, check.unit),
    limitText(check),
    marginText(check),
    `cell ${check.cell}`,
  ]);
  const lines = table([["", "check", "value", "limit", "margin", "where"], ...rows]);
  return lines.map((line, i) => {
    if (i === 0) return paint(io, "gray", line);
    return checks[i - 1].pass
      ? line.replace(/^✓/, paint(io, "green", "✓"))
      : paint(io, "red", line);
  });
}

function limitText(check: CheckRecord): string {
  const { kind, min, max } = check.limit;
  const show = (x: number | undefined) => formatQuantity(x ?? Number.NaN, check.unit);
  if (kind === "atLeast") return `at least ${show(min)}`;
  if (kind === "atMost") return `at most ${show(max)}`;
  if (kind === "within") return `${show(min)} … ${show(max)}`;
  return kind;
}

function marginText(check: CheckRecord): string {
  if (!Number.isFinite(check.margin)) return "—";
  const ratio = Number.isFinite(check.marginRatio)
    ? ` (${(check.marginRatio * 100).toFixed(0)} %)`
    : "";
  return `${formatQuantity(check.margin, check.unit)}${ratio}`;
}

/**
 * Prints one notebook's verdict: a headline, then every reason it did not pass.
 *
 * @param io Where to print.
 * @param verdict The verdict.
 * @param typeProblems Type errors in this notebook.
 * @param relativePath How to name the notebook.
 * @param version This longtail's version.
 */
export function printVerdict(
  io: CliIo,
  verdict: NotebookVerdict,
  typeProblems: readonly TypeProblem[],
  relativePath: string,
  version: string,
): void {
  const passed = verdict.passed && typeProblems.length === 0;
  const failedChecks = verdict.checks.filter((check) => !check.pass);
  const summary =
    `${verdict.cells} cells, ${
      verdict.checks.length - failedChecks.length
    }/${verdict.checks.length} checks passed` +
    (verdict.notRecorded
      ? ", no recorded results yet"
      : `, ${verdict.agreed} recorded results agree`);
  io.out(
    `${passed ? paint(io, "green", "✓") : paint(io, "red", "✗")} ${relativePath} ${
      paint(io, "gray", `— ${summary}`)
    }\n`,
  );
  for (const failure of verdict.failures) {
    if (failure.status === "failed") {
      const error = failure.error;
      const place = error?.line === undefined
        ? ""
        : ` at line ${error.line}${error.column ? `:${error.column}` : ""}`;
      const problems = error?.problems ?? [];
      if (problems.length > 0) {
        for (const problem of problems) {
          io.out(
            `    cell ${failure.cell} (line ${failure.line}) cannot run: ${problem.message} (line ${problem.line}:${problem.column})\n`,
          );
        }
      } else {io.out(
          `    cell ${failure.cell} (line ${failure.line}) failed${place}: ${
            error?.message ?? "unknown error"
          }\n`,
        );}
    } else {
      const by = (failure.blockedBy ?? []).map((n) => `cell ${n}`).join(", ");
      io.out(`    cell ${failure.cell} (line ${failure.line}) blocked: needs ${by}\n`);
    }
  }
  for (const check of failedChecks) {
    io.out(
      `    ${
        paint(io, "red", "check failed")
      } in cell ${check.cell} (line ${check.line}): ${check.reason}\n`,
    );
  }
  for (const drift of verdict.drifts) {
    io.out(`    cell ${drift.cell} (line ${drift.line}) drifted:\n`);
    for (const item of drift.drifts) {
      const recorded = item.recorded.includes("\n")
        ? `\n${indent(item.recorded, 10)}\n`
        : item.recorded;
      const now = item.now.includes("\n") ? `\n${indent(item.now, 10)}` : item.now;
      io.out(
        `      ${item.name}: recorded ${recorded}${
          item.recorded.includes("\n") ? "        " : ", "
        }now ${now}\n`,
      );
    }
  }
  for (const problem of typeProblems) {
    const where = problem.path === verdict.path
      ? `line ${problem.line}:${problem.column}`
      : `${problem.path}:${problem.line}:${problem.column}`;
    io.out(`    type error at ${where}: ${problem.message}\n`);
  }
  if (verdict.recordedWith !== undefined) {
    io.out(paint(
      io,
      "yellow",
      `    note: results were recorded with longtail ${verdict.recordedWith}; this is ${version}, so a drift may come from the library rather than the notebook\n`,
    ));
  }
}

function indent(text: string, spaces: number): string {
  return text.split("\n").map((line) => " ".repeat(spaces) + line).join("\n");
}

function formatMs(ms: number): string {
  return ms < 1
    ? `${ms.toFixed(2)} ms`
    : ms < 1000
    ? `${ms.toFixed(1)} ms`
    : `${(ms / 1000).toFixed(2)} s`;
}
