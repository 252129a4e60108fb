/**
 * Terminal output for the command line: where text goes, and colours only on a terminal
 * (and never when `NO_COLOR` is set).
 *
 * @module
 */

/** Where a command writes, so tests can capture it. */
export interface CliIo {
  /** Writes to standard output. */
  out(text: string): void;
  /** Writes to standard error. */
  err(text: string): void;
  /** Whether standard output is a terminal (colours). */
  color: boolean;
  /** Whether standard error is a terminal (progress lines). */
  progress: boolean;
}

/**
 * The real terminal.
 *
 * @returns Io over Deno's stdout and stderr.
 */
export function terminalIo(): CliIo {
  const encoder = new TextEncoder();
  let noColor = false;
  try {
    noColor = Deno.env.get("NO_COLOR") !== undefined;
  } catch {
    noColor = false;
  }
  return {
    out: (text) => writeAll(Deno.stdout, encoder.encode(text)),
    err: (text) => writeAll(Deno.stderr, encoder.encode(text)),
    color: Deno.stdout.isTerminal() && !noColor,
    progress: Deno.stderr.isTerminal(),
  };
}

function writeAll(stream: { writeSync(p: Uint8Array): number }, bytes: Uint8Array): void {
  let written = 0;
  while (written < bytes.length) written += stream.writeSync(bytes.subarray(written));
}

/**
 * Io that collects text, for tests.
 *
 * @returns The io and a way to read what was written.
 *
 * @example
 * ```ts
 * import { bufferIo } from "./_terminal.ts";
 * import { equal } from "node:assert/strict";
 * const { io, output } = bufferIo();
 * io.out("a");
 * io.err("b");
 * equal(output(), "ab");
 * ```
 */
export function bufferIo(): { io: CliIo; output: () => string; stdout: () => string } {
  let all = "";
  let out = "";
  return {
    io: {
      out: (text) => {
        all += text;
        out += text;
      },
      err: (text) => (all += text),
      color: false,
      progress: false,
    },
    output: () => all,
    stdout: () => out,
  };
}

const CODES = { red: 31, green: 32, yellow: 33, blue: 34, gray: 90, bold: 1 } as const;

/** A colour name. */
export type Colour = keyof typeof CODES;

/**
 * Colours text when the io allows it.
 *
 * @param io Where the text goes.
 * @param colour The colour.
 * @param text The text.
 * @returns The text, wrapped in ANSI codes on a terminal.
 *
 * @example
 * ```ts
 * import { bufferIo, paint } from "./_terminal.ts";
 * import { equal } from "node:assert/strict";
 * equal(paint(bufferIo().io, "red", "failed"), "failed");
 * ```
 */
export function paint(io: CliIo, colour: Colour, text: string): string {
  return io.color ? `\x1b[${CODES[colour]}m${text}\x1b[0m` : text;
}

/**
 * Formats rows as a left-aligned table with two spaces between columns.
 *
 * @param rows Rows of cells (plain text, no colour codes).
 * @returns One string per row.
 *
 * @example
 * ```ts
 * import { table } from "./_terminal.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(table([["a", "bb"], ["ccc", "d"]]), ["a    bb", "ccc  d"]);
 * ```
 */
export function table(rows: string[][]): string[] {
  const widths: number[] = [];
  for (const row of rows) {
    row.forEach((cell, i) => (widths[i] = Math.max(widths[i] ?? 0, [...cell].length)));
  }
  return rows.map((row) =>
    row.map((
      cell,
      i,
    ) => (i === row.length - 1 ? cell : cell + " ".repeat(widths[i] - [...cell].length)))
      .join("  ").trimEnd()
  );
}
