/**
 * Import failures in words a notebook's reader can act on, placed on the import that
 * failed. Deno reports them against the compiled cell module (a long `data:` URL that
 * means nothing to the reader) and by resolved URL, not as the cell wrote them:
 *
 *     Deno says:   Module not found "file:///home/amp/designs/transformer_parts.ts".
 *     we say:      cannot find the module ./transformer_parts.ts (looked for
 *                  /home/amp/designs/transformer_parts.ts); check the path, which is
 *                  relative to the notebook's folder
 *
 * @module
 */
import type { CellImport } from "../analysis/analyse_cell.ts";

/** A failure explained, with the import it belongs to. */
export interface ImportFailure {
  /** One sentence. */
  message: string;
  /** Offset of the failing import in the cell's code, when found. */
  offset?: number;
}

/**
 * Explains an error raised while a cell's imports loaded.
 *
 * @param message The error's message.
 * @param imports The cell's static imports (from its analysis).
 * @param notebookUrl The notebook's `file:` URL (relative imports resolve against it).
 * @returns The explanation, or undefined for errors that are not import failures.
 *
 * @example A local module that does not exist
 * ```ts
 * import { explainImportFailure } from "./import_failure.ts";
 * import { deepEqual } from "node:assert/strict";
 * const imports = [{
 *   source: "./parts.ts", start: 0, end: 33, sourceStart: 20, sourceEnd: 32,
 *   bindings: [{ local: "r1", imported: "r1", typeOnly: false }], typeOnly: false, attributes: "",
 * }];
 * deepEqual(
 *   explainImportFailure('Module not found "file:///home/amp/parts.ts".', imports, "file:///home/amp/amp.md"),
 *   {
 *     message: "cannot find the module ./parts.ts (looked for /home/amp/parts.ts); " +
 *       "check the path, which is relative to the notebook's folder",
 *     offset: 0,
 *   },
 * );
 * ```
 */
export function explainImportFailure(
  message: string,
  imports: readonly CellImport[],
  notebookUrl: string,
): ImportFailure | undefined {
  const resolved = (source: string) => {
    try {
      return new URL(source, notebookUrl).href;
    } catch {
      return undefined;
    }
  };
  const notFound = /Module not found "([^"]+)"/.exec(message);
  if (notFound) {
    const url = notFound[1];
    const found = imports.find((i) => resolved(i.source) === url);
    const path = url.startsWith("file:") ? decodeURIComponent(new URL(url).pathname) : url;
    return {
      message: `cannot find the module ${found?.source ?? path} (looked for ${path}); ` +
        "check the path, which is relative to the notebook's folder",
      offset: found?.start,
    };
  }
  const unmapped = /Import "([^"]+)" not a dependency and not in import map/.exec(message) ??
    /Relative import path "([^"]+)" not prefixed with/.exec(message);
  if (unmapped) {
    const found = imports.find((i) => i.source === unmapped[1]);
    return {
      message:
        `cannot find the module "${unmapped[1]}": it is neither a path (start a local file ` +
        "with ./) nor a module longtail provides (such as longtail/lib)",
      offset: found?.start,
    };
  }
  const uncached = /npm package not found in cache: "([^"]+)"/.exec(message);
  if (uncached) {
    const found = imports.find((i) => i.source.includes(uncached[1]));
    return {
      message: `the npm package ${uncached[1]} is not installed, and notebooks may not download ` +
        "code; add it to the imports of longtail's deno.json",
      offset: found?.start,
    };
  }
  const missingExport = /The requested module '([^']+)' does not provide an export named '([^']+)'/
    .exec(message);
  if (missingExport) {
    const found = imports.find((i) =>
      i.source === missingExport[1] && i.bindings.some((b) => b.imported === missingExport[2])
    );
    return {
      message: `the module ${missingExport[1]} has no export named ${missingExport[2]}`,
      offset: found?.start,
    };
  }
  return undefined;
}

/**
 * Removes the compiled cell modules' `data:` URLs from a message or stack.
 *
 * @param text Error text.
 * @param name What to say instead (the notebook's file name).
 * @returns The text without them.
 *
 * @example
 * ```ts
 * import { withoutModuleUrls } from "./import_failure.ts";
 * import { equal } from "node:assert/strict";
 * equal(
 *   withoutModuleUrls('from "data:application/typescript,import%20x" here', "amp.md"),
 *   "from amp.md here",
 * );
 * ```
 */
export function withoutModuleUrls(text: string, name: string): string {
  return text.replace(/"?data:application\/typescript,[^\s"']*"?/g, name);
}
