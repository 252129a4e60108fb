/**
 * Fuzzing the notebook splitter and the recorded-block writer with generated Markdown.
 *
 * What must hold for any text: no exception, the parts cover the file exactly (so
 * splitting then joining gives the original bytes), cells lie inside the file in order.
 * What must hold for notebooks of known blocks: the splitter finds exactly the cells that
 * were put in, with their code and first line, whatever the fences and line breaks; and
 * recording results changes nothing but the recorded blocks and the version line.
 *
 * @module
 */
import fc from "fast-check";
import {
  joinParts,
  type Notebook,
  notebookParts,
  parseRecorded,
  type RecordedEntry,
  splitNotebook,
  VERSION_LINE_PATTERN,
  writeRecorded,
} from "../../kernel/notebook/mod.ts";
import type { CellRecord } from "../../kernel/notebook/write_recorded.ts";
import { assert, assertEquals } from "../_assert.ts";
import { fuzzParameters } from "./_fuzz.ts";
import { markdownNoise, structuredNotebook } from "./_markdown_arbitraries.ts";

/** Invariants of a split that hold for any text at all. */
function assertSplitInvariants(notebook: Notebook, text: string): void {
  assert.equal(notebook.text, text);
  assert.equal(notebook.lines.join(""), text, "the lines keep every byte");
  const parts = notebookParts(notebook);
  assert.equal(joinParts(parts), text, "splitting then joining gives the original bytes");
  let line = 0;
  for (const part of parts) {
    assert.equal(part.startLine, line, "parts follow each other without gaps or overlaps");
    assert.ok(part.endLine > part.startLine, "no empty part");
    assert.equal(part.text, notebook.lines.slice(part.startLine, part.endLine).join(""));
    line = part.endLine;
  }
  assert.equal(line, notebook.lines.length, "the parts reach the end of the file");
  let previousEnd = 0;
  for (const [i, cell] of notebook.cells.entries()) {
    assert.equal(cell.index, i);
    assert.ok(cell.startLine >= previousEnd, "cells are in order and do not overlap");
    assert.ok(cell.endLine > cell.startLine && cell.endLine <= notebook.lines.length);
    assert.equal(cell.codeLine, cell.startLine + 2);
    assert.equal(cell.columnOffsets.length, cell.code.split("\n").length);
    assert.ok(cell.columnOffsets.every((offset) => Number.isInteger(offset) && offset >= 0));
    if (cell.closed) assert.ok(cell.endLine - cell.startLine >= 2, "a closed fence has two lines");
    previousEnd = cell.endLine;
    if (cell.recorded) {
      assert.equal(cell.recorded.startLine, cell.endLine, "a recorded block follows its cell");
      assert.ok(cell.recorded.endLine > cell.recorded.startLine);
      assert.ok(cell.recorded.endLine <= notebook.lines.length);
      previousEnd = cell.recorded.endLine;
    }
  }
  for (const heading of notebook.headings) {
    assert.ok(heading.level >= 1 && heading.level <= 6);
    assert.ok(heading.line >= 0 && heading.line < notebook.lines.length);
  }
  if (notebook.version) {
    // The whole line is the mark (not a list item or a quote that contains it).
    const versionText = notebook.lines[notebook.version.line].trim();
    assert.ok(VERSION_LINE_PATTERN.test(versionText), "the version line is where it is said to be");
  }
}

Deno.test("splitNotebook() keeps every byte of any Markdown-like text and never throws", () => {
  fc.assert(
    fc.property(markdownNoise(), (text) => {
      assertSplitInvariants(splitNotebook(text), text);
    }),
    fuzzParameters(400),
  );
});

Deno.test("splitNotebook() keeps every byte of any text at all, including lone surrogates", () => {
  fc.assert(
    fc.property(fc.string({ unit: "binary", maxLength: 300 }), (text) => {
      assertSplitInvariants(splitNotebook(text), text);
    }),
    fuzzParameters(200),
  );
});

Deno.test("splitNotebook() finds exactly the cells a notebook was built from", () => {
  fc.assert(
    fc.property(structuredNotebook(), (generated) => {
      const notebook = splitNotebook(generated.text);
      assertSplitInvariants(notebook, generated.text);
      assertEquals(
        notebook.cells.map((cell) => ({
          code: cell.code,
          codeLine: cell.codeLine,
          closed: cell.closed,
        })),
        generated.cells,
      );
    }),
    fuzzParameters(300),
  );
});

Deno.test("splitNotebook() finds the same cells whatever the line breaks", () => {
  fc.assert(
    fc.property(structuredNotebook(), (generated) => {
      const codes = (text: string) => splitNotebook(text).cells.map((cell) => cell.code);
      const unix = generated.text.replace(/\r\n?/g, "\n");
      assertEquals(codes(generated.text), codes(unix));
      assertEquals(codes(unix.replace(/\n/g, "\r\n")), codes(unix));
    }),
    fuzzParameters(100),
  );
});

/** Entries that read back as written: no two text or problem entries in a row (they merge). */
const recordedEntries: fc.Arbitrary<RecordedEntry[]> = fc.array(
  fc.oneof(
    fc.string({ maxLength: 30 }).map((text): RecordedEntry => ({ kind: "text", text })),
    fc.constantFrom("· not a number", "✓ looks like a check", "```", "~~~~", "\\", "4.7 kΩ", "")
      .map((text): RecordedEntry => ({ kind: "text", text })),
    fc.record({ name: fc.constantFrom("gain", "pair.gm", "Ω x", "a = b"), value: fc.double() })
      .map(({ name, value }): RecordedEntry => ({ kind: "number", name, value })),
    fc.record({
      pass: fc.boolean(),
      text: fc.constantFrom("gm = 38 mS is at least 10 mS", "Tj ok"),
    })
      .map(({ pass, text }): RecordedEntry => ({ kind: "check", pass, text })),
    fc.constantFrom("TypeError: x is not a function", "Error: a\nb")
      .map((text): RecordedEntry => ({ kind: "problem", text })),
  ),
  { maxLength: 5 },
).map((entries) =>
  entries.filter((entry, i) =>
    i === 0 || entry.kind !== entries[i - 1].kind ||
    (entry.kind !== "text" && entry.kind !== "problem")
  )
);

/** What `parseRecorded` gives back for entries written by `recordedLines`. */
function expectedReadBack(entries: RecordedEntry[]): RecordedEntry[] {
  return entries.map((entry) => {
    switch (entry.kind) {
      case "text":
        return { kind: "text", text: entry.text.replace(/\r\n|\r/g, "\n") };
      case "number":
        return {
          kind: "number",
          name: entry.name,
          value: Number(String(Number(entry.value.toPrecision(6)))),
        };
      default:
        return entry;
    }
  });
}

const records = fc.array(
  fc.option(
    fc.record({
      entries: recordedEntries,
      charts: fc.array(
        fc.record({
          path: fc.constantFrom("notebook_charts/cell-1.svg", "notebook_charts/gain Ω.svg"),
          title: fc.constantFrom("gain", "chart [1]", "phase \\ margin", "Ω"),
        }),
        { maxLength: 2 },
      ),
    }),
    { freq: 3 },
  ),
  { maxLength: 20 },
);

/** The prose and cells of a notebook, without recorded blocks and version line. */
function ownText(notebook: Notebook): string {
  return notebookParts(notebook).filter((part) => part.kind === "prose" || part.kind === "cell")
    .map((part) => part.text).join("");
}

Deno.test("writeRecorded() changes only recorded blocks and the version line, and reads back", () => {
  fc.assert(
    fc.property(structuredNotebook(), records, (generated, chosen) => {
      const notebook = splitNotebook(generated.text);
      const perCell: Array<CellRecord | undefined> = notebook.cells.map((_, i) =>
        chosen[i] ?? undefined
      );
      const written = writeRecorded(notebook, perCell, "0.1.0");
      const again = splitNotebook(written);
      assertSplitInvariants(again, written);
      assertEquals(again.cells.map((cell) => cell.code), notebook.cells.map((cell) => cell.code));
      // Everything the designer wrote is still there, byte for byte; at most line breaks
      // were added at the end, before the version line.
      const before = ownText(notebook);
      const after = ownText(again);
      assert.ok(after.startsWith(before), "the designer's text is kept");
      assert.match(after.slice(before.length), /^(\r\n|\r|\n)*$/);
      if (notebook.cells.some((cell) => !cell.closed)) {
        // A fence that is never closed swallows whatever follows it: nothing is appended.
        assert.equal(after, before, "nothing is appended inside an unclosed fence");
        assert.equal(again.version, undefined);
      } else {
        assert.equal(again.version?.version, "0.1.0");
      }
      for (const [i, cell] of notebook.cells.entries()) {
        const record = perCell[i];
        if (record === undefined || !cell.closed) continue;
        const recorded = again.cells[i].recorded;
        if (record.entries.length === 0 && (record.charts ?? []).length === 0) {
          assert.equal(recorded, undefined, "an empty record removes the block");
          continue;
        }
        assert.ok(recorded, `cell ${i + 1} has its recorded block`);
        assertEquals(parseRecorded(recorded.content), expectedReadBack(record.entries));
        assertEquals(recorded.charts, (record.charts ?? []).map((chart) => encodeURI(chart.path)));
      }
      // Recording the same results again changes nothing.
      assert.equal(writeRecorded(again, perCell, "0.1.0"), written);
    }),
    fuzzParameters(300),
  );
});
