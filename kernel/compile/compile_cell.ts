/**
 * Compiling a cell to a module the sandbox runs.
 *
 * The cell's code becomes the body of an async function (so top-level `await` works)
 * inside a module whose first line holds the cell's imports; values from other cells come
 * in as the function's argument, the cell's top-level names go out in its result, and the
 * last expression statement is captured as the shown value:
 *
 *     line 1   import { formatSi } from "longtail/lib"; export default async function (…) {
 *              const { tail } = __longtail_inputs; let __longtail_value;
 *     line 2…  the cell's code, line for line (imports blanked out)
 *     last     ;return { value: __longtail_value, names: { gm, re } }; }
 *
 * Keeping the code line for line means an error's line in the module is the cell's line
 * plus one. Relative import specifiers are made absolute against the notebook's URL,
 * because relative imports inside a `data:` module do not work.
 *
 * @module
 */
import type { CallDeclaration, CellAnalysis, CellImport } from "../analysis/analyse_cell.ts";

/** Names that compiled code uses for its own plumbing; cells should not use them. */
export const INPUTS_NAME = "__longtail_inputs";
/** The parameter that stands in for `import.meta` in compiled code. */
export const META_NAME = "__longtail_meta";
/** The variable that receives the shown value. */
export const VALUE_NAME = "__longtail_value";

/** Options for {@linkcode compileCell}. */
export interface CompileOptions {
  /** URL of the notebook file; relative imports resolve against it. */
  notebookUrl: string;
  /** Names the cell receives from other cells. */
  inputs: readonly string[];
  /**
   * Top-level `const x = f(…)` calls whose `f` is the adjustable-value helper: the
   * compiled call learns the name it is bound to (`f.named("x")(…)`).
   * @default {[]}
   */
  adjustables?: readonly CallDeclaration[];
}

/** A compiled cell. */
export interface CompiledCell {
  /** The module's source. */
  source: string;
  /** Names the module returns (the cell's top-level values). */
  names: string[];
  /** Lines of the module before the cell's first line. */
  lineOffset: number;
  /**
   * Text the compiler inserted into the cell's lines, as `[line, column, length]` (0-based
   * code line and column), so a module column can be turned back into the cell's column.
   */
  insertions: Array<[number, number, number]>;
  /**
   * The cell's imports, one binding per statement, so the sandbox can hoist the imports of
   * many cells into one module and keep each binding once.
   */
  imports: HoistedImport[];
  /**
   * The cell's function alone (`async function (…) {` … `}`), the part of {@linkcode source}
   * after its imports: its lines from the second on are the module's lines.
   */
  body: string;
}

/** One import statement a compiled cell needs. */
export interface HoistedImport {
  /** The statement, e.g. `import { formatSi } from "longtail/lib";`. */
  statement: string;
  /** The local name it binds (none for a side-effect import). */
  local?: string;
}

/**
 * Turns a 1-based line and column of a compiled module into the cell's 0-based line and
 * 1-based column.
 *
 * @param compiled The compiled cell.
 * @param line Module line.
 * @param column Module column.
 * @returns The cell's line index and column, or undefined for the module's own first line.
 *
 * @example The shown value's line is shifted by the inserted capture
 * ```ts
 * import { analyseCell } from "../analysis/analyse_cell.ts";
 * import { cellPosition, compileCell } from "./compile_cell.ts";
 * import { deepEqual } from "node:assert/strict";
 * const code = "const a = 1;\nfail(a)";
 * const compiled = compileCell(code, analyseCell(code), { notebookUrl: "file:///n.md", inputs: ["fail"] });
 * const column = compiled.source.split("\n")[2].indexOf("fail(") + 1;
 * deepEqual(cellPosition(compiled, 3, column), { lineIndex: 1, column: 1 });
 * ```
 */
export function cellPosition(
  compiled: CompiledCell,
  line: number,
  column: number,
): { lineIndex: number; column: number } | undefined {
  const lineIndex = line - 1 - compiled.lineOffset;
  if (lineIndex < 0) return undefined;
  let shift = 0;
  for (const [at, from, length] of compiled.insertions) {
    if (at === lineIndex && from + shift < column - 1) shift += length;
  }
  return { lineIndex, column: Math.max(1, column - shift) };
}

interface Edit {
  start: number;
  end: number;
  text: string;
}

/** Line and column (0-based) of an offset. */
function lineAndColumn(code: string, offset: number): [number, number] {
  const before = code.slice(0, offset);
  const line = (before.match(/\n/g) ?? []).length;
  return [line, offset - (before.lastIndexOf("\n") + 1)];
}

/**
 * Compiles one cell to module source for the sandbox.
 *
 * @param code The cell's code.
 * @param analysis Its analysis (must have no problems).
 * @param options Notebook URL, inputs, adjustable calls.
 * @returns The module source and the names it returns.
 *
 * @example
 * ```ts
 * import { analyseCell } from "../analysis/analyse_cell.ts";
 * import { compileCell } from "./compile_cell.ts";
 * import { equal, deepEqual } from "node:assert/strict";
 * const code = "import { helper } from './helpers.ts';\nconst gain = helper(tail);\ngain * 2\n";
 * const compiled = compileCell(code, analyseCell(code), {
 *   notebookUrl: "file:///home/amp/design.md",
 *   inputs: ["tail"],
 * });
 * deepEqual(compiled.names, ["helper", "gain"]);
 * equal(compiled.source.split("\n")[0].startsWith('import { helper } from "file:///home/amp/helpers.ts";'), true);
 * equal(compiled.source.split("\n")[3], ";__longtail_value = (gain * 2)");
 * // The function alone, for a module shared with other cells: the same lines.
 * equal(compiled.source.endsWith(compiled.body), true);
 * deepEqual(compiled.imports.map((i) => i.local), ["helper"]);
 * ```
 */
export function compileCell(
  code: string,
  analysis: CellAnalysis,
  options: CompileOptions,
): CompiledCell {
  const edits: Edit[] = [];
  const hoisted: string[] = [];
  const imports: HoistedImport[] = [];
  for (const declaration of analysis.imports) {
    const statement = importStatement(declaration, options.notebookUrl);
    if (statement) hoisted.push(statement);
    imports.push(...bindingStatements(declaration, options.notebookUrl));
    edits.push({ start: declaration.start, end: declaration.end, text: blank(code, declaration) });
  }
  for (const dynamic of analysis.dynamicImports) {
    const url = absoluteSpecifier(dynamic.source, options.notebookUrl);
    if (url !== dynamic.source) edits.push({ ...dynamic, text: JSON.stringify(url) });
  }
  for (const meta of analysis.importMeta) edits.push({ ...meta, text: META_NAME });
  for (const call of options.adjustables ?? []) {
    const callee = code.slice(call.calleeSpan.start, call.calleeSpan.end);
    edits.push({ ...call.calleeSpan, text: `${callee}.named(${JSON.stringify(call.name)})` });
  }
  if (analysis.lastExpression) {
    const { start, end } = analysis.lastExpression;
    edits.push({ start, end: start, text: `;${VALUE_NAME} = (` });
    edits.push({ start: end, end, text: ")" });
  }
  const body = applyEdits(code, edits);
  // Where the edits on a single line changed its length (blanked imports keep theirs).
  const insertions: Array<[number, number, number]> = [];
  for (const edit of edits) {
    const original = code.slice(edit.start, edit.end);
    if (original.includes("\n") || edit.text.length === original.length) continue;
    const [line, column] = lineAndColumn(code, edit.start);
    insertions.push([line, column, edit.text.length - original.length]);
  }
  const names = valueNames(analysis);
  const inputs = options.inputs.length > 0
    ? `const { ${options.inputs.join(", ")} } = ${INPUTS_NAME}; `
    : "";
  const fn = `async function (${INPUTS_NAME}, ${META_NAME}) { ${inputs}let ${VALUE_NAME};\n` +
    body + `\n;return { value: ${VALUE_NAME}, names: { ${names.join(", ")} } };\n}\n`;
  const source = hoisted.join(" ") + "export default " + fn;
  return { source, names, lineOffset: 1, insertions, imports, body: fn };
}

/**
 * The cell's top-level names that exist at run time (types left out), without repeats.
 *
 * @param analysis The cell's analysis.
 * @returns The names, in source order.
 *
 * @example
 * ```ts
 * import { analyseCell } from "../analysis/analyse_cell.ts";
 * import { valueNames } from "./compile_cell.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(valueNames(analyseCell("type T = number; const a: T = 1; function f() {}")), ["a", "f"]);
 * ```
 */
export function valueNames(analysis: CellAnalysis): string[] {
  const names = new Set<string>();
  for (const definition of analysis.defines) if (!definition.typeOnly) names.add(definition.name);
  return [...names];
}

/**
 * Makes a relative or absolute-path specifier a `file:` URL against the notebook's URL;
 * bare names (`longtail/lib`), `npm:`, `jsr:` and URLs stay as they are.
 *
 * @param specifier As written in the cell.
 * @param notebookUrl The notebook's URL.
 * @returns The specifier to use in compiled code.
 *
 * @example
 * ```ts
 * import { absoluteSpecifier } from "./compile_cell.ts";
 * import { equal } from "node:assert/strict";
 * equal(absoluteSpecifier("../lib/x.ts", "file:///a/b/n.md"), "file:///a/lib/x.ts");
 * equal(absoluteSpecifier("longtail/lib", "file:///a/b/n.md"), "longtail/lib");
 * ```
 */
export function absoluteSpecifier(specifier: string, notebookUrl: string): string {
  if (/^\.{1,2}\//.test(specifier) || specifier.startsWith("/")) {
    return new URL(specifier, notebookUrl).href;
  }
  return specifier;
}

function importStatement(declaration: CellImport, notebookUrl: string): string | undefined {
  const source = JSON.stringify(absoluteSpecifier(declaration.source, notebookUrl));
  const attributes = declaration.attributes ? ` ${declaration.attributes}` : "";
  if (declaration.typeOnly) return undefined;
  if (declaration.bindings.length === 0) return `import ${source}${attributes};`;
  const values = declaration.bindings.filter((binding) => !binding.typeOnly);
  if (values.length === 0) return undefined;
  const parts: string[] = [];
  const named: string[] = [];
  for (const binding of values) {
    if (binding.imported === "default") parts.unshift(binding.local);
    else if (binding.imported === "*") parts.push(`* as ${binding.local}`);
    else {
      const imported = /^[\p{L}_$][\p{L}\p{N}_$]*$/u.test(binding.imported)
        ? binding.imported
        : JSON.stringify(binding.imported);
      named.push(imported === binding.local ? imported : `${imported} as ${binding.local}`);
    }
  }
  if (named.length > 0) parts.push(`{ ${named.join(", ")} }`);
  return `import ${parts.join(", ")} from ${source}${attributes};`;
}

/** One statement per value binding (a side-effect import stays one statement). */
function bindingStatements(declaration: CellImport, notebookUrl: string): HoistedImport[] {
  if (declaration.typeOnly) return [];
  const source = JSON.stringify(absoluteSpecifier(declaration.source, notebookUrl));
  const attributes = declaration.attributes ? ` ${declaration.attributes}` : "";
  if (declaration.bindings.length === 0) {
    return [{ statement: `import ${source}${attributes};` }];
  }
  return declaration.bindings.filter((binding) => !binding.typeOnly).map((binding) => {
    const imported = /^[\p{L}_$][\p{L}\p{N}_$]*$/u.test(binding.imported)
      ? binding.imported
      : JSON.stringify(binding.imported);
    const clause = binding.imported === "default"
      ? binding.local
      : binding.imported === "*"
      ? `* as ${binding.local}`
      : `{ ${imported === binding.local ? imported : `${imported} as ${binding.local}`} }`;
    return { statement: `import ${clause} from ${source}${attributes};`, local: binding.local };
  });
}

/** Spaces in place of the code, keeping line breaks so lines stay where they were. */
function blank(code: string, span: { start: number; end: number }): string {
  return code.slice(span.start, span.end).replace(/[^\r\n]/g, " ");
}

function applyEdits(code: string, edits: Edit[]): string {
  edits.sort((a, b) => a.start - b.start || a.end - b.end);
  let out = "";
  let at = 0;
  for (const edit of edits) {
    if (edit.start < at) continue;
    out += code.slice(at, edit.start) + edit.text;
    at = edit.end;
  }
  return out + code.slice(at);
}
