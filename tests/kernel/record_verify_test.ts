/**
 * Record and verify round trips on a fixture notebook copied to a temporary folder.
 */
import { parseRecorded, splitNotebook } from "../../kernel/notebook/mod.ts";
import { NotebookChangedError, recordNotebook, verifyRun } from "../../kernel/record/mod.ts";
import { runNotebook } from "../../kernel/session/run_notebook.ts";
import { LONGTAIL_VERSION } from "../../kernel/version.ts";
import { assert, assertEquals, assertRejects } from "../_assert.ts";

const FIXTURES = new URL("./fixtures/", import.meta.url).pathname;

/** Copies the fixture notebook and its helper module into a fresh folder. */
async function copyFixture(): Promise<{ dir: string; path: string }> {
  const dir = await Deno.makeTempDir({ prefix: "longtail-record-" });
  await Deno.mkdir(`${dir}/helpers`);
  await Deno.copyFile(`${FIXTURES}stage.md`, `${dir}/stage.md`);
  await Deno.copyFile(`${FIXTURES}helpers/protocols.ts`, `${dir}/helpers/protocols.ts`);
  return { dir, path: `${dir}/stage.md` };
}

/** Records a copy of the fixture, edits it with `edit`, and hands its path to `use`. */
async function withEditedRecording<T>(
  edit: (text: string) => string,
  use: (path: string) => Promise<T>,
): Promise<T> {
  const { dir, path } = await copyFixture();
  try {
    await record(path);
    await Deno.writeTextFile(path, edit(await Deno.readTextFile(path)));
    return await use(path);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
}

async function runFile(path: string) {
  return await runNotebook(path, await Deno.readTextFile(path));
}

async function record(path: string) {
  const bytes = await Deno.readFile(path);
  return await recordNotebook(await runNotebook(path, new TextDecoder().decode(bytes)), bytes);
}

Deno.test("record writes result blocks, chart files and the version line, and the recording verifies", async () => {
  const { dir, path } = await copyFixture();
  try {
    const before = await Deno.readTextFile(path);
    const outcome = await record(path);
    const notebook = splitNotebook(outcome.text, { fileName: "stage.md" });
    assertEquals(notebook.version?.version, LONGTAIL_VERSION);
    assertEquals(
      notebook.cells.map((cell) => cell.code),
      splitNotebook(before).cells.map((cell) => cell.code),
    );
    const second = parseRecorded(notebook.cells[1].recorded!.content);
    assertEquals(
      second.filter((e) => e.kind === "number").map((e) => (e as { name: string }).name),
      [
        "thermalVoltage",
        "gm",
        "gain",
      ],
    );
    const third = parseRecorded(notebook.cells[2].recorded!.content);
    assertEquals(third.map((e) => e.kind), ["check"], "a shown check is recorded once, as a check");
    assertEquals(notebook.cells[3].recorded!.charts, ["stage_charts/cell-4.svg"]);
    assert.match(await Deno.readTextFile(`${dir}/stage_charts/cell-4.svg`), /^<svg /);
    const verdict = verifyRun(await runFile(path));
    assert.ok(verdict.passed, JSON.stringify(verdict.drifts));
    assert.ok(verdict.agreed >= 8, `agreed ${verdict.agreed}`);
    assertEquals(verdict.recordedWith, undefined);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("verify reports a changed part value as drift, with the recorded and the new value", async () => {
  await withEditedRecording(
    (text) => text.replace("adjustable(4700,", "adjustable(5100,"),
    async (path) => {
      const verdict = verifyRun(await runFile(path));
      assertEquals(verdict.passed, false);
      const gainCell = verdict.drifts.find((d) => d.cell === 2)!;
      const gain = gainCell.drifts.find((d) => d.name === "gain")!;
      assertEquals(gain.recorded, "181.804"); // closed form: 2 mA / 2 / 25.852 mV · 4.7 kΩ, six digits
      assertEquals(gain.now, "197.277"); // closed form: same with 5.1 kΩ
      assertEquals(verdict.drifts.find((d) => d.cell === 1)!.drifts, [
        { name: "collectorResistor", recorded: "4700", now: "5100" },
      ]);
      // Within a loose tolerance, the same change is no drift.
      assertEquals(verifyRun(await runFile(path), { rtol: 0.2 }).drifts, []);
    },
  );
});

Deno.test("verify says which longtail version recorded the results when it differs", async () => {
  const verdict = await withEditedRecording(
    (text) => text.replace(`longtail ${LONGTAIL_VERSION} -->`, "longtail 0.0.1 -->"),
    async (path) => verifyRun(await runFile(path)),
  );
  assertEquals(verdict.recordedWith, "0.0.1");
  assert.ok(verdict.passed, "a version note alone is not a failure");
});

Deno.test("verify fails a deliberately broken copy: a design check that no longer holds", async () => {
  const verdict = await withEditedRecording(
    (text) => text.replace('checkAtLeast("gain", gain, 100)', 'checkAtLeast("gain", gain, 1000)'),
    async (path) => verifyRun(await runFile(path)),
  );
  assertEquals(verdict.passed, false);
  assertEquals(verdict.checks.filter((c) => !c.pass).map((c) => c.name), ["gain"]);
});

Deno.test("record refuses to write when the notebook changed on disk while it ran", async () => {
  const { dir, path } = await copyFixture();
  try {
    const bytes = await Deno.readFile(path);
    const run = await runNotebook(path, new TextDecoder().decode(bytes));
    await Deno.writeTextFile(path, "edited meanwhile\n", { append: true });
    await assertRejects(() => recordNotebook(run, bytes), NotebookChangedError);
    assert.ok((await Deno.readTextFile(path)).endsWith("edited meanwhile\n"));
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("a notebook never recorded verifies on its checks alone", async () => {
  const { dir, path } = await copyFixture();
  try {
    const verdict = verifyRun(await runFile(path));
    assertEquals(verdict.notRecorded, true);
    assertEquals(verdict.passed, true);
    assertEquals(verdict.checks.length, 1); // exact: the one gain check
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("a cell that shows checks counted on an earlier cell records them as check lines", async () => {
  const { cellEntries } = await import("../../kernel/record/cell_entries.ts");
  const { entries } = cellEntries({
    status: "done",
    streams: [],
    outcome: {
      outputs: [{ "text/plain": "✓ gain = 150 is at least 100\n✗ noise = 3 nV is at most 2 nV" }],
      records: [],
      checks: [],
      adjustables: [],
      durationMs: 0,
    },
  }, 2);
  assertEquals(entries, [
    { kind: "check", pass: true, text: "gain = 150 is at least 100" },
    { kind: "check", pass: false, text: "noise = 3 nV is at most 2 nV" },
  ]);
});
