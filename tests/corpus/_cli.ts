/**
 * Running the `longtail` command line as a child process, the way a user or CI does, and
 * collecting what it printed. Shared by the corpus and the sandbox tests.
 *
 * @module
 */

/** The checkout's root folder. */
export const ROOT: string = decodeURIComponent(new URL("../../", import.meta.url).pathname).replace(
  /\/$/,
  "",
);

/** The flags of `deno task longtail` (deno.json), so tests run what users run. */
const TASK_FLAGS = [
  "--allow-read",
  "--allow-write",
  "--allow-run",
  "--allow-env",
  "--allow-ffi",
  "--allow-sys",
];

/** What a finished command did. */
export interface CliResult {
  /** Exit status. */
  code: number;
  /** Standard output and standard error, in that order, colours off. */
  output: string;
  /** Standard output alone. */
  stdout: string;
  /** Standard error alone. */
  stderr: string;
}

/** Options for {@linkcode longtail}. */
export interface LongtailOptions {
  /**
   * Working folder.
   * @default {the checkout's root}
   */
  cwd?: string;
  /**
   * Kill the command after this many milliseconds (a test must never hang).
   * @default {120000}
   */
  timeoutMs?: number;
}

/**
 * Runs `longtail ARGS...` (kernel/cli/main.ts) in a child process.
 *
 * @param args Command-line arguments, e.g. `["verify", "notebooks/"]`.
 * @param options Working folder and a time limit.
 * @returns Exit status and output.
 */
export async function longtail(args: string[], options: LongtailOptions = {}): Promise<CliResult> {
  const child = new Deno.Command(Deno.execPath(), {
    args: [
      "run",
      "--quiet",
      "--config",
      `${ROOT}/deno.json`,
      ...TASK_FLAGS,
      `${ROOT}/kernel/cli/main.ts`,
      ...args,
    ],
    cwd: options.cwd ?? ROOT,
    stdin: "null",
    stdout: "piped",
    stderr: "piped",
    env: { NO_COLOR: "1" },
  }).spawn();
  const timer = setTimeout(() => {
    try {
      child.kill("SIGKILL");
    } catch {
      // Already gone.
    }
  }, options.timeoutMs ?? 120_000);
  try {
    const { code, stdout, stderr } = await child.output();
    const out = new TextDecoder().decode(stdout);
    const err = new TextDecoder().decode(stderr);
    return { code, output: out + err, stdout: out, stderr: err };
  } finally {
    clearTimeout(timer);
  }
}

/**
 * Whether output cites a notebook line: `line 9`, `line 9, column 3`, `line 9:3` or `:9:3`.
 *
 * @param output Command output.
 * @param line 1-based notebook line.
 * @returns True when the line is cited.
 */
export function citesLine(output: string, line: number): boolean {
  return new RegExp(`\\bline ${line}\\b|:${line}:\\d`).test(output);
}
