/**
 * The child process of kernel/analysis/parse_guard.ts: analyses the code on stdin once,
 * exactly as the host would, and exits 0. If the native parser overflows its stack this
 * process dies instead of the host; if the scope walk overflows, it exits with an error.
 *
 * @module
 */
import { INSIDE_PROBE } from "./parse_guard.ts";

(globalThis as Record<symbol, unknown>)[INSIDE_PROBE] = true;
const { analyseCell } = await import("./analyse_cell.ts");

const chunks: Uint8Array[] = [];
let length = 0;
for await (const chunk of Deno.stdin.readable) {
  chunks.push(chunk);
  length += chunk.length;
}
const bytes = new Uint8Array(length);
let at = 0;
for (const chunk of chunks) {
  bytes.set(chunk, at);
  at += chunk.length;
}
analyseCell(new TextDecoder().decode(bytes));
