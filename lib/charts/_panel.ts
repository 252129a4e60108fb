/**
 * Shared panel layout and axis styling, so every chart looks like one family: same
 * margins (stacked panels line up), centred axis labels with units, engineering ticks,
 * light grid, halo behind annotation text.
 *
 * @module
 */
import * as Plot from "@observablehq/plot";
import type { ChartPanel } from "./chart.ts";
import { axisLabel, logDomain, logTicks, siTickFormat } from "./_ticks.ts";
import { CHART_PALETTE, LIMIT_DASH } from "./palette.ts";

/** Default panel height in px. */
export const PANEL_HEIGHT = 250;
/** Default space above a panel's plot area in px. */
export const PANEL_MARGIN_TOP = 16;
/** Default space below a panel's plot area (tick labels and axis label) in px. */
export const PANEL_MARGIN_BOTTOM = 44;

/** Where a log axis keeps its ticks, for {@linkcode panel} to draw. */
const LOG_TICKS: unique symbol = Symbol("longtail.logTicks") as never;

interface LogScaleOptions extends Plot.ScaleOptions {
  [LOG_TICKS]?: { ticks: number[]; labelled: Set<number> };
}

/**
 * Draws a log axis from explicit axis and grid marks. Plot passes a log scale's tick
 * formatter through d3's own label thinning, which drops the 2 and 5 labels we want on
 * short spans; axis marks with a text channel are drawn exactly as given.
 */
function explicitLogAxis(
  key: "x" | "y",
  scale: LogScaleOptions,
): [Plot.ScaleOptions, Plot.Markish[]] {
  const info = scale[LOG_TICKS];
  if (info === undefined || scale.axis === null) return [scale, []];
  const format = typeof scale.tickFormat === "function" ? scale.tickFormat : String;
  const text = (value: number) => info.labelled.has(value) ? String(format(value, 0)) : "";
  const common = {
    text,
    label: scale.label,
    labelAnchor: "center" as const,
    labelArrow: "none" as const,
    tickSize: 6,
  };
  const marks: Plot.Markish[] = key === "x"
    ? [Plot.gridX(info.ticks), Plot.axisX(info.ticks, common)]
    : [Plot.gridY(info.ticks), Plot.axisY(info.ticks, common)];
  return [{ ...scale, axis: null, grid: false }, marks];
}

/** Common panel options; `extra` wins. */
export function panel(extra: ChartPanel): ChartPanel {
  const axisMarks: Plot.Markish[] = [];
  const scales: Partial<Record<"x" | "y", Plot.ScaleOptions>> = {};
  for (const key of ["x", "y"] as const) {
    const scale = extra[key] as LogScaleOptions | undefined;
    if (scale === undefined) continue;
    const [options, marks] = explicitLogAxis(key, scale);
    scales[key] = options;
    axisMarks.push(...marks);
  }
  return {
    className: "longtail-panel",
    height: PANEL_HEIGHT,
    marginLeft: 66,
    marginRight: 30,
    marginTop: PANEL_MARGIN_TOP,
    marginBottom: PANEL_MARGIN_BOTTOM,
    style: { background: "white", color: CHART_PALETTE.note },
    ...extra,
    ...scales,
    marks: [...axisMarks, ...(extra.marks ?? [])],
  };
}

/** Options of a linear axis. */
export function linearAxis(
  label: string,
  unit: string,
  extra: Plot.ScaleOptions = {},
): Plot.ScaleOptions {
  return {
    type: "linear",
    label: axisLabel(label, unit),
    labelAnchor: "center",
    labelArrow: "none",
    tickFormat: siTickFormat(unit),
    grid: true,
    nice: true,
    ...extra,
  };
}

/** Options of a log axis covering `[min, max]`, rounded out to tidy bounds. */
export function logAxis(
  label: string,
  unit: string,
  min: number,
  max: number,
  extra: Plot.ScaleOptions = {},
): Plot.ScaleOptions {
  const domain = logDomain(min, max);
  const { ticks, labelled } = logTicks(domain[0], domain[1]);
  const format = siTickFormat(unit);
  const options: LogScaleOptions = {
    type: "log",
    domain,
    ticks,
    tickFormat: format,
    label: axisLabel(label, unit),
    labelAnchor: "center",
    labelArrow: "none",
    grid: true,
    ...extra,
  };
  options[LOG_TICKS] = { ticks, labelled };
  return options;
}

/** Annotation text with a white halo so it stays legible over grid and traces. */
export function annotation(
  data: unknown[],
  options: Plot.TextOptions,
): Plot.Text {
  return Plot.text(data, {
    fill: CHART_PALETTE.note,
    stroke: "white",
    strokeWidth: 3,
    paintOrder: "stroke",
    fontSize: 11,
    ...options,
  });
}

/** A horizontal spec-limit line, dashed, in the limit colour. */
export function limitRuleY(values: number[]): Plot.RuleY {
  return Plot.ruleY(values, {
    stroke: CHART_PALETTE.limit,
    strokeWidth: 1.5,
    strokeDasharray: LIMIT_DASH,
  });
}

/** A vertical spec-limit line, dashed, in the limit colour. */
export function limitRuleX(values: number[]): Plot.RuleX {
  return Plot.ruleX(values, {
    stroke: CHART_PALETTE.limit,
    strokeWidth: 1.5,
    strokeDasharray: LIMIT_DASH,
  });
}

/** Pads a linear extent by a fraction of its span (and gives zero spans some height). */
export function padExtent(values: number[], fraction = 0.05): [number, number] {
  // A loop, not Math.min(...values): a Monte Carlo run can hold more values than the call
  // stack takes arguments.
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (hi === lo) {
    const d = lo === 0 ? 1 : Math.abs(lo) * 0.1;
    lo -= d;
    hi += d;
  }
  const pad = (hi - lo) * fraction;
  return [lo - pad, hi + pad];
}
