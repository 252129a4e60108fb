/**
 * Rendering speed of the report, warm (target: the flagship notebook's report, all charts
 * included, under 1.5 s). The notebook runs once before the benches; what is timed is
 * the rendering of the finished run (Markdown, formulas, highlighting, sanitising every
 * chart), plus a whole run-and-render of a small fixture for scale.
 */
import { renderReport } from "../../kernel/report/mod.ts";
import { runNotebookForReport } from "../../kernel/report/report_run.ts";

const flagshipPath = new URL("../../notebooks/power_amplifier.md", import.meta.url).pathname;
const fixturePath = new URL("./fixtures/bias_review.md", import.meta.url).pathname;

async function prepared(path: string) {
  try {
    return await runNotebookForReport(path, await Deno.readTextFile(path));
  } catch {
    return undefined;
  }
}

const flagship = await prepared(flagshipPath);
const fixture = (await prepared(fixturePath))!;

Deno.bench({
  name: "renderReport() of the flagship power-amplifier notebook, all charts (target < 1.5 s)",
  ignore: flagship === undefined,
  fn: () => {
    renderReport(flagship!.source, flagship!.run);
  },
});

Deno.bench("renderReport() of the small fixture notebook", () => {
  renderReport(fixture.source, fixture.run);
});

Deno.bench({
  name: "run and render the flagship notebook in a fresh sandbox (what `render` does)",
  ignore: flagship === undefined,
  n: 3,
  fn: async () => {
    const { source, run } = await runNotebookForReport(
      flagshipPath,
      await Deno.readTextFile(flagshipPath),
    );
    renderReport(source, run);
  },
});
