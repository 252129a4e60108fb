/**
 * fast-check generators of notebook Markdown for the splitter's fuzz tests.
 *
 * Two kinds:
 * - {@linkcode markdownNoise}: text made of the characters and pieces that matter to a
 *   CommonMark block parser (fence runs, indentation, list and quote marks, every line
 *   break, non-ASCII, NUL, a byte-order mark, lone surrogates), with no structure at all.
 *   Only invariants that hold for any text can be checked on it.
 * - {@linkcode structuredNotebook}: a notebook assembled from known blocks (prose, cells
 *   with every fence form, fences that are not cells, cells in lists and quotes, indented
 *   code that only looks like a fence, an unclosed fence at the end), together with the
 *   cells the splitter must find. Sizes are bounded so every run stays fast.
 *
 * @module
 */
import fc from "fast-check";

/** Pieces of noise, weighted towards what changes how a Markdown block parses. */
const NOISE_PIECES: readonly string[] = [
  "```",
  "~~~",
  "````",
  "`",
  "~",
  "ts",
  "typescript",
  "recorded",
  " ",
  "  ",
  "    ",
  "\t",
  "\n",
  "\n",
  "\r\n",
  "\r",
  "> ",
  "- ",
  "* ",
  "1. ",
  "# ",
  "<!-- results recorded by longtail 0.1.0 -->",
  "![c](notebook_charts/c.svg)",
  "const a = 1;",
  "a",
  "Ω",
  "µ",
  "°",
  "日本",
  "😀",
  "\0",
  "\uFEFF",
  "\uD800",
  "\u2028",
  "\u0085",
  "|",
  "$",
  "\\",
];

/**
 * Any text built from Markdown-significant pieces.
 *
 * @param maxPieces Upper bound on the number of pieces.
 * @returns An arbitrary of strings.
 */
export function markdownNoise(maxPieces = 80): fc.Arbitrary<string> {
  return fc.array(fc.constantFrom(...NOISE_PIECES), { maxLength: maxPieces }).map((pieces) =>
    pieces.join("")
  );
}

/** A line break style for a whole document. */
export type LineBreaks = "lf" | "crlf" | "mixed" | "cr";

/** A generated notebook with the cells the splitter must find. */
export interface StructuredNotebook {
  /** The notebook's text. */
  text: string;
  /** The cells, in document order. */
  cells: ExpectedCell[];
  /** The line-break style used. */
  breaks: LineBreaks;
}

/** A cell the splitter must find. */
export interface ExpectedCell {
  /** The code the Markdown parser must report (lines joined with `\n`). */
  code: string;
  /** 1-based notebook line of the first code line. */
  codeLine: number;
  /** Whether the fence is closed. */
  closed: boolean;
}

/** One block before line breaks are chosen: its lines and, for a cell, what to expect. */
interface Block {
  lines: string[];
  /** True for a list: a following indented block would continue its last item. */
  list?: boolean;
  /** For a cell: its code lines as the parser reports them, and where they start. */
  cell?: { codeLines: string[]; firstCodeLine: number; closed: boolean };
}

const WORDS = ["gain", "tail", "Ω", "µA", "phase margin", "日本語", "é", "😀", "$g_m$", "x"];

const proseLine = fc.array(fc.constantFrom(...WORDS), { minLength: 1, maxLength: 6 }).map((
  words,
) => words.join(" "));

/** Code lines that contain no fence-closing line, optionally with shorter fence runs inside. */
function codeLines(fenceChar: string): fc.Arbitrary<string[]> {
  const line = fc.oneof(
    fc.constantFrom(
      "const a = 1;",
      "let { b, c: [d] } = pair;",
      "function f(x: number) { return x * 2; }",
      "",
      "  // indented comment",
      'const ohm = "Ω";',
      "tail * 2",
    ),
    // A run of the fence character that cannot close the fence: after other text.
    fc.constantFrom(`x = "${fenceChar.repeat(3)}";`, `// ${fenceChar.repeat(5)}`),
    proseLine.map((text) => `// ${text}`),
  );
  return fc.array(line, { maxLength: 5 });
}

/** A fenced cell at the top level, indented by 0–3 spaces, any fence char and length. */
const topLevelCell: fc.Arbitrary<Block> = fc.record({
  char: fc.constantFrom("`", "~"),
  length: fc.integer({ min: 3, max: 6 }),
  extraClose: fc.integer({ min: 0, max: 2 }),
  indent: fc.integer({ min: 0, max: 3 }),
  closeIndent: fc.integer({ min: 0, max: 3 }),
  info: fc.constantFrom("ts", "typescript", "TS", "ts title=gain", " ts"),
  trailingSpaces: fc.constantFrom("", " ", "  "),
}).chain((shape) =>
  codeLines(shape.char).map((lines): Block => {
    const open = " ".repeat(shape.indent) + shape.char.repeat(shape.length) + shape.info;
    const close = " ".repeat(shape.closeIndent) +
      shape.char.repeat(shape.length + shape.extraClose) +
      shape.trailingSpaces;
    // CommonMark takes up to the opening fence's indentation off each content line.
    const reported = lines.map((line) => {
      let strip = 0;
      while (strip < shape.indent && line[strip] === " ") strip++;
      return line.slice(strip);
    });
    return {
      lines: [open, ...lines, close],
      cell: { codeLines: reported, firstCodeLine: 1, closed: true },
    };
  })
);

/** A fence that is not a cell: other languages, no info, `tsx`, the recorded tag. */
const otherFence: fc.Arbitrary<Block> = fc.record({
  char: fc.constantFrom("`", "~"),
  info: fc.constantFrom("", "js", "tsx", "text", "recorded", "json"),
}).chain((shape) =>
  codeLines(shape.char).map((lines): Block => ({
    lines: [shape.char.repeat(3) + shape.info, ...lines, shape.char.repeat(3)],
  }))
);

/** A cell inside a list item: the item's content indentation is taken off the code. */
const listCell: fc.Arbitrary<Block> = fc.record({
  marker: fc.constantFrom("- ", "* ", "1. ", "10) "),
  char: fc.constantFrom("`", "~"),
}).chain((shape) =>
  codeLines(shape.char).map((lines): Block => {
    const pad = " ".repeat(shape.marker.length);
    const fence = shape.char.repeat(3);
    return {
      lines: [
        shape.marker + "step",
        "",
        pad + fence + "ts",
        ...lines.map((line) => (line === "" ? "" : pad + line)),
        pad + fence,
      ],
      cell: { codeLines: lines, firstCodeLine: 3, closed: true },
      list: true,
    };
  })
);

/** A cell inside a block quote. */
const quotedCell: fc.Arbitrary<Block> = codeLines("`").map((lines): Block => ({
  lines: ["> ```ts", ...lines.map((line) => "> " + line), "> ```"],
  cell: { codeLines: lines, firstCodeLine: 1, closed: true },
}));

/** Four spaces of indentation make an indented code block: no cell, however it looks. */
const indentedLookalike: fc.Arbitrary<Block> = codeLines("`").map((lines): Block => ({
  lines: ["    ```ts", ...lines.map((line) => "    " + line), "    ```"],
}));

const prose: fc.Arbitrary<Block> = fc.oneof(
  proseLine.map((text): Block => ({ lines: [text] })),
  proseLine.map((text): Block => ({ lines: ["## " + text] })),
  fc.array(proseLine, { minLength: 1, maxLength: 3 }).map((items): Block => ({
    lines: items.map((item) => "- " + item),
    list: true,
  })),
  fc.constant<Block>({ lines: ["| part | value |", "|---|---|", "| R1 | 4.7 kΩ |"] }),
  fc.constant<Block>({ lines: ["$$", "A_v = g_m R_C", "$$"] }),
);

/** An unclosed cell: allowed only as the last block (it runs to the end of the file). */
const unclosedCell: fc.Arbitrary<Block> = fc.record({
  char: fc.constantFrom("`", "~"),
  length: fc.integer({ min: 3, max: 5 }),
}).chain((shape) =>
  codeLines(shape.char).map((lines): Block => ({
    lines: [shape.char.repeat(shape.length) + "ts", ...lines],
    cell: { codeLines: lines, firstCodeLine: 1, closed: false },
  }))
);

function breakFor(style: LineBreaks, pick: boolean): string {
  switch (style) {
    case "lf":
      return "\n";
    case "crlf":
      return "\r\n";
    case "cr":
      return "\r";
    case "mixed":
      return pick ? "\r\n" : "\n";
  }
}

/**
 * A notebook of known blocks, separated by blank lines, with the cells it contains.
 *
 * @param maxBlocks Upper bound on the number of blocks.
 * @returns An arbitrary of notebooks with their expected cells.
 */
export function structuredNotebook(maxBlocks = 12): fc.Arbitrary<StructuredNotebook> {
  const block = fc.oneof(
    { arbitrary: prose, weight: 3 },
    { arbitrary: topLevelCell, weight: 4 },
    { arbitrary: otherFence, weight: 1 },
    { arbitrary: listCell, weight: 1 },
    { arbitrary: quotedCell, weight: 1 },
    { arbitrary: indentedLookalike, weight: 1 },
  );
  return fc.record({
    blocks: fc.array(block, { maxLength: maxBlocks }),
    last: fc.option(unclosedCell, { freq: 4 }),
    breaks: fc.constantFrom<LineBreaks>("lf", "crlf", "mixed", "cr"),
    picks: fc.array(fc.boolean(), { minLength: 200, maxLength: 200 }),
    finalBreak: fc.boolean(),
  }).map(({ blocks, last, breaks, picks, finalBreak }) => {
    const all = last === null ? blocks : [...blocks, last];
    const lines: string[] = [];
    const cells: ExpectedCell[] = [];
    for (const [i, block] of all.entries()) {
      // A blank line ends lists and quotes; the first block needs none.
      if (i > 0) lines.push("");
      // Only a line at the left margin ends a list for sure (a blank line does not).
      if (i > 0 && all[i - 1].list) lines.push("Next.", "");
      if (block.cell) {
        cells.push({
          code: block.cell.codeLines.map((line) => line + "\n").join(""),
          codeLine: lines.length + block.cell.firstCodeLine + 1,
          closed: block.cell.closed,
        });
      }
      lines.push(...block.lines);
    }
    let text = "";
    for (const [i, line] of lines.entries()) {
      const isLast = i === lines.length - 1;
      text += line + (isLast && !finalBreak ? "" : breakFor(breaks, picks[i % picks.length]));
    }
    // An unclosed cell without a final line break: the parser reports no last "\n".
    const tail = cells[cells.length - 1];
    if (tail && !tail.closed && !finalBreak && tail.code.endsWith("\n")) {
      tail.code = tail.code.slice(0, -1);
    }
    return { text, cells, breaks };
  });
}
