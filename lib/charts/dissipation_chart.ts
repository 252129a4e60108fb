/**
 * Output-stage dissipation and efficiency against output level, two stacked panels, with
 * the worst case (largest dissipation) marked on both and the dissipation limit drawn.
 *
 * @module
 */
import * as Plot from "@observablehq/plot";
import { requireFinite, requirePositive } from "../_validate.ts";
import { formatSi } from "../units/format.ts";
import { Chart } from "./chart.ts";
import { requirePoints } from "./_interpolate.ts";
import { annotation, limitRuleY, linearAxis, padExtent, panel, PANEL_HEIGHT } from "./_panel.ts";
import { CHART_PALETTE } from "./palette.ts";

/** One operating level of an output stage. */
export interface DissipationPoint {
  /** Output level (output power in W by default; see `levelUnit`). */
  level: number;
  /** Power dissipated in the output devices, W. */
  dissipation: number;
  /** Efficiency, output power over supply power, as a fraction (0.785 = 78.5 %). */
  efficiency: number;
}

/** Options for {@linkcode dissipationChart}. */
export interface DissipationChartOptions {
  /**
   * Chart title.
   * @default {"Output stage: dissipation and efficiency"}
   */
  title?: string;
  /**
   * Level axis name.
   * @default {"Output power"}
   */
  levelLabel?: string;
  /**
   * Level unit.
   * @default {"W"}
   */
  levelUnit?: string;
  /** Largest acceptable dissipation, W: draws the limit line. */
  maxDissipation?: number;
  /**
   * Width in px.
   * @default {640}
   */
  width?: number;
}

/**
 * Charts dissipation (W) and efficiency (%) of an output stage against output level,
 * marking the worst case, the level of largest dissipation.
 *
 * @param points The sweep, any order (sorted by level here).
 * @param options Level axis, limit, title.
 * @returns The chart; its description states the worst case.
 * @throws {TypeError} If there are fewer than 2 points or a value is not finite.
 * @throws {RangeError} If `maxDissipation` is not positive.
 *
 * @example Ideal class B into 8 Ω from ±20 V: worst case 2·Vs²/(π²R) = 10.1 W
 * ```ts
 * import { dissipationChart } from "./dissipation_chart.ts";
 * import { ok } from "node:assert/strict";
 * const points = Array.from({ length: 21 }, (_, i) => {
 *   const peak = (i / 20) * 20;
 *   const out = peak * peak / 16;
 *   const supply = 2 * 20 * peak / (Math.PI * 8);
 *   return { level: out, dissipation: supply - out, efficiency: supply > 0 ? out / supply : 0 };
 * });
 * ok(dissipationChart(points).description.includes("worst case 10.1 W"));
 * ```
 */
export function dissipationChart(
  points: readonly DissipationPoint[],
  options: DissipationChartOptions = {},
): Chart {
  requirePoints("points", points);
  for (const [i, p] of points.entries()) {
    requireFinite(`points[${i}].level`, p.level);
    requireFinite(`points[${i}].dissipation`, p.dissipation);
    requireFinite(`points[${i}].efficiency`, p.efficiency);
  }
  if (options.maxDissipation !== undefined) {
    requirePositive("maxDissipation", options.maxDissipation, "W");
  }
  const unit = options.levelUnit ?? "W";
  const label = options.levelLabel ?? "Output power";
  const data = [...points]
    .sort((a, b) => a.level - b.level)
    .map((p) => ({ level: p.level, dissipation: p.dissipation, percent: p.efficiency * 100 }));
  const worst = data.reduce((a, b) => (b.dissipation > a.dissipation ? b : a));
  const limit = options.maxDissipation;
  const levels = data.map((p) => p.level);
  const x = linearAxis(label, unit, { domain: padExtent(levels, 0.02) });
  const show = (v: number, u: string) => formatSi(v, u, { digits: 3 });
  const atWorst = `worst case ${show(worst.dissipation, "W")} at ${show(worst.level, unit)}`;
  const fails = limit !== undefined && worst.dissipation > limit;
  const guide = Plot.ruleX([worst.level], {
    stroke: CHART_PALETTE.reference,
    strokeDasharray: "3,3",
  });
  const rightHalf = (worst.level - levels[0]) / (levels[levels.length - 1] - levels[0] || 1) > 0.6;
  const dissipationMarks: Plot.Markish[] = [
    guide,
    Plot.line(data, { x: "level", y: "dissipation", stroke: CHART_PALETTE.ink, strokeWidth: 2 }),
    Plot.dot([worst], {
      x: "level",
      y: "dissipation",
      fill: fails ? CHART_PALETTE.limit : CHART_PALETTE.ink,
      r: 5,
    }),
    annotation([worst], {
      x: "level",
      y: "dissipation",
      text: () => atWorst + (fails ? " (over the limit)" : ""),
      // Dissipation peaks here, so the space just below the dot is clear of the curve.
      textAnchor: rightHalf ? "end" : "start",
      dx: rightHalf ? -6 : 6,
      dy: 26,
      fontWeight: "bold",
      fill: fails ? CHART_PALETTE.limit : CHART_PALETTE.note,
    }),
  ];
  const dissipationValues = [...data.map((p) => p.dissipation), 0];
  if (limit !== undefined) {
    dissipationValues.push(limit);
    dissipationMarks.unshift(
      limitRuleY([limit]),
      annotation([`limit ${show(limit, "W")}`], {
        frameAnchor: "top-left",
        textAnchor: "start",
        dx: 6,
        dy: 6,
        fill: CHART_PALETTE.limit,
      }),
    );
  }
  const [, dHi] = padExtent(dissipationValues, 0.1);
  const title = options.title ?? "Output stage: dissipation and efficiency";
  return new Chart({
    title,
    description: `${title}, ${show(levels[0], unit)} … ${show(levels[levels.length - 1], unit)}: ` +
      atWorst + (limit === undefined ? "" : ` (limit ${show(limit, "W")})`),
    width: options.width,
    panels: [
      panel({
        marginBottom: 12,
        x: { ...x, label: null, tickFormat: () => "" },
        y: linearAxis("Dissipation", "W", { domain: [0, dHi] }),
        marks: dissipationMarks,
      }),
      panel({
        height: PANEL_HEIGHT - 40,
        x,
        y: linearAxis("Efficiency", "%", { domain: [0, 100] }),
        marks: [
          guide,
          Plot.line(data, {
            x: "level",
            y: "percent",
            stroke: CHART_PALETTE.ember,
            strokeWidth: 2,
          }),
          Plot.dot([worst], { x: "level", y: "percent", fill: CHART_PALETTE.ember, r: 4 }),
          annotation([worst], {
            x: "level",
            y: "percent",
            text: () => `${formatSi(worst.percent, "%", { digits: 3 })} at worst case`,
            // Efficiency rises with level: below-right of the dot is clear.
            textAnchor: "start",
            dx: 8,
            dy: 14,
          }),
        ],
      }),
    ],
  });
}
