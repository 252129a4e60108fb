/**
 * Kernel speed: analysis and planning of a 1,000-cell notebook (target under 100 ms warm),
 * the latency of an edit that re-runs one chain of dependents, a full run of 1,000 cells
 * in a fresh sandbox, and the kernel's overhead per cell against the same code run as one
 * plain script.
 *
 * Run with `deno task bench tests/kernel/kernel_bench.ts`.
 */
import { analyseCell, buildGraph, planRun, type RunRecord } from "../../kernel/analysis/mod.ts";
import { splitNotebook } from "../../kernel/notebook/mod.ts";
import { Session } from "../../kernel/session/mod.ts";

const F = "```";

/** 100 independent chains of 10 cells: x{k}_0 → x{k}_1 → … → x{k}_9, with some prose. */
function chainsNotebook(chains: number, length: number): string {
  const parts: string[] = ["# Synthetic notebook\n"];
  for (let k = 0; k < chains; k++) {
    parts.push(`## Chain ${k}\n`);
    for (let i = 0; i < length; i++) {
      const code = i === 0
        ? `const x${k}_0 = ${k} + 0.5;\nfunction f${k}(v: number) { return Math.sqrt(v * v + 1); }`
        : `const x${k}_${i} = f${k}(x${k}_${i - 1}) + ${i};\nx${k}_${i}`;
      parts.push(`${F}ts\n${code}\n${F}\n`);
    }
  }
  return parts.join("\n");
}

const THOUSAND = chainsNotebook(100, 10);

Deno.bench({
  name: "analyse and plan a 1,000-cell notebook (split, parse, graph, plan)",
  group: "analysis",
  fn: () => {
    const notebook = splitNotebook(THOUSAND);
    const cells = notebook.cells.map((cell) => ({
      id: `c${cell.index}`,
      analysis: analyseCell(cell.code),
    }));
    const graph = buildGraph(cells);
    const versions = new Map(cells.map((cell) => [cell.id, 1]));
    const steps = planRun(graph, versions, new Map());
    if (steps.length !== 1000) throw new Error(`planned ${steps.length} cells`);
  },
});

// The state after a full run, to plan an edit against.
const analyses = splitNotebook(THOUSAND).cells.map((cell) => ({
  id: `c${cell.index}`,
  analysis: analyseCell(cell.code),
}));
const fullGraph = buildGraph(analyses);
const records = new Map<string, RunRecord>();
for (const id of fullGraph.order) {
  const seen = new Map(fullGraph.byId.get(id)!.dependencies.map((d) => [d, 1]));
  records.set(id, { version: 1, result: 1, seen, succeeded: true, held: true });
}

Deno.bench({
  name:
    "edit one input of a 1,000-cell notebook: re-analyse it, rebuild the graph, plan (10 cells)",
  group: "analysis",
  fn: () => {
    const edited = [...analyses];
    edited[420] = {
      id: "c420",
      analysis: analyseCell(
        "const x42_0 = 42.25;\nfunction f42(v: number) { return Math.sqrt(v * v + 1); }",
      ),
    };
    const graph = buildGraph(edited);
    const versions = new Map(edited.map((cell) => [cell.id, cell.id === "c420" ? 2 : 1]));
    const steps = planRun(graph, versions, records);
    if (steps.length !== 10) throw new Error(`planned ${steps.length} cells`);
  },
});

// ── with the sandbox ──────────────────────────────────────────────────────────────────

const dir = await Deno.makeTempDir({ prefix: "longtail-bench-" });
const big = new Session({ path: `${dir}/thousand.md` });
await big.send({ type: "open", text: THOUSAND });
let edits = 0;

Deno.bench({
  name: "edit one input of a 1,000-cell notebook and run its 10 dependents in the sandbox",
  group: "edit",
  fn: async () => {
    edits++;
    const head = big.cells[420];
    await big.send({
      type: "edit",
      cell: head.id,
      code:
        `const x42_0 = ${edits} + 0.25;\nfunction f42(v: number) { return Math.sqrt(v * v + 1); }`,
    });
  },
});

// A full run from scratch: a new session (and sandbox process) opens 1,000 trivial cells
// in a chain and runs them all. The sandbox loads the cells of a run in a few shared
// modules; one module per cell made this take seconds.
const CHAIN = Array.from(
  { length: 1000 },
  (_, i) => `${F}ts\n${i === 0 ? "const t0 = 1;" : `const t${i} = t${i - 1} + 1;`}\n${F}\n`,
).join("\n");
let fullRuns = 0;

Deno.bench({
  name: "open a 1,000-cell notebook of trivial cells and run all of it in a new sandbox",
  group: "full run",
  n: 5,
  warmup: 1,
  fn: async () => {
    const session = new Session({ path: `${dir}/full_run_${++fullRuns}.md` });
    try {
      await session.send({ type: "open", text: CHAIN });
      const last = session.state(session.cells[999].id);
      if (last.status !== "done") throw new Error(`the last cell is ${last.status}`);
    } finally {
      await session.close();
    }
  },
});

// Overhead: cells as a notebook re-run in the sandbox, against the same statements as one
// plain function. Two kinds of cell: trivial (the overhead alone) and ~0.1 ms of work each
// (a more typical ratio).
async function overheadPair(
  label: string,
  cells: number,
  work: (i: number) => string,
): Promise<void> {
  const codes = Array.from(
    { length: cells },
    (_, i) => i === 0 ? "const y0 = 1;" : `const y${i} = ${work(i)};`,
  );
  const session = new Session({ path: `${dir}/${label}.md` });
  await session.send({
    type: "open",
    text: codes.map((code) => `${F}ts\n${code}\n${F}\n`).join("\n"),
  });
  const plain = (await import(
    "data:application/typescript," +
      encodeURIComponent(
        `export default function () {\n${codes.join("\n")}\nreturn y${cells - 1};\n}\n`,
      )
  )).default as () => number;
  Deno.bench({
    name: `${cells} ${label} cells as one plain script`,
    group: `overhead, ${label} cells`,
    baseline: true,
    fn: () => {
      if (!(plain() > 0)) throw new Error("no result");
    },
  });
  Deno.bench({
    name: `${cells} ${label} cells re-run as a notebook in the sandbox`,
    group: `overhead, ${label} cells`,
    fn: async () => {
      await session.send({ type: "rerun" });
    },
  });
}

await overheadPair("trivial", 200, (i) => `Math.sqrt(y${i - 1} * y${i - 1} + ${i})`);
await overheadPair(
  "working",
  200,
  (i) =>
    `(() => { let s = y${
      i - 1
    }; for (let k = 1; k < 20000; k++) s = Math.sqrt(s * s + k) / 1.0001; return s; })()`,
);

globalThis.addEventListener("unload", () => {
  // Benches have no teardown hook; the sandboxes end with this process.
  Deno.removeSync(dir, { recursive: true });
});
