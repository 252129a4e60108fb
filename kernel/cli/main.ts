/**
 * `longtail`: the command line. Subcommands `run`, `record`, `verify` and `demo`; each
 * has `--help`. From a checkout: `deno task longtail <subcommand> ...`.
 *
 * @module
 */
import { joinPath, ROOT_DIR } from "../_paths.ts";
import { LONGTAIL_VERSION } from "../version.ts";
import { UnreadableError, UsageError } from "./_common.ts";
import { recordCommand } from "./record_command.ts";
import { renderCommand } from "./render.ts";
import { runCommand } from "./run_command.ts";
import { type CliIo, paint, terminalIo } from "./_terminal.ts";
import { verifyCommand } from "./verify_command.ts";

/** The notebook `demo` verifies. */
export const FLAGSHIP_NOTEBOOK: string = joinPath(ROOT_DIR, "notebooks", "power_amplifier.md");

/** Where `demo` writes the flagship's report (out/ is git-ignored). */
export const DEMO_REPORT: string = joinPath(ROOT_DIR, "out", "power_amplifier.html");

/** Help text of `demo`. */
export const DEMO_HELP = `Usage: longtail demo

Verifies the flagship notebook, notebooks/power_amplifier.md (a three-stage power
amplifier), prints the result, and writes its design report to out/power_amplifier.html
(printing the path). Takes the same options as verify.
`;

/** The general help text. */
export const HELP = `longtail ${LONGTAIL_VERSION} — amplifier design notebooks that check themselves

Usage: longtail <command> [options]

Commands:
  run NOTEBOOK       run a notebook and print its values and design checks
  record NOTEBOOK    run a notebook and write its results (and charts) into it
  verify PATHS...    rerun notebooks, compare with their recorded results, enforce checks
  render NOTEBOOK    run a notebook and write its design report as one HTML file (-o FILE)
  demo               verify the flagship power-amplifier notebook and write its report

Run longtail <command> --help for a command's options.
`;

const COMMANDS: Record<string, (args: string[], io: CliIo) => Promise<number>> = {
  run: runCommand,
  record: recordCommand,
  verify: verifyCommand,
  render: renderCommand,
  demo: demoCommand,
};

async function demoCommand(args: string[], io: CliIo): Promise<number> {
  if (args.includes("--help") || args.includes("-h")) {
    io.out(DEMO_HELP);
    return 0;
  }
  try {
    await Deno.stat(FLAGSHIP_NOTEBOOK);
  } catch {
    io.err(`The flagship notebook ${FLAGSHIP_NOTEBOOK} is not there yet.\n`);
    return 2;
  }
  const status = await verifyCommand([FLAGSHIP_NOTEBOOK, ...args], io);
  io.out(paint(io, "gray", "Design report: "));
  await renderCommand([FLAGSHIP_NOTEBOOK, "-o", DEMO_REPORT], io);
  return status;
}

/**
 * Runs the command line.
 *
 * @param args Command-line arguments.
 * @param io Where to print.
 * @returns The exit status: 0 good, 1 something failed, 2 bad usage or unreadable input.
 *
 * @example An unknown command is a usage error
 * ```ts
 * import { main } from "./main.ts";
 * import { bufferIo } from "./_terminal.ts";
 * import { equal } from "node:assert/strict";
 * equal(await main(["--version"], bufferIo().io), 0);
 * equal(await main(["frobnicate"], bufferIo().io), 2);
 * ```
 */
export async function main(args: string[], io: CliIo): Promise<number> {
  const [name, ...rest] = args;
  if (name === undefined || name === "--help" || name === "-h" || name === "help") {
    io.out(HELP);
    return name === undefined ? 2 : 0;
  }
  if (name === "--version" || name === "-V") {
    io.out(`longtail ${LONGTAIL_VERSION}\n`);
    return 0;
  }
  const command = COMMANDS[name];
  if (!command) {
    io.err(
      `longtail: there is no command ${
        JSON.stringify(name)
      }; the commands are run, record, verify, render, demo\n`,
    );
    return 2;
  }
  try {
    return await command(rest, io);
  } catch (error) {
    const code = (error as { code?: string }).code ?? "";
    if (error instanceof UsageError || code.startsWith("ERR_PARSE_ARGS")) {
      io.err(
        `longtail ${name}: ${(error as Error).message}\nRun longtail ${name} --help for usage.\n`,
      );
      return 2;
    }
    if (error instanceof UnreadableError) {
      io.err(`longtail ${name}: ${error.message}\n`);
      return 2;
    }
    throw error;
  }
}

if (import.meta.main) {
  Deno.exit(await main(Deno.args, terminalIo()));
}
