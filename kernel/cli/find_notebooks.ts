/**
 * Turning command-line paths into notebook files: files as given, folders searched for
 * Markdown files that hold at least one cell, and glob patterns (`*`, `**`, `?`, `{a,b}`).
 *
 * @module
 */
import { splitNotebook } from "../notebook/split.ts";
import { absolutePath, joinPath } from "../_paths.ts";

/** What the search found. */
export interface FoundNotebooks {
  /** Notebook paths (absolute), sorted, no repeats. */
  files: string[];
  /** Paths that do not exist, cannot be read, or hold no notebook; each with the reason. */
  problems: string[];
}

const SKIP_FOLDERS = new Set(["node_modules", ".git"]);

/**
 * Converts a glob pattern to a regular expression over `/`-separated relative paths.
 *
 * @param pattern The glob, e.g. `notebooks/** /*.md` (without the space).
 * @returns The regular expression.
 *
 * @example
 * ```ts
 * import { globToRegExp } from "./find_notebooks.ts";
 * import { equal } from "node:assert/strict";
 * equal(globToRegExp("notebooks/*.md").test("notebooks/amp.md"), true);
 * equal(globToRegExp("notebooks/*.md").test("notebooks/deep/amp.md"), false);
 * equal(globToRegExp("**" + "/*.{md,markdown}").test("a/b/c.markdown"), true);
 * ```
 */
export function globToRegExp(pattern: string): RegExp {
  let source = "";
  for (let i = 0; i < pattern.length; i++) {
    const c = pattern[i];
    if (c === "*" && pattern[i + 1] === "*") {
      const slash = pattern[i + 2] === "/";
      source += slash ? "(?:.*/)?" : ".*";
      i += slash ? 2 : 1;
    } else if (c === "*") source += "[^/]*";
    else if (c === "?") source += "[^/]";
    else if (c === "{") {
      const end = pattern.indexOf("}", i);
      if (end < 0) source += "\\{";
      else {
        source += "(?:" + pattern.slice(i + 1, end).split(",").map(escape).join("|") + ")";
        i = end;
      }
    } else source += escape(c);
  }
  return new RegExp(`^${source}$`);
}

function escape(text: string): string {
  return text.replace(/[.+^${}()|[\]\\*?]/g, "\\$&");
}

/**
 * Whether a Markdown file found in a folder is a notebook: it has cells, or it is broken
 * (unreadable, empty, not UTF-8 text), so the reader reports it instead of skipping it.
 */
function hasCells(path: string): boolean {
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(Deno.readFileSync(path));
  } catch {
    return true;
  }
  if (text.trim() === "" || text.includes("\0")) return true;
  return splitNotebook(text).cells.length > 0;
}

function walk(dir: string, visit: (path: string) => void): void {
  for (const entry of Deno.readDirSync(dir)) {
    const path = joinPath(dir, entry.name);
    if (entry.isDirectory) {
      if (
        SKIP_FOLDERS.has(entry.name) || entry.name.startsWith(".") || entry.name.endsWith("_charts")
      ) continue;
      walk(path, visit);
    } else if (entry.isFile) visit(path);
  }
}

/**
 * Finds the notebooks named by command-line paths.
 *
 * @param paths Files, folders and glob patterns.
 * @returns The notebooks, and a problem line for each path that gave none.
 *
 * @example A folder: Markdown files with cells count, others do not
 * ```ts
 * import { findNotebooks } from "./find_notebooks.ts";
 * import { deepEqual } from "node:assert/strict";
 * const dir = await Deno.makeTempDir();
 * await Deno.writeTextFile(`${dir}/amp.md`, "~~~ts\n1\n~~~\n");
 * await Deno.writeTextFile(`${dir}/README.md`, "# No cells here\n");
 * deepEqual(findNotebooks([dir]), { files: [`${dir}/amp.md`], problems: [] });
 * await Deno.remove(dir, { recursive: true });
 * ```
 */
export function findNotebooks(paths: readonly string[]): FoundNotebooks {
  const files = new Set<string>();
  const problems: string[] = [];
  for (const raw of paths) {
    if (/[*?{[]/.test(raw)) {
      const parts = raw.replace(/\\/g, "/").split("/");
      const firstGlob = parts.findIndex((part) => /[*?{[]/.test(part));
      const base = parts.slice(0, firstGlob).join("/") || ".";
      const pattern = globToRegExp(parts.slice(firstGlob).join("/"));
      const before = files.size;
      try {
        const root = absolutePath(base);
        walk(root, (path) => {
          const relative = path.slice(root.length + 1);
          // A pattern picks notebooks: Markdown files without cells are left out.
          if (pattern.test(relative) && (!/\.(md|markdown)$/i.test(path) || hasCells(path))) {
            files.add(path);
          }
        });
      } catch (error) {
        problems.push(`${raw}: ${(error as Error).message}`);
        continue;
      }
      if (files.size === before) problems.push(`${raw}: no file matches this pattern`);
      continue;
    }
    const path = absolutePath(raw);
    let info: Deno.FileInfo;
    try {
      info = Deno.statSync(path);
    } catch (error) {
      problems.push(
        error instanceof Deno.errors.NotFound
          ? `${raw}: no such file or folder`
          : `${raw}: ${(error as Error).message}`,
      );
      continue;
    }
    if (info.isDirectory) {
      const before = files.size;
      try {
        walk(path, (file) => {
          if (/\.(md|markdown)$/i.test(file) && hasCells(file)) files.add(file);
        });
      } catch (error) {
        problems.push(`${raw}: ${(error as Error).message}`);
        continue;
      }
      if (files.size === before) {
        problems.push(`${raw}: no notebooks (Markdown files with \`ts\` cells) in this folder`);
      }
    } else files.add(path);
  }
  return { files: [...files].sort(), problems };
}

/**
 * Picks shard `index` of `count` from a sorted list (every `count`-th file).
 *
 * @param files Sorted files.
 * @param shard Shard number (1-based) and count, e.g. `{ index: 2, count: 3 }`.
 * @returns The files of that shard.
 *
 * @example
 * ```ts
 * import { pickShard } from "./find_notebooks.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(pickShard(["a", "b", "c", "d", "e"], { index: 2, count: 2 }), ["b", "d"]);
 * ```
 */
export function pickShard<T>(files: readonly T[], shard: { index: number; count: number }): T[] {
  return files.filter((_, i) => i % shard.count === shard.index - 1);
}
