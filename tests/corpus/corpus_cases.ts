/**
 * The bad-input corpus: every case with its expected outcome. Committed notebooks live in
 * `cases/`; the big, binary and mode-dependent ones are generated (see `_generate.ts`).
 *
 * Each case says what `longtail run` and `longtail verify` must exit with, which message
 * must appear (in both), which notebook lines the messages must cite, and what advice
 * tells the reader what to do. `corpus_test.ts` runs them all.
 *
 * Exit codes (as documented by the command line): 0 all good; 1 a cell, a check or a
 * recorded number failed; 2 bad usage or unreadable input.
 *
 * | case                     | run | verify | must say                                             |
 * |--------------------------|-----|--------|------------------------------------------------------|
 * | empty                    | 2   | 2      | the file is empty; write a notebook or remove it     |
 * | missing file             | 2   | 2      | no such file                                         |
 * | folder without notebooks | 2   | 2      | no notebooks in that folder                          |
 * | unreadable (mode 000)    | 2   | 2      | cannot be read (skipped as root: root reads anyway)  |
 * | non-UTF-8 bytes          | 2   | 2      | not UTF-8, invalid byte on line 6; save it as UTF-8  |
 * | binary garbage           | 2   | 2      | not UTF-8; save it as UTF-8                          |
 * | UTF-16 without a mark    | 2   | 2      | NUL bytes; save it as UTF-8                          |
 * | unclosed fence           | 1   | 1      | fence on line 11 never closed; close it              |
 * | syntax error             | 1   | 1      | the parser's message at line 10                      |
 * | duplicate names          | 1   | 1      | `gain` defined by cells at lines 3 and 7             |
 * | cycle                    | 1   | 1      | the circle, cells at lines 3 and 7; break it         |
 * | undefined name           | 1   | 1      | `tailCurent` …; did you mean `tailCurrent`? line 8   |
 * | cell throws              | 1   | 1      | the error at line 9; its dependent blocked           |
 * | CRLF cell throws         | 1   | 1      | the same lines as with LF                            |
 * | NaN into a check         | 1   | 1      | the check fails: NaN, not a finite number            |
 * | Infinity into a check    | 1   | 1      | the check fails: ∞, not a finite number              |
 * | negative tail current    | 1   | 1      | RangeError … tail.current … -0.001, line 6           |
 * | unresolved import        | 1   | 1      | ./transformer_parts.ts not found, line 4             |
 * | export in a cell         | 1   | 1      | remove `export`, line 4                              |
 * | assigns another's name   | 1   | 1      | `bias` belongs to cell 1, line 8                     |
 * | byte-order mark          | 0   | 0      | the first cell is still a cell                       |
 * | 10,000 cells             | 0   | —      | every cell runs (run only: keeps CI short)           |
 * | 1 MB lines               | 0   | 0      | a 1 MB string literal and a 1 MB prose line are fine |
 * | 1 MB sum                 | 1   | 1      | too deeply nested for the parser, line 9; split it   |
 * | 10,000 parentheses       | 1   | 1      | too deeply nested for the parser, line 4             |
 *
 * @module
 */
import * as generate from "./_generate.ts";

/** What one command must do with a case. */
export interface Outcome {
  /** Exit status. */
  exit: 0 | 1 | 2;
}

/** One corpus case. */
export interface CorpusCase {
  /** Short name (test names use it). */
  name: string;
  /** What it exercises. */
  about: string;
  /** A notebook in `cases/`, or a function that makes the input in a folder and returns its path. */
  source: { file: string } | { make: (dir: string, corpusDir: string) => Promise<string> };
  /** `longtail run` on it. */
  run?: Outcome;
  /** `longtail verify` on it. */
  verify?: Outcome;
  /** Messages that must appear in the output. */
  messages: RegExp[];
  /** Notebook lines the output must cite (as `line N` or `:N:`). */
  lines?: number[];
  /** Advice that tells the reader what to do. */
  advice?: RegExp;
  /** What `run` must show beyond the messages: proof that the rest of the notebook ran. */
  runShows?: RegExp[];
  /** What must not appear (internal detail that only confuses). */
  absent?: RegExp[];
  /** Whether the case is in the one-batch `verify` over the whole corpus. */
  inFolderVerify?: boolean;
  /** Time limit for each command on it, in milliseconds (120 s when missing). */
  timeoutMs?: number;
}

const NO_INTERNALS = [/data:application/, /__longtail_/, /kernel\/sandbox\//];

/** Every case. */
export const CORPUS: readonly CorpusCase[] = [
  {
    name: "empty file",
    about: "a zero-byte notebook (what an interrupted save leaves) must not pass silently",
    source: { file: "empty.md" },
    run: { exit: 2 },
    verify: { exit: 2 },
    messages: [/empty\.md/, /is empty/],
    advice: /write a notebook|remove (the|it)/,
    inFolderVerify: true,
  },
  {
    name: "missing file",
    about: "a path that does not exist",
    source: { make: generate.missingFile },
    run: { exit: 2 },
    verify: { exit: 2 },
    messages: [/does_not_exist\.md/, /no such file/i],
  },
  {
    name: "folder without notebooks",
    about: "verify on a folder that holds files but no notebook",
    source: { make: generate.folderWithoutNotebooks },
    run: { exit: 2 },
    verify: { exit: 2 },
    messages: [/no_notebooks_here/, /no notebooks|is a folder/i],
  },
  {
    name: "unreadable file",
    about: "a notebook with mode 000",
    source: { make: generate.unreadableFile },
    run: { exit: 2 },
    verify: { exit: 2 },
    messages: [/locked\.md/, /cannot be read|permission/i],
  },
  {
    name: "non-UTF-8 bytes",
    about: "Latin-1 bytes in an otherwise fine notebook",
    source: { make: generate.nonUtf8File },
    run: { exit: 2 },
    verify: { exit: 2 },
    messages: [/latin1\.md/, /not UTF-8/],
    lines: [6],
    advice: /save it as UTF-8/,
    inFolderVerify: true,
  },
  {
    name: "binary garbage",
    about: "4 KB of seeded random bytes named .md",
    source: { make: generate.binaryGarbage },
    run: { exit: 2 },
    verify: { exit: 2 },
    messages: [/garbage\.md/, /not UTF-8/],
    advice: /save it as UTF-8/,
    inFolderVerify: true,
  },
  {
    name: "UTF-16 without a byte-order mark",
    about: "every byte is valid UTF-8, but half of them are NUL",
    source: { make: generate.utf16WithoutMark },
    run: { exit: 2 },
    verify: { exit: 2 },
    messages: [/utf16\.md/, /NUL/],
    advice: /save it as UTF-8/,
    inFolderVerify: true,
  },
  {
    name: "unclosed fence",
    about: "the last cell's fence is never closed",
    source: { file: "unclosed_fence.md" },
    run: { exit: 1 },
    verify: { exit: 1 },
    messages: [/unclosed_fence\.md/, /never closed/],
    lines: [11],
    advice: /close it/,
    runShows: [/1 done, 1 failed/],
    inFolderVerify: true,
  },
  {
    name: "syntax error",
    about: "a missing parenthesis",
    source: { file: "syntax_error.md" },
    run: { exit: 1 },
    verify: { exit: 1 },
    messages: [/syntax_error\.md/, /Expected `,` or `\)`/],
    lines: [10],
    runShows: [/2 done, 1 failed/],
    inFolderVerify: true,
  },
  {
    name: "duplicate names",
    about: "two cells define `gain`",
    source: { file: "duplicate_names.md" },
    run: { exit: 1 },
    verify: { exit: 1 },
    messages: [/duplicate_names\.md/, /`gain` is defined by both/],
    lines: [3, 7],
    advice: /only one defining cell/,
    runShows: [/1 done, 2 failed/],
    inFolderVerify: true,
  },
  {
    name: "cycle",
    about: "two cells need each other",
    source: { file: "cycle.md" },
    run: { exit: 1 },
    verify: { exit: 1 },
    messages: [/cycle\.md/, /depend on each other in a circle/],
    lines: [3, 7],
    advice: /break the circle/i,
    runShows: [/1 done, 2 failed/],
    inFolderVerify: true,
  },
  {
    name: "undefined name",
    about: "a typo in a name",
    source: { file: "undefined_name.md" },
    run: { exit: 1 },
    verify: { exit: 1 },
    messages: [/undefined_name\.md/, /`tailCurent` is not defined by any cell/],
    lines: [8],
    advice: /did you mean `tailCurrent`\?/,
    runShows: [/2 done, 1 failed/],
    inFolderVerify: true,
  },
  {
    name: "cell throws",
    about: "a cell throws; its dependent is blocked, an independent cell still runs",
    source: { file: "cell_throws.md" },
    run: { exit: 1 },
    verify: { exit: 1 },
    messages: [/cell_throws\.md/, /Error: the load of 4 Ω is below the 4 Ω minimum/],
    lines: [9],
    runShows: [/blocked/, /2 done, 1 failed, 1 blocked/, /\b24\b/],
    inFolderVerify: true,
  },
  {
    name: "CRLF cell throws",
    about: "the same notebook with CRLF line breaks reports the same lines",
    source: { make: generate.crlfThrows },
    run: { exit: 1 },
    verify: { exit: 1 },
    messages: [/crlf_throws\.md/, /Error: the load of 4 Ω is below the 4 Ω minimum/],
    lines: [9],
    runShows: [/2 done, 1 failed, 1 blocked/],
    inFolderVerify: true,
  },
  {
    name: "NaN into a design check",
    about: "0/0 reaches atLeast(): the check fails and says why",
    source: { file: "nan_into_check.md" },
    run: { exit: 1 },
    verify: { exit: 1 },
    messages: [/nan_into_check\.md/, /current ratio is NaN, not a finite number/],
    inFolderVerify: true,
  },
  {
    name: "Infinity into a design check",
    about: "10/0 reaches atMost(): the check fails and says why",
    source: { file: "infinity_into_check.md" },
    run: { exit: 1 },
    verify: { exit: 1 },
    messages: [/infinity_into_check\.md/, /dissipation is ∞ W, not a finite number/],
    inFolderVerify: true,
  },
  {
    name: "non-physical parameter",
    about: "a pair with a negative tail current: the library's RangeError, on its cell",
    source: { file: "negative_current.md" },
    run: { exit: 1 },
    verify: { exit: 1 },
    messages: [
      /negative_current\.md/,
      /RangeError: Expected tail\.current to be greater than 0 A, but found -0\.001/,
    ],
    lines: [6],
    runShows: [/\b42\b/],
    inFolderVerify: true,
  },
  {
    name: "unresolved import",
    about: "a local module that does not exist",
    source: { file: "unresolved_import.md" },
    run: { exit: 1 },
    verify: { exit: 1 },
    messages: [
      /unresolved_import\.md/,
      /transformer_parts\.ts/,
      /not found|cannot be found|cannot find/i,
    ],
    lines: [4],
    absent: NO_INTERNALS,
    runShows: [/\b7\b/],
    inFolderVerify: true,
  },
  {
    name: "export in a cell",
    about: "`export` has no meaning in a cell",
    source: { file: "export_in_cell.md" },
    run: { exit: 1 },
    verify: { exit: 1 },
    messages: [/export_in_cell\.md/, /Remove `export`/],
    lines: [4],
    inFolderVerify: true,
  },
  {
    name: "assignment to another cell's name",
    about: "a cell writes a name it does not own",
    source: { file: "assigns_other_cell.md" },
    run: { exit: 1 },
    verify: { exit: 1 },
    messages: [/assigns_other_cell\.md/, /`bias` belongs to cell 1/],
    lines: [8],
    advice: /define a new name/,
    inFolderVerify: true,
  },
  {
    name: "byte-order mark",
    about: "a UTF-8 byte-order mark before the first fence does not hide the cell",
    source: { make: generate.byteOrderMark },
    run: { exit: 0 },
    verify: { exit: 0 },
    messages: [/bom_start\.md/],
    runShows: [/\b42\b/],
    inFolderVerify: true,
  },
  {
    name: "10,000 cells",
    about: "a chain of 10,000 cells runs, each once, in order",
    source: { make: generate.tenThousandCells },
    run: { exit: 0 },
    messages: [/ten_thousand_cells\.md/],
    runShows: [/10001 cells: 10001 done/, /\b9999\b/],
    // Cells load in shared modules of up to 200 (one module per cell took about 100 s
    // here); a few seconds on a 2-core machine, so a generous limit still catches a relapse.
    timeoutMs: 60_000,
  },
  {
    name: "1 MB lines",
    about: "a 1 MB prose line and a 1 MB string literal",
    source: { make: generate.megabyteLines },
    run: { exit: 0 },
    verify: { exit: 0 },
    messages: [/megabyte_line\.md/],
    runShows: [/\b1000000\b/],
    inFolderVerify: true,
  },
  {
    name: "1 MB sum",
    about: "a 1 MB line that is one long sum must not crash the parser's host",
    source: { make: generate.megabyteExpression },
    run: { exit: 1 },
    verify: { exit: 1 },
    messages: [/megabyte_expression\.md/, /too deeply nested/],
    lines: [9],
    advice: /split/,
    runShows: [/\b2\b/, /2 done, 1 failed/],
    inFolderVerify: true,
  },
  {
    name: "10,000 parentheses",
    about: "nesting deep enough to overflow a recursive parser",
    source: { make: generate.deepNesting },
    run: { exit: 1 },
    verify: { exit: 1 },
    messages: [/deep_nesting\.md/, /too deeply nested/],
    lines: [4],
    advice: /split/,
    runShows: [/\b9\b/],
    inFolderVerify: true,
  },
];
