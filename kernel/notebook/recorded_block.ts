/**
 * The recorded-results block: plain text that any Markdown viewer shows, and that
 * `verify` reads back to compare with a fresh run.
 *
 *     ```recorded
 *     38.2 dB                                   ← the cell's shown value, as text
 *     · tailCurrent = 0.002 (2 mA)               ← a number, by name (6 significant digits;
 *                                                  an adjustable value's unit in brackets)
 *     ✓ phase margin = 61.1° is at least 45° (margin 16.1°)   ← a design check that passed
 *     ✗ junction temperature = 131 °C is not at most 125 °C (short by 6 °C)
 *     ! TypeError: x is not a function          ← a failure, recorded only with --force
 *     ```
 *
 * A text line that happens to start with one of the marks is written with a leading `\`.
 *
 * @module
 */

/** One recorded item. */
export type RecordedEntry =
  | { kind: "text"; text: string }
  | { kind: "number"; name: string; value: number; shown?: string }
  | { kind: "check"; pass: boolean; text: string }
  | { kind: "problem"; text: string };

const NUMBER_MARK = "· ";
const PASS_MARK = "✓ ";
const FAIL_MARK = "✗ ";
const PROBLEM_MARK = "! ";
const MARKS = [NUMBER_MARK, PASS_MARK, FAIL_MARK, PROBLEM_MARK, "\\"];

/**
 * Formats a recorded number: six significant digits, shortest form.
 *
 * @param value Any number.
 * @returns The text, e.g. `"0.002"`, `"1.23457e-7"`, `"NaN"`, `"Infinity"`.
 *
 * @example
 * ```ts
 * import { formatRecordedNumber } from "./recorded_block.ts";
 * import { equal } from "node:assert/strict";
 * equal(formatRecordedNumber(0.0020000000000000005), "0.002");
 * equal(formatRecordedNumber(1 / 3), "0.333333");
 * equal(formatRecordedNumber(-Infinity), "-Infinity");
 * ```
 */
export function formatRecordedNumber(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  return String(Number(value.toPrecision(6)));
}

/**
 * Writes entries as the lines inside a `recorded` fence.
 *
 * @param entries What to record.
 * @returns The lines, without line breaks.
 *
 * @example
 * ```ts
 * import { recordedLines } from "./recorded_block.ts";
 * import { deepEqual } from "node:assert/strict";
 * deepEqual(recordedLines([
 *   { kind: "text", text: "4.7 kΩ" },
 *   { kind: "number", name: "gain", value: 12.5 },
 *   { kind: "check", pass: true, text: "gain = 12.5 is at least 10 (margin 2.5)" },
 * ]), ["4.7 kΩ", "· gain = 12.5", "✓ gain = 12.5 is at least 10 (margin 2.5)"]);
 * ```
 */
export function recordedLines(entries: readonly RecordedEntry[]): string[] {
  const lines: string[] = [];
  for (const entry of entries) {
    switch (entry.kind) {
      case "text":
        for (const line of entry.text.split(/\r\n|\r|\n/)) {
          lines.push(MARKS.some((mark) => line.startsWith(mark)) ? "\\" + line : line);
        }
        break;
      case "number":
        // `shown` (the value with its unit, for adjustable values) is for the reader; the
        // number before it is what verify compares.
        lines.push(
          `${NUMBER_MARK}${entry.name} = ${formatRecordedNumber(entry.value)}` +
            (entry.shown === undefined ? "" : ` (${oneLine(entry.shown)})`),
        );
        break;
      case "check":
        lines.push((entry.pass ? PASS_MARK : FAIL_MARK) + oneLine(entry.text));
        break;
      case "problem":
        for (const line of entry.text.split(/\r\n|\r|\n/)) lines.push(PROBLEM_MARK + line);
        break;
    }
  }
  return lines;
}

/**
 * Reads the text inside a `recorded` fence back into entries.
 *
 * @param content The fence's content.
 * @returns The entries; consecutive text lines form one text entry.
 *
 * @example Round trip
 * ```ts
 * import { parseRecorded, recordedLines } from "./recorded_block.ts";
 * import { deepEqual } from "node:assert/strict";
 * const entries = [
 *   { kind: "text" as const, text: "{ gain: 12.5 }\n· not a number line" },
 *   { kind: "number" as const, name: "pair.gm", value: 0.0386 },
 *   { kind: "number" as const, name: "tailCurrent", value: 0.002, shown: "2 mA" },
 *   { kind: "check" as const, pass: false, text: "Tj = 131 °C is not at most 125 °C" },
 * ];
 * deepEqual(parseRecorded(recordedLines(entries).join("\n") + "\n"), entries);
 * ```
 */
export function parseRecorded(content: string): RecordedEntry[] {
  const entries: RecordedEntry[] = [];
  const lines = content.split(/\r\n|\r|\n/);
  if (lines[lines.length - 1] === "") lines.pop();
  for (const line of lines) {
    const last = entries[entries.length - 1];
    if (line.startsWith(NUMBER_MARK)) {
      const body = line.slice(NUMBER_MARK.length);
      const at = body.lastIndexOf(" = ");
      const rest = at < 0 ? "" : body.slice(at + 3);
      const open = rest.indexOf(" (");
      const value = at < 0 ? Number.NaN : Number(open < 0 ? rest : rest.slice(0, open));
      const entry: RecordedEntry = {
        kind: "number",
        name: at < 0 ? body : body.slice(0, at),
        value,
      };
      if (open >= 0 && rest.endsWith(")")) entry.shown = rest.slice(open + 2, -1);
      entries.push(entry);
    } else if (line.startsWith(PASS_MARK) || line.startsWith(FAIL_MARK)) {
      entries.push({ kind: "check", pass: line.startsWith(PASS_MARK), text: line.slice(2) });
    } else if (line.startsWith(PROBLEM_MARK)) {
      const text = line.slice(PROBLEM_MARK.length);
      if (last?.kind === "problem") last.text += "\n" + text;
      else entries.push({ kind: "problem", text });
    } else {
      const text = line.startsWith("\\") ? line.slice(1) : line;
      if (last?.kind === "text") last.text += "\n" + text;
      else entries.push({ kind: "text", text });
    }
  }
  return entries;
}

function oneLine(text: string): string {
  return text.replace(/\s*(\r\n|\r|\n)\s*/g, " ");
}
