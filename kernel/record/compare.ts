/**
 * Comparing recorded results with a fresh run: what drifted, by name, with both values.
 *
 * Numbers compare with a relative tolerance. Text compares piece by piece: the words
 * must be the same, and the numbers in it must agree within the same tolerance, so
 * `4.7 kΩ` against `4.70 kΩ` is no drift while `4.7 kΩ` against `5.1 kΩ` is.
 *
 * @module
 */
import { formatRecordedNumber, type RecordedEntry } from "../notebook/recorded_block.ts";

/** One difference between the recorded and the new result. */
export interface Drift {
  /** What differs: `shown value`, a number's name, `check …`, `error`. */
  name: string;
  /** As recorded (`(not recorded)` when new). */
  recorded: string;
  /** As it is now (`(missing)` when gone). */
  now: string;
}

/** Options for {@linkcode compareEntries}. */
export interface CompareOptions {
  /**
   * Relative tolerance for numbers (in text too).
   * @default {1e-5}
   */
  rtol?: number;
}

/** The default relative tolerance: recorded numbers carry six significant digits. */
export const DEFAULT_RTOL = 1e-5;

const NUMBER = /[-+]?(?:\d+\.?\d*|\.\d+)(?:e[-+]?\d+)?/gi;

/**
 * Whether two numbers agree within a relative tolerance (NaN agrees with NaN, ∞ with ∞).
 *
 * @param recorded The recorded number.
 * @param now The new number.
 * @param rtol Relative tolerance.
 * @returns True when they agree.
 *
 * @example
 * ```ts
 * import { numbersAgree } from "./compare.ts";
 * import { equal } from "node:assert/strict";
 * equal(numbersAgree(0.00215443, 0.0021544347, 1e-5), true); // six digits as recorded
 * equal(numbersAgree(4700, 5100, 1e-5), false);
 * equal(numbersAgree(NaN, NaN, 1e-5), true);
 * ```
 */
export function numbersAgree(recorded: number, now: number, rtol: number): boolean {
  if (Number.isNaN(recorded) || Number.isNaN(now)) {
    return Number.isNaN(recorded) && Number.isNaN(now);
  }
  if (!Number.isFinite(recorded) || !Number.isFinite(now)) return recorded === now;
  return Math.abs(recorded - now) <= rtol * Math.max(Math.abs(recorded), Math.abs(now));
}

/**
 * Whether two texts agree: same words, numbers within a relative tolerance.
 *
 * @param recorded The recorded text.
 * @param now The new text.
 * @param rtol Relative tolerance.
 * @returns True when they agree.
 *
 * @example
 * ```ts
 * import { textsAgree } from "./compare.ts";
 * import { equal } from "node:assert/strict";
 * equal(textsAgree("gain = 38.2 dB", "gain = 38.2000001 dB", 1e-5), true);
 * equal(textsAgree("gain = 38.2 dB", "gain = 38.9 dB", 1e-5), false);
 * equal(textsAgree("gain = 38.2 dB", "gain = 38.2 V", 1e-5), false);
 * ```
 */
export function textsAgree(recorded: string, now: string, rtol: number): boolean {
  if (recorded === now) return true;
  const words = (text: string) => text.split(NUMBER);
  const numbers = (text: string) => (text.match(NUMBER) ?? []).map(Number);
  const a = words(recorded);
  const b = words(now);
  if (a.length !== b.length || a.some((word, i) => word !== b[i])) return false;
  const x = numbers(recorded);
  const y = numbers(now);
  return x.length === y.length && x.every((value, i) => numbersAgree(value, y[i], rtol));
}

/**
 * Compares the recorded entries of a cell with the new ones.
 *
 * @param recorded Entries read from the notebook.
 * @param now Entries built from the fresh run.
 * @param options Tolerance.
 * @returns The drifts (empty when everything agrees).
 *
 * @example A part value changed
 * ```ts
 * import { compareEntries } from "./compare.ts";
 * import { deepEqual } from "node:assert/strict";
 * const drift = compareEntries(
 *   [{ kind: "number", name: "r1", value: 4700 }],
 *   [{ kind: "number", name: "r1", value: 5100 }],
 * );
 * deepEqual(drift, [{ name: "r1", recorded: "4700", now: "5100" }]);
 * ```
 */
export function compareEntries(
  recorded: readonly RecordedEntry[],
  now: readonly RecordedEntry[],
  options: CompareOptions = {},
): Drift[] {
  const rtol = options.rtol ?? DEFAULT_RTOL;
  const drifts: Drift[] = [];
  const textOf = (entries: readonly RecordedEntry[], kind: "text" | "problem") =>
    entries.filter((e) => e.kind === kind).map((e) => (e as { text: string }).text).join("\n");
  for (const kind of ["text", "problem"] as const) {
    const before = textOf(recorded, kind);
    const after = textOf(now, kind);
    if (!textsAgree(before, after, rtol)) {
      drifts.push({
        name: kind === "text" ? "shown value" : "error",
        recorded: before === "" ? "(nothing)" : before,
        now: after === "" ? "(nothing)" : after,
      });
    }
  }
  const numbers = (entries: readonly RecordedEntry[]) =>
    new Map(entries.flatMap((e) => (e.kind === "number" ? [[e.name, e.value] as const] : [])));
  const before = numbers(recorded);
  const after = numbers(now);
  for (const [name, value] of before) {
    const current = after.get(name);
    if (current === undefined) {
      drifts.push({ name, recorded: formatRecordedNumber(value), now: "(missing)" });
    } else if (!numbersAgree(value, current, rtol)) {
      drifts.push({
        name,
        recorded: formatRecordedNumber(value),
        now: formatRecordedNumber(current),
      });
    }
  }
  for (const [name, value] of after) {
    if (!before.has(name)) {
      drifts.push({ name, recorded: "(not recorded)", now: formatRecordedNumber(value) });
    }
  }
  const checks = (entries: readonly RecordedEntry[]) =>
    entries.flatMap((e) => (e.kind === "check" ? [`${e.pass ? "✓" : "✗"} ${e.text}`] : []));
  const checksBefore = checks(recorded);
  const checksAfter = checks(now);
  for (let i = 0; i < Math.max(checksBefore.length, checksAfter.length); i++) {
    const a = checksBefore[i];
    const b = checksAfter[i];
    if (a !== undefined && b !== undefined && textsAgree(a, b, rtol)) continue;
    drifts.push({
      name: `check ${checkName(a ?? b ?? "")}`,
      recorded: a ?? "(not recorded)",
      now: b ?? "(missing)",
    });
  }
  return drifts;
}

/** The check's name from its line: the words before ` = ` (or the first few words). */
function checkName(line: string): string {
  const text = line.replace(/^[✓✗] /, "");
  const at = text.indexOf(" = ");
  return at > 0 ? text.slice(0, at) : text.split(" ").slice(0, 3).join(" ");
}
