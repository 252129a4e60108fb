/**
 * The process the kill-during-record test kills: it takes a finished run (saved by the
 * test, so no cell has to run again), reads the notebook, says "ready" and records the
 * results with the kernel's own `recordNotebook`, the step `longtail record` ends with.
 *
 * Usage: deno run -A tests/sandbox/_record_driver.ts RUN_FILE
 *
 * @module
 */
import { recordNotebook } from "../../kernel/record/record_notebook.ts";
import { decodeLine } from "../../kernel/sandbox/protocol.ts";
import type { NotebookRun } from "../../kernel/session/run_notebook.ts";

const saved = decodeLine(await Deno.readTextFile(Deno.args[0])) as NotebookRun & {
  adjustables: Array<[string, string]>;
};
const run: NotebookRun = { ...saved, adjustables: new Map(saved.adjustables) };
const bytes = await Deno.readFile(run.path);
Deno.stdout.writeSync(new TextEncoder().encode("ready\n"));
await recordNotebook(run, bytes);
Deno.stdout.writeSync(new TextEncoder().encode("done\n"));
