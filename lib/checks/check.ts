/**
 * Design checks: a quantity, a limit, and a verdict with its margin.
 *
 * Every check result carries the well-known marker `Symbol.for("longtail.check")`, so the
 * kernel can find and count checks in any cell value without importing this library.
 *
 * @module
 */
import { formatSi, TRADE_UNITS } from "../units/format.ts";

/** The marker every check result carries; the kernel looks for it by this global symbol. */
export const CHECK_MARKER: unique symbol = Symbol.for("longtail.check") as never;

/** Which side of the limit passes. */
export type LimitKind = "atLeast" | "atMost" | "within";

/** A limit as data, so front-ends can print it without reparsing the reason. */
export interface Limit {
  /** Which side passes. */
  kind: LimitKind;
  /** Lower bound (for `atLeast` and `within`). */
  min?: number;
  /** Upper bound (for `atMost` and `within`). */
  max?: number;
}

/** The outcome of one design check. */
export interface CheckResult {
  /** Marker so the kernel recognises a check result; always `1` (protocol version). */
  readonly [CHECK_MARKER]: 1;
  /** Short name a reviewer recognises, e.g. `"phase margin"`. */
  name: string;
  /** The checked value, in `unit` (SI base units unless a `displayUnit` was asked for). */
  value: number;
  /** Unit symbol of `value`, the limits and the margin (`""` or `"ratio"`: a pure number). */
  unit: string;
  /** The value in SI base units, present only when the check reports in a trade unit. */
  siValue?: number;
  /** The SI unit of `siValue`, present only when the check reports in a trade unit. */
  siUnit?: string;
  /** The limit. */
  limit: Limit;
  /** True when the value meets the limit. */
  pass: boolean;
  /**
   * Distance to the nearest bound in `unit`; positive when passing, negative when failing,
   * NaN when the value is not a finite number.
   */
  margin: number;
  /**
   * `margin` as a fraction of the bound's magnitude (0.25 = 25 % of headroom); NaN when
   * the bound is zero or the value is not finite.
   */
  marginRatio: number;
  /** One line that says why it passed or failed. */
  reason: string;
}

/** Options shared by the check constructors. */
export interface CheckOptions {
  /**
   * Unit symbol of the value and the limit.
   * @default {""}
   */
  unit?: string;
  /**
   * Significant digits in the reason text.
   * @default {4}
   */
  digits?: number;
  /**
   * Trade unit to report in (a key of `TRADE_UNITS`, e.g. `"V/µs"` for a `"V/s"` check):
   * the value and limit are still given in `unit`, and the result's `value`, `limit`,
   * `margin` and `unit` are converted, so every front-end prints "19.9 V/µs" rather than
   * "19.9 MV/s". The SI value stays in `siValue`.
   * @default {unit}
   */
  displayUnit?: string;
}

function build(
  name: string,
  value: number,
  limit: Limit,
  options: CheckOptions,
): CheckResult {
  if (options.displayUnit !== undefined && options.displayUnit !== (options.unit ?? "")) {
    return inTradeUnit(name, value, limit, options, options.displayUnit);
  }
  const unit = options.unit ?? "";
  const show = (x: number) => formatSi(x, unit, { digits: options.digits ?? 4 });
  let margin = Number.NaN;
  let bound = Number.NaN;
  if (Number.isFinite(value)) {
    const below = limit.min === undefined ? Infinity : value - limit.min;
    const above = limit.max === undefined ? Infinity : limit.max - value;
    margin = Math.min(below, above);
    bound = below <= above ? limit.min! : limit.max!;
  }
  const pass = Number.isFinite(margin) && margin >= 0;
  const marginRatio = bound === 0 || !Number.isFinite(bound)
    ? Number.NaN
    : margin / Math.abs(bound);
  const wanted = limit.kind === "atLeast"
    ? `at least ${show(limit.min!)}`
    : limit.kind === "atMost"
    ? `at most ${show(limit.max!)}`
    : `within ${show(limit.min!)} … ${show(limit.max!)}`;
  let reason: string;
  if (!Number.isFinite(value)) {
    reason = `${name} is ${show(value)}, not a finite number, so it cannot be ${wanted}`;
  } else if (pass) {
    reason = `${name} = ${show(value)} is ${wanted} (margin ${show(margin)})`;
  } else {
    reason = `${name} = ${show(value)} is not ${wanted} (short by ${show(-margin)})`;
  }
  return { [CHECK_MARKER]: 1, name, value, unit, limit, pass, margin, marginRatio, reason };
}

function inTradeUnit(
  name: string,
  value: number,
  limit: Limit,
  options: CheckOptions,
  displayUnit: string,
): CheckResult {
  const siUnit = options.unit ?? "";
  const trade = Object.hasOwn(TRADE_UNITS, displayUnit) ? TRADE_UNITS[displayUnit] : undefined;
  if (!trade || trade.siUnit !== siUnit) {
    const known = Object.entries(TRADE_UNITS)
      .filter(([, t]) => t.siUnit === siUnit)
      .map(([u]) => `"${u}"`);
    throw new RangeError(
      `Expected displayUnit to be a trade unit of "${siUnit}" (${
        known.length > 0 ? known.join(", ") : "none known"
      }), but found "${displayUnit}"`,
    );
  }
  const scaled: Limit = { kind: limit.kind };
  if (limit.min !== undefined) scaled.min = limit.min / trade.size;
  if (limit.max !== undefined) scaled.max = limit.max / trade.size;
  const result = build(name, value / trade.size, scaled, {
    ...options,
    unit: displayUnit,
    displayUnit: undefined,
  });
  return { ...result, siValue: value, siUnit };
}

/**
 * Checks that `value >= min`.
 *
 * @param name What is checked, e.g. `"phase margin"`.
 * @param value The design's value.
 * @param min The smallest acceptable value.
 * @param options Unit, digits and the trade unit to report in.
 * @returns The check result.
 * @throws {RangeError} If `displayUnit` is not a trade unit of `unit`.
 *
 * @example Phase margin over 45°
 * ```ts
 * import { atLeast } from "./check.ts";
 * import { equal } from "node:assert/strict";
 * const check = atLeast("phase margin", 61.1, 45, { unit: "°" });
 * equal(check.pass, true);
 * equal(check.reason, "phase margin = 61.1° is at least 45° (margin 16.1°)");
 * ```
 *
 * @example A slew rate reported in the trade unit V/µs
 * ```ts
 * import { atLeast } from "./check.ts";
 * import { equal } from "node:assert/strict";
 * const check = atLeast("slew rate", 19.9e6, 15e6, { unit: "V/s", displayUnit: "V/µs" });
 * equal(check.reason, "slew rate = 19.9 V/µs is at least 15 V/µs (margin 4.9 V/µs)");
 * equal(check.siValue, 19.9e6);
 * ```
 */
export function atLeast(
  name: string,
  value: number,
  min: number,
  options: CheckOptions = {},
): CheckResult {
  return build(name, value, { kind: "atLeast", min }, options);
}

/**
 * Checks that `value <= max`.
 *
 * @param name What is checked, e.g. `"junction temperature"`.
 * @param value The design's value.
 * @param max The largest acceptable value.
 * @param options Unit, digits and the trade unit to report in.
 * @returns The check result.
 * @throws {RangeError} If `displayUnit` is not a trade unit of `unit`.
 *
 * @example Junction temperature over its limit fails with a negative margin
 * ```ts
 * import { atMost } from "./check.ts";
 * import { equal } from "node:assert/strict";
 * const check = atMost("junction temperature", 131, 125, { unit: "°C" });
 * equal(check.pass, false);
 * equal(check.margin, -6);
 * ```
 */
export function atMost(
  name: string,
  value: number,
  max: number,
  options: CheckOptions = {},
): CheckResult {
  return build(name, value, { kind: "atMost", max }, options);
}

/**
 * Checks that `min <= value <= max`; the margin is the distance to the nearer bound.
 *
 * @param name What is checked.
 * @param value The design's value.
 * @param min Lower bound.
 * @param max Upper bound.
 * @param options Unit, digits and the trade unit to report in.
 * @returns The check result.
 * @throws {RangeError} If `min > max`, or `displayUnit` is not a trade unit of `unit`.
 *
 * @example Output offset within ±50 mV
 * ```ts
 * import { within } from "./check.ts";
 * import { equal } from "node:assert/strict";
 * equal(within("output offset", 0.012, -0.05, 0.05, { unit: "V" }).pass, true);
 * ```
 */
export function within(
  name: string,
  value: number,
  min: number,
  max: number,
  options: CheckOptions = {},
): CheckResult {
  if (!(min <= max)) {
    throw new RangeError(`Expected min to be at most max (${max}), but found ${min}`);
  }
  return build(name, value, { kind: "within", min, max }, options);
}

/**
 * Tells whether a value is a check result, by its marker.
 *
 * @param value Anything.
 * @returns True for a check result.
 *
 * @example
 * ```ts
 * import { atLeast, isCheck } from "./check.ts";
 * import { equal } from "node:assert/strict";
 * equal(isCheck(atLeast("gain", 10, 5)), true);
 * equal(isCheck({ pass: true }), false);
 * ```
 */
export function isCheck(value: unknown): value is CheckResult {
  return typeof value === "object" && value !== null &&
    (value as Record<symbol, unknown>)[CHECK_MARKER] === 1;
}
