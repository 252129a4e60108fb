/**
 * The reactive plan on graph shapes, counting evaluations: each stale cell runs exactly
 * once, after everything it needs, and only stale cells run.
 *
 * A small simulator stands in for the sandbox: it "runs" the planned cells in order and
 * records what each saw, as the session does, and a cell fails when told to.
 */
import {
  analyseCell,
  buildGraph,
  type NotebookGraph,
  planRun,
  type RunRecord,
} from "../../kernel/analysis/mod.ts";
import { assert, assertEquals } from "../_assert.ts";

class Simulator {
  graph: NotebookGraph;
  versions = new Map<string, number>();
  records = new Map<string, RunRecord>();
  status = new Map<string, "done" | "failed" | "blocked">();
  runs = new Map<string, number>();
  order: string[] = [];
  failing = new Set<string>();
  #result = 0;

  constructor(readonly codes: Record<string, string>) {
    this.graph = this.#build();
    for (const id of Object.keys(codes)) this.versions.set(id, 1);
  }

  #build(): NotebookGraph {
    return buildGraph(
      Object.entries(this.codes).map(([id, code]) => ({ id, analysis: analyseCell(code) })),
    );
  }

  edit(id: string, code?: string): void {
    if (code !== undefined) this.codes[id] = code;
    this.versions.set(id, this.versions.get(id)! + 1);
    this.graph = this.#build();
  }

  /** Runs the plan; returns the cells that ran, in order. */
  run(): string[] {
    const ran: string[] = [];
    for (const step of planRun(this.graph, this.versions, this.records)) {
      const node = this.graph.byId.get(step.id)!;
      const seen = new Map(node.dependencies.map((d) => [d, this.records.get(d)?.result ?? -1]));
      let status: "done" | "failed" | "blocked";
      if (node.problems.length > 0) status = "failed";
      else if (node.dependencies.some((d) => this.status.get(d) !== "done")) status = "blocked";
      else {
        ran.push(step.id);
        this.runs.set(step.id, (this.runs.get(step.id) ?? 0) + 1);
        status = this.failing.has(step.id) ? "failed" : "done";
      }
      this.status.set(step.id, status);
      this.records.set(step.id, {
        version: this.versions.get(step.id)!,
        result: ++this.#result,
        seen,
        succeeded: status === "done",
        held: status === "done",
      });
    }
    this.order.push(...ran);
    return ran;
  }
}

Deno.test("chain: a → b → c → d runs each once, in order; editing c re-runs c and d only", () => {
  //   a ──▶ b ──▶ c ──▶ d
  const sim = new Simulator({
    d: "const d = c + 1",
    c: "const c = b + 1",
    b: "const b = a + 1",
    a: "const a = 1",
  });
  assertEquals(sim.run(), ["a", "b", "c", "d"]);
  assertEquals(sim.run(), []);
  sim.edit("c", "const c = b + 2");
  assertEquals(sim.run(), ["c", "d"]);
  assertEquals([...sim.runs.values()].reduce((s, n) => s + n, 0), 6); // exact: 4 + 2 evaluations
});

Deno.test("diamond: editing the top re-runs all four, the bottom once, after both sides", () => {
  //     a
  //    ╱ ╲
  //   b   c
  //    ╲ ╱
  //     d
  const sim = new Simulator({
    a: "const a = 1",
    b: "const b = a * 2",
    c: "const c = a * 3",
    d: "const d = b + c",
  });
  sim.run();
  sim.edit("a", "const a = 2");
  const ran = sim.run();
  assertEquals(ran, ["a", "b", "c", "d"]);
  assertEquals(sim.runs.get("d"), 2); // exact: once per edit of a, never twice in one run
});

Deno.test("jagged diamond: a longer side does not make the bottom run twice or too early", () => {
  //      a
  //     ╱ ╲
  //    b   c
  //    │   │
  //    │   d
  //     ╲ ╱
  //      e
  const sim = new Simulator({
    e: "const e = b + d",
    d: "const d = c + 1",
    c: "const c = a + 1",
    b: "const b = a + 1",
    a: "const a = 1",
  });
  // Dependencies first; among ready cells, the one that comes first in the document.
  assertEquals(sim.run(), ["a", "c", "d", "b", "e"]);
  sim.edit("a", "const a = 5");
  const ran = sim.run();
  assertEquals(ran.length, 5); // exact: five cells, once each
  assert.ok(ran.indexOf("e") > ran.indexOf("d") && ran.indexOf("d") > ran.indexOf("c"));
  sim.edit("c", "const c = a + 2");
  assertEquals(sim.run(), ["c", "d", "e"]);
});

Deno.test("cycle: the cells of a cycle fail, cells below it are blocked, the rest run", () => {
  //   a ──▶ b ──▶ c ──▶ d        e (independent)
  //   ▲           │
  //   └───────────┘
  const sim = new Simulator({
    a: "const a = c + 1",
    b: "const b = a + 1",
    c: "const c = b + 1",
    d: "const d = c + 1",
    e: "const e = 1",
  });
  assertEquals(sim.graph.cycles, [["a", "b", "c"]]);
  assertEquals(sim.run(), ["e"]);
  assertEquals(["a", "b", "c", "d"].map((id) => sim.status.get(id)), [
    "failed",
    "failed",
    "failed",
    "blocked",
  ]);
  // Breaking the cycle lets everything run, each once.
  sim.edit("a", "const a = 1");
  assertEquals(sim.run(), ["a", "b", "c", "d"]);
});

Deno.test("error in the middle: a failing cell blocks only its dependents, and fixing it re-runs just them", () => {
  //   a ──▶ b (throws) ──▶ c
  //   │
  //   └──▶ d
  const sim = new Simulator({
    a: "const a = 1",
    b: "const b = a + 1",
    c: "const c = b + 1",
    d: "const d = a + 1",
  });
  sim.failing.add("b");
  assertEquals(sim.run(), ["a", "b", "d"]);
  assertEquals(sim.status.get("c"), "blocked");
  assertEquals(sim.run(), [], "a failure is a result: nothing re-runs until something changes");
  sim.failing.delete("b");
  sim.edit("b");
  assertEquals(sim.run(), ["b", "c"]);
  assertEquals(sim.runs.get("a"), 1); // exact: a never re-ran
});

Deno.test("a renamed definition makes its users fail, and restoring it re-runs them", () => {
  const sim = new Simulator({ a: "const a = 1", b: "const b = a + 1" });
  sim.run();
  sim.edit("a", "const renamed = 1");
  sim.run();
  assertEquals(sim.status.get("b"), "failed");
  assert.match(sim.graph.byId.get("b")!.problems[0].message, /`a` is not defined/);
  sim.edit("a", "const a = 2");
  assertEquals(sim.run(), ["a", "b"]);
});

Deno.test("editing one input of a 1,000-cell notebook re-runs only its 10 dependents and itself", () => {
  // 100 independent chains of 10 cells: x{k}_0 → x{k}_1 → … → x{k}_9.
  const codes: Record<string, string> = {};
  for (let k = 0; k < 100; k++) {
    for (let i = 0; i < 10; i++) {
      codes[`c${k}_${i}`] = i === 0
        ? `const x${k}_0 = ${k};`
        : `const x${k}_${i} = x${k}_${i - 1} + 1;`;
    }
  }
  const sim = new Simulator(codes);
  assertEquals(sim.run().length, 1000); // exact: every cell once
  sim.edit("c42_3", "const x42_3 = x42_2 + 2;");
  assertEquals(sim.run(), ["c42_3", "c42_4", "c42_5", "c42_6", "c42_7", "c42_8", "c42_9"]);
});

Deno.test("a failed cell is not restored after a restart: its dependents stay blocked", () => {
  //   a ──▶ b (failed) ──▶ c
  const sim = new Simulator({ a: "const a = 1", b: "const b = a + 1", c: "const c = b + 1" });
  sim.failing.add("b");
  sim.run();
  for (const record of sim.records.values()) record.held = false;
  sim.edit("c", "const c = b + 2");
  assertEquals(planRun(sim.graph, sim.versions, sim.records), [{ id: "c", restore: false }]);
});

Deno.test("a lost value is restored only when a stale cell needs it, and restoring makes nothing else stale", () => {
  //   a ──▶ b ──▶ c          after a sandbox restart, editing c needs b's value again
  const sim = new Simulator({ a: "const a = 1", b: "const b = a + 1", c: "const c = b + 1" });
  sim.run();
  for (const record of sim.records.values()) record.held = false;
  sim.edit("c", "const c = b + 2");
  const steps = planRun(sim.graph, sim.versions, sim.records);
  assertEquals(steps, [{ id: "a", restore: true }, { id: "b", restore: true }, {
    id: "c",
    restore: false,
  }]);
});
