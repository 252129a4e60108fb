/**
 * `longtail`: the command line. Subcommands `run`, `record`, `verify`, `render`, `watch` and `demo`; each
 * has `--help`. From a checkout: `deno task longtail <subcommand> ...`.
 *
 * @module
 */
import { LONGTAIL_VERSION } from "../version.ts";
import { UnreadableError, UsageError } from "./_common.ts";
import { demoCommand } from "./demo_command.ts";
import { recordCommand } from "./record_command.ts";
import { renderCommand } from "./render.ts";
import { runCommand } from "./run_command.ts";
import { type CliIo, terminalIo } from "./_terminal.ts";
import { verifyCommand } from "./verify_command.ts";
import { watchCommand } from "./watch_command.ts";

/** The general help text. */
export const HELP = `longtail ${LONGTAIL_VERSION} — amplifier design notebooks that check themselves

Usage: longtail <command> [options]

Commands:
  run NOTEBOOK       run a notebook and print its values and design checks
  record NOTEBOOK    run a notebook and write its results (and charts) into it
  verify PATHS...    rerun notebooks, compare with their recorded results, enforce checks
  render NOTEBOOK    run a notebook and write its design report as one HTML file (-o FILE)
  watch NOTEBOOK     run a notebook, then rerun what changed each time the file is saved
  demo               verify the flagship power-amplifier notebook and write its report

Run longtail <command> --help for a command's options.
`;

const COMMANDS: Record<string, (args: string[], io: CliIo) => Promise<number>> = {
  run: runCommand,
  record: recordCommand,
  verify: verifyCommand,
  render: renderCommand,
  watch: watchCommand,
  demo: demoCommand,
};

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
      }; the commands are run, record, verify, render, watch, demo\n`,
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
