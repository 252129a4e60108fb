/**
 * Finding adjustable-value declarations: top-level `const name = helper(…)` where `helper`
 * is `adjustable` imported from `longtail/notebook`, by the same cell or by the cell it
 * takes `helper` from.
 *
 * @module
 */
import type { CallDeclaration, CellAnalysis } from "./analyse_cell.ts";
import type { NotebookGraph } from "./graph.ts";

/** The module name notebooks import the adjustable-value helper from. */
export const NOTEBOOK_HELPERS_MODULE = "longtail/notebook";

function helperNames(analysis: CellAnalysis): string[] {
  return analysis.imports.filter((d) => d.source === NOTEBOOK_HELPERS_MODULE).flatMap((d) =>
    d.bindings.filter((b) => b.imported === "adjustable" && !b.typeOnly).map((b) => b.local)
  );
}

/**
 * The adjustable-value declarations of one cell.
 *
 * @param id The cell's id.
 * @param analyses Every cell's analysis, by id.
 * @param graph The notebook's graph.
 * @returns The declarations (name, helper name, where the helper is called).
 *
 * @example
 * ```ts
 * import { analyseCell } from "./analyse_cell.ts";
 * import { adjustableCalls } from "./adjustables.ts";
 * import { buildGraph } from "./graph.ts";
 * import { deepEqual } from "node:assert/strict";
 * const analyses = new Map([
 *   ["a", analyseCell('import { adjustable } from "longtail/notebook";')],
 *   ["b", analyseCell("const tail = adjustable(2e-3, { unit: 'A' }); const x = Math.max(1, 2);")],
 * ]);
 * const graph = buildGraph([...analyses].map(([id, analysis]) => ({ id, analysis })));
 * deepEqual(adjustableCalls("b", analyses, graph).map((call) => call.name), ["tail"]);
 * ```
 */
export function adjustableCalls(
  id: string,
  analyses: ReadonlyMap<string, CellAnalysis>,
  graph: NotebookGraph,
): CallDeclaration[] {
  const analysis = analyses.get(id);
  if (!analysis || analysis.calls.length === 0) return [];
  const own = new Set(helperNames(analysis));
  const node = graph.byId.get(id);
  return analysis.calls.filter((call) => {
    if (own.has(call.callee)) return true;
    const input = node?.inputs.find((i) => i.name === call.callee);
    const provider = input && analyses.get(input.from);
    return provider !== undefined && helperNames(provider).includes(call.callee);
  });
}

/**
 * Every adjustable value of a notebook, with the cell that declares it.
 *
 * @param analyses Every cell's analysis, by id.
 * @param graph The notebook's graph.
 * @returns Name → cell id.
 *
 * @example Two adjustable values in one cell
 * ```ts
 * import { analyseCell } from "./analyse_cell.ts";
 * import { findAdjustables } from "./adjustables.ts";
 * import { buildGraph } from "./graph.ts";
 * import { deepEqual } from "node:assert/strict";
 * const code = 'import { adjustable as knob } from "longtail/notebook";\n' +
 *   "const rail = knob(30, { unit: 'V' });\nconst load = knob(8, { unit: 'Ω' });";
 * const analyses = new Map([["c1", analyseCell(code)]]);
 * const graph = buildGraph([{ id: "c1", analysis: analyses.get("c1")! }]);
 * deepEqual([...findAdjustables(analyses, graph)], [["rail", "c1"], ["load", "c1"]]);
 * ```
 */
export function findAdjustables(
  analyses: ReadonlyMap<string, CellAnalysis>,
  graph: NotebookGraph,
): Map<string, string> {
  const names = new Map<string, string>();
  for (const id of analyses.keys()) {
    for (const call of adjustableCalls(id, analyses, graph)) names.set(call.name, id);
  }
  return names;
}
