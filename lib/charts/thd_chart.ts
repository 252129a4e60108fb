/**
 * THD against output level, THD in percent on a log axis (distortion spans decades), with
 * the limit drawn and the level where the curve first rises through it marked.
 *
 * @module
 */
import * as Plot from "@observablehq/plot";
import { requireFinite, requireNonNegative, requirePositive } from "../_validate.ts";
import { formatSi } from "../units/format.ts";
import { Chart } from "./chart.ts";
import { firstCrossing, requirePoints } from "./_interpolate.ts";
import { annotation, limitRuleY, linearAxis, logAxis, padExtent, panel } from "./_panel.ts";
import { CHART_PALETTE } from "./palette.ts";

/** One point of a THD sweep. */
export interface ThdPoint {
  /** Output level (peak volts by default; see `levelUnit`). */
  level: number;
  /** THD as a fraction (0.001 = 0.1 %). */
  thd: number;
}

/** Options for {@linkcode thdChart}. */
export interface ThdChartOptions {
  /**
   * Chart title.
   * @default {"THD against output level"}
   */
  title?: string;
  /**
   * Level axis name.
   * @default {"Output level, peak"}
   */
  levelLabel?: string;
  /**
   * Level unit.
   * @default {"V"}
   */
  levelUnit?: string;
  /**
   * Level axis scale.
   * @default {"linear"}
   */
  levelScale?: "linear" | "log";
  /** Largest acceptable THD as a fraction: draws the limit line. */
  maxThd?: number;
  /**
   * Width in px.
   * @default {640}
   */
  width?: number;
}

/**
 * Charts THD (percent, log axis) against output level, with the limit and the first level
 * where THD rises through it.
 *
 * @param points The sweep, any order (sorted by level here).
 * @param options Level axis, limit, title.
 * @returns The chart; its description names where the limit is first reached.
 * @throws {TypeError} If there are fewer than 2 points or a value is not finite.
 * @throws {RangeError} If a THD is not positive, or a level is not positive on a log axis.
 *
 * @example Cubic distortion: THD grows with the square of the level, a straight line on log axes
 * ```ts
 * import { thdChart } from "./thd_chart.ts";
 * import { ok } from "node:assert/strict";
 * const points = [1, 2, 4, 8, 16].map((level) => ({ level, thd: 1e-4 * level * level }));
 * const chart = thdChart(points, { maxThd: 0.01, levelScale: "log" });
 * ok(chart.description.includes("reaches the limit at 10 V"));
 * ```
 */
export function thdChart(points: readonly ThdPoint[], options: ThdChartOptions = {}): Chart {
  requirePoints("points", points);
  const levelScale = options.levelScale ?? "linear";
  for (const [i, p] of points.entries()) {
    if (levelScale === "log") requirePositive(`points[${i}].level`, p.level);
    else requireFinite(`points[${i}].level`, p.level);
    requirePositive(`points[${i}].thd`, p.thd);
  }
  if (options.maxThd !== undefined) requirePositive("maxThd", options.maxThd);
  const unit = options.levelUnit ?? "V";
  const label = options.levelLabel ?? "Output level, peak";
  const data = [...points]
    .sort((a, b) => a.level - b.level)
    .map((p) => ({ level: p.level, percent: p.thd * 100 }));
  const percents = data.map((p) => p.percent);
  const limit = options.maxThd === undefined ? undefined : options.maxThd * 100;
  const values = limit === undefined ? percents : [...percents, limit];
  const levels = data.map((p) => p.level);
  const reached = limit === undefined
    ? undefined
    : percents[0] > limit
    ? levels[0]
    : firstCrossing(levels, percents.map(Math.log), Math.log(limit), levelScale === "log");
  const marks: Plot.Markish[] = [
    Plot.line(data, { x: "level", y: "percent", stroke: CHART_PALETTE.ink, strokeWidth: 2 }),
    Plot.dot(data, { x: "level", y: "percent", fill: CHART_PALETTE.ink, r: 2.5 }),
  ];
  const show = (v: number) => formatSi(v, unit, { digits: 3 });
  if (limit !== undefined) {
    requireNonNegative("maxThd", limit);
    marks.unshift(limitRuleY([limit]));
    marks.push(
      annotation([{ level: levels[0], percent: limit }], {
        x: "level",
        y: "percent",
        text: () => `limit ${formatSi(limit, "%", { digits: 3 })}`,
        textAnchor: "start",
        dx: 4,
        dy: -8,
        fill: CHART_PALETTE.limit,
      }),
    );
    if (reached !== undefined) {
      marks.push(
        Plot.ruleX([reached], { stroke: CHART_PALETTE.reference, strokeDasharray: "3,3" }),
        Plot.dot([{ level: reached, percent: limit }], {
          x: "level",
          y: "percent",
          stroke: CHART_PALETTE.limit,
          strokeWidth: 2,
          r: 5,
        }),
        annotation([{ level: reached, percent: limit }], {
          x: "level",
          y: "percent",
          text: () => `limit reached at ${show(reached)}`,
          // THD rises through the limit, so above-left of the crossing is empty.
          textAnchor: "end",
          dx: -10,
          dy: -12,
          fontWeight: "bold",
        }),
      );
    }
  }
  const [lo, hi] = [Math.min(...values), Math.max(...values)];
  const title = options.title ?? "THD against output level";
  const summary = limit === undefined
    ? `THD ${formatSi(percents[0], "%", { digits: 3 })} … ${
      formatSi(percents[percents.length - 1], "%", { digits: 3 })
    }`
    : reached === undefined
    ? `THD stays under the limit ${formatSi(limit, "%", { digits: 3 })} over the sweep`
    : `THD reaches the limit at ${show(reached)} (limit ${formatSi(limit, "%", { digits: 3 })})`;
  return new Chart({
    title,
    description: `${title}, ${show(levels[0])} … ${show(levels[levels.length - 1])}: ${summary}`,
    width: options.width,
    panels: [
      panel({
        x: levelScale === "log"
          ? logAxis(label, unit, levels[0], levels[levels.length - 1])
          : linearAxis(label, unit, {
            domain: levels[0] >= 0 ? [0, padExtent(levels, 0.03)[1]] : padExtent(levels, 0.03),
          }),
        y: logAxis("THD", "%", lo, hi),
        marks,
      }),
    ],
  });
}
