/**
 * Killing `record` at random moments never leaves a half-written notebook: after each
 * kill the file is byte for byte either what it was or what record meant to write.
 *
 * The notebook is small in cells but carries 2 MB of prose, so writing it takes long
 * enough to be interrupted. Three states take turns, so every write really changes the
 * file (recording the same results twice would change nothing and prove nothing):
 *
 *     original ──record (gain 10)──▶ with results A ──record (gain 20)──▶ with results B
 *                                          ▲                                   │
 *                                          └─────────record (gain 10)──────────┘
 *
 * The cells run once per state, up front; each killed process (tests/sandbox/
 * _record_driver.ts) loads the finished run and performs only the recording step, so
 * 200 kills fit in well under a minute. A few more kills hit the real `longtail record`
 * command anywhere in its life. Kill moments come from a seeded generator.
 *
 * @module
 */
import { splitNotebook } from "../../kernel/notebook/split.ts";
import { encodeLine } from "../../kernel/sandbox/protocol.ts";
import { type NotebookRun, runNotebook } from "../../kernel/session/run_notebook.ts";
import { assert } from "../_assert.ts";
import { longtail, ROOT } from "../corpus/_cli.ts";
import { findProcesses, longtailCommand, SANDBOX_CHILD } from "./_processes.ts";

const DRIVER = `${ROOT}/tests/sandbox/_record_driver.ts`;
const KILLS = 200;
const CLI_KILLS = 10;

/** mulberry32: a tiny seeded generator of uniform numbers in [0, 1). */
function seededUniform(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function notebookText(): string {
  const filler = "The output stage idles warm; the bias tracks the heat sink. ".repeat(2) + "\n";
  const padding = Array.from({ length: 8_000 }, (_, i) => (i % 40 === 39 ? "\n" : filler)).join("");
  return [
    "# Kill target\n\n",
    "```ts\n",
    'import { adjustable } from "longtail/notebook";\n',
    "const gain = adjustable(10, { min: 1, max: 100 });\n",
    "```\n\n",
    padding,
    "\n```ts\n",
    "gain * 2\n",
    "```\n\n",
    padding,
    "\nThe end.\n",
  ].join("");
}

function sameBytes(a: Uint8Array, b: Uint8Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

async function saveRun(run: NotebookRun, path: string): Promise<void> {
  await Deno.writeTextFile(path, encodeLine({ ...run, adjustables: [...run.adjustables] }));
}

interface Driven {
  /** Milliseconds from "ready" to exit, when not killed. */
  writeMs: number;
  /** Whether it was killed. */
  killed: boolean;
}

/** Starts the driver; kills it `delayMs` after "ready" (or after start, when `early`). */
async function drive(runFile: string, kill?: { delayMs: number; early: boolean }): Promise<Driven> {
  const child = new Deno.Command(Deno.execPath(), {
    args: ["run", "--quiet", "--config", `${ROOT}/deno.json`, "-A", DRIVER, runFile],
    stdin: "null",
    stdout: "piped",
    stderr: "null",
  }).spawn();
  let killed = false;
  const killNow = () => {
    try {
      child.kill("SIGKILL");
      killed = true;
    } catch {
      // It finished first.
    }
  };
  const started = performance.now();
  if (kill?.early) setTimeout(killNow, kill.delayMs);
  let readyAt = Number.NaN;
  const reader = child.stdout.getReader();
  let seen = "";
  for (;;) {
    const { value, done } = await reader.read();
    if (done) break;
    seen += new TextDecoder().decode(value);
    if (Number.isNaN(readyAt) && seen.includes("ready\n")) {
      readyAt = performance.now();
      if (kill && !kill.early) setTimeout(killNow, kill.delayMs);
    }
  }
  const status = await child.status;
  const end = performance.now();
  if (!kill) assert.equal(status.code, 0, "an uninterrupted record succeeds");
  return {
    writeMs: end - (Number.isNaN(readyAt) ? started : readyAt),
    killed: killed && !status.success,
  };
}

/** Removes leftover temporary files of interrupted writes; returns how many there were. */
async function sweepTemporaries(dir: string): Promise<number> {
  let count = 0;
  for await (const entry of Deno.readDir(dir)) {
    if (entry.name.startsWith(".") && entry.name.endsWith(".tmp")) {
      await Deno.remove(`${dir}/${entry.name}`);
      count++;
    }
  }
  return count;
}

Deno.test("record killed at 200 random moments leaves the notebook old or new, never partial", async () => {
  const dir = await Deno.makeTempDir({ prefix: "longtail_kill_" });
  const path = `${dir}/kill_target.md`;
  try {
    const original = new TextEncoder().encode(notebookText());
    await Deno.writeFile(path, original);
    // Three states and the record that leads out of each.
    const states: Array<{ bytes: Uint8Array; runFile: string; next?: number }> = [];
    const valuesFor: Array<Record<string, number>> = [{}, { gain: 20 }, {}];
    let bytes = original;
    const writeTimes: number[] = [];
    for (let i = 0; i < 3; i++) {
      const run = await runNotebook(path, new TextDecoder().decode(bytes), {
        values: valuesFor[i],
      });
      assert.ok(run.states.every((state) => state.status === "done"), "the target notebook runs");
      const runFile = `${dir}/run${i}.json`;
      await saveRun(run, runFile);
      states.push({ bytes, runFile });
      writeTimes.push((await drive(runFile)).writeMs);
      bytes = await Deno.readFile(path);
    }
    // Recording results A over results B gives exactly the text with results A.
    assert.ok(
      sameBytes(bytes, states[1].bytes),
      "re-recording is stable: A → B → A gives the same A",
    );
    assert.ok(!sameBytes(states[1].bytes, states[2].bytes), "results A and B differ");
    states[0].next = 1;
    states[1].next = 2;
    states[2].next = 1;

    const window = Math.max(...writeTimes) * 1.2;
    const random = seededUniform(20_240_611);
    let kills = 0;
    let stayedOld = 0;
    let becameNew = 0;
    let temporaries = 0;
    while (kills < KILLS) {
      const current = await Deno.readFile(path);
      const at = states.findIndex((state) => sameBytes(state.bytes, current));
      assert.ok(at >= 0, "the notebook is one of the known states");
      const state = states[at];
      const early = random() < 0.1;
      const delayMs = early ? random() * 150 : random() * window;
      const driven = await drive(state.runFile, { delayMs, early });
      const after = await Deno.readFile(path);
      const old = sameBytes(after, state.bytes);
      const fresh = sameBytes(after, states[state.next!].bytes);
      assert.ok(
        old || fresh,
        `after a kill ${delayMs.toFixed(1)} ms in, the notebook is old or new`,
      );
      temporaries += await sweepTemporaries(dir);
      if (!driven.killed) continue; // It finished before the kill: not a kill.
      kills++;
      if (old) stayedOld++;
      else becameNew++;
    }
    // The kills must really spread over the write, or this test would prove nothing.
    assert.ok(stayedOld >= 20, `kills before the rename: ${stayedOld}`);
    assert.ok(becameNew >= 5, `kills after the rename: ${becameNew}`);
    const final = splitNotebook(await Deno.readTextFile(path));
    assert.equal(final.cells.length, 2, "both cells are intact");
    console.log(
      `${kills} kills: ${stayedOld} left the old notebook, ${becameNew} the new one; ` +
        `${temporaries} temporary file(s) were left behind and removed; write window ${
          window.toFixed(0)
        } ms`,
    );
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("the real `longtail record`, killed at random moments, leaves the notebook old or new", async () => {
  const dir = await Deno.makeTempDir({ prefix: "longtail_kill_cli_" });
  const path = `${dir}/kill_target.md`;
  try {
    await Deno.writeTextFile(path, notebookText());
    const settings = [["--set", "gain=10"], ["--set", "gain=20"]];
    // Uninterrupted once each way, to learn both states and how long a record takes.
    const texts: Uint8Array[] = [await Deno.readFile(path)];
    const durations: number[] = [];
    for (const setting of [settings[0], settings[1], settings[0]]) {
      const started = performance.now();
      const result = await longtail(["record", "--quiet", path, ...setting]);
      durations.push(performance.now() - started);
      assert.equal(result.code, 0, result.output);
      texts.push(await Deno.readFile(path));
    }
    assert.ok(sameBytes(texts[3], texts[1]), "recording gain 10 again gives the same text");
    const typical = Math.max(...durations);
    const random = seededUniform(7);
    for (let i = 0; i < CLI_KILLS; i++) {
      const before = await Deno.readFile(path);
      const isA = sameBytes(before, texts[1]);
      const child = longtailCommand(
        ["record", "--quiet", path, ...(isA ? settings[1] : settings[0])],
        { stdin: "null", stdout: "null", stderr: "null" },
      ).spawn();
      const delay = typical * (0.3 + 0.9 * random());
      const timer = setTimeout(() => {
        try {
          child.kill("SIGKILL");
        } catch {
          // Finished first.
        }
      }, delay);
      await child.status;
      clearTimeout(timer);
      const after = await Deno.readFile(path);
      const expectedNew = isA ? texts[2] : texts[1];
      assert.ok(
        sameBytes(after, before) || sameBytes(after, expectedNew),
        `after a kill at ${delay.toFixed(0)} ms the notebook is old or new`,
      );
      await sweepTemporaries(dir);
    }
    // A killed record must not leave its sandbox process behind.
    await new Promise((resolve) => setTimeout(resolve, 1500));
    const orphans = await sandboxesIn(dir);
    for (const pid of orphans) Deno.kill(pid, "SIGKILL");
    assert.deepEqual(orphans, [], "no sandbox process outlives its killed record");
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

/** Sandbox processes working in `dir` (Linux /proc; elsewhere none are found). */
async function sandboxesIn(dir: string): Promise<number[]> {
  if (Deno.build.os !== "linux") return [];
  const real = await Deno.realPath(dir);
  return await findProcesses(
    SANDBOX_CHILD,
    async (pid) => (await Deno.readLink(`/proc/${pid}/cwd`)).startsWith(real) ? pid : undefined,
  );
}
