/**
 * The type-checking form of a cell: a real module file that imports its inputs (values
 * and types) from the modules of the cells that define them and exports what other cells
 * use, so `deno check` sees the whole notebook as ordinary modules.
 *
 *     line 1   import { tail, type Stage } from "./cell_2.ts";   ← inputs, all on one line
 *     line 2…  the cell's code, line for line (relative imports made absolute)
 *     last     export { gm }; export type { Pair };                ← what other cells use
 *
 * @module
 */
import type { CellAnalysis } from "../analysis/analyse_cell.ts";
import type { CellInput } from "../analysis/graph.ts";
import { absoluteSpecifier } from "./compile_cell.ts";

/** Options for {@linkcode checkModule}. */
export interface CheckModuleOptions {
  /** URL of the notebook; relative imports resolve against it. */
  notebookUrl: string;
  /** Values from other cells. */
  inputs: readonly CellInput[];
  /** Types from other cells. */
  typeInputs: readonly CellInput[];
  /** File name (relative, e.g. `"./cell_3.ts"`) of each cell's module, by cell id. */
  fileOf: (cellId: string) => string;
  /** Names other cells use as values. */
  exportValues: readonly string[];
  /** Names other cells use only as types. */
  exportTypes: readonly string[];
}

/**
 * Builds the type-checking module of one cell. Its line `n + 1` is the cell's line `n`.
 *
 * @param code The cell's code.
 * @param analysis Its analysis.
 * @param options Inputs, exports and file names.
 * @returns The module source.
 *
 * @example
 * ```ts
 * import { analyseCell } from "../analysis/analyse_cell.ts";
 * import { checkModule } from "./check_module.ts";
 * import { equal } from "node:assert/strict";
 * const code = "const gm: number = tail / 0.052;\n";
 * const source = checkModule(code, analyseCell(code), {
 *   notebookUrl: "file:///amp/design.md",
 *   inputs: [{ name: "tail", from: "c1" }],
 *   typeInputs: [],
 *   fileOf: (id) => `./${id}.ts`,
 *   exportValues: ["gm"],
 *   exportTypes: [],
 * });
 * equal(source, 'import { tail } from "./c1.ts";\nconst gm: number = tail / 0.052;\n\nexport { gm };\n');
 * ```
 */
export function checkModule(
  code: string,
  analysis: CellAnalysis,
  options: CheckModuleOptions,
): string {
  const byProvider = new Map<string, string[]>();
  for (const input of options.inputs) {
    const names = byProvider.get(input.from) ?? [];
    names.push(input.name);
    byProvider.set(input.from, names);
  }
  for (const input of options.typeInputs) {
    const names = byProvider.get(input.from) ?? [];
    names.push(`type ${input.name}`);
    byProvider.set(input.from, names);
  }
  const head = [...byProvider].map(([from, names]) =>
    `import { ${names.join(", ")} } from ${JSON.stringify(options.fileOf(from))};`
  ).join(" ");
  // Relative specifiers become absolute (the module lives in a temporary folder).
  const spans = [
    ...analysis.imports.map((d) => ({ start: d.sourceStart, end: d.sourceEnd, source: d.source })),
    ...analysis.dynamicImports,
  ].sort((a, b) => a.start - b.start);
  let body = "";
  let at = 0;
  for (const span of spans) {
    const url = absoluteSpecifier(span.source, options.notebookUrl);
    body += code.slice(at, span.start) + JSON.stringify(url);
    at = span.end;
  }
  body += code.slice(at);
  const exports: string[] = [];
  if (options.exportValues.length > 0) {
    exports.push(`export { ${options.exportValues.join(", ")} };`);
  }
  if (options.exportTypes.length > 0) {
    exports.push(`export type { ${options.exportTypes.join(", ")} };`);
  }
  return `${head}\n${body}${body.endsWith("\n") ? "" : "\n"}\n${exports.join(" ")}\n`;
}
