/**
 * The bad-input corpus through the real command line: every case of corpus_cases.ts gets
 * its expected exit status from `run` and `verify`, and a message that names the file,
 * cites the notebook line and says what to do. Then one `verify` over the whole corpus
 * must finish, report every notebook, and exit 2 (some inputs are unreadable).
 *
 * Generated inputs go to a temporary folder that is removed afterwards.
 *
 * @module
 */
import { assert } from "../_assert.ts";
import { citesLine, type CliResult, longtail, ROOT } from "./_cli.ts";
import { CORPUS, type CorpusCase } from "./corpus_cases.ts";
import { isReallyUnreadable } from "./_generate.ts";

const CASES_DIR = `${ROOT}/tests/corpus/cases`;

function isRoot(): boolean {
  try {
    return Deno.uid() === 0;
  } catch {
    return false;
  }
}

async function materialise(item: CorpusCase, dir: string): Promise<string> {
  if ("file" in item.source) return `${CASES_DIR}/${item.source.file}`;
  return await item.source.make(dir, CASES_DIR);
}

function show(result: CliResult): string {
  const text = result.output.length > 3000 ? result.output.slice(0, 3000) + " …" : result.output;
  return `exit ${result.code}\n${text}`;
}

function assertSays(item: CorpusCase, result: CliResult, command: string): void {
  for (const message of item.messages) {
    assert.match(
      result.output,
      message,
      `${command} of "${item.name}" says ${message}\n${show(result)}`,
    );
  }
  for (const line of item.lines ?? []) {
    assert.ok(
      citesLine(result.output, line),
      `${command} of "${item.name}" cites line ${line}\n${show(result)}`,
    );
  }
  if (item.advice) {
    assert.match(
      result.output,
      item.advice,
      `${command} of "${item.name}" says what to do\n${show(result)}`,
    );
  }
  for (const noise of item.absent ?? []) {
    assert.doesNotMatch(
      result.output,
      noise,
      `${command} of "${item.name}" hides internals\n${show(result)}`,
    );
  }
}

for (const item of CORPUS) {
  const needsUnreadable = item.name === "unreadable file";
  Deno.test({
    name: `corpus: ${item.name} — ${item.about}` +
      (needsUnreadable && isRoot()
        ? " (skipped: running as root, which reads mode-000 files anyway)"
        : ""),
    ignore: needsUnreadable && isRoot(),
    async fn() {
      const dir = await Deno.makeTempDir({ prefix: "longtail_corpus_" });
      try {
        const path = await materialise(item, dir);
        if (needsUnreadable && !(await isReallyUnreadable(path))) {
          // Not root, yet the file system ignores modes (some mounts do): nothing to test.
          console.log(`skipped: ${path} stays readable on this file system`);
          return;
        }
        if (item.run) {
          const result = await longtail(["run", path], { timeoutMs: item.timeoutMs });
          assert.equal(result.code, item.run.exit, `run exits ${item.run.exit}\n${show(result)}`);
          assertSays(item, result, "run");
          for (const shown of item.runShows ?? []) {
            assert.match(
              result.output,
              shown,
              `run of "${item.name}" shows ${shown}\n${show(result)}`,
            );
          }
        }
        if (item.verify) {
          const result = await longtail(["verify", "--no-type-check", path], {
            timeoutMs: item.timeoutMs,
          });
          assert.equal(
            result.code,
            item.verify.exit,
            `verify exits ${item.verify.exit}\n${show(result)}`,
          );
          assertSays(item, result, "verify");
          assert.match(
            result.output,
            /^\d+ passed, \d+ failed$/m,
            "verify ends with its summary line",
          );
        }
      } finally {
        await Deno.chmod(dir, 0o755).catch(() => {});
        for (const entry of Deno.readDirSync(dir)) {
          await Deno.chmod(`${dir}/${entry.name}`, 0o644).catch(() => {});
        }
        await Deno.remove(dir, { recursive: true });
      }
    },
  });
}

Deno.test("corpus: verify over the whole corpus finishes, reports every notebook and exits 2", async () => {
  const dir = await Deno.makeTempDir({ prefix: "longtail_corpus_all_" });
  try {
    const names: string[] = [];
    for (const item of CORPUS.filter((c) => c.inFolderVerify)) {
      let path = await materialise(item, dir);
      if (!path.startsWith(dir)) {
        const copy = `${dir}/${path.split("/").pop()}`;
        await Deno.copyFile(path, copy);
        path = copy;
      }
      names.push(path.split("/").pop()!);
    }
    const result = await longtail(["verify", dir], { timeoutMs: 300_000 });
    assert.equal(result.code, 2, `some inputs are unreadable: exit 2\n${show(result)}`);
    for (const name of names) {
      assert.ok(result.output.includes(name), `the report names ${name}\n${show(result)}`);
    }
    const summary = /^(\d+) passed, (\d+) failed$/m.exec(result.output);
    assert.ok(summary, `verify ends with its summary line\n${show(result)}`);
    const expectedPass = CORPUS.filter((c) => c.inFolderVerify && c.verify?.exit === 0).length;
    assert.equal(Number(summary[1]), expectedPass, "the notebooks that should pass, pass");
    assert.equal(Number(summary[2]), names.length - expectedPass, "every other notebook fails");
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});
