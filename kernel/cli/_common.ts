/**
 * What the subcommands share: reading a notebook file, adjustable values from `--set`,
 * the time limit, and usage errors.
 *
 * @module
 */
import { analyseCell } from "../analysis/analyse_cell.ts";
import { findAdjustables } from "../analysis/adjustables.ts";
import { buildGraph } from "../analysis/graph.ts";
import { closestName } from "../analysis/closest_name.ts";
import { parseValue } from "../adjustable/parse_value.ts";
import { splitNotebook } from "../notebook/split.ts";
import { basename } from "../_paths.ts";

/** A command-line mistake: the command prints it with a hint and exits with 2. */
export class UsageError extends Error {
  /**
   * @param message What is wrong, in one sentence.
   */
  constructor(message: string) {
    super(message);
    this.name = "UsageError";
  }
}

/** A notebook file that cannot be read: exit 2. */
export class UnreadableError extends Error {
  /**
   * @param message What is wrong, naming the file.
   */
  constructor(message: string) {
    super(message);
    this.name = "UnreadableError";
  }
}

/**
 * Reads a notebook file as UTF-8, keeping its exact bytes.
 *
 * @param path The file.
 * @returns Its bytes and text.
 * @throws {UnreadableError} If it is missing, unreadable, a folder, or not UTF-8 text.
 */
export async function readNotebookFile(path: string): Promise<{ bytes: Uint8Array; text: string }> {
  let bytes: Uint8Array;
  try {
    bytes = await Deno.readFile(path);
  } catch (error) {
    if (error instanceof Deno.errors.NotFound) throw new UnreadableError(`${path}: no such file`);
    if (error instanceof Deno.errors.IsADirectory) {
      throw new UnreadableError(
        `${path} is a folder; give a notebook file (verify accepts folders)`,
      );
    }
    throw new UnreadableError(`${path} cannot be read: ${(error as Error).message}`);
  }
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true, ignoreBOM: true }).decode(bytes);
  } catch {
    const at = firstInvalidUtf8(bytes);
    const line = new TextDecoder().decode(bytes.subarray(0, at)).split("\n").length;
    throw new UnreadableError(
      `${path} is not UTF-8 text (invalid byte 0x${
        bytes[at]?.toString(16).padStart(2, "0")
      } on line ${line}); ` +
        "save it as UTF-8",
    );
  }
  // An empty file is what an interrupted save leaves: it must not pass as a notebook.
  if (text.replace(/^\uFEFF/, "").trim() === "") {
    throw new UnreadableError(
      `${path} is empty (line 1): there is no notebook in it; write a notebook or remove the file`,
    );
  }
  // NUL is valid UTF-8 but never part of a notebook: a UTF-16 or binary file.
  const nul = text.indexOf("\0");
  if (nul >= 0) {
    const line = text.slice(0, nul).split("\n").length;
    throw new UnreadableError(
      `${path} has NUL bytes (the first on line ${line}), so it is not a UTF-8 text notebook ` +
        "(UTF-16 or binary?); save it as UTF-8",
    );
  }
  return { bytes, text };
}

function firstInvalidUtf8(bytes: Uint8Array): number {
  const decoder = new TextDecoder("utf-8", { fatal: true });
  let low = 0;
  let high = bytes.length;
  // The longest valid prefix, by bisection (a prefix may end mid-character: allow 3 bytes).
  while (low < high) {
    const mid = Math.ceil((low + high) / 2);
    try {
      decoder.decode(bytes.subarray(0, mid), { stream: true });
      decoder.decode();
      low = mid;
    } catch {
      high = mid - 1;
    }
  }
  return low;
}

/**
 * Parses a `--timeout` value in seconds.
 *
 * @param text The option's text, or undefined.
 * @returns Milliseconds, or undefined for the default.
 * @throws {UsageError} If it is not a positive number.
 */
export function timeoutMs(text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  const seconds = Number(text);
  if (!(seconds > 0) || !Number.isFinite(seconds)) {
    throw new UsageError(
      `Expected --timeout to be a number of seconds greater than 0, but found ${
        JSON.stringify(text)
      }`,
    );
  }
  return Math.round(seconds * 1000);
}

/**
 * Parses `--set name=value` options against the notebook's adjustable values.
 *
 * @param settings The `--set` texts.
 * @param text The notebook's text (to find its adjustable values).
 * @param path The notebook's path.
 * @returns Values by name.
 * @throws {UsageError} If a setting is malformed or names no adjustable value.
 */
export function parseSettings(
  settings: readonly string[],
  text: string,
  path: string,
): Record<string, number> {
  if (settings.length === 0) return {};
  const notebook = splitNotebook(text, { fileName: basename(path) });
  const analyses = new Map(notebook.cells.map((cell, i) => [`c${i + 1}`, analyseCell(cell.code)]));
  const graph = buildGraph([...analyses].map(([id, analysis]) => ({ id, analysis })));
  const declared = findAdjustables(analyses, graph);
  const values: Record<string, number> = {};
  for (const setting of settings) {
    const at = setting.indexOf("=");
    if (at <= 0) {
      throw new UsageError(
        `Expected --set name=value (e.g. --set tailCurrent=2m), but found ${
          JSON.stringify(setting)
        }`,
      );
    }
    const name = setting.slice(0, at).trim();
    if (!declared.has(name)) {
      const suggestion = closestName(name, declared.keys());
      const known = declared.size > 0
        ? ` (it has: ${[...declared.keys()].join(", ")})`
        : " (it declares none)";
      throw new UsageError(
        `The notebook declares no adjustable value named ${name}` +
          (suggestion ? `; did you mean ${suggestion}?` : known),
      );
    }
    try {
      values[name] = parseValue(setting.slice(at + 1));
    } catch (error) {
      throw new UsageError(`--set ${name}: ${(error as Error).message}`);
    }
  }
  return values;
}

/**
 * A path relative to the working folder when it lies inside it.
 *
 * @param path An absolute path.
 * @returns The shorter form.
 */
export function relativeToCwd(path: string): string {
  const cwd = Deno.cwd().replace(/[\\/]$/, "");
  return path.startsWith(cwd + "/") ? path.slice(cwd.length + 1) : path;
}
