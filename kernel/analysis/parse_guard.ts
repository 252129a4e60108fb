/**
 * A guard in front of the TypeScript parser for hostile or machine-made cells.
 *
 * oxc-parser is native code that recurses once per nesting level. Past a few thousand
 * levels it overflows its thread's stack, and a native stack overflow aborts the whole
 * process: no exception, no message, the command simply dies. Measured with oxc-parser
 * 0.159 on Linux x86-64 (one probe per construct, doubling the size):
 *
 *     construct                      parses at      aborts at
 *     "(" × n (unclosed)             4,000 chars    8,000 chars
 *     type "(" × n                   4,000 chars    6,000 chars
 *     "a:" labels                    10,000 chars   20,000 chars
 *     "1+1+…" one long sum           40,000 chars   200,000 chars
 *
 * So a cell of up to {@linkcode DIRECT_PARSE_LIMIT} characters (half of the smallest
 * size that was ever seen to fail) is parsed directly. A longer cell is first analysed
 * once, exactly as the host would (parse, semantic checks, scope walk), in a throw-away
 * child process; if that child dies or throws, the cell is reported as too deeply nested
 * instead of taking the host down with it. Every example notebook's cells are far
 * below the limit, so this costs nothing in ordinary use (about 80 ms per long cell).
 *
 * @module
 */
import { spawnSync } from "node:child_process";
import type { CellProblem } from "./analyse_cell.ts";

/** Cells up to this many UTF-16 code units are parsed in the host directly. */
export const DIRECT_PARSE_LIMIT = 2000;

/** Set inside the probe process, where the analysis must run unguarded. */
export const INSIDE_PROBE: unique symbol = Symbol.for("longtail.insideParseProbe") as never;

const verdicts = new Map<string, boolean>();
const MAX_REMEMBERED = 64;

/**
 * Whether the parser can take a cell's code without crashing the host.
 *
 * @param code The cell's code.
 * @returns True when it is short, or when a child process parsed it and survived. When
 *   no child process may be started (no `--allow-run`), long code is let through.
 *
 * @example Short code needs no child process
 * ```ts
 * import { parsesSafely } from "./parse_guard.ts";
 * import { equal } from "node:assert/strict";
 * equal(parsesSafely("const gain = 10;"), true);
 * ```
 */
export function parsesSafely(code: string): boolean {
  if (code.length <= DIRECT_PARSE_LIMIT) return true;
  if ((globalThis as Record<symbol, unknown>)[INSIDE_PROBE] === true) return true;
  const known = verdicts.get(code);
  if (known !== undefined) return known;
  const verdict = probeInChild(code);
  if (verdicts.size >= MAX_REMEMBERED) verdicts.delete(verdicts.keys().next().value!);
  verdicts.set(code, verdict);
  return verdict;
}

/**
 * The problem to report instead of parsing, for code the parser cannot take.
 *
 * @param code The cell's code.
 * @returns A syntax problem placed at the start of the cell's longest line, or undefined
 *   when the code may be parsed.
 *
 * @example
 * ```ts
 * import { nestingProblem } from "./parse_guard.ts";
 * import { equal } from "node:assert/strict";
 * equal(nestingProblem("const a = (1 + 2) * 3;"), undefined);
 * ```
 */
export function nestingProblem(code: string): CellProblem | undefined {
  if (parsesSafely(code)) return undefined;
  return {
    kind: "syntax",
    message:
      "This cell is too deeply nested for the TypeScript parser (it would run out of stack); " +
      "split the long expression or the deep nesting into several smaller statements",
    offset: longestLineStart(code),
  };
}

function longestLineStart(code: string): number {
  let best = 0;
  let bestLength = -1;
  let start = 0;
  for (const line of code.split("\n")) {
    if (line.length > bestLength) {
      best = start;
      bestLength = line.length;
    }
    start += line.length + 1;
  }
  return best;
}

function probeInChild(code: string): boolean {
  const probe = new URL("./_parse_probe.ts", import.meta.url);
  if (probe.protocol !== "file:") return true; // Loaded from a URL: no local probe to run.
  const config = new URL("../../deno.json", import.meta.url);
  try {
    const result = spawnSync(
      Deno.execPath(),
      [
        "run",
        "--quiet",
        "--no-prompt",
        "--no-lock",
        "--config",
        decodeURIComponent(config.pathname),
        "--allow-read",
        "--allow-ffi",
        "--allow-env",
        decodeURIComponent(probe.pathname),
      ],
      // Only parsing happens there, nothing of the cell runs: the usual environment is fine.
      { input: new TextEncoder().encode(code) },
    );
    if (result.error) return true; // Could not start a process: parse directly, as before.
    return result.status === 0;
  } catch {
    return true;
  }
}
