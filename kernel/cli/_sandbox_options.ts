/**
 * The sandbox options that `run`, `record` and `verify` share: what the cells may do
 * beyond the defaults (read more, reach a host, see a variable) and the limits on time
 * and memory. Parsed and checked once here; the report's `granted:` line comes from here.
 *
 * @module
 */
import { absolutePath } from "../_paths.ts";
import { parseSettings, readNotebookFile, UsageError } from "./_common.ts";

/** `parseArgs` definitions of the sandbox options. */
export const SANDBOX_ARGS = {
  timeout: { type: "string" },
  "notebook-timeout": { type: "string" },
  "memory-limit": { type: "string" },
  "allow-read": { type: "string", multiple: true },
  "allow-net": { type: "string", multiple: true },
  "allow-env": { type: "string", multiple: true },
} as const;

/** Help lines of the sandbox options. */
export const SANDBOX_HELP = `  --timeout SECONDS   time limit per cell (default 30)
  --notebook-timeout SECONDS
                      time limit for a whole notebook (default 600)
  --memory-limit MB   memory limit of the sandbox process (default 4096)
  --allow-read PATH   let the cells read PATH too (repeatable)
  --allow-net HOST    let the cells reach HOST or HOST:PORT (repeatable)
  --allow-env NAME    pass the environment variable NAME to the cells (repeatable)`;

/** The parsed sandbox options, ready for `runNotebook`. */
export interface SandboxSettings {
  /** Per-cell limit (undefined: the default). */
  cellTimeoutMs?: number;
  /** Whole-notebook limit (undefined: the default). */
  notebookTimeoutMs?: number;
  /** Heap limit in megabytes (undefined: the default). */
  memoryMb?: number;
  /** Extra readable paths, absolute. */
  allowRead: string[];
  /** Reachable hosts. */
  allowNet: string[];
  /** Environment variables passed in. */
  allowEnv: string[];
}

function positive(option: string, text: string | undefined, unit: string): number | undefined {
  if (text === undefined) return undefined;
  const value = Number(text);
  if (!(value > 0) || !Number.isFinite(value)) {
    throw new UsageError(
      `Expected --${option} to be a number of ${unit} greater than 0, but found ${
        JSON.stringify(text)
      }`,
    );
  }
  return value;
}

/**
 * Reads the sandbox options from parsed arguments.
 *
 * @param values The `values` of `parseArgs` (with {@linkcode SANDBOX_ARGS} among its options).
 * @returns The settings.
 * @throws {UsageError} If a limit is not a positive number, a host or a variable name is malformed.
 *
 * @example
 * ```ts
 * import { sandboxSettings } from "./_sandbox_options.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(sandboxSettings({ "notebook-timeout": "90", "allow-net": ["127.0.0.1:8000"] }), {
 *   cellTimeoutMs: undefined,
 *   notebookTimeoutMs: 90_000,
 *   memoryMb: undefined,
 *   allowRead: [],
 *   allowNet: ["127.0.0.1:8000"],
 *   allowEnv: [],
 * });
 * ```
 */
export function sandboxSettings(values: Record<string, unknown>): SandboxSettings {
  const list = (name: string) =>
    ((values[name] as string[] | undefined) ?? []).flatMap((v) => v.split(","))
      .map((v) => v.trim()).filter((v) => v !== "");
  const cell = positive("timeout", values.timeout as string | undefined, "seconds");
  const notebook = positive(
    "notebook-timeout",
    values["notebook-timeout"] as string | undefined,
    "seconds",
  );
  const memory = positive(
    "memory-limit",
    values["memory-limit"] as string | undefined,
    "megabytes",
  );
  const allowNet = list("allow-net");
  for (const host of allowNet) {
    if (!/^(\[[0-9a-fA-F:.]+\]|[\w.-]+)(:\d{1,5})?$/.test(host)) {
      throw new UsageError(
        `Expected --allow-net HOST or HOST:PORT (e.g. 127.0.0.1:8000), but found ${
          JSON.stringify(host)
        }`,
      );
    }
  }
  const allowEnv = list("allow-env");
  for (const name of allowEnv) {
    if (!/^[A-Za-z_][A-Za-z0-9_]*$/.test(name)) {
      throw new UsageError(
        `Expected --allow-env NAME (a variable name), but found ${JSON.stringify(name)}`,
      );
    }
  }
  return {
    cellTimeoutMs: cell === undefined ? undefined : Math.round(cell * 1000),
    notebookTimeoutMs: notebook === undefined ? undefined : Math.round(notebook * 1000),
    memoryMb: memory === undefined ? undefined : Math.round(memory),
    allowRead: list("allow-read").map((path) => absolutePath(path)),
    allowNet,
    allowEnv,
  };
}

/**
 * The report line that says what the cells were granted beyond the defaults.
 *
 * @param settings Parsed sandbox options.
 * @returns `granted: read /data, net 127.0.0.1:8000, env BENCH` with a line break, or "".
 *
 * @example
 * ```ts
 * import { grantsLine } from "./_sandbox_options.ts";
 * import { equal } from "node:assert/strict";
 * equal(grantsLine({ allowRead: ["/data"], allowNet: [], allowEnv: ["BENCH"] }), "granted: read /data, env BENCH\n");
 * equal(grantsLine({ allowRead: [], allowNet: [], allowEnv: [] }), "");
 * ```
 */
export function grantsLine(
  settings: Pick<SandboxSettings, "allowRead" | "allowNet" | "allowEnv">,
): string {
  const parts = [
    ...settings.allowRead.map((path) => `read ${path}`),
    ...settings.allowNet.map((host) => `net ${host}`),
    ...settings.allowEnv.map((name) => `env ${name}`),
  ];
  return parts.length === 0 ? "" : `granted: ${parts.join(", ")}\n`;
}

/** `parseArgs` definitions every single-notebook command shares: `--set`, sandbox, `--help`. */
export const NOTEBOOK_ARGS = {
  set: { type: "string", multiple: true },
  ...SANDBOX_ARGS,
  help: { type: "boolean", short: "h" },
} as const;

/** A notebook a command was asked to run, read and ready. */
export interface OpenedNotebook {
  /** Absolute path. */
  path: string;
  /** The file's bytes, as read. */
  bytes: Uint8Array;
  /** The file's text. */
  text: string;
  /** `--set` values, by adjustable name. */
  values: Record<string, number>;
  /** Sandbox limits and grants. */
  sandbox: SandboxSettings;
}

/**
 * Reads the one notebook a command names, with its `--set` values and sandbox settings.
 *
 * @param positionals The command's positional arguments.
 * @param values The `values` of `parseArgs` (with {@linkcode NOTEBOOK_ARGS} among its options).
 * @param example A usage example for the error, e.g. `"longtail run design.md"`.
 * @returns The notebook and its settings.
 * @throws {UsageError} If there is not exactly one notebook, or an option is malformed.
 * @throws {UnreadableError} If the file cannot be read as a notebook.
 */
export async function openNotebook(
  positionals: readonly string[],
  values: Record<string, unknown>,
  example: string,
): Promise<OpenedNotebook> {
  if (positionals.length !== 1) {
    throw new UsageError(`Expected one notebook file, e.g. ${example}`);
  }
  const path = absolutePath(positionals[0]);
  const { bytes, text } = await readNotebookFile(path);
  const settings = parseSettings((values.set as string[] | undefined) ?? [], text, path);
  return { path, bytes, text, values: settings, sandbox: sandboxSettings(values) };
}
