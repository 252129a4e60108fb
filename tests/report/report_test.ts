import { assert, assertEquals, assertRejects, assertThrows } from "../_assert.ts";
import { renderReport } from "../../kernel/report/mod.ts";
import { renderCommand } from "../../kernel/cli/render.ts";
import { UsageError } from "../../kernel/cli/_common.ts";
import { bufferIo } from "../../kernel/cli/_terminal.ts";
import { splitNotebook } from "../../kernel/notebook/split.ts";
import { LONGTAIL_VERSION } from "../../kernel/version.ts";
import {
  attribute,
  byClass,
  elements,
  fixturePath,
  hasClass,
  type HtmlNode,
  renderFixture,
  textOf,
} from "./_fixture.ts";

const ADDRESS_ATTRIBUTES = [
  "href",
  "xlink:href",
  "src",
  "srcset",
  "action",
  "formaction",
  "poster",
  "background",
];

function cellSections(document: HtmlNode): HtmlNode[] {
  return byClass(document, "lt-cell").filter((node) => node.tagName === "section");
}

Deno.test("renderReport() shows every cell once, in notebook order, with each of its outputs and printed lines", async () => {
  const { source, run, document } = await renderFixture("bias_review.md");
  const notebook = splitNotebook(source.text);
  const sections = cellSections(document);
  assertEquals(sections.length, notebook.cells.length);
  sections.forEach((section, i) => {
    assertEquals(attribute(section, "id"), `lt-cell-${i + 1}`);
    assertEquals(attribute(section, "data-status"), run.cells[i].status);
    const outputs = byClass(section, "lt-output");
    assertEquals(
      outputs.length,
      run.cells[i].outcome?.outputs.length ?? 0,
      `outputs of cell ${i + 1}`,
    );
    assertEquals(
      byClass(section, "lt-stream").length,
      run.cells[i].streams.length,
      `printed text of cell ${i + 1}`,
    );
    const code = byClass(section, "lt-code")[0];
    assertEquals(code.tagName, "details");
    assertEquals(textOf(code).includes(notebook.cells[i].code.trim().split("\n")[0]), true);
  });
  // The fixture's printed line and its shown number are both in cell 2.
  assert.match(textOf(sections[1]), /quiescent dissipation 1\.08 W/);
  assert.ok(sections.some((section) => byClass(section, "lt-figure").length === 1));
});

Deno.test("renderReport() sums up exactly the notebook's checks, failures first, each linked to the cell that computes it", async () => {
  const { run, document } = await renderFixture("bias_review.md");
  const expected = run.cells.flatMap((cell, i) =>
    (cell.outcome?.checks ?? []).map((check) => ({ check, cell: i + 1 }))
  );
  assertEquals(expected.length, 2);
  const table = byClass(document, "lt-checks")[0];
  const rows = [...elements(table)].filter((node) => node.tagName === "tr").slice(1);
  assertEquals(rows.length, expected.length);
  const seen = rows.map((row) => {
    const cells = [...elements(row)].filter((node) => node.tagName === "td");
    const link = [...elements(row)].find((node) => node.tagName === "a")!;
    const target = attribute(link, "href")!.slice(1);
    const anchored = [...elements(document)].find((node) => attribute(node, "id") === target);
    assert.ok(anchored, `the link #${target} has a target`);
    let section: HtmlNode | null | undefined = anchored;
    while (section && !hasClass(section, "lt-cell")) section = section.parentNode;
    assertEquals(textOf(link), `cell ${attribute(section!, "id")!.replace("lt-cell-", "")}`);
    return {
      name: textOf(cells[1]),
      pass: textOf(cells[0]).includes("pass"),
      cell: Number(textOf(link).slice(5)),
    };
  });
  assertEquals(seen.map((row) => row.pass), [false, true]);
  assertEquals(
    seen.map(({ name, pass, cell }) => `${name}|${pass}|${cell}`).sort(),
    expected.map(({ check, cell }) => `${check.name}|${check.pass}|${cell}`).sort(),
  );
  assert.match(textOf(document), /1 passed, 1 failed/);
  // Value, limit and margin in engineering units: 1.08 W against 0.8 W (closed form from the fixture's numbers).
  assert.match(textOf(rows[0]), /1\.08\sW.*≤\s800\smW.*−280\smW\s\(−35\s%\)/);
});

Deno.test("renderReport() heads the report with the title, the run's time, and the longtail and Deno versions", async () => {
  const { run, document } = await renderFixture("bias_review.md");
  const h1 = [...elements(document)].filter((node) => node.tagName === "h1");
  assertEquals(h1.length, 1, "the first heading becomes the title and is not repeated");
  assertEquals(textOf(h1[0]), "Bias review of a small class-AB follower");
  const title = [...elements(document)].find((node) => node.tagName === "title")!;
  assertEquals(textOf(title), "Bias review of a small class-AB follower · design report");
  const facts = textOf(byClass(document, "lt-facts")[0]);
  assert.ok(facts.includes(LONGTAIL_VERSION) && facts.includes(Deno.version.deno));
  const time = [...elements(document)].find((node) => node.tagName === "time")!;
  assertEquals(attribute(time, "datetime"), run.ranAt.toISOString());
  assert.match(facts, /7 cells, 5 ran, 1 failed, 1 blocked/);
});

for (const name of ["bias_review.md", "hostile.md"]) {
  Deno.test(`renderReport() of ${name} names no address anywhere, so opening it makes no request`, async () => {
    const { html, document } = await renderFixture(name);
    // Addresses may appear as text (code, a prose link's address), never as a reference.
    assertEquals(/(src|href|action)\s*=\s*["']?\s*(https?:|\/\/)/i.test(html), false);
    for (const node of elements(document)) {
      for (const attr of node.attrs ?? []) {
        assertEquals(
          /https?:|^\s*\/\//i.test(attr.value),
          false,
          `${node.tagName} ${attr.name}="${attr.value}"`,
        );
      }
      for (const attr of ADDRESS_ATTRIBUTES) {
        const value = attribute(node, attr);
        if (value === undefined) continue;
        assert.ok(
          value.startsWith("#") || value.startsWith("data:image/"),
          `${node.tagName} ${attr}="${value}"`,
        );
      }
      for (
        const styled of [
          attribute(node, "style") ?? "",
          node.tagName === "style" ? textOf(node) : "",
        ]
      ) {
        assertEquals(
          /url\s*\(\s*(?!['"]?#)/i.test(styled),
          false,
          `a style loads nothing: ${styled.slice(0, 80)}`,
        );
        assertEquals(/@import|@font-face/i.test(styled), false);
      }
    }
    const policy = [...elements(document)].find((node) =>
      attribute(node, "http-equiv") === "Content-Security-Policy"
    );
    assert.match(attribute(policy!, "content")!, /default-src 'none'/);
  });
}

Deno.test("renderReport() renders prose as Markdown: formulas as MathML, raw HTML as text, prices as text", async () => {
  const { document } = await renderFixture("bias_review.md");
  const main = [...elements(document)].find((node) => node.tagName === "main")!;
  const maths = [...elements(main)].filter((node) => node.tagName === "math");
  assertEquals(maths.length, 2, "one inline and one display formula");
  assertEquals(maths.filter((node) => attribute(node, "display") === "block").length, 1);
  assert.ok(textOf(main).includes("Prices such as $5 and $6 stay text."));
  assert.ok([...elements(main)].some((node) => node.tagName === "table"));
  // The external link keeps its text and shows its address as text; the anchor link stays a link.
  assert.ok(textOf(main).includes("the maker's site (https://parts.example/bias)"));
  assertEquals(
    [...elements(main)].some((node) => (attribute(node, "href") ?? "").includes("parts.example")),
    false,
  );
  assertEquals(
    [...elements(main)].filter((node) =>
      node.tagName === "a" && attribute(node, "href") === "#summary"
    ).length,
    1,
  );
  assert.ok([...elements(main)].some((node) => attribute(node, "id") === "summary"));
  const hostile = await renderFixture("hostile.md");
  const hostileMain = [...elements(hostile.document)].find((node) => node.tagName === "main")!;
  assert.ok(textOf(hostileMain).includes(`<script>alert("prose")</script>`));
  assert.ok(textOf(hostileMain).includes(`<iframe src=`));
});

Deno.test("renderReport() gives every element a unique id, so two pictures' clip paths stay their own", async () => {
  const { document } = await renderFixture("bias_review.md");
  const ids = [...elements(document)].map((node) => attribute(node, "id")).filter((id) =>
    id !== undefined
  );
  assertEquals(new Set(ids).size, ids.length);
  const figures = byClass(document, "lt-figure");
  assertEquals(figures.length, 2);
  for (const figure of figures) {
    const inside = new Set(
      [...elements(figure)].map((node) => attribute(node, "id")).filter(Boolean),
    );
    const references = [...elements(figure)].map((node) => attribute(node, "clip-path")).filter(
      Boolean,
    ) as string[];
    assert.ok(references.length > 0);
    for (const reference of references) {
      assert.ok(inside.has(reference.replace(/^url\(#|\)$/g, "")), reference);
    }
  }
});

Deno.test("renderReport() shows an error in place with its notebook line, and names the failed cell on the blocked one", async () => {
  const { source, run, document } = await renderFixture("bias_review.md");
  const throwLine =
    source.text.split("\n").findIndex((line) => line.includes("throw new RangeError")) + 1;
  const failed = run.cells.findIndex((cell) => cell.status === "failed") + 1;
  const blocked = run.cells.findIndex((cell) => cell.status === "blocked") + 1;
  const sections = cellSections(document);
  const error = byClass(sections[failed - 1], "lt-error")[0];
  assert.ok(error, "the failed cell shows its error");
  assert.match(textOf(error), new RegExp(`at line ${throwLine}\\b`));
  assert.match(textOf(error), /RangeError: the second stage has no load/);
  assert.ok(textOf(byClass(error, "lt-source")[0]).startsWith(`${throwLine} │`));
  const note = byClass(sections[blocked - 1], "lt-note")[0];
  const link = [...elements(note)].find((node) => node.tagName === "a")!;
  assertEquals(attribute(link, "href"), `#lt-cell-${failed}`);
});

Deno.test("renderReport() keeps hostile markup from running, loading or leaving its output's box", async () => {
  const { run, document } = await renderFixture("hostile.md");
  const raw = run.cells.flatMap((cell) => cell.outcome?.outputs ?? []);
  assert.ok(
    raw.some((bundle) => (bundle["text/html"] ?? "").includes("<script>")),
    "the fixture did return a script",
  );
  assert.ok(
    raw.some((bundle) => (bundle["image/svg+xml"] ?? "").includes("onload=")),
    "and an SVG handler",
  );
  const all = [...elements(document)];
  const scripts = all.filter((node) => node.tagName === "script");
  assertEquals(scripts.length, 1, "only the report's own print script");
  assert.match(textOf(scripts[0]), /^addEventListener\("beforeprint"/);
  for (const tag of ["iframe", "form", "input", "foreignObject", "animate", "object", "embed"]) {
    assertEquals(all.filter((node) => node.tagName === tag).length, 0, `no <${tag}>`);
  }
  assertEquals(
    all.filter((node) => node.tagName === "style").length,
    1,
    "only the report's own style sheet",
  );
  for (const node of all) {
    for (const attr of node.attrs ?? []) {
      assert.ok(!/^on/i.test(attr.name), `${node.tagName} ${attr.name}`);
    }
  }
  const body = all.find((node) => node.tagName === "body")!;
  assertEquals((body.childNodes ?? []).filter((node) => node.tagName).map((node) => node.tagName), [
    "header",
    "main",
    "footer",
    "script",
  ]);
  const main = all.find((node) => node.tagName === "main")!;
  const sections = cellSections(document);
  assertEquals(sections.length, run.cells.length);
  for (const section of sections) assertEquals(section.parentNode, main);
  for (
    const output of byClass(document, "lt-output").filter((node) =>
      !hasClass(node, "lt-output-checks")
    )
  ) {
    for (const node of elements(output)) {
      assert.ok(
        !(attribute(node, "class") ?? "").split(/\s+/).some((c) => c.startsWith("lt-")),
        "no report classes in outputs",
      );
    }
  }
  // The check's name and reason are shown as text, not markup.
  const summary = textOf(byClass(document, "lt-checks")[0]);
  assert.ok(summary.includes("<b>bold</b> check"));
  assert.ok(textOf(main).includes("<script>alert('stream')</script>"));
  assert.ok(textOf(main).includes("</pre></section></main><script>alert('plain')</script>"));
  assert.ok(
    textOf(main).includes("open cell"),
    "an unclosed table cell is closed inside its output",
  );
});

Deno.test("renderReport() refuses a run that does not have one result per cell", () => {
  assertThrows(
    () =>
      renderReport({ text: "~~~ts\n1\n~~~\n", path: "a.md" }, { ranAt: new Date(0), cells: [] }),
    RangeError,
  );
});

Deno.test("renderReport() says which cells never ran when a run stopped early", () => {
  const html = renderReport(
    { text: "# Stopped\n\n~~~ts\nconst a = 1\n~~~\n", path: "stopped.md" },
    {
      ranAt: new Date(0),
      cells: [{ id: "c1", status: "queued", streams: [] }],
    },
  );
  assert.match(html, /Not run: the run stopped before this cell/);
  assert.match(html, /1 cell, 0 ran, 1 not run/);
  assert.match(html, /This notebook computes no design checks/);
});

Deno.test("render writes the report through a temporary file, prints its path and exits 1 when a check failed", async () => {
  const folder = await Deno.makeTempDir({ prefix: "longtail_render_" });
  try {
    const output = `${folder}/reports/bias.html`;
    const { io, stdout } = bufferIo();
    const status = await renderCommand([fixturePath("bias_review.md"), "-o", output], io);
    assertEquals(status, 1);
    assertEquals(stdout().trim(), output);
    assert.ok((await Deno.readTextFile(output)).startsWith("<!DOCTYPE html>"));
    const left = [];
    for await (const entry of Deno.readDir(`${folder}/reports`)) left.push(entry.name);
    assertEquals(left, ["bias.html"], "no temporary file is left behind");
    const quiet = bufferIo();
    assertEquals(
      await renderCommand([fixturePath("hostile.md"), "-o", `${folder}/h.html`], quiet.io),
      0,
    );
  } finally {
    await Deno.remove(folder, { recursive: true });
  }
});

Deno.test("render refuses to run without exactly one notebook, and explains its options with --help", async () => {
  const { io, stdout } = bufferIo();
  await assertRejects(() => renderCommand([], io), UsageError);
  assertEquals(await renderCommand(["--help"], io), 0);
  assert.match(stdout(), /Usage: longtail render NOTEBOOK/);
});
