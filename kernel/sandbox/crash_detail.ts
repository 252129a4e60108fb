/**
 * What to say when the sandbox process dies under a cell: the engine's own last words are
 * a dump for engine developers, so a memory exhaustion is told in one sentence with the
 * limit, and other deaths keep only the last few lines of what the process printed.
 *
 * @module
 */

/** Options for {@linkcode crashDetail}. */
export interface CrashDetailOptions {
  /** The sandbox's heap limit in megabytes, to name it. */
  memoryMb: number;
}

/**
 * Describes how the sandbox process ended.
 *
 * @param status Its exit status.
 * @param stderr What it printed on stderr (the end of it).
 * @param options The memory limit.
 * @returns One or a few lines.
 *
 * @example Out of memory
 * ```ts
 * import { crashDetail } from "./crash_detail.ts";
 * import { equal } from "node:assert/strict";
 * equal(
 *   crashDetail({ code: 133, signal: "SIGTRAP" }, "#\n# Fatal JavaScript out of memory: Reached heap limit\n#", {
 *     memoryMb: 128,
 *   }),
 *   "The cell ran out of memory: the sandbox's memory limit of 128 MB was reached " +
 *     "(--memory-limit MB sets another)",
 * );
 * ```
 */
export function crashDetail(
  status: { code: number; signal: string | null },
  stderr: string,
  options: CrashDetailOptions,
): string {
  if (
    /Reached heap limit|JavaScript heap out of memory|Fatal JavaScript out of memory/i.test(stderr)
  ) {
    return `The cell ran out of memory: the sandbox's memory limit of ${options.memoryMb} MB was reached ` +
      "(--memory-limit MB sets another)";
  }
  const last = stderr.trim().split("\n").slice(-8).join("\n");
  return `The sandbox process exited (code ${status.code}${
    status.signal ? `, signal ${status.signal}` : ""
  })` +
    (last ? `\n${last}` : "");
}
