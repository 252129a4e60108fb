/**
 * Splitting a notebook into prose, cells and recorded-results blocks, byte for byte.
 *
 * The CommonMark parser finds the fences (backticks or tildes, any length, inside lists
 * and quotes); its line maps tell which lines each one covers. The notebook keeps the
 * original lines with their terminators, so every part is an exact slice of the file and
 * joining the parts gives the file back.
 *
 * @module
 */
import { splitLines, stripTerminator } from "./_lines.ts";
import { type MarkdownToken, markdownTokens } from "./_markdown.ts";
import { chartsFolderName, isCellInfo, isRecordedInfo, VERSION_LINE_PATTERN } from "./format.ts";

/** The recorded-results block that follows a cell. */
export interface RecordedRegion {
  /** First line (0-based) of the region: the line after the cell's closing fence. */
  startLine: number;
  /** Line after the region (0-based, exclusive): after the block and its chart links. */
  endLine: number;
  /** The text inside the `recorded` fence, container indentation removed. */
  content: string;
  /** Chart links (as written) found in the image lines right after the block. */
  charts: string[];
}

/** One cell: a fenced block tagged `ts` or `typescript`. */
export interface NotebookCell {
  /** Position among the cells, 0-based, in document order. */
  index: number;
  /** The TypeScript source, container indentation removed (as the Markdown parser gives it). */
  code: string;
  /** The fence's info string, e.g. `"ts"`. */
  info: string;
  /** First line (0-based) of the cell: its opening fence. */
  startLine: number;
  /** Line after the cell (0-based, exclusive): after the closing fence. */
  endLine: number;
  /** 1-based notebook line of the first code line. */
  codeLine: number;
  /** For each code line, how many columns the container indentation took off. */
  columnOffsets: number[];
  /** What precedes the fence on its line (list indentation, `> `); repeated on inserted lines. */
  prefix: string;
  /** False when the fence is never closed (it then runs to the end of the file). */
  closed: boolean;
  /** The recorded-results block right after the cell, if any. */
  recorded?: RecordedRegion;
}

/** The version line at the end of a recorded notebook. */
export interface VersionMark {
  /** Its line (0-based). */
  line: number;
  /** The longtail version named on it. */
  version: string;
}

/** A notebook: its exact text, its lines, and what the Markdown parser found. */
export interface Notebook {
  /** The file's text, exactly as read. */
  text: string;
  /** The lines of `text`, each with its terminator. */
  lines: string[];
  /** The cells in document order. */
  cells: NotebookCell[];
  /** Headings in the prose, for front-ends that print an outline. */
  headings: NotebookHeading[];
  /** The version line, if the notebook was recorded. */
  version?: VersionMark;
  /** The chart folder's name (relative to the notebook's folder). */
  chartsFolder: string;
}

/** A prose heading. */
export interface NotebookHeading {
  /** Level 1–6. */
  level: number;
  /** Heading text as written (inline Markdown kept). */
  text: string;
  /** Its line (0-based). */
  line: number;
}

/** What kind of text a part of the notebook holds. */
export type PartKind = "prose" | "cell" | "recorded" | "version";

/** A run of whole lines of one kind; the parts of a notebook cover it exactly, in order. */
export interface NotebookPart {
  /** Kind of text. */
  kind: PartKind;
  /** First line, 0-based. */
  startLine: number;
  /** Line after the part, 0-based, exclusive. */
  endLine: number;
  /** Index of the cell it belongs to (cells and recorded blocks). */
  cell?: number;
  /** The exact text of those lines. */
  text: string;
}

/** Options for {@linkcode splitNotebook}. */
export interface SplitOptions {
  /**
   * The notebook's file name, used to recognise links into its chart folder.
   * @default {"notebook.md"}
   */
  fileName?: string;
}

/**
 * Splits a notebook into cells (with their recorded blocks), headings and its version line.
 *
 * @param text The notebook's text.
 * @param options File name (for the chart folder).
 * @returns The notebook.
 *
 * @example A cell inside a list keeps its code without the list indentation
 * ```ts
 * import { splitNotebook } from "./split.ts";
 * import { equal } from "node:assert/strict";
 * const notebook = splitNotebook("# Gain\n\n- step one\n\n  ~~~~ts\n  const gain = 10;\n  ~~~~\n");
 * equal(notebook.cells.length, 1);
 * equal(notebook.cells[0].code, "const gain = 10;\n");
 * equal(notebook.cells[0].codeLine, 6);
 * equal(notebook.cells[0].columnOffsets[0], 2);
 * equal(notebook.headings[0].text, "Gain");
 * ```
 */
export function splitNotebook(text: string, options: SplitOptions = {}): Notebook {
  const lines = splitLines(text);
  const chartsFolder = chartsFolderName(options.fileName ?? "notebook.md");
  // A UTF-8 byte-order mark is not text: CommonMark would see it as a character before
  // the first fence or heading. It is not a line break either, so line maps stay right.
  const tokens = markdownTokens(text.startsWith("\uFEFF") ? text.slice(1) : text);
  const cells: NotebookCell[] = [];
  const headings: NotebookHeading[] = [];
  let version: VersionMark | undefined;
  // Indices of block tokens with a line map, in document order: a recorded block must be
  // the very next one after its cell, and its chart links the one after that.
  const blocks: number[] = [];
  tokens.forEach((token, j) => {
    if (token.map !== null) blocks.push(j);
  });
  for (let i = 0; i < blocks.length; i++) {
    const token = tokens[blocks[i]];
    const map = token.map!;
    if (token.type === "heading_open") {
      const inline = tokens[blocks[i] + 1];
      headings.push({
        level: Number(token.tag.slice(1)),
        text: inline?.content ?? "",
        line: map[0],
      });
    } else if (token.type === "html_block") {
      // The whole line must be the mark: one inside a list item or quote belongs to the prose.
      const match = VERSION_LINE_PATTERN.exec(stripTerminator(lines[map[0]] ?? "").trim());
      if (match && map[1] - map[0] === 1) version = { line: map[0], version: match[1] };
    } else if (token.type === "fence" && isCellInfo(token.info)) {
      const cell = makeCell(token, lines, cells.length);
      const next = tokens[blocks[i + 1]];
      if (
        cell.closed && next?.type === "fence" && isRecordedInfo(next.info) &&
        blankBetween(lines, cell.endLine, next.map![0])
      ) {
        let endLine = next.map![1];
        const charts: string[] = [];
        const after = tokens[blocks[i + 2]];
        if (after?.type === "paragraph_open" && blankBetween(lines, endLine, after.map![0])) {
          const links = chartLinks(tokens[blocks[i + 2] + 1], chartsFolder);
          if (links) {
            charts.push(...links);
            endLine = after.map![1];
            i++;
          }
        }
        cell.recorded = { startLine: cell.endLine, endLine, content: next.content, charts };
        i++;
      }
      cells.push(cell);
    }
  }
  return { text, lines, cells, headings, version, chartsFolder };
}

function makeCell(token: MarkdownToken, lines: string[], index: number): NotebookCell {
  const [startLine, endLine] = token.map!;
  const opening = stripTerminator(lines[startLine] ?? "");
  const fenceAt = opening.indexOf(token.markup);
  const prefix = fenceAt > 0 ? opening.slice(0, fenceAt).replace(/^\uFEFF/, "") : "";
  const closed = isClosingFence(lines[endLine - 1], token.markup) && endLine - startLine >= 2;
  const codeLines = token.content.split("\n");
  const columnOffsets = codeLines.map((codeLine, k) => {
    const raw = stripTerminator(lines[startLine + 1 + k] ?? "");
    return raw.endsWith(codeLine) ? raw.length - codeLine.length : 0;
  });
  return {
    index,
    code: token.content,
    info: token.info,
    startLine,
    endLine,
    codeLine: startLine + 2,
    columnOffsets,
    prefix,
    closed,
  };
}

/** A closing fence: only container marks and spaces before a run of the opening character. */
function isClosingFence(line: string | undefined, markup: string): boolean {
  if (line === undefined) return false;
  const text = stripTerminator(line).trimEnd();
  const char = markup[0];
  let run = 0;
  while (run < text.length && text[text.length - 1 - run] === char) run++;
  if (run < markup.length) return false;
  return /^[\s>]*$/.test(text.slice(0, text.length - run));
}

function blankBetween(lines: string[], from: number, to: number): boolean {
  for (let line = from; line < to; line++) {
    if (!/^[\s>]*$/.test(stripTerminator(lines[line]))) return false;
  }
  return true;
}

/** The chart links of a paragraph made only of images pointing into the chart folder. */
function chartLinks(inline: MarkdownToken | undefined, chartsFolder: string): string[] | undefined {
  if (inline?.type !== "inline" || !inline.children) return undefined;
  const links: string[] = [];
  for (const child of inline.children) {
    if (child.type === "image") {
      const src = child.attrs?.find(([name]) => name === "src")?.[1] ?? "";
      if (!decodeURI(src).startsWith(chartsFolder + "/")) return undefined;
      links.push(src);
    } else if (
      child.type === "softbreak" || (child.type === "text" && child.content.trim() === "")
    ) {
      continue;
    } else {
      return undefined;
    }
  }
  return links.length > 0 ? links : undefined;
}

/**
 * Cuts a notebook into parts that cover it exactly: prose, cells, recorded blocks, the version line.
 *
 * @param notebook A split notebook.
 * @returns The parts, in order; their texts joined give `notebook.text`.
 *
 * @example Prose, a cell, prose
 * ```ts
 * import { notebookParts, splitNotebook } from "./split.ts";
 * import { deepEqual } from "node:assert/strict";
 * const parts = notebookParts(splitNotebook("Intro\n~~~ts\n1\n~~~\nEnd"));
 * deepEqual(parts.map((part) => part.kind), ["prose", "cell", "prose"]);
 * ```
 */
export function notebookParts(notebook: Notebook): NotebookPart[] {
  const parts: NotebookPart[] = [];
  const push = (kind: PartKind, startLine: number, endLine: number, cell?: number) => {
    if (endLine <= startLine) return;
    const text = notebook.lines.slice(startLine, endLine).join("");
    parts.push(
      cell === undefined
        ? { kind, startLine, endLine, text }
        : { kind, startLine, endLine, cell, text },
    );
  };
  let line = 0;
  const marks: Array<[PartKind, number, number, number | undefined]> = [];
  for (const cell of notebook.cells) {
    marks.push(["cell", cell.startLine, cell.endLine, cell.index]);
    if (cell.recorded) {
      marks.push(["recorded", cell.recorded.startLine, cell.recorded.endLine, cell.index]);
    }
  }
  if (notebook.version) {
    marks.push(["version", notebook.version.line, notebook.version.line + 1, undefined]);
  }
  marks.sort((a, b) => a[1] - b[1]);
  for (const [kind, start, end, cell] of marks) {
    push("prose", line, start);
    push(kind, start, end, cell);
    line = end;
  }
  push("prose", line, notebook.lines.length);
  return parts;
}

/**
 * Joins parts back into the notebook's text.
 *
 * @param parts Parts from {@linkcode notebookParts}.
 * @returns The concatenated text.
 *
 * @example Split then join gives the original bytes
 * ```ts
 * import { joinParts, notebookParts, splitNotebook } from "./split.ts";
 * import { equal } from "node:assert/strict";
 * const text = "# A\r\n\r\n~~~typescript\r\nconst a = 1\r\n~~~\r\ntail";
 * equal(joinParts(notebookParts(splitNotebook(text))), text);
 * ```
 */
export function joinParts(parts: readonly NotebookPart[]): string {
  return parts.map((part) => part.text).join("");
}
