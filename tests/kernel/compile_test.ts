/**
 * Compiling cells: the module the sandbox runs, and the modules the type check sees.
 */
import { analyseCell, buildGraph } from "../../kernel/analysis/mod.ts";
import { compileCell, typeCheckNotebooks } from "../../kernel/compile/mod.ts";
import { splitNotebook } from "../../kernel/notebook/mod.ts";
import { assert, assertEquals } from "../_assert.ts";

type CellModule = {
  default: (
    inputs: Record<string, unknown>,
    meta: Record<string, unknown>,
  ) => Promise<{ value: unknown; names: Record<string, unknown> }>;
};

async function load(source: string): Promise<CellModule> {
  return await import("data:application/typescript," + encodeURIComponent(source));
}

Deno.test("compileCell() returns the cell's names and its last expression, with inputs passed in", async () => {
  const code =
    "const gm = tail / 0.052;\nfunction twice(x: number) { return 2 * x; }\nclass Stage {}\nawait Promise.resolve();\ntwice(gm)\n";
  const compiled = compileCell(code, analyseCell(code), {
    notebookUrl: "file:///amp/design.md",
    inputs: ["tail"],
  });
  assertEquals(compiled.names, ["gm", "twice", "Stage"]);
  const module = await load(compiled.source);
  const { value, names } = await module.default({ tail: 0.0052 }, {});
  assertEquals(value, 0.2); // closed form: 2 · 5.2 mA / 52 mV
  assertEquals(names.gm, 0.1); // closed form: 5.2 mA / 52 mV
  assertEquals(typeof names.Stage, "function");
});

Deno.test("compileCell() keeps the cell's lines where they were, so errors map back", async () => {
  const code = "const a = 1;\n\nconst b = (undefined as unknown as { x: number }).x;\n";
  const compiled = compileCell(code, analyseCell(code), {
    notebookUrl: "file:///n.md",
    inputs: [],
  });
  const lines = compiled.source.split("\n");
  assertEquals(lines[compiled.lineOffset + 2], code.split("\n")[2]);
  const error = await (await load(compiled.source)).default({}, {}).then(
    () => undefined,
    (e) => e as Error,
  );
  const frame = /:(\d+):(\d+)\)?$/m.exec(error!.stack!.split("\n")[1]);
  assertEquals(Number(frame![1]) - compiled.lineOffset, 3); // exact: the cell's third line
});

Deno.test("compileCell() hoists imports, drops type-only ones and makes relative specifiers absolute", () => {
  const code = [
    'import { a, type T } from "./local.ts";',
    'import type { U } from "m";',
    'import d, * as ns from "../up.ts";',
    'import data from "./data.json" with { type: "json" };',
    'const later = await import("./lazy.ts");',
    "const url = import.meta.url;",
  ].join("\n");
  const compiled = compileCell(code, analyseCell(code), {
    notebookUrl: "file:///home/amp/notes/design.md",
    inputs: [],
  });
  const head = compiled.source.split("\n")[0];
  assert.ok(head.includes('import { a } from "file:///home/amp/notes/local.ts";'));
  assert.ok(head.includes('import d, * as ns from "file:///home/amp/up.ts";'));
  assert.ok(
    head.includes('import data from "file:///home/amp/notes/data.json" with { type: "json" };'),
  );
  assert.ok(!head.includes('"m"'), "a type-only import is erased");
  assert.ok(compiled.source.includes('await import("file:///home/amp/notes/lazy.ts")'));
  assert.ok(compiled.source.includes("const url = __longtail_meta.url;"));
  assertEquals(compiled.names, ["a", "d", "ns", "data", "later", "url"]);
});

Deno.test("compileCell() tells the adjustable helper the name it is bound to", () => {
  const code = 'const tail = adjustable(2e-3, { unit: "A" });';
  const analysis = analyseCell(code);
  const compiled = compileCell(code, analysis, {
    notebookUrl: "file:///n.md",
    inputs: ["adjustable"],
    adjustables: analysis.calls,
  });
  assert.ok(
    compiled.source.includes('const tail = adjustable.named("tail")(2e-3, { unit: "A" });'),
  );
});

Deno.test("typeCheckNotebooks() places errors at notebook lines and columns, also in list cells", async () => {
  const F = "```";
  const path = "/tmp/longtail-typed/design.md";
  const text =
    `# Typed\n\n${F}ts\nconst gain: number = 10;\ninterface Stage { gain: number }\n${F}\n\n- a list\n\n  ${F}ts\n  const stage: Stage = { gain };\n  const label: string = gain;\n  ${F}\n`;
  const notebook = splitNotebook(text);
  const cells = notebook.cells.map((cell) => ({
    id: `c${cell.index + 1}`,
    index: cell.index,
    code: cell.code,
    analysis: analyseCell(cell.code),
    codeLine: cell.codeLine,
    columnOffsets: cell.columnOffsets,
    fenceLine: cell.startLine + 1,
  }));
  const graph = buildGraph(cells.map((cell) => ({ id: cell.id, analysis: cell.analysis })));
  const result = await typeCheckNotebooks([{ path, cells, graph }]);
  assertEquals(result.problems.map((p) => [p.line, p.column]), [[12, 9]]); // exact: `label` on line 12, column 9
  assert.match(
    result.problems[0].message,
    /^TS2322: Type 'number' is not assignable to type 'string'/,
  );
  assertEquals(result.problems[0].path, path);
});
