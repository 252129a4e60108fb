/**
 * `record`: writing a run's results into the notebook and its chart folder.
 *
 * Charts go to `<name>_charts/cell-N.svg` beside the notebook. The notebook itself is
 * written after its charts, atomically, and only if it did not change on disk while the
 * cells ran; chart files that no cell produces any more are removed after that.
 *
 * @module
 */
import { type CellRecord, writeRecorded } from "../notebook/write_recorded.ts";
import type { NotebookRun } from "../session/run_notebook.ts";
import { dirname, joinPath } from "../_paths.ts";
import { LONGTAIL_VERSION } from "../version.ts";
import { cellEntries } from "./cell_entries.ts";
import { writeFileAtomic } from "./write_files.ts";

/** What `record` wrote. */
export interface RecordOutcome {
  /** The notebook's new text. */
  text: string;
  /** Cells with a recorded block. */
  recordedCells: number;
  /** Chart files written (paths). */
  charts: string[];
  /** Chart files removed because no cell produces them any more. */
  removed: string[];
}

/**
 * Thrown when the notebook changed on disk between reading and writing.
 *
 * @example
 * ```ts
 * import { NotebookChangedError } from "./record_notebook.ts";
 * import { match } from "node:assert/strict";
 * match(new NotebookChangedError("amp.md").message, /amp\.md changed on disk/);
 * ```
 */
export class NotebookChangedError extends Error {
  /**
   * Creates the error.
   *
   * @param path The notebook.
   */
  constructor(path: string) {
    super(`${path} changed on disk while its cells ran; nothing was recorded (run record again)`);
    this.name = "NotebookChangedError";
  }
}

/**
 * Builds the records of every cell of a run.
 *
 * @param run A finished run.
 * @returns One record per cell index, with its charts.
 *
 * @example
 * ```ts
 * import { runNotebook } from "../session/run_notebook.ts";
 * import { recordsOf } from "./record_notebook.ts";
 * import { deepEqual } from "node:assert/strict";
 * const dir = await Deno.makeTempDir();
 * const run = await runNotebook(`${dir}/amp.md`, "~~~ts\nconst gain = 20;\ngain * 2\n~~~\n");
 * deepEqual(recordsOf(run)[0].entries, [
 *   { kind: "text", text: "40" },
 *   { kind: "number", name: "gain", value: 20 },
 * ]);
 * await Deno.remove(dir, { recursive: true });
 * ```
 */
export function recordsOf(
  run: NotebookRun,
): Array<CellRecord & { chartFiles: Array<{ path: string; svg: string }> }> {
  const numberOf = new Map(run.cells.map((cell) => [cell.id, cell.index + 1]));
  return run.cells.map((cell, i) => {
    const { entries, charts } = cellEntries(run.states[i], cell.index + 1, {
      cellLabel: (id) => `cell ${numberOf.get(id) ?? "?"}`,
    });
    const folder = run.notebook.chartsFolder;
    return {
      entries,
      charts: charts.map((chart) => ({ path: `${folder}/${chart.fileName}`, title: chart.title })),
      chartFiles: charts.map((chart) => ({ path: `${folder}/${chart.fileName}`, svg: chart.svg })),
    };
  });
}

/**
 * Writes a run's results: chart files, then the notebook (atomically).
 *
 * @param run A finished run of the notebook at `run.path`.
 * @param originalBytes The notebook's bytes as read before the run.
 * @returns What was written.
 * @throws {NotebookChangedError} If the file changed on disk since it was read.
 *
 * @example Run, then record
 * ```ts
 * import { runNotebook } from "../session/run_notebook.ts";
 * import { recordNotebook } from "./record_notebook.ts";
 * import { match } from "node:assert/strict";
 * const dir = await Deno.makeTempDir();
 * const path = `${dir}/amp.md`;
 * await Deno.writeTextFile(path, "~~~ts\n2 * 21\n~~~\n");
 * const bytes = await Deno.readFile(path);
 * await recordNotebook(await runNotebook(path, new TextDecoder().decode(bytes)), bytes);
 * const fence = "`".repeat(3);
 * match(await Deno.readTextFile(path), new RegExp(`~~~\n\n${fence}recorded\n42\n${fence}\n`));
 * await Deno.remove(dir, { recursive: true });
 * ```
 */
export async function recordNotebook(
  run: NotebookRun,
  originalBytes: Uint8Array,
): Promise<RecordOutcome> {
  const records = recordsOf(run);
  const text = writeRecorded(run.notebook, records, LONGTAIL_VERSION);
  const current = await Deno.readFile(run.path);
  if (!sameBytes(current, originalBytes)) throw new NotebookChangedError(run.path);
  const folder = dirname(run.path);
  const chartDir = joinPath(folder, run.notebook.chartsFolder);
  const wanted = new Set<string>();
  const written: string[] = [];
  for (const record of records) {
    for (const chart of record.chartFiles) {
      await Deno.mkdir(chartDir, { recursive: true });
      const path = joinPath(folder, chart.path);
      await writeFileAtomic(path, chart.svg);
      wanted.add(path);
      written.push(path);
    }
  }
  // Check again right before the swap: the charts took time, and an editor may have saved.
  if (!sameBytes(await Deno.readFile(run.path), originalBytes)) {
    throw new NotebookChangedError(run.path);
  }
  await writeFileAtomic(run.path, text);
  // Old charts go only after the new notebook is in place: a kill before this point leaves
  // the old notebook with every chart it links to.
  const removed: string[] = [];
  try {
    for (const entry of Deno.readDirSync(chartDir)) {
      const path = joinPath(chartDir, entry.name);
      if (entry.isFile && /^cell-\d+(-\d+)?\.svg$/.test(entry.name) && !wanted.has(path)) {
        await Deno.remove(path);
        removed.push(path);
      }
    }
  } catch (error) {
    if (!(error instanceof Deno.errors.NotFound)) throw error;
  }
  return {
    text,
    recordedCells:
      records.filter((r) => r.entries.length > 0 || (r.charts?.length ?? 0) > 0).length,
    charts: written,
    removed,
  };
}

function sameBytes(a: Uint8Array, b: Uint8Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}
