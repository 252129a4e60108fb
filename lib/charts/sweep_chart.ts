/**
 * Any result field against any swept parameter: one or more series, lin or log axes, the
 * limit drawn when one applies. Series are labelled at their right end rather than in a
 * legend box, so the eye does not travel between key and line.
 *
 * @module
 */
import * as Plot from "@observablehq/plot";
import { requireFinite, requirePositive } from "../_validate.ts";
import { formatSi } from "../units/format.ts";
import { Chart } from "./chart.ts";
import { requirePoints } from "./_interpolate.ts";
import {
  annotation,
  limitRuleY,
  linearAxis,
  logAxis,
  padExtent,
  panel,
  PANEL_HEIGHT,
  PANEL_MARGIN_BOTTOM,
  PANEL_MARGIN_TOP,
} from "./_panel.ts";
import { CHART_PALETTE, CHART_SERIES } from "./palette.ts";

/** How to read a number from a row: a dotted path (`"pair.cmrr"`) or a function. */
export type SweepAccessor<T> = string | ((row: T) => number);

/** One series of a sweep chart. */
export interface SweepSeries<T> {
  /** Where the value comes from. */
  y: SweepAccessor<T>;
  /** Name printed beside the series. */
  label: string;
}

/** Options for {@linkcode sweepChart}. */
export interface SweepChartOptions<T> {
  /** The swept parameter. */
  x: SweepAccessor<T>;
  /** The result: one accessor, or several labelled series. */
  y: SweepAccessor<T> | SweepSeries<T>[];
  /**
   * Parameter axis name.
   * @default {the x path, or "Parameter"}
   */
  xLabel?: string;
  /**
   * Parameter unit.
   * @default {""}
   */
  xUnit?: string;
  /**
   * Result axis name.
   * @default {the y path, or "Result"}
   */
  yLabel?: string;
  /**
   * Result unit.
   * @default {""}
   */
  yUnit?: string;
  /**
   * Parameter axis scale.
   * @default {"linear"}
   */
  xScale?: "linear" | "log";
  /**
   * Result axis scale.
   * @default {"linear"}
   */
  yScale?: "linear" | "log";
  /** Requirement on the result; a design check's `limit` fits. */
  limit?: { min?: number; max?: number };
  /**
   * Chart title.
   * @default {"<yLabel> against <xLabel>"}
   */
  title?: string;
  /**
   * Width in px.
   * @default {640}
   */
  width?: number;
}

/** Sweeps with more points than this are drawn as lines without dots. */
const MAX_DOTS = 60;

function reader<T>(accessor: SweepAccessor<T>, name: string): (row: T) => number {
  if (typeof accessor === "function") return accessor;
  if (typeof accessor !== "string" || accessor === "") {
    throw new TypeError(`Expected ${name} to be a field path or a function, but found ${accessor}`);
  }
  const path = accessor.split(".");
  return (row: T) => {
    let value: unknown = row;
    for (const key of path) value = (value as Record<string, unknown> | undefined)?.[key];
    return value as number;
  };
}

/**
 * Charts one or more result fields against a swept parameter.
 *
 * @param rows One result per parameter value (any objects).
 * @param options What to read, axis names, units and scales, limit, title.
 * @returns The chart; its description states the range of each series.
 * @throws {TypeError} If there are fewer than 2 rows, an accessor is invalid, or a value
 * read is not a finite number.
 * @throws {RangeError} If a value is not positive on a log axis.
 *
 * @example CMRR against tail resistance, read by field path
 * ```ts
 * import { sweepChart } from "./sweep_chart.ts";
 * import { ok } from "node:assert/strict";
 * const rows = [1e3, 1e4, 1e5].map((r) => ({ tail: r, pair: { cmrrDb: 20 * Math.log10(r / 25) } }));
 * const chart = sweepChart(rows, {
 *   x: "tail", xLabel: "Tail resistance", xUnit: "Ω", xScale: "log",
 *   y: "pair.cmrrDb", yLabel: "CMRR", yUnit: "dB", limit: { min: 60 },
 * });
 * ok(chart.description.startsWith("CMRR against Tail resistance"));
 * ```
 */
export function sweepChart<T>(rows: readonly T[], options: SweepChartOptions<T>): Chart {
  requirePoints("rows", rows);
  const xScale = options.xScale ?? "linear";
  const yScale = options.yScale ?? "linear";
  const xUnit = options.xUnit ?? "";
  const yUnit = options.yUnit ?? "";
  const xLabel = options.xLabel ?? (typeof options.x === "string" ? options.x : "Parameter");
  const yLabel = options.yLabel ??
    (typeof options.y === "string" ? options.y : Array.isArray(options.y) ? "Result" : "Result");
  const series: SweepSeries<T>[] = Array.isArray(options.y)
    ? options.y
    : [{ y: options.y, label: yLabel }];
  if (series.length === 0) {
    throw new TypeError("Expected y to name at least one series, but found none");
  }
  const readX = reader(options.x, "x");
  const table = series.map((s, k) => {
    const readY = reader(s.y, `y[${k}]`);
    return rows.map((row, i) => {
      const x = readX(row);
      const y = readY(row);
      const name = typeof s.y === "string" ? s.y : s.label;
      if (xScale === "log") requirePositive(`x of rows[${i}]`, x);
      else requireFinite(`x of rows[${i}]`, x);
      if (yScale === "log") requirePositive(`${name} of rows[${i}]`, y);
      else requireFinite(`${name} of rows[${i}]`, y);
      return { x, y, series: s.label };
    }).sort((a, b) => a.x - b.x);
  });
  const all = table.flat();
  const xs = all.map((p) => p.x);
  const ys = all.map((p) => p.y);
  const bounds = [options.limit?.min, options.limit?.max].filter((b): b is number =>
    b !== undefined
  );
  bounds.forEach((b) => requireFinite("limit", b));
  const yValues = [...ys, ...bounds];
  const multi = series.length > 1;
  const marks: Plot.Markish[] = [];
  if (bounds.length > 0) {
    marks.push(
      limitRuleY(bounds),
      annotation(
        bounds.map((b) => ({
          y: b,
          text: `${b === options.limit?.min ? "min" : "max"} ${formatSi(b, yUnit, { digits: 3 })}`,
        })),
        {
          y: "y",
          frameAnchor: "left",
          text: "text",
          textAnchor: "start",
          dx: 6,
          dy: -8,
          fill: CHART_PALETTE.limit,
        } as Plot.TextOptions,
      ),
    );
  }
  const labelOffsets = multi ? seriesLabelOffsets(table, yScale, yValues) : [];
  table.forEach((points, k) => {
    const colour = CHART_SERIES[k % CHART_SERIES.length];
    marks.push(
      Plot.line(points, { x: "x", y: "y", stroke: colour, strokeWidth: 2 }),
    );
    // Dots show where a sparse sweep was evaluated; on a dense one they only blur the line.
    if (points.length <= MAX_DOTS) {
      marks.push(Plot.dot(points, { x: "x", y: "y", fill: colour, r: 3 }));
    }
    if (multi) {
      const last = points[points.length - 1];
      marks.push(
        annotation([last], {
          x: "x",
          y: "y",
          text: () => points[0].series,
          textAnchor: "start",
          dx: 8,
          dy: labelOffsets[k],
          fill: colour,
          fontWeight: "bold",
        }),
      );
    }
  });
  const xAxis = xScale === "log"
    ? logAxis(xLabel, xUnit, Math.min(...xs), Math.max(...xs))
    : linearAxis(xLabel, xUnit, { domain: padExtent(xs, 0.03) });
  const yAxis = yScale === "log"
    ? logAxis(yLabel, yUnit, Math.min(...yValues), Math.max(...yValues))
    : linearAxis(yLabel, yUnit, { domain: padExtent(yValues, 0.08) });
  const labelRoom = multi ? Math.max(...series.map((s) => s.label.length)) * 6.5 + 16 : 30;
  const show = (v: number, u: string) => formatSi(v, u, { digits: 3 });
  const ranges = table.map((points) => {
    const values = points.map((p) => p.y);
    return `${multi ? `${points[0].series} ` : ""}${show(Math.min(...values), yUnit)} … ${
      show(Math.max(...values), yUnit)
    }`;
  });
  const title = options.title ?? `${yLabel} against ${xLabel}`;
  return new Chart({
    title,
    description: `${title}, ${show(Math.min(...xs), xUnit)} … ${show(Math.max(...xs), xUnit)}: ` +
      ranges.join("; "),
    width: options.width,
    panels: [panel({ marginRight: labelRoom, x: xAxis, y: yAxis, marks })],
  });
}

/** Smallest vertical distance between two series labels, in px (11 px text plus air). */
const LABEL_GAP = 13;

/**
 * Vertical offsets (px) that keep the series labels at the right end at least LABEL_GAP
 * apart: where lines end close together their names would print over each other.
 *
 * ```
 *   ─────────── gain A        labels sorted by height, pushed down while they crowd,
 *   ─────────── gain B   →    then pulled back up if the last one left the plot
 * ```
 *
 * The y mapping uses the padded data domain before Plot tidies it ("nice"), so it can be a
 * pixel or two off; the gap has room for that.
 */
function seriesLabelOffsets(
  table: { x: number; y: number }[][],
  yScale: "linear" | "log",
  yValues: number[],
): number[] {
  const top = PANEL_MARGIN_TOP;
  const bottom = PANEL_HEIGHT - PANEL_MARGIN_BOTTOM;
  const map = (v: number) => (yScale === "log" ? Math.log10(v) : v);
  const [d0, d1] = yScale === "log"
    ? [Math.min(...yValues), Math.max(...yValues)].map(map)
    : padExtent(yValues, 0.08);
  const span = d1 - d0 || 1;
  const wanted = table.map((points) =>
    top + ((d1 - map(points[points.length - 1].y)) / span) * (bottom - top)
  );
  const order = wanted.map((_, i) => i).sort((a, b) => wanted[a] - wanted[b] || a - b);
  const placed = wanted.slice();
  for (let j = 1; j < order.length; j++) {
    placed[order[j]] = Math.max(wanted[order[j]], placed[order[j - 1]] + LABEL_GAP);
  }
  const last = order[order.length - 1];
  placed[last] = Math.min(placed[last], bottom);
  for (let j = order.length - 2; j >= 0; j--) {
    placed[order[j]] = Math.min(placed[order[j]], placed[order[j + 1]] - LABEL_GAP);
  }
  return placed.map((y, i) => y - wanted[i]);
}
