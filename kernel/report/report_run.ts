/**
 * From a headless run (kernel/session/run_notebook.ts) to what the report needs.
 *
 * @module
 */
import { type NotebookRun, runNotebook, type RunNotebookOptions } from "../session/run_notebook.ts";
import type { ReportRun, ReportSource } from "./render_report.ts";

/** Options for {@linkcode reportRunOf}. */
export interface ReportRunOptions {
  /** When the run started. */
  ranAt: Date;
  /**
   * Adjustable values set for the run (`--set`), by name.
   * @default {{}}
   */
  values?: Record<string, number>;
  /**
   * Extra folders or files the notebook was allowed to read.
   * @default {[]}
   */
  allowRead?: string[];
  /**
   * Hosts the notebook was allowed to reach.
   * @default {[]}
   */
  allowNet?: string[];
  /**
   * Environment variables passed to the notebook.
   * @default {[]}
   */
  allowEnv?: string[];
}

/**
 * Turns a finished headless run into the report's view of it.
 *
 * @param run The run.
 * @param options When it started and what it was given.
 * @returns Each cell's id and final state in document order, and the run's facts.
 *
 * @example
 * ```ts ignore
 * import { runNotebook } from "../session/run_notebook.ts";
 * import { reportRunOf } from "./report_run.ts";
 * const ranAt = new Date();
 * const run = reportRunOf(await runNotebook("design.md", text), { ranAt });
 * ```
 */
export function reportRunOf(run: NotebookRun, options: ReportRunOptions): ReportRun {
  const report: ReportRun = {
    ranAt: options.ranAt,
    cells: run.cells.map((cell, i) => ({ ...run.states[i], id: cell.id })),
    durationMs: run.timing.analysisMs + run.timing.runMs,
  };
  if (options.values && Object.keys(options.values).length > 0) {
    report.values = { ...options.values };
  }
  const granted = [
    ...(options.allowRead ?? []).map((path) => `read ${path}`),
    ...(options.allowNet ?? []).map((host) => `network ${host}`),
    ...(options.allowEnv ?? []).map((name) => `environment variable ${name}`),
  ];
  if (granted.length > 0) report.granted = granted;
  return report;
}

/**
 * Runs a notebook in a sandboxed session and returns what {@linkcode renderReport} takes.
 *
 * @param path The notebook's path.
 * @param text The notebook's text.
 * @param options Session options (time limit, adjustable values, extra reads).
 * @returns The source and the run.
 *
 * @example
 * ```ts ignore
 * import { runNotebookForReport } from "./report_run.ts";
 * import { renderReport } from "./render_report.ts";
 * const path = "notebooks/power_amplifier.md";
 * const { source, run } = await runNotebookForReport(path, await Deno.readTextFile(path));
 * const html = renderReport(source, run);
 * ```
 */
export async function runNotebookForReport(
  path: string,
  text: string,
  options: RunNotebookOptions = {},
): Promise<{ source: ReportSource; run: ReportRun }> {
  const ranAt = new Date();
  const run = await runNotebook(path, text, options);
  return {
    source: { text, path },
    run: reportRunOf(run, {
      ranAt,
      values: options.values,
      allowRead: options.allowRead,
      allowNet: options.allowNet,
      allowEnv: options.allowEnv,
    }),
  };
}
