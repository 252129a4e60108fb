/**
 * The command line: help on every subcommand, exit codes 0 / 1 / 2, run, record, verify
 * (drift, checks, type errors, JUnit, shards, unreadable input).
 */
import { main } from "../../kernel/cli/main.ts";
import { bufferIo } from "../../kernel/cli/_terminal.ts";
import { assert, assertEquals } from "../_assert.ts";

const FIXTURES = new URL("./fixtures/", import.meta.url).pathname;
const F = "```";

async function cli(...args: string[]): Promise<{ status: number; output: string }> {
  const { io, output } = bufferIo();
  const status = await main(args, io);
  return { status, output: output() };
}

async function workspace(): Promise<{ dir: string; path: string; remove: () => Promise<void> }> {
  const dir = await Deno.makeTempDir({ prefix: "longtail-cli-" });
  await Deno.mkdir(`${dir}/helpers`);
  await Deno.copyFile(`${FIXTURES}stage.md`, `${dir}/stage.md`);
  await Deno.copyFile(`${FIXTURES}helpers/protocols.ts`, `${dir}/helpers/protocols.ts`);
  return { dir, path: `${dir}/stage.md`, remove: () => Deno.remove(dir, { recursive: true }) };
}

Deno.test("longtail prints help for itself and every subcommand, and exits 2 when misused", async () => {
  for (const command of ["run", "record", "verify", "demo"]) {
    const { status, output } = await cli(command, "--help");
    assertEquals(status, 0, command);
    assert.match(output, new RegExp(`Usage: longtail ${command}`));
  }
  assertEquals((await cli("--help")).status, 0);
  assertEquals((await cli()).status, 2);
  const unknown = await cli("frobnicate");
  assertEquals(unknown.status, 2);
  assert.match(unknown.output, /there is no command "frobnicate"/);
  const badOption = await cli("run", "--colour", "x.md");
  assertEquals(badOption.status, 2);
  assert.match(badOption.output, /Run longtail run --help for usage/);
  assertEquals((await cli("run")).status, 2);
  assertEquals((await cli("verify")).status, 2);
});

Deno.test("longtail run prints headings, values and the check table, and exits 0", async () => {
  const { status, output } = await cli("run", `${FIXTURES}stage.md`);
  assertEquals(status, 0);
  assert.match(output, /# A small gain stage/);
  assert.match(output, /adjustable collectorResistor = 4\.7 kΩ/);
  assert.match(output, /181\.80411/);
  assert.match(output, /Design checks/);
  assert.match(output, /✓\s+gain\s+181\.8\s+at least 100/);
  assert.match(output, /4 cells: 4 done, 0 failed, 0 blocked · checks: 1 passed, 0 failed/);
  assert.ok(!output.includes("\x1b["), "no colours when not on a terminal");
});

Deno.test("longtail run --set changes an adjustable value and rejects unknown names", async () => {
  const set = await cli("run", `${FIXTURES}stage.md`, "--set", "collectorResistor=5k1");
  assertEquals(set.status, 0);
  assert.match(set.output, /collectorResistor = 5\.1 kΩ \(set\)/);
  assert.match(set.output, /197\.27/);
  const typo = await cli("run", `${FIXTURES}stage.md`, "--set", "colectorResistor=5k1");
  assertEquals(typo.status, 2);
  assert.match(typo.output, /did you mean collectorResistor\?/);
  const bad = await cli("run", `${FIXTURES}stage.md`, "--set", "collectorResistor=lots");
  assertEquals(bad.status, 2);
  assert.match(bad.output, /Expected a number such as/);
});

Deno.test("longtail run exits 1 when a cell fails and 2 when the file is missing or not UTF-8", async () => {
  const dir = await Deno.makeTempDir();
  try {
    await Deno.writeTextFile(
      `${dir}/broken.md`,
      `${F}ts\nconst a = 1;\n${F}\n\n${F}ts\nthrow new Error("boom " + a);\n${F}\n`,
    );
    const broken = await cli("run", `${dir}/broken.md`);
    assertEquals(broken.status, 1);
    assert.match(broken.output, /Error: boom 1 \(line 6, column 7\)/);
    const missing = await cli("run", `${dir}/nowhere.md`);
    assertEquals(missing.status, 2);
    assert.match(missing.output, /nowhere\.md: no such file/);
    await Deno.writeFile(
      `${dir}/latin1.md`,
      new Uint8Array([0x23, 0x20, 0x4f, 0x68, 0x6d, 0x0a, 0xb5, 0x0a]),
    );
    const latin1 = await cli("run", `${dir}/latin1.md`);
    assertEquals(latin1.status, 2);
    assert.match(latin1.output, /is not UTF-8 text \(invalid byte 0xb5 on line 2\)/);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("longtail record refuses a notebook with a failed cell unless forced", async () => {
  const dir = await Deno.makeTempDir();
  try {
    const text = `${F}ts\nconst a = 1;\n${F}\n\n${F}ts\nthrow new Error("boom");\n${F}\n`;
    await Deno.writeTextFile(`${dir}/broken.md`, text);
    const refused = await cli("record", `${dir}/broken.md`, "--quiet");
    assertEquals(refused.status, 1);
    assert.match(refused.output, /Not recorded: 1 cell\(s\) of .*broken\.md did not finish/);
    assertEquals(await Deno.readTextFile(`${dir}/broken.md`), text);
    const forced = await cli("record", `${dir}/broken.md`, "--quiet", "--force");
    assertEquals(forced.status, 0);
    assert.match(await Deno.readTextFile(`${dir}/broken.md`), /! failed: Error: boom \(line 6\)/);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("longtail verify passes a recorded notebook and fails a drifted one with exit 1", async () => {
  const ws = await workspace();
  try {
    assertEquals((await cli("record", ws.path, "--quiet")).status, 0);
    const good = await cli("verify", ws.dir);
    assertEquals(good.status, 0, good.output);
    assert.match(
      good.output,
      /✓ .*stage\.md — 4 cells, 1\/1 checks passed, \d+ recorded results agree/,
    );
    assert.match(good.output, /1 passed, 0 failed\n$/);
    const text = await Deno.readTextFile(ws.path);
    await Deno.writeTextFile(
      ws.path,
      text.replace("const tailCurrent = 2e-3;", "const tailCurrent = 3e-3;"),
    );
    const drifted = await cli("verify", ws.path, "--junit", `${ws.dir}/report.xml`);
    assertEquals(drifted.status, 1);
    assert.match(drifted.output, /cell 2 \(line 19\) drifted:/);
    assert.match(drifted.output, /gain: recorded 181\.804, now 272\.706/);
    assert.match(drifted.output, /0 passed, 1 failed\n$/);
    const xml = await Deno.readTextFile(`${ws.dir}/report.xml`);
    assert.match(xml, /tests="1" failures="1" errors="0"/);
    assert.match(xml, /gain: recorded 181\.804, now 272\.706/);
  } finally {
    await ws.remove();
  }
});

Deno.test("longtail verify places type errors at notebook lines and exits 1", async () => {
  const dir = await Deno.makeTempDir();
  try {
    await Deno.writeTextFile(
      `${dir}/typed.md`,
      `# Typed\n\n${F}ts\nconst gain: number = 10;\n${F}\n\n${F}ts\nconst label: string = gain;\n${F}\n`,
    );
    const { status, output } = await cli("verify", `${dir}/typed.md`);
    assertEquals(status, 1);
    assert.match(
      output,
      /type error at line 8:7: TS2322: Type 'number' is not assignable to type 'string'/,
    );
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("longtail verify expands folders and patterns, splits shards, and exits 2 on bad input", async () => {
  const dir = await Deno.makeTempDir();
  try {
    for (const name of ["a", "b", "c"]) {
      await Deno.writeTextFile(`${dir}/${name}.md`, `${F}ts\nconst ${name} = 1;\n${F}\n`);
    }
    await Deno.writeTextFile(`${dir}/README.md`, "# Not a notebook: no cells\n");
    const all = await cli("verify", dir, "--no-type-check");
    assert.match(all.output, /3 passed, 0 failed/);
    const shard = await cli("verify", `${dir}/*.md`, "--shard", "2/2", "--no-type-check");
    assertEquals(shard.status, 0);
    assert.match(shard.output, /b\.md/);
    assert.ok(!shard.output.includes("a.md") && !shard.output.includes("c.md"));
    assertEquals((await cli("verify", dir, "--shard", "3/2")).status, 2);
    assertEquals((await cli("verify", dir, "--rtol", "-1")).status, 2);
    await Deno.mkdir(`${dir}/empty`);
    const empty = await cli("verify", `${dir}/empty`);
    assertEquals(empty.status, 2);
    assert.match(empty.output, /no notebooks/);
    const missing = await cli("verify", `${dir}/missing.md`, `${dir}/a.md`, "--no-type-check");
    assertEquals(missing.status, 2);
    assert.match(missing.output, /missing\.md: no such file or folder/);
    assert.match(missing.output, /1 passed, 0 failed/);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("deno task longtail verify exits 1 on a drift, as a separate process", async () => {
  const ws = await workspace();
  try {
    assertEquals((await cli("record", ws.path, "--quiet")).status, 0);
    const text = await Deno.readTextFile(ws.path);
    await Deno.writeTextFile(
      ws.path,
      text.replace("const tailCurrent = 2e-3;", "const tailCurrent = 1e-3;"),
    );
    const root = new URL("../../", import.meta.url).pathname;
    const output = await new Deno.Command(Deno.execPath(), {
      args: ["task", "--quiet", "longtail", "verify", ws.path, "--no-type-check"],
      cwd: root,
      env: { NO_COLOR: "1" },
      stdout: "piped",
      stderr: "piped",
    }).output();
    const stdout = new TextDecoder().decode(output.stdout);
    assertEquals(output.code, 1, stdout + new TextDecoder().decode(output.stderr));
    assert.match(stdout, /0 passed, 1 failed/);
  } finally {
    await ws.remove();
  }
});
