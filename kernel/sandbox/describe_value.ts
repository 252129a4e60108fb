/**
 * Turning a cell's values into what leaves the sandbox: MIME bundles for its shown value,
 * named numbers, and design checks. Runs inside the sandbox process; values never leave it.
 *
 * Two well-known symbols connect this to any library without importing it:
 * - `Symbol.for("longtail.display")`: a method returning a MIME bundle (or a Promise of one);
 * - `Symbol.for("longtail.check")`: the marker (value `1`) on a design-check result.
 *
 * @module
 */
import type { CheckRecord, MimeBundle, NumberRecord } from "./protocol.ts";

/** The rich-display method's well-known symbol. */
export const DISPLAY_SYMBOL: symbol = Symbol.for("longtail.display");
/** The design-check marker's well-known symbol. */
export const CHECK_SYMBOL: symbol = Symbol.for("longtail.check");

/** Longest text kept in one MIME entry; longer output is cut with a note. */
export const MAX_OUTPUT_CHARS = 1_000_000;

/** What the sandbox reports about one cell's values. */
export interface ValueDescription {
  /** Bundles for the shown value. */
  outputs: MimeBundle[];
  /** Named numbers. */
  records: NumberRecord[];
  /** Design checks not yet counted on an earlier cell. */
  checks: CheckRecord[];
}

/** Options for {@linkcode describeValue}. */
export interface DescribeOptions {
  /**
   * How to name the shown value's numbers (`pair` gives `pair.gm`).
   * @default {"value"}
   */
  label?: string;
  /**
   * Checks already counted (on other cells); new ones are added.
   * @default {a new set}
   */
  counted?: WeakSet<object>;
}

/**
 * Describes a cell's shown value and top-level names.
 *
 * @param value The shown value (`undefined`: nothing shown).
 * @param names The cell's top-level values by name.
 * @param options Label and the set of checks already counted.
 * @returns Bundles, numbers and checks.
 *
 * @example A number, a plain object and a check
 * ```ts
 * import { describeValue } from "./describe_value.ts";
 * import { deepEqual, equal } from "node:assert/strict";
 * const check = { [Symbol.for("longtail.check")]: 1, name: "gain", value: 12, unit: "",
 *   limit: { kind: "atLeast", min: 10 }, pass: true, margin: 2, marginRatio: 0.2,
 *   reason: "gain = 12 is at least 10 (margin 2)" };
 * const stage = { gain: 12, rin: 4700, checks: [check] };
 * const described = await describeValue(stage, { tail: 2e-3, stage }, { label: "stage" });
 * deepEqual(described.records.map((r) => r.name), ["tail", "stage.gain", "stage.rin"]);
 * equal(described.checks.length, 1);
 * equal(described.outputs[0]["text/plain"].includes("rin: 4700"), true);
 * ```
 */
export async function describeValue(
  value: unknown,
  names: Record<string, unknown>,
  options: DescribeOptions = {},
): Promise<ValueDescription> {
  const label = options.label ?? "value";
  const counted = options.counted ?? new WeakSet();
  const records: NumberRecord[] = [];
  for (const [name, named] of Object.entries(names)) {
    if (typeof named === "number") records.push({ name, value: named });
  }
  if (isPlainObject(value) && !isDisplayable(value) && !isCheck(value)) {
    for (const [key, field] of Object.entries(value)) {
      if (typeof field === "number") records.push({ name: `${label}.${key}`, value: field });
    }
  }
  const checks: CheckRecord[] = [];
  const take = (candidate: unknown) => {
    if (isCheck(candidate) && !counted.has(candidate)) {
      counted.add(candidate);
      checks.push(checkRecord(candidate));
    }
  };
  for (const candidate of [value, ...Object.values(names)]) collectChecks(candidate, take);
  return { outputs: await bundles(value), records, checks };
}

/** A check, an array of checks, or checks in the fields (and array fields) of an object. */
function collectChecks(value: unknown, take: (candidate: unknown) => void): void {
  if (value === null || typeof value !== "object") return;
  if (isCheck(value)) return take(value);
  const items = Array.isArray(value) ? value : isPlainObject(value) ? Object.values(value) : [];
  for (const item of items.slice(0, 10_000)) {
    if (isCheck(item)) take(item);
    else if (Array.isArray(item)) { for (const inner of item.slice(0, 10_000)) take(inner); }
  }
}

async function bundles(value: unknown): Promise<MimeBundle[]> {
  if (value === undefined) return [];
  if (
    Array.isArray(value) && value.length > 0 && value.length <= 50 && value.every(isDisplayable)
  ) {
    const all: MimeBundle[] = [];
    for (const item of value) all.push(await displayBundle(item));
    return all;
  }
  if (isDisplayable(value)) return [await displayBundle(value)];
  if (isCheck(value)) return [{ "text/plain": checkLine(value) }];
  if (Array.isArray(value) && value.length > 0 && value.every(isCheck)) {
    return [{ "text/plain": value.map(checkLine).join("\n") }];
  }
  const bundle: MimeBundle = { "text/plain": limit(plainText(value)) };
  if (
    value !== null && typeof value === "object" && (Array.isArray(value) || isPlainObject(value))
  ) {
    try {
      const json = JSON.stringify(value);
      if (json !== undefined && json.length <= 100_000) bundle["application/json"] = json;
    } catch {
      // Cycles or BigInt: the plain text is enough.
    }
  }
  return [bundle];
}

async function displayBundle(value: object): Promise<MimeBundle> {
  const method = (value as Record<symbol, unknown>)[DISPLAY_SYMBOL] as () => unknown;
  const raw = await method.call(value);
  const bundle: MimeBundle = {};
  if (raw !== null && typeof raw === "object") {
    for (const [type, content] of Object.entries(raw)) {
      if (typeof content === "string") bundle[type] = limit(content);
    }
  }
  bundle["text/plain"] ??= limit(plainText(value));
  return bundle;
}

function plainText(value: unknown): string {
  if (typeof value === "string") return value;
  return Deno.inspect(readable(value, 0, new Set()), {
    colors: false,
    depth: 4,
    iterableLimit: 200,
    strAbbreviateSize: 10_000,
    breakLength: 100,
    getters: false,
  });
}

const INSPECT = Symbol.for("Deno.customInspect");

/**
 * A copy of plain data for printing: design checks print as their one-line verdict and
 * symbol-keyed markers are left out. Other objects print as they are.
 */
function readable(value: unknown, depth: number, seen: Set<object>): unknown {
  if (isCheck(value)) return { [INSPECT]: () => checkLine(value) };
  if (value === null || typeof value !== "object" || depth > 5 || seen.has(value)) return value;
  if (Array.isArray(value)) {
    if (value.length > 1000) return value;
    seen.add(value);
    return value.map((item) => readable(item, depth + 1, seen));
  }
  if (!isPlainObject(value) || isDisplayable(value)) return value;
  seen.add(value);
  const copy: Record<string, unknown> = Object.getPrototypeOf(value) === null
    ? Object.create(null)
    : {};
  for (const [key, field] of Object.entries(value)) copy[key] = readable(field, depth + 1, seen);
  return copy;
}

function limit(text: string): string {
  if (text.length <= MAX_OUTPUT_CHARS) return text;
  return text.slice(0, MAX_OUTPUT_CHARS) +
    `\n… (output cut at ${MAX_OUTPUT_CHARS} of ${text.length} characters)`;
}

function checkLine(check: Record<string, unknown>): string {
  return `${check.pass === true ? "✓" : "✗"} ${String(check.reason ?? check.name)}`;
}

function checkRecord(check: Record<string, unknown>): CheckRecord {
  const number = (x: unknown) => (typeof x === "number" ? x : Number.NaN);
  const rawLimit = (check.limit ?? {}) as Record<string, unknown>;
  const limitRecord: CheckRecord["limit"] = { kind: String(rawLimit.kind ?? "") };
  if (typeof rawLimit.min === "number") limitRecord.min = rawLimit.min;
  if (typeof rawLimit.max === "number") limitRecord.max = rawLimit.max;
  return {
    name: String(check.name ?? "check"),
    value: number(check.value),
    unit: String(check.unit ?? ""),
    limit: limitRecord,
    pass: check.pass === true,
    margin: number(check.margin),
    marginRatio: number(check.marginRatio),
    reason: String(check.reason ?? check.name ?? ""),
  };
}

function isCheck(value: unknown): value is Record<string, unknown> {
  return value !== null && typeof value === "object" &&
    (value as Record<symbol, unknown>)[CHECK_SYMBOL] === 1;
}

function isDisplayable(value: unknown): value is object {
  return value !== null && (typeof value === "object" || typeof value === "function") &&
    typeof (value as Record<symbol, unknown>)[DISPLAY_SYMBOL] === "function";
}

function isPlainObject(value: unknown): value is Record<string, unknown> {
  if (value === null || typeof value !== "object" || Array.isArray(value)) return false;
  const proto = Object.getPrototypeOf(value);
  return proto === Object.prototype || proto === null;
}
