/**
 * The notebook's dependency graph: which cell defines each name, which cells each cell
 * needs, the order to run them in, and the problems (duplicates, cycles, unknown names,
 * writes to another cell's name).
 *
 *     cell 1: const tail = 2e-3          cell 1 ──tail──▶ cell 2 ──gm──▶ cell 4
 *     cell 2: const gm = tail / 0.052               └────tail────────▶ cell 3
 *     cell 3: tail * 1000
 *     cell 4: gm * 10e3                  run order: 1, 2, 3, 4 (dependencies first,
 *                                        otherwise document order)
 *
 * Only value uses order the cells; a name used only as a type (`x: Stage`) is a type
 * input, which the type checker needs but the run does not.
 *
 * @module
 */
import type { CellAnalysis } from "./analyse_cell.ts";
import { closestName } from "./closest_name.ts";
import { isGlobalName } from "./globals.ts";

/** One cell as the graph sees it. */
export interface GraphCellInput {
  /** Stable identity of the cell (survives edits of other cells). */
  id: string;
  /** The cell's analysis. */
  analysis: CellAnalysis;
  /**
   * How messages name this cell.
   * @default {"cell N" (N = position, 1-based)}
   */
  label?: string;
}

/** A name that comes from another cell. */
export interface CellInput {
  /** The name. */
  name: string;
  /** Id of the cell that defines it. */
  from: string;
}

/** What kind of problem. */
export type ProblemKind =
  | "syntax"
  | "export"
  | "duplicate"
  | "undefined"
  | "assignment"
  | "cycle";

/** A problem that stops a cell from running. */
export interface GraphProblem {
  /** What kind of problem. */
  kind: ProblemKind;
  /** One or two sentences, naming the cells involved. */
  message: string;
  /** Offset in the cell's code where it shows, if it has one place. */
  offset?: number;
  /** Other cells involved (ids). */
  cells?: string[];
}

/** One cell of the graph. */
export interface GraphCell {
  /** Identity. */
  id: string;
  /** Position in the document, 0-based. */
  index: number;
  /** Label used in messages. */
  label: string;
  /** Names used at run time that other cells define. */
  inputs: CellInput[];
  /** Names used only as types that other cells define. */
  typeInputs: CellInput[];
  /** Cells this one needs at run time (ids, document order, no repeats). */
  dependencies: string[];
  /** Cells that need this one at run time. */
  dependents: string[];
  /** Problems that stop this cell from running. */
  problems: GraphProblem[];
}

/** The graph of a whole notebook. */
export interface NotebookGraph {
  /** The cells in document order. */
  cells: GraphCell[];
  /** Cells by id. */
  byId: Map<string, GraphCell>;
  /** Which cell defines each name (the first one, if several do). */
  definers: Map<string, string>;
  /** All cells, dependencies before dependents, otherwise in document order. */
  order: string[];
  /** Each cycle's cells (ids, document order). */
  cycles: string[][];
}

/**
 * Builds the graph of a notebook from its cells' analyses.
 *
 * @param cells The cells in document order.
 * @returns The graph, with problems attached to the cells they stop.
 *
 * @example A diamond runs its top first and its bottom last
 * ```ts
 * import { analyseCell } from "./analyse_cell.ts";
 * import { buildGraph } from "./graph.ts";
 * import { deepEqual } from "node:assert/strict";
 * const codes = ["const d = b + c", "const b = a * 2", "const c = a * 3", "const a = 1"];
 * const graph = buildGraph(codes.map((code, i) => ({ id: `c${i}`, analysis: analyseCell(code) })));
 * deepEqual(graph.order, ["c3", "c1", "c2", "c0"]);
 * deepEqual(graph.byId.get("c0")!.dependencies, ["c1", "c2"]);
 * ```
 */
export function buildGraph(cells: readonly GraphCellInput[]): NotebookGraph {
  const graphCells: GraphCell[] = cells.map((cell, index) => ({
    id: cell.id,
    index,
    label: cell.label ?? `cell ${index + 1}`,
    inputs: [],
    typeInputs: [],
    dependencies: [],
    dependents: [],
    problems: cell.analysis.problems.map((problem) => ({ ...problem })),
  }));
  const byId = new Map(graphCells.map((cell) => [cell.id, cell]));
  const definers = findDefiners(cells, graphCells);
  const typeOnly = new Set<string>();
  for (const cell of cells) {
    const values = new Set(cell.analysis.defines.filter((d) => !d.typeOnly).map((d) => d.name));
    for (const definition of cell.analysis.defines) {
      const name = definition.name;
      if (definers.get(name) === cell.id && !values.has(name)) typeOnly.add(name);
    }
  }
  for (const [i, cell] of cells.entries()) {
    resolveUses(cell.analysis, graphCells[i], definers, typeOnly, byId);
  }
  for (const cell of graphCells) {
    for (const dependency of cell.dependencies) byId.get(dependency)!.dependents.push(cell.id);
  }
  const cycles = findCycles(graphCells, byId);
  for (const cycle of cycles) reportCycle(cycle, byId);
  return { cells: graphCells, byId, definers, order: topologicalOrder(graphCells, byId), cycles };
}

/** Name → defining cell; two cells defining one name is a problem for both. */
function findDefiners(
  cells: readonly GraphCellInput[],
  graphCells: GraphCell[],
): Map<string, string> {
  const definers = new Map<string, string>();
  // An import of the same export from the same module may appear in many cells: it is one value.
  const importKeys = new Map<string, string>();
  const importKey = (analysis: CellAnalysis, name: string) => {
    for (const declaration of analysis.imports) {
      for (const binding of declaration.bindings) {
        if (binding.local === name) return `${declaration.source}\0${binding.imported}`;
      }
    }
    return undefined;
  };
  const reported = new Set<string>();
  for (const [i, cell] of cells.entries()) {
    for (const definition of cell.analysis.defines) {
      const name = definition.name;
      const key = definition.kind === "import" || definition.kind === "type"
        ? importKey(cell.analysis, name)
        : undefined;
      const first = definers.get(name);
      if (first === undefined) {
        definers.set(name, cell.id);
        if (key) importKeys.set(name, key);
        continue;
      }
      if (first === cell.id) continue;
      if (key !== undefined && importKeys.get(name) === key) continue;
      const firstCell = graphCells.find((c) => c.id === first)!;
      const here = graphCells[i];
      const message =
        `\`${name}\` is defined by both ${firstCell.label} and ${here.label}; a name may have only one defining cell`;
      here.problems.push({ kind: "duplicate", message, offset: definition.start, cells: [first] });
      if (!reported.has(name)) {
        reported.add(name);
        const firstAnalysis = cells.find((c) => c.id === first)!.analysis;
        const offset = firstAnalysis.defines.find((d) => d.name === name)?.start;
        firstCell.problems.push({ kind: "duplicate", message, offset, cells: [cell.id] });
      }
    }
  }
  return definers;
}

function resolveUses(
  analysis: CellAnalysis,
  cell: GraphCell,
  definers: Map<string, string>,
  typeOnly: Set<string>,
  byId: Map<string, GraphCell>,
): void {
  const seen = new Set<string>();
  const seenTypes = new Set<string>();
  const reported = new Set<string>();
  const dependencies = new Set<string>();
  for (const use of analysis.uses) {
    const from = definers.get(use.name);
    if (from !== undefined && from !== cell.id) {
      if (use.write) {
        if (!reported.has(use.name)) {
          reported.add(use.name);
          cell.problems.push({
            kind: "assignment",
            message: `\`${use.name}\` belongs to ${byId.get(from)!.label}; a cell may not assign ` +
              `another cell's name (define a new name instead)`,
            offset: use.start,
            cells: [from],
          });
        }
      } else if (use.typeOnly || typeOnly.has(use.name)) {
        // A type (or an ambient `declare`) has no value to pass at run time.
        if (!seenTypes.has(use.name)) {
          seenTypes.add(use.name);
          cell.typeInputs.push({ name: use.name, from });
        }
      } else if (!seen.has(use.name)) {
        seen.add(use.name);
        cell.inputs.push({ name: use.name, from });
        dependencies.add(from);
      }
    } else if (from === undefined && !use.typeOnly && !isGlobalName(use.name)) {
      if (reported.has(use.name)) continue;
      reported.add(use.name);
      const suggestion = closestName(use.name, definers.keys());
      cell.problems.push({
        kind: "undefined",
        message: `\`${use.name}\` is not defined by any cell` +
          (suggestion ? `; did you mean \`${suggestion}\`?` : ""),
        offset: use.start,
      });
    }
  }
  cell.dependencies = [...dependencies].sort((a, b) => byId.get(a)!.index - byId.get(b)!.index);
}

/**
 * Strongly connected components with more than one cell (Tarjan's algorithm, iterative so
 * a 10,000-cell chain does not overflow the stack).
 */
function findCycles(cells: GraphCell[], byId: Map<string, GraphCell>): string[][] {
  const index = new Map<string, number>();
  const low = new Map<string, number>();
  const onStack = new Set<string>();
  const stack: string[] = [];
  const cycles: string[][] = [];
  let counter = 0;
  for (const root of cells) {
    if (index.has(root.id)) continue;
    const work: Array<{ id: string; next: number }> = [{ id: root.id, next: 0 }];
    index.set(root.id, counter);
    low.set(root.id, counter++);
    stack.push(root.id);
    onStack.add(root.id);
    while (work.length > 0) {
      const frame = work[work.length - 1];
      const dependencies = byId.get(frame.id)!.dependencies;
      if (frame.next < dependencies.length) {
        const next = dependencies[frame.next++];
        if (!index.has(next)) {
          index.set(next, counter);
          low.set(next, counter++);
          stack.push(next);
          onStack.add(next);
          work.push({ id: next, next: 0 });
        } else if (onStack.has(next)) {
          low.set(frame.id, Math.min(low.get(frame.id)!, index.get(next)!));
        }
        continue;
      }
      work.pop();
      if (work.length > 0) {
        const parent = work[work.length - 1].id;
        low.set(parent, Math.min(low.get(parent)!, low.get(frame.id)!));
      }
      if (low.get(frame.id) === index.get(frame.id)) {
        const component: string[] = [];
        let member: string;
        do {
          member = stack.pop()!;
          onStack.delete(member);
          component.push(member);
        } while (member !== frame.id);
        if (component.length > 1) {
          cycles.push(component.sort((a, b) => byId.get(a)!.index - byId.get(b)!.index));
        }
      }
    }
  }
  return cycles.sort((a, b) => byId.get(a[0])!.index - byId.get(b[0])!.index);
}

function reportCycle(cycle: string[], byId: Map<string, GraphCell>): void {
  const members = new Set(cycle);
  const links = cycle.map((id) => {
    const cell = byId.get(id)!;
    const names = cell.inputs.filter((input) => members.has(input.from));
    const uses = names.map((input) => `\`${input.name}\` from ${byId.get(input.from)!.label}`);
    return `${cell.label} uses ${uses.join(", ")}`;
  });
  const message = `These cells depend on each other in a circle: ${links.join("; ")}. ` +
    "Break the circle: one of these names must be computed without the others";
  for (const id of cycle) {
    byId.get(id)!.problems.push({
      kind: "cycle",
      message,
      cells: cycle.filter((other) => other !== id),
    });
  }
}

/**
 * Kahn's algorithm, always taking the ready cell that comes first in the document; cells
 * on a cycle never become ready and are appended in document order.
 */
function topologicalOrder(cells: GraphCell[], byId: Map<string, GraphCell>): string[] {
  const waiting = new Map(cells.map((cell) => [cell.id, cell.dependencies.length]));
  const ready = new MinHeap();
  for (const cell of cells) if (cell.dependencies.length === 0) ready.push(cell.index);
  const order: string[] = [];
  const placed = new Set<string>();
  while (ready.size > 0) {
    const cell = cells[ready.pop()];
    order.push(cell.id);
    placed.add(cell.id);
    for (const dependent of cell.dependents) {
      const left = waiting.get(dependent)! - 1;
      waiting.set(dependent, left);
      if (left === 0) ready.push(byId.get(dependent)!.index);
    }
  }
  // What is left sits on a cycle or below one: depth-first, dependencies first, so a cell
  // below a cycle still comes after the cycle's cells (back edges are simply skipped).
  for (const root of cells) {
    if (placed.has(root.id)) continue;
    const work: Array<{ id: string; next: number }> = [{ id: root.id, next: 0 }];
    placed.add(root.id);
    while (work.length > 0) {
      const frame = work[work.length - 1];
      const dependencies = byId.get(frame.id)!.dependencies;
      if (frame.next < dependencies.length) {
        const next = dependencies[frame.next++];
        if (!placed.has(next)) {
          placed.add(next);
          work.push({ id: next, next: 0 });
        }
        continue;
      }
      work.pop();
      order.push(frame.id);
    }
  }
  return order;
}

/** A binary heap of numbers (cell positions), smallest first. */
class MinHeap {
  #items: number[] = [];
  get size(): number {
    return this.#items.length;
  }
  push(value: number): void {
    const items = this.#items;
    items.push(value);
    let i = items.length - 1;
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (items[parent] <= items[i]) break;
      [items[parent], items[i]] = [items[i], items[parent]];
      i = parent;
    }
  }
  pop(): number {
    const items = this.#items;
    const top = items[0];
    const last = items.pop()!;
    if (items.length > 0) {
      items[0] = last;
      let i = 0;
      for (;;) {
        const left = 2 * i + 1;
        const right = left + 1;
        let smallest = i;
        if (left < items.length && items[left] < items[smallest]) smallest = left;
        if (right < items.length && items[right] < items[smallest]) smallest = right;
        if (smallest === i) break;
        [items[smallest], items[i]] = [items[i], items[smallest]];
        i = smallest;
      }
    }
    return top;
  }
}
