/**
 * The sandbox through the real command line: forbidden operations are denied and reported
 * on their cells, grants by option work and are reported, time, output and memory limits
 * stop a misbehaving cell without stopping the run, and the child sees no environment.
 *
 * Network traffic stays on the loopback address: a grant is tested against a server this
 * test starts on 127.0.0.1, and the denied fetch never leaves the sandbox.
 *
 * @module
 */
import { assert } from "../_assert.ts";
import { longtail, ROOT } from "../corpus/_cli.ts";
import { findProcesses, longtailCommand, SANDBOX_CHILD } from "./_processes.ts";

const FIXTURES = `${ROOT}/tests/sandbox/fixtures`;

/** The lines of `run` output that belong to one cell (from its header to the next). */
function cellBlock(output: string, cell: number): string {
  const lines = output.split("\n");
  const start = lines.findIndex((line) =>
    new RegExp(`\\bcell ${cell}\\b`).test(line) && /[✓✗⊘⏹]/.test(line)
  );
  if (start < 0) return "";
  let end = start + 1;
  while (
    end < lines.length && !/^\S*[✓✗⊘⏹] cell \d+/.test(lines[end].trim()) && !/^#/.test(lines[end])
  ) end++;
  return lines.slice(start, end).join("\n");
}

Deno.test("every forbidden operation is denied and reported on its own cell", async () => {
  const written = `${FIXTURES}/written_by_notebook.txt`;
  await Deno.remove(written).catch(() => {});
  const result = await longtail(["run", `${FIXTURES}/forbidden.md`]);
  assert.equal(result.code, 1, result.output);
  const expected: Array<[number, RegExp]> = [
    [1, /this notebook tried to read \/etc\/passwd; grant it with --allow-read=\/etc\/passwd/],
    [
      2,
      /this notebook tried to read the environment variable HOME; grant it with --allow-env=HOME/,
    ],
    [
      3,
      /this notebook tried to reach 127\.0\.0\.1:4507; grant it with --allow-net=127\.0\.0\.1:4507/,
    ],
    [4, /this notebook tried to start the program ls; notebooks may never start programs/],
    [5, /this notebook tried to write .*written_by_notebook\.txt; notebooks may never write files/],
    [
      6,
      /this notebook tried to load native code from libc\.so\.6; notebooks may never load native code/,
    ],
  ];
  for (const [cell, message] of expected) {
    const block = cellBlock(result.output, cell);
    assert.match(block, /failed|denied/, `cell ${cell} is reported as stopped:\n${result.output}`);
    assert.match(block, message, `cell ${cell} says what it tried:\n${block}`);
  }
  assert.match(
    cellBlock(result.output, 7),
    /✓[^\n]*\n\s+3\b/,
    "reading its own folder still works",
  );
  assert.equal(
    await Deno.stat(written).then(() => true, () => false),
    false,
    "nothing was written",
  );
});

Deno.test("a read granted with --allow-read works, and the report says what was granted", async () => {
  const dir = await Deno.makeTempDir({ prefix: "longtail_grant_" });
  try {
    const secret = `${dir}/outside/calibration.txt`;
    await Deno.mkdir(`${dir}/outside`);
    await Deno.writeTextFile(secret, "offset 1.25 mV\n");
    await Deno.mkdir(`${dir}/notebook`);
    const notebook = `${dir}/notebook/reads.md`;
    await Deno.writeTextFile(
      notebook,
      "# Reads a calibration file\n\n```ts\n" +
        `const calibration = await Deno.readTextFile(${
          JSON.stringify(secret)
        });\ncalibration.trim()\n` +
        "```\n",
    );
    const denied = await longtail(["run", notebook]);
    assert.equal(denied.code, 1, denied.output);
    assert.ok(denied.output.includes(`grant it with --allow-read=${secret}`), denied.output);
    const granted = await longtail(["run", `--allow-read=${secret}`, notebook]);
    assert.equal(granted.code, 0, granted.output);
    assert.match(granted.output, /offset 1\.25 mV/);
    assert.match(
      granted.output,
      new RegExp(`granted: read ${secret.replace(/[.*+?^${}()|[\]\\/]/g, "\\$&")}`),
    );
    const verified = await longtail([
      "verify",
      "--no-type-check",
      `--allow-read=${secret}`,
      notebook,
    ]);
    assert.equal(verified.code, 0, verified.output);
    assert.match(verified.output, /granted: read /);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("network granted with --allow-net reaches that host only", async () => {
  const dir = await Deno.makeTempDir({ prefix: "longtail_net_" });
  const controller = new AbortController();
  const server = Deno.serve(
    { hostname: "127.0.0.1", port: 0, signal: controller.signal, onListen: () => {} },
    () => new Response("42 mA"),
  );
  try {
    const port = server.addr.port;
    const notebook = `${dir}/fetches.md`;
    await Deno.writeTextFile(
      notebook,
      "# Fetches a value from a bench instrument\n\n```ts\n" +
        `const reply = await fetch("http://127.0.0.1:${port}/current");\nconst reading = await reply.text();\nreading\n` +
        "```\n",
    );
    const denied = await longtail(["run", notebook]);
    assert.equal(denied.code, 1, denied.output);
    assert.ok(denied.output.includes(`grant it with --allow-net=127.0.0.1:${port}`), denied.output);
    const granted = await longtail(["run", `--allow-net=127.0.0.1:${port}`, notebook]);
    assert.equal(granted.code, 0, granted.output);
    assert.match(granted.output, /42 mA/);
    assert.match(granted.output, new RegExp(`granted: .*net 127\\.0\\.0\\.1:${port}`));
  } finally {
    controller.abort();
    await server.finished;
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test({
  name:
    "the sandbox process has no environment but what it needs, and --allow-env passes one variable",
  ignore: Deno.build.os !== "linux", // It looks at the process through /proc.
}, async () => {
  const dir = await Deno.makeTempDir({ prefix: "longtail_env_" });
  try {
    const notebook = `${dir}/environment.md`;
    // The first cell waits for a file in its own folder, so the test can look at the
    // sandbox process's environment from outside (/proc/PID/environ) while it is alive.
    await Deno.writeTextFile(
      notebook,
      "# What the sandbox process was given\n\n```ts\n" +
        'for (;;) {\n  try {\n    await Deno.stat("go.txt");\n    break;\n  } catch {\n' +
        "    await new Promise((resolve) => setTimeout(resolve, 50));\n  }\n}\nconst waited = true;\n" +
        "```\n\n```ts\n" +
        'const bench = Deno.env.get("LONGTAIL_BENCH_ID");\nbench\n' +
        "```\n",
    );
    const child = longtailCommand(["run", "--allow-env=LONGTAIL_BENCH_ID", notebook], {
      env: { NO_COLOR: "1", LONGTAIL_SECRET_TOKEN: "hunter2", LONGTAIL_BENCH_ID: "bench-7" },
      stdout: "piped",
      stderr: "piped",
    }).spawn();
    let environment: string[] | undefined;
    for (let tries = 0; tries < 300 && environment === undefined; tries++) {
      await new Promise((resolve) => setTimeout(resolve, 100));
      environment = await sandboxEnvironment(dir);
    }
    await Deno.writeTextFile(`${dir}/go.txt`, "go");
    const { code, stdout, stderr } = await child.output();
    const output = new TextDecoder().decode(stdout) + new TextDecoder().decode(stderr);
    assert.equal(code, 0, output);
    assert.ok(environment, "the sandbox process was found");
    const names = environment.map((entry) => entry.split("=")[0]).sort();
    // Exactly: Deno's cache, the program search path (so a denied program is reported as
    // denied, not as missing), two switches that quieten Deno, and the one variable granted.
    assert.deepEqual(names, [
      "DENO_DIR",
      "DENO_NO_UPDATE_CHECK",
      "LONGTAIL_BENCH_ID",
      "NO_COLOR",
      "PATH",
    ]);
    assert.ok(
      !environment.some((entry) => entry.includes("hunter2")),
      "no secret reaches the sandbox",
    );
    assert.match(cellBlock(output, 2), /bench-7/, "the granted variable is readable");
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

/** The environment of the sandbox process working in `dir`, read from /proc (Linux). */
async function sandboxEnvironment(dir: string): Promise<string[] | undefined> {
  const environments = await findProcesses(SANDBOX_CHILD, async (pid) => {
    if ((await Deno.realPath(`/proc/${pid}/cwd`)) !== (await Deno.realPath(dir))) return undefined;
    const environ = await Deno.readTextFile(`/proc/${pid}/environ`);
    return environ.split("\0").filter((item) => item !== "");
  });
  return environments[0];
}

Deno.test("an endless loop is stopped at the time limit by killing its process; the next cell runs", async () => {
  const result = await longtail(["run", "--timeout", "2", `${FIXTURES}/endless_loop.md`], {
    timeoutMs: 60_000,
  });
  assert.equal(result.code, 1, result.output);
  const looping = cellBlock(result.output, 1);
  assert.match(looping, /time limit/);
  assert.match(looping, /\b2 s\b/, "the limit is named");
  assert.match(looping, /line 7/, "the cell is named by its line");
  const pid = Number(/sandbox process (\d+)/.exec(result.output)?.[1]);
  assert.ok(pid > 0, "the cell said which process it ran in");
  const alive = await Deno.stat(`/proc/${pid}`).then(() => true, () => false);
  assert.equal(alive, false, `the looping process ${pid} is gone`);
  assert.match(cellBlock(result.output, 2), /✓[^\n]*\n\s+5\b/, "the independent cell still ran");
});

Deno.test("verify stops a looping notebook and goes on with the next one", async () => {
  const dir = await Deno.makeTempDir({ prefix: "longtail_loop_verify_" });
  try {
    await Deno.copyFile(`${FIXTURES}/endless_loop.md`, `${dir}/a_endless_loop.md`);
    await Deno.writeTextFile(`${dir}/b_fine.md`, "# Fine\n\n```ts\nconst fine = 1;\nfine\n```\n");
    const result = await longtail(["verify", "--no-type-check", "--timeout", "2", dir], {
      timeoutMs: 60_000,
    });
    assert.equal(result.code, 1, result.output);
    assert.match(result.output, /a_endless_loop\.md[\s\S]*time limit/);
    assert.match(result.output, /b_fine\.md/);
    assert.match(result.output, /^1 passed, 1 failed$/m);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("a notebook time limit stops a slow notebook and names the cells left out", async () => {
  const started = performance.now();
  const result = await longtail(["run", "--notebook-timeout", "2.5", `${FIXTURES}/slow_cells.md`], {
    timeoutMs: 60_000,
  });
  const seconds = (performance.now() - started) / 1000;
  assert.equal(result.code, 1, result.output);
  assert.match(result.output, /notebook time limit of 2\.5 s/);
  assert.match(cellBlock(result.output, 1), /✓/, "the first cells ran");
  assert.match(
    cellBlock(result.output, 6),
    /notebook time limit/,
    "the last cell says why it did not run",
  );
  assert.ok(seconds < 20, `it stopped instead of running on (${seconds.toFixed(1)} s)`);
});

Deno.test("huge output is cut off with a note, and the notebook goes on", async () => {
  const result = await longtail(["run", `${FIXTURES}/huge_output.md`], { timeoutMs: 120_000 });
  assert.equal(result.code, 0, result.output.slice(0, 2000));
  assert.ok(
    result.output.length < 4_000_000,
    `the output stays small (${result.output.length} characters)`,
  );
  assert.match(
    cellBlock(result.output, 1),
    /printing stopped: a cell may print at most/,
    "printed text is cut with a note",
  );
  assert.match(
    cellBlock(result.output, 2),
    /output cut at \d+ of 20000000 characters/,
    "a huge shown value is cut with a note",
  );
  assert.match(cellBlock(result.output, 3), /✓[^\n]*\n\s+3\b/, "the next cell ran");
});

Deno.test("a cell that eats memory is stopped at the memory limit; the next cell runs", async () => {
  const result = await longtail(["run", "--memory-limit", "128", `${FIXTURES}/memory_hog.md`], {
    timeoutMs: 120_000,
  });
  assert.equal(result.code, 1, result.output.slice(0, 3000));
  const hog = cellBlock(result.output, 1);
  assert.match(hog, /memory limit of 128 MB/, hog);
  assert.doesNotMatch(result.output, /C stack trace|Mark-Compact/, "no engine dump");
  assert.match(cellBlock(result.output, 2), /✓[^\n]*\n\s+11\b/);
});

Deno.test("a cell that ends its own process is reported, and the run does not hang", async () => {
  const result = await longtail(["run", `${FIXTURES}/exits_sandbox.md`], { timeoutMs: 60_000 });
  assert.equal(result.code, 1, result.output);
  assert.match(cellBlock(result.output, 2), /exit|ended/i, result.output);
  assert.match(cellBlock(result.output, 3), /✓[^\n]*\n\s+2\b/, result.output);
});

Deno.test("record refuses to overwrite a notebook that changed on disk while its cells ran", async () => {
  const dir = await Deno.makeTempDir({ prefix: "longtail_changed_" });
  try {
    const path = `${dir}/slow.md`;
    // The cell waits until the test says go (a file in its own folder, which it may read),
    // so the edit surely lands while the cells run, after record has read the notebook.
    await Deno.writeTextFile(
      path,
      '# Slow\n\n```ts\nfor (;;) {\n  try {\n    await Deno.stat("go.txt");\n    break;\n  } catch {\n' +
        "    await new Promise((resolve) => setTimeout(resolve, 50));\n  }\n}\nconst waited = 1;\nwaited\n```\n",
    );
    const recording = longtail(["record", path], { timeoutMs: 60_000 });
    await new Promise((resolve) => setTimeout(resolve, 2000));
    const edited = (await Deno.readTextFile(path)) + "\nA line the designer added meanwhile.\n";
    await Deno.writeTextFile(path, edited);
    await Deno.writeTextFile(`${dir}/go.txt`, "go");
    const result = await recording;
    assert.equal(result.code, 1, result.output);
    assert.match(result.output, /changed on disk/);
    assert.equal(
      await Deno.readTextFile(path),
      edited,
      "the designer's edit is kept, byte for byte",
    );
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

/** Processes whose parent is `pid` and whose command line mentions `text` (Linux /proc). */
async function childrenOf(pid: number, text: string): Promise<number[]> {
  return await findProcesses(text, async (child) => {
    const stat = await Deno.readTextFile(`/proc/${child}/stat`);
    const parent = Number(stat.slice(stat.lastIndexOf(")") + 2).split(" ")[1]);
    return parent === pid ? child : undefined;
  });
}

Deno.test({
  name:
    "a looping sandbox ends when longtail itself is killed, instead of spinning on as an orphan",
  ignore: Deno.build.os !== "linux", // It finds the processes through /proc.
}, async () => {
  const host = longtailCommand(["run", "--timeout", "60", `${FIXTURES}/endless_loop.md`], {
    stdin: "null",
    stdout: "null",
    stderr: "null",
  }).spawn();
  let sandbox: number[] = [];
  for (let tries = 0; tries < 100 && sandbox.length === 0; tries++) {
    await new Promise((resolve) => setTimeout(resolve, 100));
    sandbox = await childrenOf(host.pid, SANDBOX_CHILD);
  }
  assert.equal(sandbox.length, 1, "the sandbox process started");
  await new Promise((resolve) => setTimeout(resolve, 500)); // Let the cell start looping.
  host.kill("SIGKILL");
  await host.status;
  let alive = true;
  for (let tries = 0; tries < 50 && alive; tries++) {
    await new Promise((resolve) => setTimeout(resolve, 100));
    alive = await Deno.stat(`/proc/${sandbox[0]}`).then(() => true, () => false);
  }
  if (alive) Deno.kill(sandbox[0], "SIGKILL"); // Do not leave it behind, whatever the verdict.
  assert.equal(alive, false, `the orphaned sandbox ${sandbox[0]} ended within 5 s`);
});
