/**
 * Analysing one cell: parse it with oxc-parser, then find the names it defines, the names
 * it uses from elsewhere, its imports, and its last expression (its shown value).
 *
 * Needs `--allow-ffi` (oxc-parser is a native module).
 *
 * @module
 */
import { parseSync } from "oxc-parser";
import { type AstNode, type FreeReference, type TopLevelName, walkScopes } from "./_scope.ts";
import { nestingProblem } from "./parse_guard.ts";

export type { DeclarationKind, FreeReference, TopLevelName } from "./_scope.ts";

/** One imported binding. */
export interface ImportBinding {
  /** Local name in the cell. */
  local: string;
  /** Imported name: an export name, `"default"`, or `"*"` for a namespace import. */
  imported: string;
  /** True for `import type` / `import { type X }`. */
  typeOnly: boolean;
}

/** An `import` declaration of the cell. */
export interface CellImport {
  /** The module specifier as written. */
  source: string;
  /** Offsets of the declaration in the cell's code. */
  start: number;
  /** End offset (exclusive). */
  end: number;
  /** Offsets of the specifier's string literal (quotes included). */
  sourceStart: number;
  /** End offset of the string literal (exclusive). */
  sourceEnd: number;
  /** The bindings; empty for a side-effect import. */
  bindings: ImportBinding[];
  /** True for `import type …` (erased at run time). */
  typeOnly: boolean;
  /** The `with { … }` clause as written, or "". */
  attributes: string;
}

/** A span of the cell's code. */
export interface CodeSpan {
  /** Start offset (UTF-16 units). */
  start: number;
  /** End offset (exclusive). */
  end: number;
}

/** A top-level `const name = helper(…)` call, a candidate adjustable-value declaration. */
export interface CallDeclaration {
  /** The declared name. */
  name: string;
  /** The called identifier. */
  callee: string;
  /** Where the callee is written. */
  calleeSpan: CodeSpan;
}

/** A problem found in one cell on its own. */
export interface CellProblem {
  /** What kind of problem. */
  kind: "syntax" | "export";
  /** One sentence. */
  message: string;
  /** Offset in the cell's code. */
  offset: number;
}

/** Everything the kernel needs to know about one cell's code. */
export interface CellAnalysis {
  /** Top-level names, in source order. */
  defines: TopLevelName[];
  /** Names used but not declared by the cell (every occurrence, in source order). */
  uses: FreeReference[];
  /** Import declarations. */
  imports: CellImport[];
  /** String-literal arguments of `import("…")`, to rewrite relative specifiers. */
  dynamicImports: Array<CodeSpan & { source: string }>;
  /** Each `import.meta`. */
  importMeta: CodeSpan[];
  /** The last statement, when it is an expression statement: the cell's shown value. */
  lastExpression?: CodeSpan;
  /** Top-level `const x = f(…)` declarations. */
  calls: CallDeclaration[];
  /** Problems (syntax errors, `export`). */
  problems: CellProblem[];
}

/**
 * Analyses a cell's code.
 *
 * @param code TypeScript source of one cell.
 * @returns The analysis; syntax errors are reported in `problems`, never thrown.
 *
 * @example Definitions, free names and the shown value
 * ```ts
 * import { analyseCell } from "./analyse_cell.ts";
 * import { deepEqual, equal } from "node:assert/strict";
 * const code = "const { gm, re: [r1] } = pair;\nfunction twice(x: number) { return 2 * x; }\ntwice(gm) + tail";
 * const analysis = analyseCell(code);
 * deepEqual(analysis.defines.map((d) => d.name), ["gm", "r1", "twice"]);
 * deepEqual(analysis.uses.map((u) => u.name), ["pair", "tail"]);
 * equal(code.slice(analysis.lastExpression!.start, analysis.lastExpression!.end), "twice(gm) + tail");
 * ```
 */
export function analyseCell(code: string): CellAnalysis {
  // Nesting past the native parser's stack aborts the whole process: rule that out first.
  const tooDeep = nestingProblem(code);
  if (tooDeep) {
    return {
      defines: [],
      uses: [],
      imports: [],
      dynamicImports: [],
      importMeta: [],
      calls: [],
      problems: [tooDeep],
    };
  }
  const parsed = parseSync("cell.ts", code, {
    sourceType: "module",
    lang: "ts",
    showSemanticErrors: true,
  });
  const problems: CellProblem[] = [];
  for (const error of parsed.errors) {
    problems.push({
      kind: "syntax",
      message: error.message.replace(/\.$/, ""),
      offset: error.labels?.[0]?.start ?? 0,
    });
  }
  const empty: CellAnalysis = {
    defines: [],
    uses: [],
    imports: [],
    dynamicImports: [],
    importMeta: [],
    calls: [],
    problems,
  };
  if (problems.length > 0) return empty;
  const program = parsed.program as unknown as AstNode;
  const { declared, free } = walkScopes(program);
  const analysis: CellAnalysis = { ...empty, defines: declared, uses: free };
  for (const statement of program.body as AstNode[]) {
    if (statement.type === "ImportDeclaration") {
      analysis.imports.push(importOf(statement, code));
    } else if (/^Export/.test(statement.type) || statement.type === "TSExportAssignment") {
      problems.push({
        kind: "export",
        message:
          "Remove `export`: every top-level name of a cell is already shared with the other cells",
        offset: statement.start,
      });
    } else if (statement.type === "VariableDeclaration" && statement.kind === "const") {
      for (const declarator of statement.declarations) {
        const init = unwrap(declarator.init);
        if (
          declarator.id.type === "Identifier" && init?.type === "CallExpression" &&
          init.callee.type === "Identifier"
        ) {
          analysis.calls.push({
            name: declarator.id.name,
            callee: init.callee.name,
            calleeSpan: { start: init.callee.start, end: init.callee.end },
          });
        }
      }
    }
  }
  const last = program.body[program.body.length - 1] as AstNode | undefined;
  if (last?.type === "ExpressionStatement" && !last.directive) {
    analysis.lastExpression = { start: last.expression.start, end: last.expression.end };
  }
  visit(program, (node) => {
    if (node.type === "MetaProperty" && node.meta?.name === "import") {
      analysis.importMeta.push({ start: node.start, end: node.end });
    } else if (
      node.type === "ImportExpression" && node.source?.type === "Literal" &&
      typeof node.source.value === "string"
    ) {
      analysis.dynamicImports.push({
        start: node.source.start,
        end: node.source.end,
        source: node.source.value,
      });
    }
  });
  return analysis;
}

function importOf(node: AstNode, code: string): CellImport {
  const bindings: ImportBinding[] = [];
  for (const specifier of node.specifiers ?? []) {
    const typeOnly = node.importKind === "type" || specifier.importKind === "type";
    const imported = specifier.type === "ImportDefaultSpecifier"
      ? "default"
      : specifier.type === "ImportNamespaceSpecifier"
      ? "*"
      : specifier.imported.type === "Identifier"
      ? specifier.imported.name
      : String(specifier.imported.value);
    bindings.push({ local: specifier.local.name, imported, typeOnly });
  }
  const attributes = (node.attributes ?? []).length > 0
    ? code.slice(node.source.end, node.end).replace(/;\s*$/, "").trim()
    : "";
  return {
    source: node.source.value,
    start: node.start,
    end: node.end,
    sourceStart: node.source.start,
    sourceEnd: node.source.end,
    bindings,
    typeOnly: node.importKind === "type",
    attributes,
  };
}

function unwrap(node: AstNode | null | undefined): AstNode | null | undefined {
  let current = node;
  while (
    current && (current.type === "ParenthesizedExpression" || current.type === "TSAsExpression" ||
      current.type === "TSSatisfiesExpression" || current.type === "TSNonNullExpression")
  ) current = current.expression;
  return current;
}

/** Calls `fn` on every node of the tree, depth first. */
function visit(node: AstNode, fn: (node: AstNode) => void): void {
  const stack: AstNode[] = [node];
  while (stack.length > 0) {
    const current = stack.pop()!;
    fn(current);
    for (const key in current) {
      if (key === "type" || key === "start" || key === "end") continue;
      const value = current[key];
      if (value === null || typeof value !== "object") continue;
      if (Array.isArray(value)) {
        for (const child of value) if (child && typeof child.type === "string") stack.push(child);
      } else if (typeof value.type === "string") stack.push(value);
    }
  }
}
