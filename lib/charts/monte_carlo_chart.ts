/**
 * Monte Carlo spread of one result: a histogram (bars filled by pass or fail) or a
 * cumulative curve, with the requirement drawn and the yield stated.
 *
 * Histogram bin edges are shifted so that each requirement bound falls on an edge; then
 * every bar is wholly passing or wholly failing and its fill can say which.
 *
 * @module
 */
import * as Plot from "@observablehq/plot";
import { requireFinite } from "../_validate.ts";
import { formatSi } from "../units/format.ts";
import { Chart } from "./chart.ts";
import { requirePoints } from "./_interpolate.ts";
import { annotation, limitRuleX, linearAxis, padExtent, panel } from "./_panel.ts";
import { CHART_PALETTE } from "./palette.ts";

/** The requirement on a result: either bound may be absent (the shape of a check's limit). */
export interface RequirementBounds {
  /** Smallest acceptable value. */
  min?: number;
  /** Largest acceptable value. */
  max?: number;
}

/** Options for {@linkcode monteCarloChart}. */
export interface MonteCarloChartOptions {
  /**
   * Chart title.
   * @default {"Monte Carlo spread"}
   */
  title?: string;
  /**
   * Name of the quantity, for the axis.
   * @default {"Result"}
   */
  label?: string;
  /**
   * Unit of the values.
   * @default {""}
   */
  unit?: string;
  /** The requirement; a design check's `limit` fits. */
  requirement?: RequirementBounds;
  /**
   * Histogram or cumulative curve.
   * @default {"histogram"}
   */
  kind?: "histogram" | "cumulative";
  /**
   * Approximate number of histogram bins.
   * @default {clamp(round(√n), 10, 60)}
   */
  bins?: number;
  /**
   * Width in px.
   * @default {640}
   */
  width?: number;
}

/**
 * The yield as a percentage that never reads 100 % while a trial failed: more digits until
 * the rounding stops hiding the failures ("99.985%"), and "> 99.9999%" past six digits.
 */
function yieldPercent(passing: number, trials: number): string {
  const percent = (100 * passing) / trials;
  if (passing === trials) return "100%";
  for (let digits = 3; digits <= 6; digits++) {
    const text = formatSi(percent, "%", { digits });
    if (Number.parseFloat(text) < 100) return text;
  }
  return "> 99.9999%";
}

/**
 * Charts the spread of a Monte Carlo result with its requirement and yield.
 *
 * @param values One result per trial.
 * @param options Quantity name and unit, requirement, kind, bins, title.
 * @returns The chart; its description states the yield.
 * @throws {TypeError} If there are fewer than 2 values or one is not finite.
 * @throws {RangeError} If the requirement has `min > max` or `bins < 1`.
 *
 * @example Yield of 3 passing trials out of 4
 * ```ts
 * import { monteCarloChart } from "./monte_carlo_chart.ts";
 * import { ok } from "node:assert/strict";
 * const chart = monteCarloChart([38, 41, 45, 52], { unit: "dB", requirement: { min: 40 } });
 * ok(chart.description.includes("yield 75% (3 of 4)"));
 * ```
 */
export function monteCarloChart(
  values: ArrayLike<number>,
  options: MonteCarloChartOptions = {},
): Chart {
  const list = Array.from(values ?? []);
  requirePoints("values", list);
  list.forEach((v, i) => requireFinite(`values[${i}]`, v));
  const unit = options.unit ?? "";
  const label = options.label ?? "Result";
  const kind = options.kind ?? "histogram";
  const { min, max } = options.requirement ?? {};
  if (min !== undefined) requireFinite("requirement.min", min);
  if (max !== undefined) requireFinite("requirement.max", max);
  if (min !== undefined && max !== undefined && min > max) {
    throw new RangeError(`Expected requirement.min to be at most ${max}, but found ${min}`);
  }
  const passes = (v: number) => (min === undefined || v >= min) && (max === undefined || v <= max);
  const sorted = [...list].sort((a, b) => a - b);
  const n = sorted.length;
  const passing = sorted.filter(passes).length;
  const bounds = [min, max].filter((b): b is number => b !== undefined);
  const show = (v: number) => formatSi(v, unit, { digits: 3 });
  const yieldText = bounds.length === 0
    ? `${n} trials, ${show(sorted[0])} … ${show(sorted[n - 1])}`
    : `yield ${yieldPercent(passing, n)} (${passing} of ${n})`;
  const requirementText = min !== undefined && max !== undefined
    ? `requirement ${show(min)} … ${show(max)}`
    : min !== undefined
    ? `requirement ≥ ${show(min)}`
    : max !== undefined
    ? `requirement ≤ ${show(max)}`
    : "no requirement";
  const xDomain = padExtent([sorted[0], sorted[n - 1], ...bounds], 0.04);
  const x = linearAxis(label, unit, { domain: xDomain });
  const limitMarks: Plot.Markish[] = bounds.length === 0 ? [] : [
    limitRuleX(bounds),
    // The min label sits left of its line and the max label right, away from the passing bars.
    ...bounds.map((b) =>
      annotation([{ b }], {
        x: "b",
        frameAnchor: "top",
        text: () => (b === min ? `min ${show(b)}` : `max ${show(b)}`),
        textAnchor: b === min ? "end" : "start",
        dx: b === min ? -5 : 5,
        dy: 4,
        fill: CHART_PALETTE.limit,
      })
    ),
  ];
  // A histogram leaves its top corners empty, a rising cumulative curve its bottom right.
  const yieldMark = annotation([yieldText], {
    frameAnchor: kind === "cumulative" ? "bottom-right" : "top-right",
    textAnchor: "end",
    dx: -6,
    dy: kind === "cumulative" ? -8 : 22,
    fontWeight: "bold",
    fontSize: 12,
  });
  let body: Plot.Markish[];
  let y: Plot.ScaleOptions;
  if (kind === "cumulative") {
    const steps = sorted.map((v, i) => ({ v, fraction: (100 * (i + 1)) / n }));
    steps.unshift({ v: sorted[0], fraction: 0 });
    body = [
      Plot.line(steps, {
        x: "v",
        y: "fraction",
        curve: "step-after",
        stroke: CHART_PALETTE.ink,
        strokeWidth: 2,
      }),
    ];
    y = linearAxis("Trials at or below", "%", { domain: [0, 100] });
  } else {
    const bins = options.bins ?? Math.min(60, Math.max(10, Math.round(Math.sqrt(n))));
    if (!(bins >= 1)) throw new RangeError(`Expected bins to be at least 1, but found ${bins}`);
    const lo = sorted[0];
    const hi = sorted[n - 1];
    const width = hi > lo ? (hi - lo) / bins : Math.abs(lo) * 0.01 || 1;
    // Anchor the bin grid on a requirement bound, so no bar straddles it.
    const anchor = bounds[0] ?? lo;
    const start = anchor - Math.ceil((anchor - lo) / width + 1e-9) * width;
    const count = Math.floor((hi - start) / width) + 1;
    const counts = new Array<number>(count).fill(0);
    for (const v of sorted) counts[Math.min(count - 1, Math.floor((v - start) / width))]++;
    const bars = counts.map((c, i) => {
      const x1 = start + i * width;
      return { x1, x2: x1 + width, count: c, pass: passes(x1 + width / 2) };
    });
    body = [
      Plot.rectY(bars, {
        x1: "x1",
        x2: "x2",
        y: "count",
        fill: (d: { pass: boolean }) => (d.pass ? CHART_PALETTE.passFill : CHART_PALETTE.failFill),
        stroke: (d: { pass: boolean }) => (d.pass ? "white" : CHART_PALETTE.limit),
        strokeWidth: 0.75,
      }),
      Plot.ruleY([0], { stroke: CHART_PALETTE.note }),
    ];
    const highest = Math.max(...counts);
    y = linearAxis("Trials", "", {
      domain: [0, highest * 1.25],
      tickFormat: (v: number) => Number.isInteger(v) ? String(v) : "",
    });
  }
  const title = options.title ?? "Monte Carlo spread";
  return new Chart({
    title,
    // A given title already names the quantity; the default one needs the label.
    description: `${options.title ?? `${title} of ${label}`}: ${yieldText}; ${requirementText}`,
    width: options.width,
    notes: [
      `${requirementText[0].toUpperCase()}${requirementText.slice(1)}, ${n} trials.` +
      (kind === "histogram" && bounds.length > 0
        ? " Failing trials in pale bars outlined in crimson."
        : ""),
    ],
    panels: [panel({ x, y, marks: [...body, ...limitMarks, yieldMark] })],
  });
}
