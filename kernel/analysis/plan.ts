/**
 * Which cells must run, and in which order: the reactive rule.
 *
 * Every cell has a source version (bumped when its code or its adjustable values change)
 * and, once run, a result version (bumped each time it produces a new result or failure).
 * Each run remembers the result versions of the providers it used, like a link that
 * remembers what it last saw:
 *
 *         a (v3, result 7)
 *        ╱ ╲
 *       b   c        d ran after seeing b@result 4 and c@result 9;
 *        ╲ ╱         when a is edited, a, b, c, d are stale and run once each,
 *         d          in dependency order: a, b, c, d
 *
 * A cell is stale when it never ran, its source version changed, one of its providers is
 * stale, or a provider's result version differs from the one it saw (or its set of
 * providers changed). Walking the cells in dependency order decides this in one pass, so
 * each stale cell appears once however many paths lead to it (diamonds).
 *
 * After the sandbox restarts, finished cells keep their outputs but their values are gone
 * (`held: false`); such a cell is re-run as a *restore* only if a stale cell needs it, and a
 * restore does not make its dependents stale. A cell that failed has no value to restore:
 * its dependents stay blocked until it changes.
 *
 * @module
 */
import type { NotebookGraph } from "./graph.ts";

/** What the kernel remembers about a cell's last run. */
export interface RunRecord {
  /** The cell's source version at that run. */
  version: number;
  /** The result version the run produced. */
  result: number;
  /** Result versions of the providers it used, by provider id. */
  seen: ReadonlyMap<string, number>;
  /** Whether the run produced a value (it did not fail and was not blocked). */
  succeeded: boolean;
  /** Whether the sandbox still holds that value (false after a restart). */
  held: boolean;
}

/** One step of a plan. */
export interface PlanStep {
  /** Cell id. */
  id: string;
  /** True when the cell only re-creates a value the sandbox lost (its result stays). */
  restore: boolean;
}

/** Options for {@linkcode planRun}. */
export interface PlanOptions {
  /**
   * Cells to run even if they are up to date (their dependents follow).
   * @default {[]}
   */
  force?: Iterable<string>;
}

/**
 * Plans a run: the stale cells (and the lost values they need), dependencies first.
 *
 * @param graph The notebook's graph.
 * @param versions Current source version of each cell, by id.
 * @param records The last run of each cell, by id (missing: never ran).
 * @param options Cells to force.
 * @returns The steps, in the order to take them.
 *
 * @example After editing the top of a diamond, all four cells run once
 * ```ts
 * import { analyseCell } from "./analyse_cell.ts";
 * import { buildGraph } from "./graph.ts";
 * import { planRun, type RunRecord } from "./plan.ts";
 * import { deepEqual } from "node:assert/strict";
 * const codes = ["const a = 1", "const b = a + 1", "const c = a + 2", "const d = b + c", "const e = 5"];
 * const graph = buildGraph(codes.map((code, i) => ({ id: "abcde"[i], analysis: analyseCell(code) })));
 * const versions = new Map([..."abcde"].map((id) => [id, 1]));
 * const records = new Map<string, RunRecord>();
 * for (const id of graph.order) {
 *   const seen = new Map(graph.byId.get(id)!.dependencies.map((d) => [d, 1]));
 *   records.set(id, { version: 1, result: 1, seen, succeeded: true, held: true });
 * }
 * deepEqual(planRun(graph, versions, records), []);
 * versions.set("a", 2);
 * deepEqual(planRun(graph, versions, records).map((step) => step.id), ["a", "b", "c", "d"]);
 * ```
 */
export function planRun(
  graph: NotebookGraph,
  versions: ReadonlyMap<string, number>,
  records: ReadonlyMap<string, RunRecord>,
  options: PlanOptions = {},
): PlanStep[] {
  const force = new Set(options.force ?? []);
  const stale = new Set<string>();
  for (const id of graph.order) {
    const cell = graph.byId.get(id)!;
    const record = records.get(id);
    let isStale = record === undefined || record.version !== versions.get(id) || force.has(id) ||
      record.seen.size !== cell.dependencies.length;
    for (const dependency of cell.dependencies) {
      if (isStale) break;
      isStale = stale.has(dependency) ||
        record!.seen.get(dependency) !== records.get(dependency)?.result;
    }
    if (isStale) stale.add(id);
  }
  // Lost values that stale cells need, found from the bottom up.
  const restore = new Set<string>();
  for (let i = graph.order.length - 1; i >= 0; i--) {
    const id = graph.order[i];
    if (!stale.has(id) && !restore.has(id)) continue;
    for (const dependency of graph.byId.get(id)!.dependencies) {
      if (stale.has(dependency) || restore.has(dependency)) continue;
      const record = records.get(dependency);
      if (record?.succeeded && !record.held) restore.add(dependency);
    }
  }
  const steps: PlanStep[] = [];
  for (const id of graph.order) {
    if (stale.has(id)) steps.push({ id, restore: false });
    else if (restore.has(id)) steps.push({ id, restore: true });
  }
  return steps;
}
