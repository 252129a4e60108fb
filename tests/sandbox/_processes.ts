/**
 * Starting `longtail` as a child process the test can kill, and finding the processes it
 * left running through Linux /proc. Shared by the sandbox tests.
 *
 * @module
 */
import { ROOT } from "../corpus/_cli.ts";

/** What a sandbox process's command line contains. */
export const SANDBOX_CHILD = "kernel/sandbox/child.ts";

/** The command that runs `longtail ARGS...` with every permission, ready to `spawn()`. */
export function longtailCommand(args: string[], options: Deno.CommandOptions = {}): Deno.Command {
  return new Deno.Command(Deno.execPath(), {
    ...options,
    args: [
      "run",
      "--quiet",
      "--config",
      `${ROOT}/deno.json`,
      "-A",
      `${ROOT}/kernel/cli/main.ts`,
      ...args,
    ],
  });
}

/**
 * Every process whose command line mentions `text` and that `pick` keeps (returns a value
 * for), in /proc order. A process that ends or cannot be read while it is looked at is
 * passed over, so `pick` may read more of /proc/PID freely.
 */
export async function findProcesses<T>(
  text: string,
  pick: (pid: number) => Promise<T | undefined>,
): Promise<T[]> {
  const found: T[] = [];
  for await (const entry of Deno.readDir("/proc")) {
    if (!/^\d+$/.test(entry.name)) continue;
    try {
      const cmdline = await Deno.readTextFile(`/proc/${entry.name}/cmdline`);
      if (!cmdline.includes(text)) continue;
      const picked = await pick(Number(entry.name));
      if (picked !== undefined) found.push(picked);
    } catch {
      // Gone meanwhile, or not ours to read.
    }
  }
  return found;
}
