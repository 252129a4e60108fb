/**
 * The notebook file: splitting into prose, cells and recorded blocks byte for byte, and
 * writing recorded results without touching anything else.
 */
import fc from "fast-check";
import {
  joinParts,
  notebookParts,
  parseRecorded,
  type RecordedEntry,
  recordedLines,
  splitNotebook,
  writeRecorded,
} from "../../kernel/notebook/mod.ts";
import { assert, assertEquals } from "../_assert.ts";

const F = "```";

function roundTrips(text: string): void {
  const notebook = splitNotebook(text);
  assert.equal(notebook.lines.join(""), text);
  assert.equal(joinParts(notebookParts(notebook)), text);
}

Deno.test("splitNotebook() then joinParts() returns the original bytes for awkward files", () => {
  const texts = [
    "",
    "no newline at the end",
    `${F}ts\nconst a = 1\n${F}`,
    `\uFEFF# With a byte-order mark\r\n\r\n${F}ts\r\nconst a = 1\r\n${F}\r\n`,
    `old Mac\r${F}ts\rconst a = 1\r${F}\r`,
    `${F}ts\nnever closed\n`,
    `~~~~ts\n~~~\nstill code\n~~~~\n`,
    `> ${F}ts\n> const quoted = 1\n> ${F}\n`,
    `1. item\n\n   ${F}typescript\n   const listed = 2\n   ${F}\n`,
    `    ${F}ts\n    indented code, not a cell\n    ${F}\n`,
    `Ωmega µ ✓ 😀\n${F}ts\nconst µ = "Ω"\n${F}\n`,
  ];
  for (const text of texts) roundTrips(text);
});

Deno.test("splitNotebook() finds cells in tilde, long, listed and quoted fences, not indented code", () => {
  const text = [
    "# Title", // 1
    "", // 2
    "~~~~ts", // 3
    "const a = 1;", // 4
    "~~~", // 5 (too short: still code)
    "~~~~", // 6
    "", // 7
    "- item", // 8
    "", // 9
    `  ${F}typescript`, // 10
    "  const b = a;", // 11
    `  ${F}`, // 12
    `> ${F}ts`, // 13
    "> const c = b;", // 14
    `> ${F}`, // 15
    "", // 16
    `    ${F}ts`, // 17
    "    not a cell", // 18
    `    ${F}`, // 19
    `${F}js`, // 20
    "not a cell either", // 21
    F, // 22
  ].join("\n") + "\n";
  const notebook = splitNotebook(text);
  assertEquals(notebook.cells.map((cell) => cell.code), [
    "const a = 1;\n~~~\n",
    "const b = a;\n",
    "const c = b;\n",
  ]);
  assertEquals(notebook.cells.map((cell) => cell.codeLine), [4, 11, 14]);
  assertEquals(notebook.cells.map((cell) => cell.columnOffsets[0]), [0, 2, 2]);
  assertEquals(notebook.cells.map((cell) => cell.prefix), ["", "  ", "> "]);
  assertEquals(notebook.headings.map((heading) => heading.text), ["Title"]);
});

Deno.test("splitNotebook() marks an unclosed fence and keeps everything after it as code", () => {
  const notebook = splitNotebook(`Intro\n${F}ts\nconst a = 1\n\n# Not a heading\n`);
  assertEquals(notebook.cells.length, 1);
  assertEquals(notebook.cells[0].closed, false);
  assertEquals(notebook.cells[0].code, "const a = 1\n\n# Not a heading\n");
  assertEquals(notebook.headings.length, 0);
});

Deno.test("splitNotebook() attaches the recorded block and chart links that follow a cell", () => {
  const text = [
    `${F}ts`,
    "1 + 1",
    F,
    "",
    `${F}recorded`,
    "2",
    "· x = 3",
    F,
    "",
    "![chart from cell 1](design_charts/cell-1.svg)",
    "",
    "![a picture of my own](photos/bench.png)",
    "",
    "<!-- results recorded by longtail 0.0.9 -->",
    "",
  ].join("\n");
  const notebook = splitNotebook(text, { fileName: "design.md" });
  const recorded = notebook.cells[0].recorded!;
  assertEquals(recorded.content, "2\n· x = 3\n");
  assertEquals(recorded.charts, ["design_charts/cell-1.svg"]);
  assertEquals([recorded.startLine, recorded.endLine], [3, 10]); // exact: lines 4–10, 0-based
  assertEquals(notebook.version, { line: 13, version: "0.0.9" }); // exact: line 14, 0-based
  assertEquals(notebookParts(notebook).map((part) => part.kind), [
    "cell",
    "recorded",
    "prose",
    "version",
  ]);
});

Deno.test("splitNotebook() does not take a recorded block that is separated from its cell by prose", () => {
  const notebook = splitNotebook(`${F}ts\n1\n${F}\n\nProse.\n\n${F}recorded\n1\n${F}\n`);
  assertEquals(notebook.cells[0].recorded, undefined);
});

Deno.test("writeRecorded() changes only the recorded blocks and the version line", () => {
  const text = [
    "# Design",
    "",
    `${F}ts`,
    "const gain = 10;",
    "gain",
    F,
    "",
    `${F}recorded`,
    "9",
    F,
    "",
    "Some prose with trailing spaces   ",
    "",
    "- in a list",
    "",
    "  ~~~ts",
    "  gain * 2",
    "  ~~~",
    "End without a newline",
  ].join("\r\n");
  const notebook = splitNotebook(text);
  const out = writeRecorded(notebook, [
    { entries: [{ kind: "text", text: "10" }, { kind: "number", name: "gain", value: 10 }] },
    { entries: [{ kind: "text", text: "20" }] },
  ], "0.1.0");
  const again = splitNotebook(out);
  assertEquals(again.cells.map((cell) => cell.code), notebook.cells.map((cell) => cell.code));
  assertEquals(parseRecorded(again.cells[0].recorded!.content), [
    { kind: "text", text: "10" },
    { kind: "number", name: "gain", value: 10 },
  ]);
  assertEquals(again.cells[1].recorded!.content, "20\n");
  assertEquals(again.version?.version, "0.1.0");
  // Everything that is not a recorded block or the version line is byte-identical.
  const keep = (nb: ReturnType<typeof splitNotebook>) =>
    notebookParts(nb).filter((part) => part.kind === "prose" || part.kind === "cell")
      .map((part) => part.text.replace(/\r\n$/, "")).join("|");
  assertEquals(keep(again).replace(/\|\|/g, "|"), keep(notebook).replace(/\|\|/g, "|"));
  assert.ok(
    out.includes("\r\n  ~~~\r\n\r\n  ```recorded\r\n  20\r\n  ```\r\n"),
    "indented like its cell",
  );
  assert.ok(!/[^\r]\n/.test(out), "new lines use the file's CRLF line breaks");
  // Recording again with the same results changes nothing.
  assertEquals(
    writeRecorded(again, [
      { entries: [{ kind: "text", text: "10" }, { kind: "number", name: "gain", value: 10 }] },
      { entries: [{ kind: "text", text: "20" }] },
    ], "0.1.0"),
    out,
  );
});

Deno.test("writeRecorded() removes a block when a cell has nothing to record", () => {
  const text = `${F}ts\nconst a = 1\n${F}\n\n${F}recorded\nold\n${F}\n\nAfter.\n`;
  const out = writeRecorded(splitNotebook(text), [{ entries: [] }], "0.1.0");
  assertEquals(
    out,
    `${F}ts\nconst a = 1\n${F}\n\nAfter.\n\n<!-- results recorded by longtail 0.1.0 -->\n`,
  );
});

Deno.test("recorded blocks escape text lines that look like marks and fence themselves out of backticks", () => {
  const entries: RecordedEntry[] = [
    { kind: "text", text: `· looks like a number\n✓ looks like a check\n${F}ts inside` },
    { kind: "problem", text: "failed: TypeError: boom (line 4)" },
  ];
  const out = writeRecorded(splitNotebook(`${F}ts\n1\n${F}\n`), [{ entries }], "0.1.0");
  const notebook = splitNotebook(out);
  assertEquals(parseRecorded(notebook.cells[0].recorded!.content), entries);
  assert.ok(out.includes("````recorded"), "a longer fence than any backtick run inside");
});

Deno.test("splitting then joining returns the original bytes for generated Markdown", () => {
  const piece = fc.constantFrom(
    "# H\n",
    "text ",
    "\n",
    "\r\n",
    "\r",
    F,
    "~~~",
    "ts",
    "typescript",
    "recorded",
    "  ",
    "> ",
    "- ",
    "1. ",
    "const a = 1;",
    "µΩ",
    "<!-- results recorded by longtail 0.1.0 -->",
    "![c](notebook_charts/cell-1.svg)",
  );
  fc.assert(
    fc.property(fc.array(piece, { maxLength: 60 }), (pieces) => roundTrips(pieces.join(""))),
    { numRuns: 300 },
  );
});

Deno.test("recordedLines() and parseRecorded() round-trip generated entries", () => {
  const entry: fc.Arbitrary<RecordedEntry> = fc.oneof(
    fc.record({
      kind: fc.constant("number" as const),
      name: fc.stringMatching(/^[a-z][a-zA-Z0-9.]{0,8}$/),
      value: fc.double({ noNaN: true, noDefaultInfinity: true }).map((x) =>
        Number(x.toPrecision(6))
      ),
    }),
    fc.record({
      kind: fc.constant("check" as const),
      pass: fc.boolean(),
      text: fc.stringMatching(/^[a-z =.]{1,20}$/),
    }),
  );
  fc.assert(
    fc.property(fc.array(entry, { maxLength: 10 }), (entries) => {
      // fast-check builds objects without a prototype; the parser builds plain ones.
      const normalised = entries.map((
        e,
      ) => (e.kind === "number" && Object.is(e.value, -0) ? { ...e, value: 0 } : { ...e }));
      assertEquals(parseRecorded(recordedLines(normalised).join("\n")), normalised);
    }),
    { numRuns: 200 },
  );
});
