/**
 * Every example notebook is a test: `longtail verify notebooks/` must pass (checks hold,
 * recorded numbers agree, cells type-check), and a deliberately broken copy must fail with a
 * message that names the cell, the quantity, and the old and new values.
 */
import { main } from "../kernel/cli/main.ts";
import { bufferIo } from "../kernel/cli/_terminal.ts";
import { assert, assertEquals } from "./_assert.ts";

const NOTEBOOKS = new URL("../notebooks/", import.meta.url).pathname;

async function cli(...args: string[]): Promise<{ status: number; output: string }> {
  const { io, output } = bufferIo();
  const status = await main(args, io);
  return { status, output: output() };
}

Deno.test("longtail verify notebooks/ passes every example notebook", async () => {
  const names = [...Deno.readDirSync(NOTEBOOKS)]
    .filter((entry) => entry.isFile && entry.name.endsWith(".md"))
    .map((entry) => entry.name);
  assert.ok(names.length >= 4, `expected at least four notebooks, found ${names.join(", ")}`);
  const { status, output } = await cli("verify", NOTEBOOKS);
  assertEquals(status, 0, output);
  assert.match(output, new RegExp(`^${names.length} passed, 0 failed$`, "m"));
  for (const name of names) assert.match(output, new RegExp(`✓ .*${name}`), output);
});

Deno.test("longtail verify fails a copy of the flagship whose compensation capacitor was cut", async () => {
  const dir = await Deno.makeTempDir({ prefix: "longtail-broken-" });
  try {
    const source = `${NOTEBOOKS}power_amplifier.md`;
    const text = await Deno.readTextFile(source);
    const original = "const compensationCapacitance = adjustable(100e-12,";
    assert.ok(text.includes(original), "the flagship declares its compensation capacitor");
    const charts = `${NOTEBOOKS}power_amplifier_charts`;
    await Deno.mkdir(`${dir}/power_amplifier_charts`);
    for (const entry of [...safeReadDir(charts)]) {
      await Deno.copyFile(`${charts}/${entry}`, `${dir}/power_amplifier_charts/${entry}`);
    }
    await Deno.writeTextFile(
      `${dir}/power_amplifier.md`,
      text.replace(original, "const compensationCapacitance = adjustable(10e-12,"),
    );
    const { status, output } = await cli("verify", dir, "--no-type-check");
    assertEquals(status, 1, output);
    assert.match(output, /✗ .*power_amplifier\.md/);
    assert.match(output, /phase margin/);
    assert.ok(text.includes("```recorded"), "the flagship carries its recorded results");
    assert.match(output, /drifted/);
    assert.match(output, /compensationCapacitance: recorded 1e-10, now 1e-11/);
    assert.match(output, /^0 passed, 1 failed$/m);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

function safeReadDir(path: string): string[] {
  try {
    return [...Deno.readDirSync(path)].filter((e) => e.isFile).map((e) => e.name);
  } catch (error) {
    if (error instanceof Deno.errors.NotFound) return [];
    throw error;
  }
}
