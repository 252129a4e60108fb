/**
 * Fuzzing the cell analysis and the dependency graph with generated TypeScript.
 *
 * - Cells built from statements of every declaration form: the analysis finds exactly the
 *   names they define, read, write and use as types, and the shown value.
 * - The same cells with a breaking token spliced in anywhere, and arbitrary text: the
 *   analysis never throws; it reports syntax problems inside the cell's code.
 * - Notebooks of random cells over a small pool of names: the graph never throws, its
 *   cycles are exactly the groups of cells that reach each other (checked against a plain
 *   reachability search), and its order puts every dependency first outside cycles.
 *
 * @module
 */
import fc from "fast-check";
import { analyseCell } from "../../kernel/analysis/analyse_cell.ts";
import { isGlobalName } from "../../kernel/analysis/globals.ts";
import { buildGraph } from "../../kernel/analysis/graph.ts";
import { assert, assertEquals } from "../_assert.ts";
import { fuzzParameters } from "./_fuzz.ts";
import { BREAKING_TOKENS, generatedCell } from "./_typescript_arbitraries.ts";

const PROBLEM_KINDS = new Set(["syntax", "export"]);
const GRAPH_PROBLEM_KINDS = new Set([
  "syntax",
  "export",
  "duplicate",
  "undefined",
  "assignment",
  "cycle",
]);

Deno.test("analyseCell() finds the names every declaration form defines and uses", () => {
  fc.assert(
    fc.property(generatedCell(), (cell) => {
      const analysis = analyseCell(cell.code);
      assertEquals(analysis.problems, [], `no problems in\n${cell.code}`);
      assertEquals(
        analysis.defines.map((d) => ({ name: d.name, typeOnly: d.typeOnly })),
        cell.defines,
        `definitions of\n${cell.code}`,
      );
      // Globals (Math, console, Deno) are free too; the graph, not the analysis, drops them.
      const reads = new Set(
        analysis.uses.filter((u) => !u.write && !u.typeOnly && !isGlobalName(u.name)).map((u) =>
          u.name
        ),
      );
      const writes = new Set(analysis.uses.filter((u) => u.write).map((u) => u.name));
      const types = new Set(analysis.uses.filter((u) => u.typeOnly).map((u) => u.name));
      assertEquals(reads, cell.uses, `reads of\n${cell.code}`);
      assertEquals(writes, cell.writes, `writes of\n${cell.code}`);
      assertEquals(types, cell.typeUses, `type uses of\n${cell.code}`);
      for (const use of analysis.uses) {
        assert.equal(
          cell.code.slice(use.start, use.start + use.name.length),
          use.name,
          "offsets point at the name",
        );
      }
      const last = analysis.lastExpression;
      assertEquals(last && cell.code.slice(last.start, last.end), cell.lastExpression);
    }),
    fuzzParameters(300),
  );
});

Deno.test("analyseCell() reports broken code as syntax problems and never throws", () => {
  fc.assert(
    fc.property(
      generatedCell(),
      fc.array(fc.tuple(fc.nat(), fc.constantFrom(...BREAKING_TOKENS)), {
        minLength: 1,
        maxLength: 3,
      }),
      (cell, insertions) => {
        let code = cell.code;
        for (const [at, token] of insertions) {
          const offset = at % (code.length + 1);
          code = code.slice(0, offset) + token + code.slice(offset);
        }
        const analysis = analyseCell(code);
        for (const problem of analysis.problems) {
          assert.ok(PROBLEM_KINDS.has(problem.kind), problem.kind);
          assert.ok(
            problem.offset >= 0 && problem.offset <= code.length,
            "the problem is inside the cell",
          );
          assert.ok(problem.message.length > 0);
        }
        if (analysis.problems.some((problem) => problem.kind === "syntax")) {
          assertEquals(analysis.defines, [], "a cell that does not parse defines nothing");
        }
      },
    ),
    fuzzParameters(300),
  );
});

Deno.test("analyseCell() survives arbitrary text, including NUL and lone surrogates", () => {
  fc.assert(
    fc.property(fc.string({ unit: "binary", maxLength: 200 }), (code) => {
      const analysis = analyseCell(code);
      for (const problem of analysis.problems) {
        assert.ok(problem.offset >= 0 && problem.offset <= code.length);
      }
    }),
    fuzzParameters(300),
  );
});

/** A small notebook: each cell defines some names of the pool and uses others. */
const POOL = ["n0", "n1", "n2", "n3", "n4", "n5", "n6", "n7"];
const randomNotebook = fc.array(
  fc.record({
    defines: fc.uniqueArray(fc.constantFrom(...POOL), { maxLength: 2 }),
    uses: fc.uniqueArray(fc.constantFrom(...POOL, "Math", "nowhere"), { maxLength: 3 }),
  }),
  { maxLength: 12 },
);

function cellCode(cell: { defines: string[]; uses: string[] }): string {
  const list = `[${cell.uses.join(", ")}].length`;
  if (cell.defines.length === 0) return list;
  const own = new Set(cell.defines);
  // Uses of the cell's own names stay inside it; the first declaration carries the others.
  const foreign = cell.uses.filter((name) => !own.has(name));
  return cell.defines.map((name, i) =>
    `const ${name} = ${i === 0 ? `[${foreign.join(", ")}].length` : "0"};`
  ).join("\n");
}

/** Strongly connected groups by brute force: i and j together when each reaches the other. */
function mutualGroups(edges: Map<string, string[]>, ids: string[]): string[][] {
  const reach = new Map<string, Set<string>>();
  for (const id of ids) {
    const seen = new Set<string>();
    const stack = [...(edges.get(id) ?? [])];
    while (stack.length > 0) {
      const next = stack.pop()!;
      if (seen.has(next)) continue;
      seen.add(next);
      stack.push(...(edges.get(next) ?? []));
    }
    reach.set(id, seen);
  }
  const groups: string[][] = [];
  const placed = new Set<string>();
  for (const id of ids) {
    if (placed.has(id)) continue;
    const group = ids.filter((other) =>
      other === id || (reach.get(id)!.has(other) && reach.get(other)!.has(id))
    );
    for (const member of group) placed.add(member);
    if (group.length > 1) groups.push(group);
  }
  return groups;
}

Deno.test("buildGraph() finds every cycle, duplicate and unknown name, and orders the rest", () => {
  fc.assert(
    fc.property(randomNotebook, (cells) => {
      const ids = cells.map((_, i) => `c${i}`);
      const graph = buildGraph(
        cells.map((cell, i) => ({ id: ids[i], analysis: analyseCell(cellCode(cell)) })),
      );
      // Who defines what: the first cell to define a name owns it.
      const owner = new Map<string, string>();
      cells.forEach((cell, i) =>
        cell.defines.forEach((name) => owner.has(name) || owner.set(name, ids[i]))
      );
      const edges = new Map<string, string[]>();
      cells.forEach((cell, i) => {
        const node = graph.byId.get(ids[i])!;
        const expected = new Set(
          cell.uses.filter((name) => !cell.defines.includes(name)).map((name) => owner.get(name))
            .filter((from): from is string => from !== undefined && from !== ids[i]),
        );
        assertEquals(new Set(node.dependencies), expected, `dependencies of ${ids[i]}`);
        edges.set(ids[i], node.dependencies);
        for (const problem of node.problems) {
          assert.ok(GRAPH_PROBLEM_KINDS.has(problem.kind), problem.kind);
        }
        if (cell.uses.includes("nowhere")) {
          assert.ok(
            node.problems.some((p) => p.kind === "undefined" && p.message.includes("`nowhere`")),
          );
        }
        for (const name of cell.defines) {
          const definers = cells.filter((other) => other.defines.includes(name)).length;
          if (definers > 1) {
            assert.ok(
              node.problems.some((p) =>
                p.kind === "duplicate" && p.message.includes(`\`${name}\``)
              ),
              `${ids[i]} is told that ${name} has two definitions`,
            );
          }
        }
      });
      const groups = mutualGroups(edges, ids);
      assertEquals(
        graph.cycles,
        groups,
        "the cycles are the groups of cells that reach each other",
      );
      for (const group of groups) {
        for (const id of group) {
          assert.ok(graph.byId.get(id)!.problems.some((p) => p.kind === "cycle"));
        }
      }
      assertEquals([...graph.order].sort(), [...ids].sort(), "the order has every cell once");
      const position = new Map(graph.order.map((id, i) => [id, i]));
      const groupOf = new Map(groups.flatMap((group, g) => group.map((id) => [id, g])));
      for (const [id, dependencies] of edges) {
        for (const dependency of dependencies) {
          const sameCycle = groupOf.has(id) && groupOf.get(id) === groupOf.get(dependency);
          if (!sameCycle) {
            assert.ok(
              position.get(dependency)! < position.get(id)!,
              `${dependency} runs before ${id}`,
            );
          }
        }
      }
    }),
    fuzzParameters(300),
  );
});
