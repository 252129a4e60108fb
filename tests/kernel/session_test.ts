/**
 * Sessions with the real sandbox process: events, evaluation counts on graph shapes,
 * incremental edits, cancelled stale runs, time limits, outputs and permissions.
 */
import { Session, type SessionEvent } from "../../kernel/session/mod.ts";
import { assert, assertEquals } from "../_assert.ts";

const F = "```";

function notebookOf(codes: string[]): string {
  return codes.map((code) => `${F}ts\n${code}\n${F}\n`).join("\n");
}

interface Harness {
  session: Session;
  events: SessionEvent[];
  runs: (id: string) => number;
  last: (type: SessionEvent["type"], cell: string) => SessionEvent | undefined;
  dir: string;
  close: () => Promise<void>;
}

async function open(
  codes: string[] | string,
  options: { cellTimeoutMs?: number; values?: Record<string, number> } = {},
): Promise<Harness> {
  const dir = await Deno.makeTempDir({ prefix: "longtail-session-" });
  const session = new Session({ path: `${dir}/notebook.md`, ...options });
  const events: SessionEvent[] = [];
  session.subscribe((event) => events.push(event));
  await session.send({ type: "open", text: typeof codes === "string" ? codes : notebookOf(codes) });
  return {
    session,
    events,
    dir,
    runs: (id) => events.filter((e) => e.type === "running" && e.cell === id).length,
    last: (type, cell) => events.findLast((e) => e.type === type && "cell" in e && e.cell === cell),
    close: async () => {
      await session.close();
      await Deno.remove(dir, { recursive: true });
    },
  };
}

function shown(h: Harness, id: string): string | undefined {
  return h.session.state(id).outcome?.outputs[0]?.["text/plain"];
}

Deno.test("Session runs a diamond's cells once each, the bottom after both sides", async () => {
  //     c1
  //    ╱  ╲
  //  c2    c3
  //    ╲  ╱
  //     c4
  const h = await open(["const a = 2;", "const b = a * 3;", "const c = a * 5;", "b + c"]);
  try {
    assertEquals(["c1", "c2", "c3", "c4"].map(h.runs), [1, 1, 1, 1]); // exact: each cell once
    assertEquals(shown(h, "c4"), "16"); // closed form: 2·3 + 2·5
    const order = h.events.filter((e) => e.type === "running").map((e) =>
      (e as { cell: string }).cell
    );
    assertEquals(order.indexOf("c4"), 3); // exact: last
    assertEquals(h.events[0].type, "analysed");
    assertEquals(h.events[h.events.length - 1].type, "idle");
  } finally {
    await h.close();
  }
});

Deno.test("Session re-runs an edited cell and its dependents once each, and nothing else", async () => {
  //   c1 ──▶ c2 ──▶ c3        c4 (independent)
  const h = await open(["const a = 1;", "const b = a + 1;", "b * 10", "const other = 7;"]);
  try {
    await h.session.send({ type: "edit", cell: "c2", code: "const b = a + 2;" });
    assertEquals(["c1", "c2", "c3", "c4"].map(h.runs), [1, 2, 2, 1]); // exact: c2 and c3 again
    assertEquals(shown(h, "c3"), "30"); // closed form: (1 + 2)·10
  } finally {
    await h.close();
  }
});

Deno.test("Session: an error in the middle blocks only its dependents, with the notebook line", async () => {
  //   c1 ──▶ c2 (throws) ──▶ c3
  //    └───▶ c4
  const h = await open([
    "const a = 1;",
    "const b = a +\n  (undefined as unknown as { x: number }).x;",
    "b",
    "a + 1",
  ]);
  try {
    const failed = h.last("failed", "c2") as Extract<SessionEvent, { type: "failed" }>;
    assertEquals(failed.error.kind, "runtime");
    assert.match(failed.error.message, /^TypeError: Cannot read properties of undefined/);
    assertEquals(failed.error.line, 7); // exact: the cell's second code line in the notebook
    assertEquals((h.last("blocked", "c3") as Extract<SessionEvent, { type: "blocked" }>).by, [
      "c2",
    ]);
    assertEquals(shown(h, "c4"), "2"); // closed form
    // Fixing the broken cell runs it and the blocked one; the others stay as they were.
    await h.session.send({ type: "edit", cell: "c2", code: "const b = a + 41;" });
    assertEquals(["c1", "c2", "c3", "c4"].map(h.runs), [1, 2, 1, 1]); // exact
    assertEquals(shown(h, "c3"), "42"); // closed form
  } finally {
    await h.close();
  }
});

Deno.test("Session reports analysis problems without running, and blocks the cells below", async () => {
  const h = await open([
    "const gain = 1;",
    "const x = gian * 2;",
    "x + 1",
    "const a = b;\nconst b = a;",
  ]);
  try {
    const failed = h.last("failed", "c2") as Extract<SessionEvent, { type: "failed" }>;
    assertEquals(failed.error.kind, "problem");
    assertEquals(failed.error.message, "`gian` is not defined by any cell; did you mean `gain`?");
    assertEquals([failed.error.line, failed.error.column], [6, 11]); // exact: line 6, column 11
    assertEquals(h.session.state("c3").status, "blocked");
    assertEquals(h.session.state("c4").status, "failed");
    assertEquals(h.runs("c2") + h.runs("c3"), 0); // exact: never ran
  } finally {
    await h.close();
  }
});

Deno.test("Session cancels the rest of a stale run when an edit arrives", async () => {
  //   c1 ──▶ c2 (slow) ──▶ c3
  const h = await open(
    ["const a = 1;", "await new Promise((r) => setTimeout(r, 400));\nconst slow = a;", "slow + 1"]
      .slice(0, 1),
  );
  try {
    const started = new Promise<void>((resolve) => {
      const stop = h.session.subscribe((event) => {
        if (event.type === "running" && event.cell === "c2") {
          stop();
          resolve();
        }
      });
    });
    const text = notebookOf([
      "const a = 1;",
      "await new Promise((r) => setTimeout(r, 400));\nconst slow = a;",
      "slow + 1",
    ]);
    const first = h.session.send({ type: "open", text });
    await started;
    const second = h.session.send({ type: "edit", cell: "c1", code: "const a = 5;" });
    await Promise.all([first, second]);
    assertEquals(h.runs("c3"), 1); // exact: the stale run of c3 was cancelled
    assertEquals(h.runs("c2"), 2); // exact: the running cell finished, then ran again
    assertEquals(shown(h, "c3"), "6"); // closed form: 5 + 1
  } finally {
    await h.close();
  }
});

Deno.test("Session stops a cell past its time limit, restarts the sandbox and goes on", async () => {
  //   c1 ──▶ c2 (endless) ──▶ c3        c1 ──▶ c4 (needs c1's value in the new sandbox)
  const h = await open([
    "const a = 3;",
    "while (a > 0) { /* forever */ }\nconst stuck = a;",
    "stuck",
    "a * 2",
  ], {
    cellTimeoutMs: 1500,
  });
  try {
    const failed = h.last("failed", "c2") as Extract<SessionEvent, { type: "failed" }>;
    assertEquals(failed.error.kind, "timeout");
    assert.match(failed.error.message, /1\.5 s|1500 ms/);
    assertEquals(h.session.state("c3").status, "blocked");
    assertEquals(shown(h, "c4"), "6"); // closed form: 3·2, computed in the restarted sandbox
    assertEquals(h.runs("c4"), 1); // exact
  } finally {
    await h.close();
  }
});

Deno.test("Session shows rich displays, counts each design check once, and records numbers", async () => {
  const dir = new URL("./fixtures/", import.meta.url).pathname;
  const session = new Session({ path: `${dir}virtual.md` });
  const states: Record<string, SessionEvent> = {};
  session.subscribe((event) => {
    if ("cell" in event) states[event.cell] = event;
  });
  try {
    await session.send({
      type: "open",
      text: notebookOf([
        'import { bar, checkAtLeast } from "./helpers/protocols.ts";\nconst gain = 150;\nconst stage = { gain, checks: [checkAtLeast("gain", gain, 100)] };',
        "stage.checks",
        "bar('headroom', 0.25)",
        "stage",
      ]),
    });
    const done = (id: string) => session.state(id).outcome!;
    assertEquals(done("c1").checks.map((c) => c.name), ["gain"]);
    assertEquals(done("c2").checks.length + done("c4").checks.length, 0); // exact: counted on c1 only
    assertEquals(done("c1").records, [{ name: "gain", value: 150 }]);
    assertEquals(done("c3").outputs[0]["text/plain"], "headroom: 25.0 %");
    assert.match(done("c3").outputs[0]["image/svg+xml"], /<rect width="25"/);
    assertEquals(done("c4").records, [{ name: "stage.gain", value: 150 }]);
    assert.ok(states.c4.type === "done");
  } finally {
    await session.close();
  }
});

Deno.test("Session uses set adjustable values and re-runs only the cells that depend on them", async () => {
  const h = await open([
    'import { adjustable } from "longtail/notebook";\nconst tail = adjustable(2e-3, { unit: "A", min: 1e-4, max: 1e-2 });',
    "tail * 1000",
    "const unrelated = 1;",
  ]);
  try {
    assertEquals(shown(h, "c2"), "2"); // closed form: 2 mA in mA
    assertEquals([...h.session.adjustableNames().keys()], ["tail"]);
    await h.session.send({ type: "set", values: { tail: 5e-3 } });
    assertEquals(shown(h, "c2"), "5"); // closed form: 5 mA in mA
    assertEquals(["c1", "c2", "c3"].map(h.runs), [2, 2, 1]); // exact
    assertEquals(h.session.state("c1").outcome!.adjustables[0].value, 5e-3); // exact: as set
    await h.session.send({ type: "set", values: { tail: 0.5 } });
    assert.match(
      h.session.state("c1").error!.message,
      /RangeError: Expected the value set for tail to be a finite number within/,
    );
  } finally {
    await h.close();
  }
});

Deno.test("Session runs top-level await and imports modules relative to a notebook outside the checkout", async () => {
  const dir = await Deno.makeTempDir({ prefix: "longtail-elsewhere-" });
  await Deno.writeTextFile(
    `${dir}/parts.ts`,
    "export const seriesResistance = (a: number, b: number) => a + b;\n",
  );
  const session = new Session({ path: `${dir}/design.md` });
  try {
    await session.send({
      type: "open",
      text: notebookOf([
        'import { seriesResistance } from "./parts.ts";\nconst total = await Promise.resolve(seriesResistance(4700, 300));',
        'const text = await (await import("./parts.ts")).seriesResistance(1, 2);\ntotal + text',
      ]),
    });
    assertEquals(session.state("c2").outcome!.outputs[0]["text/plain"], "5003"); // closed form: 4700 + 300 + 3
  } finally {
    await session.close();
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("the sandbox denies reads outside the notebook's folder, the environment, the network, writes and subprocesses", async () => {
  const attempts = [
    'await Deno.readTextFile("/etc/hostname")',
    'Deno.env.get("HOME")',
    'await fetch("http://example.com/")',
    'await Deno.writeTextFile("written.txt", "x")',
    'new Deno.Command("true").outputSync()',
  ];
  const h = await open(attempts);
  try {
    for (const id of ["c1", "c2", "c3", "c4", "c5"]) {
      const state = h.session.state(id);
      assertEquals(state.status, "failed", id);
      assertEquals(state.error!.kind, "denied", `${id}: ${state.error!.message}`);
    }
    assert.match(
      h.session.state("c1").error!.message,
      /tried to read \/etc\/hostname; grant it with --allow-read=\/etc\/hostname/,
    );
    await Deno.stat(`${h.dir}/written.txt`).then(() => assert.fail("the write happened"), () => {});
  } finally {
    await h.close();
  }
});

Deno.test("a cell that calls Deno.exit or writes to stdout itself does not break the sandbox", async () => {
  const h = await open([
    'Deno.stdout.writeSync(new TextEncoder().encode("stray text, no line break"));\nconst a = 1;',
    "Deno.exit(3);",
    "a + 1",
  ]);
  try {
    assertEquals(h.session.state("c1").status, "done");
    const exit = h.session.state("c2").error!;
    assertEquals([exit.kind, exit.line, exit.column], ["runtime", 7, 6]); // exact: `exit` on line 7, column 6
    assert.match(exit.message, /Deno\.exit\(3\) is not available in a notebook cell/);
    assertEquals(shown(h, "c3"), "2"); // closed form
  } finally {
    await h.close();
  }
});

Deno.test("an import that cannot be resolved fails its cell at the cell's line, and the rest runs", async () => {
  const h = await open(['import { nothing } from "./missing.ts";\nnothing', "const fine = 1;"]);
  try {
    const error = h.session.state("c1").error!;
    assert.match(
      error.message,
      /^cannot find the module \.\/missing\.ts \(looked for .*\/missing\.ts\)/,
    );
    assert.ok(!error.message.includes("data:"), "no module URL in the message");
    assertEquals(error.line, 2); // exact: the import, on the cell's first code line
    assertEquals(h.session.state("c2").status, "done");
  } finally {
    await h.close();
  }
});

Deno.test("a cell cannot fake the sandbox's replies, read its stdin, or print without end", async () => {
  const forged = JSON.stringify({ type: "done", batch: 1, cell: "c3", outcome: { outputs: [] } });
  const h = await open([
    `Deno.stdout.writeSync(new TextEncoder().encode(${
      JSON.stringify("\n" + forged + "\n")
    }));\nconst a = 1;`,
    "Deno.stdin.readable",
    "for (let i = 0; i < 200_000; i++) console.log('line', i);\nconst b = a;",
  ]);
  try {
    assertEquals(h.session.state("c1").status, "done");
    assert.match(h.session.state("c2").error!.message, /stdin is not available in a notebook cell/);
    const printed = h.session.state("c3").streams.map((chunk) => chunk.text).join("");
    assert.ok(printed.length < 1_100_000, `printed ${printed.length} characters`);
    assert.match(printed, /printing stopped: a cell may print at most 1000000 characters/);
    assertEquals(h.runs("c3"), 1); // exact: the forged "done" did not count
  } finally {
    await h.close();
  }
});
