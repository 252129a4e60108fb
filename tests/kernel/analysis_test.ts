/**
 * Cell analysis: every declaration form, every scoping rule, and the notebook-level
 * problems (duplicates, cycles, unknown names, writes to another cell's name, syntax).
 */
import fc from "fast-check";
import { analyseCell, buildGraph, type GraphProblem } from "../../kernel/analysis/mod.ts";
import { locateInNotebook, splitNotebook } from "../../kernel/notebook/mod.ts";
import { assert, assertEquals } from "../_assert.ts";

function defines(code: string): string[] {
  return analyseCell(code).defines.map((d) => `${d.name}:${d.kind}${d.typeOnly ? ":type" : ""}`);
}

function uses(code: string): string[] {
  const names = analyseCell(code).uses.filter((u) => !u.write).map((u) =>
    u.name + (u.typeOnly ? ":type" : "")
  );
  return [...new Set(names)];
}

Deno.test("analyseCell() finds const, let, var, function, class and destructured names", () => {
  assertEquals(defines("const a = 1, b = 2; let c; var d;"), [
    "a:const",
    "b:const",
    "c:let",
    "d:var",
  ]);
  assertEquals(defines("const { x, y: [z, ...rest], w = 3, ...others } = source;"), [
    "x:const",
    "z:const",
    "rest:const",
    "w:const",
    "others:const",
  ]);
  assertEquals(defines("const [first, , third = 1] = list;"), ["first:const", "third:const"]);
  assertEquals(defines("function f() {} async function g() {} function* h() {} class K {}"), [
    "f:function",
    "g:function",
    "h:function",
    "K:class",
  ]);
});

Deno.test("analyseCell() counts import bindings as definitions, type imports as types", () => {
  assertEquals(
    defines(
      'import d, { a, b as c, type T } from "m"; import * as ns from "./x.ts"; import "side";',
    ),
    [
      "d:import",
      "a:import",
      "c:import",
      "T:type:type",
      "ns:import",
    ],
  );
  assertEquals(defines('import type { U } from "m";'), ["U:type:type"]);
});

Deno.test("analyseCell() counts types, interfaces, enums and ambient declarations", () => {
  assertEquals(defines("type P = { a: number }; interface Q { b: P } enum E { A, B }"), [
    "P:type:type",
    "Q:interface:type",
    "E:enum",
  ]);
  assertEquals(defines("declare const external: number;"), ["external:const:type"]);
});

Deno.test("analyseCell() hoists var out of blocks and loops but keeps let, const and functions in them", () => {
  assertEquals(
    defines(
      "if (ok) { var hoisted = 1; let inner = 2; function local() {} } for (var i = 0; i < 3; i++) {}",
    ),
    [
      "hoisted:var",
      "i:var",
    ],
  );
  assertEquals(uses("if (ok) { let inner = 2; } inner"), ["ok", "inner"]);
});

Deno.test("analyseCell() resolves names through functions, parameters, blocks and catch clauses", () => {
  assertEquals(uses("function f(a, { b }, [c] = d, ...e) { return a + b + c + e + g; }"), [
    "d",
    "g",
  ]);
  assertEquals(uses("const f = (x = y) => { const z = x; return z + w; };"), ["y", "w"]);
  assertEquals(uses("try { risky(); } catch ({ message }) { report(message); }"), [
    "risky",
    "report",
  ]);
  assertEquals(uses("try { risky(); } catch (e) { } e"), ["risky", "e"]);
  assertEquals(uses("{ const local = 1; } { local; }"), ["local"]);
  assertEquals(uses("for (const item of items) { use(item); } item"), ["items", "use", "item"]);
  assertEquals(
    uses("const fact = function self(n) { return n < 2 ? 1 : n * self(n - 1); }; self"),
    ["self"],
  );
  assertEquals(
    uses("function outer() { return inner(); function inner() { return arguments.length; } }"),
    [],
  );
  assertEquals(uses("switch (k) { case 1: { let s = 1; break; } default: s }"), ["k", "s"]);
});

Deno.test("analyseCell() knows that labels, property keys and member names are not references", () => {
  assertEquals(uses("outer: for (;;) { break outer; }"), []);
  assertEquals(
    uses(
      "const o = { gain: 1, [key]: 2, 'q': 3, short, method() { return this.gain; } }; o.gain.toFixed(2)",
    ),
    [
      "key",
      "short",
    ],
  );
  assertEquals(
    uses(
      "class K extends Base { field = value; static s = K; #hidden = 1; [computed]() {} get g() { return this.#hidden; } }",
    ),
    [
      "Base",
      "value",
      "computed",
    ],
  );
  assertEquals(uses("const { a: renamed } = source; renamed; a"), ["source", "a"]);
  assertEquals(uses("import.meta.url; new.target"), []);
});

Deno.test("analyseCell() tells type uses from value uses", () => {
  assertEquals(uses("const x: Stage = build(); let y = x as Pair; type L<T> = T[];"), [
    "Stage:type",
    "build",
    "Pair:type",
  ]);
  assertEquals(uses("function f<T extends Base>(t: T): T { return t; }"), ["Base:type"]);
  assertEquals(uses("const n: typeof other = 1;"), ["other:type"]);
  assertEquals(uses("const v = (w satisfies Shape);"), ["w", "Shape:type"]);
});

Deno.test("analyseCell() marks writes to free names and finds the shown value", () => {
  const analysis = analyseCell(
    "a = 1; b += 2; c++; [d, e] = pair; ({ f } = obj); obj.field = 3;\ntotal * 2",
  );
  assertEquals(analysis.uses.filter((u) => u.write).map((u) => u.name), [
    "a",
    "b",
    "c",
    "d",
    "e",
    "f",
  ]);
  const code = "const a = 1;\ntotal * 2";
  const last = analyseCell(code).lastExpression!;
  assertEquals(code.slice(last.start, last.end), "total * 2");
  assertEquals(analyseCell("const a = 1;").lastExpression, undefined);
});

Deno.test("analyseCell() reports syntax errors and export statements as problems", () => {
  const syntax = analyseCell("const a = ;");
  assertEquals(syntax.problems.map((p) => p.kind), ["syntax"]);
  assertEquals(syntax.problems[0].offset, 10); // exact: the offset of ';'
  assertEquals(analyseCell("let x = 1; let x = 2;").problems.map((p) => p.kind), ["syntax"]);
  assertEquals(analyseCell("export const a = 1;").problems.map((p) => p.kind), ["export"]);
});

Deno.test("analyseCell() never throws on generated TypeScript-like text", () => {
  const token = fc.constantFrom(
    "const ",
    "let ",
    "a",
    "b",
    " = ",
    "1",
    ";",
    "\n",
    "(",
    ")",
    "{",
    "}",
    "=>",
    "function ",
    "class ",
    "import ",
    "from ",
    '"m"',
    "[",
    "]",
    ".",
    ":",
    "number",
    "await ",
  );
  fc.assert(
    fc.property(fc.array(token, { maxLength: 40 }), (tokens) => {
      const analysis = analyseCell(tokens.join(""));
      assert.ok(Array.isArray(analysis.defines) && Array.isArray(analysis.problems));
    }),
    { numRuns: 300 },
  );
});

function graphOf(codes: string[]) {
  return buildGraph(codes.map((code, i) => ({ id: `c${i + 1}`, analysis: analyseCell(code) })));
}

function problems(codes: string[]): Array<[string, GraphProblem["kind"], string]> {
  return graphOf(codes).cells.flatMap((cell) =>
    cell.problems.map((p) => [cell.id, p.kind, p.message] as [string, GraphProblem["kind"], string])
  );
}

Deno.test("buildGraph() orders cells by dependency, not by document order", () => {
  const graph = graphOf([
    "const total = a + b;",
    "const b = a * 2;",
    "const a = 1;",
    "Math.sqrt(total)",
  ]);
  assertEquals(graph.order, ["c3", "c2", "c1", "c4"]);
  assertEquals(graph.byId.get("c1")!.inputs, [{ name: "a", from: "c3" }, {
    name: "b",
    from: "c2",
  }]);
  assertEquals(graph.byId.get("c4")!.dependencies, ["c1"]);
});

Deno.test("buildGraph() reports a name defined by two cells on both cells", () => {
  const found = problems(["const gain = 1;", "const other = 2;", "function gain() {}"]);
  assertEquals(found.map(([id, kind]) => `${id}:${kind}`), ["c1:duplicate", "c3:duplicate"]);
  assert.match(found[0][2], /`gain` is defined by both cell 1 and cell 3/);
});

Deno.test("buildGraph() allows the same import in several cells but not a clash with a definition", () => {
  assertEquals(problems(['import { a } from "m";', 'import { a } from "m";', "a"]), []);
  assertEquals(
    problems(['import { a } from "m";', 'import { a } from "other";']).map(([, kind]) => kind),
    [
      "duplicate",
      "duplicate",
    ],
  );
});

Deno.test("buildGraph() lists the cells of a cycle and the names that close it", () => {
  const graph = graphOf([
    "const a = c + 1;",
    "const b = a + 1;",
    "const c = b + 1;",
    "const d = 4;",
  ]);
  assertEquals(graph.cycles, [["c1", "c2", "c3"]]);
  const message = graph.byId.get("c2")!.problems[0].message;
  assert.match(message, /circle/);
  assert.match(
    message,
    /cell 1 uses `c` from cell 3; cell 2 uses `a` from cell 1; cell 3 uses `b` from cell 2/,
  );
  assertEquals(graph.byId.get("c4")!.problems, []);
});

Deno.test("buildGraph() suggests the closest defined name for an unknown one, and ignores globals", () => {
  const found = problems([
    "const tailCurrent = 1e-3;",
    "tailCurent * 2 + Math.PI + Number.EPSILON + console.log.length",
  ]);
  assertEquals(found.length, 1); // exact: only the misspelt name
  assertEquals(found[0][2], "`tailCurent` is not defined by any cell; did you mean `tailCurrent`?");
  assertEquals(problems(["unknownTypeOnly as unknown as Missing"]).map(([, kind]) => kind), [
    "undefined",
  ]);
  assertEquals(problems(["const x: MissingType = 1;"]), []);
});

Deno.test("buildGraph() forbids assigning another cell's name but allows mutating its object's fields", () => {
  const found = problems([
    "let gain = 1; const stage = { gain: 1 };",
    "gain = 2;",
    "stage.gain = 3;",
  ]);
  assertEquals(found.map(([id, kind]) => `${id}:${kind}`), ["c2:assignment"]);
  assert.match(found[0][2], /`gain` belongs to cell 1; a cell may not assign another cell's name/);
});

Deno.test("buildGraph() treats a global name defined by a cell as that cell's (it shadows the global)", () => {
  assertEquals(graphOf(["const name = 'amp';", "name.length"]).byId.get("c2")!.dependencies, [
    "c1",
  ]);
});

Deno.test("buildGraph() keeps type-only uses out of the run order", () => {
  const graph = graphOf(["const stage: Stage = { gain: 1 };", "interface Stage { gain: number }"]);
  assertEquals(graph.byId.get("c1")!.dependencies, []);
  assertEquals(graph.byId.get("c1")!.typeInputs, [{ name: "Stage", from: "c2" }]);
});

Deno.test("problems are placed at notebook line and column, also inside lists", () => {
  const F = "```";
  const text =
    `# T\n\n${F}ts\nconst gain = 1;\n${F}\n\n- item\n\n  ${F}ts\n  const y = 2;\n  gian + y\n  ${F}\n`;
  const notebook = splitNotebook(text);
  const graph = buildGraph(
    notebook.cells.map((cell) => ({ id: `c${cell.index}`, analysis: analyseCell(cell.code) })),
  );
  const problem = graph.byId.get("c1")!.problems[0];
  const cell = notebook.cells[1];
  assertEquals(locateInNotebook(cell.code, problem.offset!, cell), { line: 11, column: 3 });
  assert.match(problem.message, /did you mean `gain`/);
});
