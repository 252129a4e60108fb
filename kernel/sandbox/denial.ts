/**
 * Turning the sandbox's permission errors into sentences a notebook's reader can act on:
 * what the notebook tried, and the option that grants it (or that nothing does).
 *
 *     Deno says:   Requires read access to "/home/amp/.ssh/id_ed25519", run again with …
 *     we say:      this notebook tried to read /home/amp/.ssh/id_ed25519; grant it with
 *                  --allow-read=/home/amp/.ssh/id_ed25519 if you trust it
 *
 * Reads, network and named environment variables can be granted; writing files, starting
 * programs, loading native code, importing code from the network and reading system
 * information never can.
 *
 * @module
 */

/** What a denied operation was, read from the permission error. */
export interface Denial {
  /** The permission Deno asked for: `read`, `write`, `net`, `env`, `run`, `ffi`, `sys`, `import`. */
  kind: string;
  /** What it was for (a path, a host, a variable name, a program), when Deno said. */
  target?: string;
}

/**
 * Reads a permission error message.
 *
 * @param message The error's message.
 * @returns The denial, or undefined when the message is not a permission error.
 *
 * @example
 * ```ts
 * import { parseDenial } from "./denial.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(
 *   parseDenial('Requires env access to "HOME", run again with the --allow-env flag'),
 *   { kind: "env", target: "HOME" },
 * );
 * ```
 */
export function parseDenial(message: string): Denial | undefined {
  const match = /Requires (\w+) access(?: to "((?:[^"\\]|\\.)*)")?/.exec(message);
  if (!match) return undefined;
  return match[2] === undefined ? { kind: match[1] } : { kind: match[1], target: match[2] };
}

/**
 * Says what a notebook tried and how (or whether) it can be allowed.
 *
 * @param message The permission error's message.
 * @param options The notebook's folder, to show a relative target as the full path.
 * @returns One sentence starting "this notebook tried to …"; the original message when
 *   it is not a permission error.
 *
 * @example A read outside the notebook's folder
 * ```ts
 * import { explainDenial } from "./denial.ts";
 * import { equal } from "node:assert/strict";
 * equal(
 *   explainDenial('Requires read access to "/etc/passwd", run again with the --allow-read flag'),
 *   "this notebook tried to read /etc/passwd; grant it with --allow-read=/etc/passwd if you trust it",
 * );
 * ```
 *
 * @example Writing is never allowed
 * ```ts
 * import { explainDenial } from "./denial.ts";
 * import { equal } from "node:assert/strict";
 * equal(
 *   explainDenial('Requires write access to "out.txt", run again with the --allow-write flag', {
 *     notebookDir: "/home/amp",
 *   }),
 *   "this notebook tried to write /home/amp/out.txt; notebooks may never write files " +
 *     "(longtail record writes their results)",
 * );
 * ```
 */
export function explainDenial(message: string, options: { notebookDir?: string } = {}): string {
  const denial = parseDenial(message);
  if (!denial) return message;
  const target = denial.target ?? "";
  const full = options.notebookDir && target !== "" && !/^([/\\]|[A-Za-z]:)/.test(target)
    ? `${options.notebookDir.replace(/[\\/]$/, "")}/${target.replace(/^\.\//, "")}`
    : target;
  const grant = (option: string, value: string) =>
    value === ""
      ? `grant it with ${option}=… if you trust it`
      : `grant it with ${option}=${value} if you trust it`;
  switch (denial.kind) {
    case "read":
      return `this notebook tried to read ${full || "a file"}; ${grant("--allow-read", full)}`;
    case "net":
      return `this notebook tried to reach ${target || "the network"}; ${
        grant("--allow-net", target)
      }`;
    case "env":
      return `this notebook tried to read the environment variable ${target || "(all of them)"}; ` +
        grant("--allow-env", target);
    case "import":
      return `this notebook tried to import code from ${target || "the network"}; notebooks may ` +
        "import only the library, installed npm packages and files in their own folder";
    case "write":
      return `this notebook tried to write ${full || "a file"}; notebooks may never write files ` +
        "(longtail record writes their results)";
    case "run":
      return `this notebook tried to start the program ${
        target || "(unknown)"
      }; notebooks may never start programs`;
    case "ffi":
      return `this notebook tried to load native code${target ? ` from ${target}` : ""}; ` +
        "notebooks may never load native code";
    case "sys":
      return `this notebook tried to read system information${target ? ` (${target})` : ""}; ` +
        "notebooks may never read it";
    case "all":
      return `this notebook tried to use ${target || "something"}, which needs every permission; ` +
        "notebooks may never have that";
    default:
      return `this notebook tried something the sandbox does not allow (${denial.kind}${
        target ? ` ${target}` : ""
      })`;
  }
}
