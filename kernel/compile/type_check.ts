/**
 * Type-checking notebooks: every cell of every notebook becomes a module file in one
 * temporary folder (see check_module.ts), one `deno check` looks at them all, and each
 * error is placed back at its notebook line.
 *
 *     /tmp/longtail-check-XXXX/
 *       n1/cell_1.ts  n1/cell_2.ts …     ← first notebook
 *       n2/cell_1.ts …                   ← second notebook
 *
 * Cells that cannot run (their analysis found problems) are left out, with every cell
 * that needs them, so a broken cell is reported once, by the analysis.
 *
 * @module
 */
import type { CellAnalysis } from "../analysis/analyse_cell.ts";
import type { NotebookGraph } from "../analysis/graph.ts";
import { fileUrlFromPath, joinPath, pathFromFileUrl, ROOT_DIR } from "../_paths.ts";
import { checkModule } from "./check_module.ts";

/** One cell to check. */
export interface TypeCheckCell {
  /** Cell id (as in the graph). */
  id: string;
  /** Position, 0-based. */
  index: number;
  /** Code. */
  code: string;
  /** Analysis. */
  analysis: CellAnalysis;
  /** Notebook line (1-based) of the first code line. */
  codeLine: number;
  /** Columns the container indentation took off each code line. */
  columnOffsets: number[];
  /** Notebook line (1-based) of the opening fence. */
  fenceLine: number;
}

/** One notebook to check. */
export interface TypeCheckTarget {
  /** Absolute path of the notebook. */
  path: string;
  /** Its cells in document order. */
  cells: TypeCheckCell[];
  /** Its graph. */
  graph: NotebookGraph;
}

/** A type error placed in a notebook (or in a module it imports). */
export interface TypeProblem {
  /** The notebook's path (or the imported module's). */
  path: string;
  /** 1-based line. */
  line: number;
  /** 1-based column. */
  column: number;
  /** The checker's message, e.g. `TS2322: Type 'string' is not assignable to type 'number'.` */
  message: string;
}

/** Options for {@linkcode typeCheckNotebooks}. */
export interface TypeCheckOptions {
  /**
   * The longtail checkout (its deno.json maps `longtail/lib`).
   * @default {the checkout this code runs from}
   */
  rootDir?: string;
}

/** What the type check found. */
export interface TypeCheckResult {
  /** Problems, in the order the checker printed them. */
  problems: TypeProblem[];
  /** Output the checker printed that could not be placed (empty normally). */
  unplaced: string[];
  /** Milliseconds the check took. */
  ms: number;
}

/**
 * Type-checks notebooks in one batch.
 *
 * @param targets The notebooks.
 * @param options The checkout to check against.
 * @returns The problems placed at notebook lines.
 *
 * @example A string where a number belongs, in the notebook's third line
 * ```ts
 * import { analyseCell } from "../analysis/analyse_cell.ts";
 * import { buildGraph } from "../analysis/graph.ts";
 * import { typeCheckNotebooks } from "./type_check.ts";
 * import { equal } from "node:assert/strict";
 * const code = "const gain: number = 10;\nconst label: string = gain;\n";
 * const cell = { id: "c1", index: 0, code, analysis: analyseCell(code), codeLine: 2, columnOffsets: [], fenceLine: 1 };
 * const graph = buildGraph([{ id: "c1", analysis: cell.analysis }]);
 * const result = await typeCheckNotebooks([{ path: "/tmp/amp.md", cells: [cell], graph }]);
 * equal(result.problems[0].line, 3);
 * ```
 */
export async function typeCheckNotebooks(
  targets: readonly TypeCheckTarget[],
  options: TypeCheckOptions = {},
): Promise<TypeCheckResult> {
  const started = performance.now();
  const root = options.rootDir ?? ROOT_DIR;
  const folder = await Deno.makeTempDir({ prefix: "longtail-check-" });
  try {
    const files: string[] = [];
    const placeOf = new Map<string, { target: TypeCheckTarget; cell: TypeCheckCell }>();
    for (const [n, target] of targets.entries()) {
      const dir = joinPath(folder, `n${n + 1}`);
      await Deno.mkdir(dir);
      const modules = checkModules(target);
      for (const [cell, source] of modules) {
        const file = joinPath(dir, fileName(cell));
        await Deno.writeTextFile(file, source);
        files.push(file);
        placeOf.set(fileUrlFromPath(file), { target, cell });
      }
    }
    if (files.length === 0) return { problems: [], unplaced: [], ms: performance.now() - started };
    const output = await new Deno.Command(Deno.execPath(), {
      args: ["check", "--quiet", "--config", joinPath(root, "deno.json"), ...files],
      env: { NO_COLOR: "1", DENO_NO_UPDATE_CHECK: "1" },
      stdout: "piped",
      stderr: "piped",
    }).output();
    const text = new TextDecoder().decode(output.stdout) + new TextDecoder().decode(output.stderr);
    const { problems, unplaced } = parseCheckOutput(text, placeOf);
    if (!output.success && problems.length === 0 && unplaced.length === 0) {
      unplaced.push(text.trim() || `deno check exited with code ${output.code}`);
    }
    return { problems, unplaced, ms: performance.now() - started };
  } finally {
    await Deno.remove(folder, { recursive: true }).catch(() => {});
  }
}

function fileName(cell: TypeCheckCell): string {
  return `cell_${cell.index + 1}.ts`;
}

/** The check module of each cell that can be checked. */
function checkModules(target: TypeCheckTarget): Map<TypeCheckCell, string> {
  const { graph } = target;
  const byId = new Map(target.cells.map((cell) => [cell.id, cell]));
  // Cells with problems, and everything that imports from them (values or types).
  const skipped = new Set<string>();
  for (const id of graph.order) {
    const node = graph.byId.get(id)!;
    if (
      node.problems.length > 0 ||
      [...node.inputs, ...node.typeInputs].some((input) => skipped.has(input.from))
    ) skipped.add(id);
  }
  // Cycles put dependents before providers in `order`; one more pass catches them.
  for (const id of graph.order) {
    const node = graph.byId.get(id)!;
    if ([...node.inputs, ...node.typeInputs].some((input) => skipped.has(input.from))) {
      skipped.add(id);
    }
  }
  const values = new Map<string, Set<string>>();
  const types = new Map<string, Set<string>>();
  for (const node of graph.cells) {
    for (const input of node.inputs) {
      if (!values.has(input.from)) values.set(input.from, new Set());
      values.get(input.from)!.add(input.name);
    }
    for (const input of node.typeInputs) {
      if (!types.has(input.from)) types.set(input.from, new Set());
      types.get(input.from)!.add(input.name);
    }
  }
  const modules = new Map<TypeCheckCell, string>();
  for (const cell of target.cells) {
    if (skipped.has(cell.id)) continue;
    const node = graph.byId.get(cell.id)!;
    const exportValues = [...(values.get(cell.id) ?? [])];
    const exportTypes = [...(types.get(cell.id) ?? [])].filter((name) =>
      !exportValues.includes(name)
    );
    modules.set(
      cell,
      checkModule(cell.code, cell.analysis, {
        notebookUrl: fileUrlFromPath(target.path),
        inputs: node.inputs,
        typeInputs: node.typeInputs,
        fileOf: (id) => `./${fileName(byId.get(id)!)}`,
        exportValues,
        exportTypes,
      }),
    );
  }
  return modules;
}

/** Reads `deno check` output: a header line with the code and message, …, `at URL:line:column`. */
function parseCheckOutput(
  text: string,
  placeOf: Map<string, { target: TypeCheckTarget; cell: TypeCheckCell }>,
): { problems: TypeProblem[]; unplaced: string[] } {
  const problems: TypeProblem[] = [];
  const unplaced: string[] = [];
  const lines = text.split(/\r?\n/);
  let header: string | undefined;
  let body: string[] = [];
  for (const line of lines) {
    const start = /^(?:error: )?(TS\d+) \[ERROR\]: (.*)$/.exec(line) ?? /^error: (.*)$/.exec(line);
    const at = /^\s+at (\S+):(\d+):(\d+)\s*$/.exec(line);
    if (start && !/^error: Type checking failed/.test(line)) {
      header = start.length === 3 ? `${start[1]}: ${start[2]}` : start[1];
      body = [];
    } else if (at && header !== undefined) {
      // The last two body lines are the source excerpt and the caret under it.
      const detail = body.length >= 2 ? body.slice(0, -2) : [];
      const message = [header, ...detail.map((l) => l.trim()).filter((l) => l !== "")].join(" ");
      problems.push(place(at[1], Number(at[2]), Number(at[3]), message, placeOf));
      header = undefined;
    } else if (header !== undefined) {
      body.push(line);
    } else if (/^error:/.test(line) && !/Type checking failed/.test(line)) {
      unplaced.push(line);
    }
  }
  return { problems, unplaced };
}

function place(
  url: string,
  line: number,
  column: number,
  message: string,
  placeOf: Map<string, { target: TypeCheckTarget; cell: TypeCheckCell }>,
): TypeProblem {
  const found = placeOf.get(url);
  if (!found) {
    const path = url.startsWith("file:") ? pathFromFileUrl(url) : url;
    return { path, line, column, message };
  }
  const { target, cell } = found;
  // Module line 1 holds the generated imports; line n + 1 is the cell's line n.
  const lineIndex = line - 2;
  const codeLines = cell.code.split("\n").length;
  if (lineIndex < 0 || lineIndex >= codeLines) {
    return { path: target.path, line: cell.fenceLine, column: 1, message };
  }
  return {
    path: target.path,
    line: cell.codeLine + lineIndex,
    column: column + (cell.columnOffsets[lineIndex] ?? 0),
    message,
  };
}
