/**
 * The host side of the sandbox: one long-lived `deno run` child per session, with narrow
 * permissions, fed batches of compiled cells over stdin and answering over stdout.
 *
 * Permissions of the child: no network, no writes, no subprocesses, no FFI, no system
 * information, no environment beyond two named variables a chart library probes; reads
 * only in the notebook's folder, the longtail checkout's `lib/` and `kernel/adjustable/`,
 * `node_modules/` and the Deno cache (see {@linkcode sandboxPermissions}). The child
 * inherits only the environment Deno needs to find its cache. A cell that runs past its time limit gets the child
 * killed; the next batch starts a fresh one.
 *
 * @module
 */
import {
  type ChildMessage,
  type ChildStep,
  decodeLine,
  encodeLine,
  type HostMessage,
} from "./protocol.ts";
import { crashDetail } from "./crash_detail.ts";

/** Options for {@linkcode Sandbox}. */
export interface SandboxOptions {
  /** The longtail checkout (holds deno.json, lib/, kernel/). */
  rootDir: string;
  /** The notebook's folder: the child's working folder, readable. */
  notebookDir: string;
  /**
   * Extra folders or files the child may read.
   * @default {[]}
   */
  allowRead?: string[];
  /**
   * Hosts (`name` or `name:port`) the child may reach over the network.
   * @default {[]}
   */
  allowNet?: string[];
  /**
   * Environment variables passed to the child and readable by its cells.
   * @default {[]}
   */
  allowEnv?: string[];
  /**
   * Per-cell time limit in milliseconds.
   * @default {30000}
   */
  cellTimeoutMs?: number;
  /**
   * Largest JavaScript heap of the sandbox, in megabytes (a cell that needs more ends the
   * process and is reported as a crash).
   * @default {4096}
   */
  memoryMb?: number;
}

/** How a batch ended. */
export type BatchEnd =
  | { kind: "finished"; cancelled: boolean }
  | { kind: "timeout"; cell: string; limitMs: number }
  | { kind: "crashed"; cell?: string; detail: string };

/** Default per-cell time limit, in milliseconds. */
export const DEFAULT_CELL_TIMEOUT_MS = 30_000;

/**
 * The `deno run` permission flags for a sandbox.
 *
 * @param options Root, notebook folder and extra reads.
 * @returns The flags: reads of a list of paths, and two named environment variables.
 *
 * @example Only reads are granted
 * ```ts
 * import { sandboxPermissions } from "./sandbox.ts";
 * import { equal } from "node:assert/strict";
 * const flags = sandboxPermissions({ rootDir: "/opt/longtail", notebookDir: "/home/amp" });
 * equal(flags.filter((flag) => flag.startsWith("--allow-")).length, 2);
 * equal(flags.some((flag) => flag.startsWith("--allow-read=") && flag.includes("/home/amp")), true);
 * ```
 */
export function sandboxPermissions(options: SandboxOptions): string[] {
  const sep = options.rootDir.includes("\\") ? "\\" : "/";
  const join = (...parts: string[]) => parts.join(sep);
  const reads = [
    options.notebookDir,
    join(options.rootDir, "lib"),
    join(options.rootDir, "kernel", "adjustable"),
    join(options.rootDir, "node_modules"),
    ...denoCacheDirs(),
    ...(options.allowRead ?? []),
  ];
  const flags = [
    "--no-prompt",
    // Code comes only from the library, installed packages and the notebook's folder: no
    // import may fetch anything (a URL can carry data out as well as code in).
    "--deny-import",
    "--cached-only",
    `--allow-read=${[...new Set(reads)].join(",")}`,
    `--allow-env=${[...new Set([...NAMED_VARIABLES, ...(options.allowEnv ?? [])])].join(",")}`,
  ];
  if ((options.allowNet ?? []).length > 0) {
    flags.push(`--allow-net=${[...new Set(options.allowNet)].join(",")}`);
  }
  return flags;
}

/**
 * Environment variables cells may read: only ones libraries probe when they load (jsdom's
 * HTTP client asks for these two), and the sandbox sets none of them.
 */
export const NAMED_VARIABLES: readonly string[] = ["UNDICI_NO_WASM_SIMD", "UNDICI_USE_MILO"];

/**
 * What the child process gets: where Deno's cache is (named directly, so no home folder is
 * needed), the program search path, and the variables granted by name.
 */
function childEnvironment(granted: readonly string[] = []): Record<string, string> {
  const env: Record<string, string> = { NO_COLOR: "1", DENO_NO_UPDATE_CHECK: "1" };
  const cache = denoCacheDirs()[0];
  if (cache !== undefined) env.DENO_DIR = cache;
  // PATH lets a denied `new Deno.Command("ls")` be reported as denied, not as "not found".
  for (const name of ["PATH", "SystemRoot", ...granted]) {
    try {
      const value = Deno.env.get(name);
      if (value !== undefined) env[name] = value;
    } catch {
      // Not allowed to read it: leave it out.
    }
  }
  return env;
}

function denoCacheDirs(): string[] {
  try {
    const explicit = Deno.env.get("DENO_DIR");
    if (explicit) return [explicit];
    const home = Deno.env.get("HOME") ?? Deno.env.get("USERPROFILE");
    if (Deno.build.os === "windows") {
      const local = Deno.env.get("LOCALAPPDATA");
      return local ? [`${local}\\deno`] : [];
    }
    if (Deno.build.os === "darwin") return home ? [`${home}/Library/Caches/deno`] : [];
    const xdg = Deno.env.get("XDG_CACHE_HOME");
    return xdg ? [`${xdg}/deno`] : home ? [`${home}/.cache/deno`] : [];
  } catch {
    // Without env access the cache stays unreadable; imports of cached modules still load.
    return [];
  }
}

/**
 * A sandbox process, started on first use and restarted after a kill.
 *
 * @example One batch of one compiled cell
 * ```ts
 * import { Sandbox } from "./sandbox.ts";
 * import { deepEqual } from "node:assert/strict";
 * const dir = await Deno.makeTempDir();
 * const sandbox = new Sandbox({ rootDir: new URL("../..", import.meta.url).pathname, notebookDir: dir });
 * const kinds: string[] = [];
 * const end = await sandbox.runBatch(
 *   [{ cell: "c1", kind: "run", source: "export default async () => ({ value: 6 * 7, names: {} });" }],
 *   { values: {}, notebookUrl: `file://${dir}/amp.md`, onMessage: (message) => kinds.push(message.type) },
 * );
 * deepEqual([end, kinds], [{ kind: "finished", cancelled: false }, ["started", "done"]]);
 * await sandbox.close();
 * await Deno.remove(dir, { recursive: true });
 * ```
 */
export class Sandbox {
  readonly #options: SandboxOptions;
  #process: Deno.ChildProcess | undefined;
  #writer: WritableStreamDefaultWriter<Uint8Array> | undefined;
  #listener: ((message: ChildMessage) => void) | undefined;
  #exited: Promise<Deno.CommandStatus> | undefined;
  #ready: Promise<void> | undefined;
  #stderr = "";
  #batch = 0;
  #running: number | undefined;

  /**
   * Creates a sandbox (the process starts with the first batch).
   *
   * @param options Folders, reads and the time limit.
   */
  constructor(options: SandboxOptions) {
    this.#options = options;
  }

  /** Per-cell time limit in milliseconds. */
  get cellTimeoutMs(): number {
    return this.#options.cellTimeoutMs ?? DEFAULT_CELL_TIMEOUT_MS;
  }

  /** Whether a child process is alive. */
  get alive(): boolean {
    return this.#process !== undefined;
  }

  #start(): Promise<void> {
    const root = this.#options.rootDir;
    const childPath = new URL("./child.ts", import.meta.url);
    const command = new Deno.Command(Deno.execPath(), {
      args: [
        "run",
        "--quiet",
        "--config",
        `${root}/deno.json`,
        "--no-lock",
        `--v8-flags=--max-old-space-size=${this.#options.memoryMb ?? 4096}`,
        ...sandboxPermissions(this.#options),
        childPath.protocol === "file:" ? decodeURIComponent(childPath.pathname) : childPath.href,
        // The child watches for this process to go away (see startWatchdog in child.ts).
        String(Deno.pid),
      ],
      cwd: this.#options.notebookDir,
      stdin: "piped",
      stdout: "piped",
      stderr: "piped",
      clearEnv: true,
      env: childEnvironment(this.#options.allowEnv),
    });
    const process = command.spawn();
    this.#process = process;
    this.#writer = process.stdin.getWriter();
    this.#stderr = "";
    this.#exited = process.status;
    let signalReady: () => void = () => {};
    let failReady: (error: Error) => void = () => {};
    const ready = new Promise<void>((resolve, reject) => {
      signalReady = resolve;
      failReady = reject;
    });
    const token = crypto.randomUUID();
    this.#readLines(process.stdout, (line) => {
      // Only lines that start with the token are replies; anything else a cell printed
      // to stdout directly is ignored.
      if (!line.startsWith(token)) return;
      let message: ChildMessage;
      try {
        message = decodeLine(line.slice(token.length)) as ChildMessage;
      } catch {
        return;
      }
      if (message.type === "ready") signalReady();
      else this.#listener?.(message);
    });
    this.#collectStderr(process.stderr);
    process.status.then((status) => {
      if (this.#process === process) {
        this.#process = undefined;
        this.#writer = undefined;
      }
      failReady(new Error(`The sandbox process exited (code ${status.code}) before it was ready`));
    });
    this.#send({ type: "hello", token }).catch(() => {});
    this.#ready = ready;
    return ready;
  }

  async #readLines(stream: ReadableStream<Uint8Array>, onLine: (line: string) => void) {
    const decoder = new TextDecoder();
    let buffer = "";
    try {
      for await (const chunk of stream) {
        buffer += decoder.decode(chunk, { stream: true });
        let newline = buffer.indexOf("\n");
        while (newline >= 0) {
          const line = buffer.slice(0, newline);
          buffer = buffer.slice(newline + 1);
          newline = buffer.indexOf("\n");
          try {
            onLine(line);
          } catch (error) {
            // A listener's bug must not stop the reading (the child would block on a full pipe).
            queueMicrotask(() => {
              throw error;
            });
          }
        }
      }
    } catch {
      // The process was killed mid-line.
    }
  }

  async #collectStderr(stream: ReadableStream<Uint8Array>) {
    const decoder = new TextDecoder();
    try {
      for await (const chunk of stream) {
        this.#stderr = (this.#stderr + decoder.decode(chunk, { stream: true })).slice(-20_000);
      }
    } catch {
      // Killed.
    }
  }

  async #send(message: HostMessage): Promise<void> {
    await this.#writer!.write(new TextEncoder().encode(encodeLine(message)));
  }

  /**
   * Runs a batch of steps in order; messages arrive through `onMessage` as they happen.
   *
   * @param steps The steps, in plan order.
   * @param options Adjustable values to use, the notebook URL, and the message callback.
   * @returns How the batch ended.
   */
  async runBatch(
    steps: ChildStep[],
    options: {
      values: Record<string, number>;
      notebookUrl: string;
      onMessage: (message: ChildMessage) => void;
    },
  ): Promise<BatchEnd> {
    if (!this.#process) this.#start();
    try {
      await this.#ready;
    } catch (error) {
      return { kind: "crashed", detail: `${(error as Error).message}\n${this.#stderr}`.trim() };
    }
    const batch = ++this.#batch;
    this.#running = batch;
    const process = this.#process!;
    const limitMs = this.cellTimeoutMs;
    let timer: ReturnType<typeof setTimeout> | undefined;
    let currentCell: string | undefined;
    try {
      return await new Promise<BatchEnd>((resolve) => {
        const arm = (cell: string) => {
          clearTimeout(timer);
          currentCell = cell;
          timer = setTimeout(() => {
            this.kill();
            resolve({ kind: "timeout", cell, limitMs });
          }, limitMs);
        };
        this.#listener = (message) => {
          if (!("batch" in message) || message.batch !== batch) return;
          if (message.type === "started") arm(message.cell);
          if (message.type === "done" || message.type === "failed") {
            clearTimeout(timer);
            currentCell = undefined;
          }
          if (message.type === "batchEnd") {
            resolve({ kind: "finished", cancelled: message.cancelled });
          } else options.onMessage(message);
        };
        process.status.then((status) => {
          // Give the stderr reader a moment to catch the last words.
          setTimeout(() =>
            resolve({
              kind: "crashed",
              cell: currentCell,
              detail: crashDetail(status, this.#stderr, {
                memoryMb: this.#options.memoryMb ?? 4096,
              }),
            }), 50);
        });
        this.#send({
          type: "run",
          batch,
          steps,
          values: options.values,
          notebookUrl: options.notebookUrl,
        }).catch(() => {});
      });
    } finally {
      clearTimeout(timer);
      this.#listener = undefined;
      this.#running = undefined;
    }
  }

  /** Asks the child to stop the running batch after its current cell. */
  cancel(): void {
    if (this.#running !== undefined && this.#process) {
      this.#send({ type: "cancel", batch: this.#running }).catch(() => {});
    }
  }

  /** Kills the child process (values are lost; the next batch starts a new one). */
  kill(): void {
    const process = this.#process;
    if (!process) return;
    this.#process = undefined;
    this.#writer = undefined;
    try {
      process.kill("SIGKILL");
    } catch {
      // Already gone.
    }
  }

  /** Stops the child and waits for it to exit. */
  async close(): Promise<void> {
    const process = this.#process;
    const exited = this.#exited;
    if (!process) {
      await exited?.catch(() => {});
      return;
    }
    this.#process = undefined;
    try {
      await this.#writer?.close();
    } catch {
      // Closed already.
    }
    this.#writer = undefined;
    const timer = setTimeout(() => {
      try {
        process.kill("SIGKILL");
      } catch {
        // Gone.
      }
    }, 2000);
    await exited?.catch(() => {});
    clearTimeout(timer);
  }
}
