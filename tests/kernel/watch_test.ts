/**
 * `longtail watch`: after a save, only the edited cell and its dependents run again, each
 * once, and the new values are printed.
 */
import { watchNotebook } from "../../kernel/cli/watch_command.ts";
import { bufferIo } from "../../kernel/cli/_terminal.ts";
import { assert, assertEquals } from "../_assert.ts";

const F = "```";

Deno.test("watchNotebook() reruns only the edited cell and its dependents after a save", async () => {
  //   c1 gain ──▶ c2 doubled
  //   c3 other (independent)
  const dir = await Deno.makeTempDir({ prefix: "longtail-watch-" });
  const path = `${dir}/watched.md`;
  const notebook = (gain: number) =>
    `# Watched\n\n${F}ts\nconst gain = ${gain};\n${F}\n\n${F}ts\nconst doubled = gain * 2;\ndoubled\n${F}\n\n${F}ts\nconst other = 7;\nother\n${F}\n`;
  await Deno.writeTextFile(path, notebook(20));
  const rounds: string[][] = [];
  let roundArrived: () => void = () => {};
  const next = () => new Promise<void>((resolve) => (roundArrived = resolve));
  const controller = new AbortController();
  const { io, output } = bufferIo();
  let first = next();
  const watching = watchNotebook(path, io, {
    signal: controller.signal,
    settleMs: 50,
    onRound: (ran) => {
      rounds.push(ran);
      roundArrived();
    },
  });
  try {
    await first;
    assertEquals(rounds[0].length, 3); // closed form: every cell runs once on the first round
    first = next();
    await Deno.writeTextFile(path, notebook(25));
    await first;
    assertEquals(rounds[1].length, 2); // closed form: the edited cell and its one dependent
    assert.match(output(), /\n {2}50\n/);
    assert.match(output(), /ran 2 of 3 cells/);
  } finally {
    controller.abort();
    await watching;
    await Deno.remove(dir, { recursive: true });
  }
});
