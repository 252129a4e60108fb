/**
 * The README's promises: the two fresh-machine commands exist as tasks, and its example
 * notebook runs as printed.
 */
import { main } from "../kernel/cli/main.ts";
import { bufferIo } from "../kernel/cli/_terminal.ts";
import { assert, assertEquals } from "./_assert.ts";

const ROOT = new URL("../", import.meta.url).pathname;
const README = Deno.readTextFileSync(`${ROOT}README.md`);

Deno.test("README gives the demo and test commands, and deno.json defines both tasks", () => {
  assert.match(README, /npx -y deno@2\.9\.6 task demo/);
  assert.match(README, /npx -y deno@2\.9\.6 task test/);
  const config = JSON.parse(Deno.readTextFileSync(`${ROOT}deno.json`));
  assert.ok(config.tasks.demo && config.tasks.test, "tasks demo and test exist");
});

Deno.test("README's example notebook runs as printed and its checks pass", async () => {
  const example = /````markdown\n([\s\S]*?)\n````/.exec(README);
  assert.ok(example, "README has a ````markdown example notebook");
  const dir = await Deno.makeTempDir({ prefix: "longtail-readme-" });
  try {
    await Deno.writeTextFile(`${dir}/example.md`, example[1] + "\n");
    const { io, output } = bufferIo();
    const status = await main(["run", `${dir}/example.md`], io);
    assertEquals(status, 0, output());
    assert.match(output(), /checks: \d+ passed, 0 failed/);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});
