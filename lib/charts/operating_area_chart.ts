/**
 * Device current against voltage across it, with the allowed operating area shaded, the
 * path the load drives the device along, and the point closest to (or furthest over) the
 * boundary marked. Log–log by default, where the power limit is a straight line.
 *
 * ```
 *  current │▒▒▒▒▒▒▒▒▒▒▒┐ max current
 *          │▒▒▒▒▒▒▒▒▒▒▒▒╲  max power (I = P / V)
 *          │▒▒▒ load ●▒▒▒▒╲
 *          │▒▒▒▒▒▒▒▒▒▒▒▒▒▒▒│ max voltage
 *          └───────────────┴── voltage
 * ```
 *
 * @module
 */
import * as Plot from "@observablehq/plot";
import { requireFinite, requirePositive } from "../_validate.ts";
import { formatSi } from "../units/format.ts";
import { Chart } from "./chart.ts";
import { interpolateAt, requirePoints } from "./_interpolate.ts";
import { annotation, linearAxis, logAxis, padExtent, panel } from "./_panel.ts";
import { CHART_PALETTE } from "./palette.ts";

/** A point in the device's current–voltage plane. */
export interface DevicePoint {
  /** Voltage across the device, V. */
  voltage: number;
  /** Current through the device, A. */
  current: number;
}

/** Device ratings that bound the allowed operating area. */
export interface DeviceRatings {
  /** Largest voltage across the device, V. */
  maxVoltage: number;
  /** Largest current, A. */
  maxCurrent: number;
  /** Largest dissipation, W. */
  maxPower: number;
}

/** Options for {@linkcode operatingAreaBoundary}. */
export interface OperatingAreaBoundaryOptions {
  /**
   * Number of points along the boundary.
   * @default {60}
   */
  points?: number;
  /**
   * Lowest voltage of the boundary, as a fraction of `maxVoltage`.
   * @default {0.001}
   */
  fromFraction?: number;
}

/**
 * The edge of the allowed operating area from three ratings: the allowed current at each
 * voltage is `min(maxCurrent, maxPower / voltage)` up to `maxVoltage`. Points are spaced
 * evenly in log voltage.
 *
 * @param ratings Voltage, current and power ratings.
 * @param options Number of points and the lowest voltage.
 * @returns Boundary points in ascending voltage.
 * @throws {RangeError} If a rating is not positive or `points < 2`.
 *
 * @example 100 V, 10 A, 100 W: the power limit meets the current limit at 10 V
 * ```ts
 * import { operatingAreaBoundary } from "./operating_area_chart.ts";
 * import { equal } from "node:assert/strict";
 * const edge = operatingAreaBoundary({ maxVoltage: 100, maxCurrent: 10, maxPower: 100 });
 * equal(edge[0].current, 10);
 * equal(edge[edge.length - 1].current, 1);
 * ```
 */
export function operatingAreaBoundary(
  ratings: DeviceRatings,
  options: OperatingAreaBoundaryOptions = {},
): DevicePoint[] {
  requirePositive("maxVoltage", ratings.maxVoltage, "V");
  requirePositive("maxCurrent", ratings.maxCurrent, "A");
  requirePositive("maxPower", ratings.maxPower, "W");
  const count = options.points ?? 60;
  const from = options.fromFraction ?? 0.001;
  if (!(count >= 2)) throw new RangeError(`Expected points to be at least 2, but found ${count}`);
  requirePositive("fromFraction", from);
  const edge: DevicePoint[] = [];
  for (let i = 0; i < count; i++) {
    const voltage = ratings.maxVoltage * from ** (1 - i / (count - 1));
    edge.push({ voltage, current: Math.min(ratings.maxCurrent, ratings.maxPower / voltage) });
  }
  return edge;
}

/** Options for {@linkcode operatingAreaChart}. */
export interface OperatingAreaChartOptions {
  /** Edge of the allowed area in ascending voltage, e.g. from {@linkcode operatingAreaBoundary}. */
  boundary: readonly DevicePoint[];
  /** The path the load drives the device along (a line for a resistor, a loop otherwise). */
  load: readonly DevicePoint[];
  /** The quiescent point, marked when given. */
  quiescent?: DevicePoint;
  /**
   * Axis scales.
   * @default {"log"}
   */
  scale?: "log" | "linear";
  /**
   * Chart title.
   * @default {"Device operating area"}
   */
  title?: string;
  /**
   * Width in px.
   * @default {640}
   */
  width?: number;
}

/**
 * Charts a device's operating area with the load line, marking the load point that comes
 * nearest the boundary (largest current as a fraction of the allowed current at its
 * voltage).
 *
 * @param options Boundary, load path, quiescent point, scale, title.
 * @returns The chart; its description states the closest approach in percent of the rating.
 * @throws {TypeError} If the boundary or load has fewer than 2 points or a value is not finite.
 * @throws {RangeError} If a value is not positive on log axes.
 *
 * @example An 8 Ω load line from 40 V inside a 100 V / 10 A / 100 W device
 * ```ts
 * import { operatingAreaBoundary, operatingAreaChart } from "./operating_area_chart.ts";
 * import { ok } from "node:assert/strict";
 * const boundary = operatingAreaBoundary({ maxVoltage: 100, maxCurrent: 10, maxPower: 100 });
 * const load = Array.from({ length: 39 }, (_, i) => ({ voltage: 1 + i, current: (40 - 1 - i) / 8 }));
 * const chart = operatingAreaChart({ boundary, load });
 * ok(chart.description.includes("of the allowed current"));
 * ```
 */
export function operatingAreaChart(options: OperatingAreaChartOptions): Chart {
  const scale = options.scale ?? "log";
  requirePoints("boundary", options.boundary);
  requirePoints("load", options.load);
  const check = (name: string, p: DevicePoint) => {
    if (scale === "log") {
      requirePositive(`${name}.voltage`, p.voltage, "V");
      requirePositive(`${name}.current`, p.current, "A");
    } else {
      requireFinite(`${name}.voltage`, p.voltage);
      requireFinite(`${name}.current`, p.current);
    }
  };
  options.boundary.forEach((p, i) => check(`boundary[${i}]`, p));
  // On log axes the load's zero-current and zero-voltage ends cannot be drawn: drop them.
  const load = scale === "log"
    ? options.load.filter((p) => p.voltage > 0 && p.current > 0)
    : [...options.load];
  load.forEach((p, i) => check(`load[${i}]`, p));
  requirePoints("load (points with positive voltage and current)", load);
  if (options.quiescent !== undefined) check("quiescent", options.quiescent);
  const boundary = [...options.boundary].sort((a, b) => a.voltage - b.voltage);
  const bv = boundary.map((p) => p.voltage);
  const bi = boundary.map((p) => (scale === "log" ? Math.log(p.current) : p.current));
  const allowed = (v: number) => {
    if (v > bv[bv.length - 1]) return 0;
    const c = interpolateAt(bv, bi, v, scale === "log");
    return scale === "log" ? Math.exp(c) : c;
  };
  let worst = load[0];
  let worstRatio = -Infinity;
  for (const p of load) {
    const ratio = p.current / allowed(p.voltage);
    if (ratio > worstRatio) [worst, worstRatio] = [p, ratio];
  }
  const voltages = [...bv, ...load.map((p) => p.voltage)];
  const currents = [...boundary.map((p) => p.current), ...load.map((p) => p.current)];
  if (options.quiescent !== undefined) {
    voltages.push(options.quiescent.voltage);
    currents.push(options.quiescent.current);
  }
  const over = worstRatio > 1;
  const percent = formatSi(worstRatio * 100, "%", { digits: 3 });
  const at = `${formatSi(worst.voltage, "V", { digits: 3 })}, ${
    formatSi(worst.current, "A", { digits: 3 })
  }`;
  const x = scale === "log"
    ? logAxis(
      "Voltage across device",
      "V",
      Math.min(...voltages) / 1.2,
      Math.max(...voltages) * 1.2,
    )
    : linearAxis("Voltage across device", "V", { domain: [0, padExtent(voltages)[1]] });
  const y = scale === "log"
    ? logAxis("Device current", "A", Math.min(...currents) / 1.2, Math.max(...currents) * 1.2)
    : linearAxis("Device current", "A", { domain: [0, padExtent(currents)[1]] });
  const floor = (y.domain as number[])[0];
  const title = options.title ?? "Device operating area";
  const marks: Plot.Markish[] = [
    Plot.areaY(boundary, {
      x: "voltage",
      y1: floor,
      y2: "current",
      fill: CHART_PALETTE.areaFill,
      curve: "linear",
    }),
    Plot.line(boundary, {
      x: "voltage",
      y: "current",
      stroke: CHART_PALETTE.limit,
      strokeWidth: 2,
    }),
    Plot.ruleX([boundary[boundary.length - 1]], {
      x: "voltage",
      y1: floor,
      y2: "current",
      stroke: CHART_PALETTE.limit,
      strokeWidth: 2,
    }),
    annotation([{ voltage: boundary[0].voltage, current: floor }], {
      x: "voltage",
      y: "current",
      text: () => "allowed area",
      textAnchor: "start",
      dx: 8,
      dy: -8,
      fill: CHART_PALETTE.ink,
      stroke: CHART_PALETTE.areaFill,
    }),
    Plot.line(load, { x: "voltage", y: "current", stroke: CHART_PALETTE.ink, strokeWidth: 2 }),
    Plot.dot([worst], {
      x: "voltage",
      y: "current",
      fill: over ? CHART_PALETTE.limit : CHART_PALETTE.ink,
      r: 5,
    }),
    annotation([worst], {
      x: "voltage",
      y: "current",
      text: () => `${over ? "over the boundary" : "closest"}: ${percent} of allowed`,
      textAnchor: "start",
      dx: 9,
      dy: -9,
      fontWeight: "bold",
      fill: over ? CHART_PALETTE.limit : CHART_PALETTE.note,
    }),
  ];
  if (options.quiescent !== undefined) {
    marks.push(
      Plot.dot([options.quiescent], {
        x: "voltage",
        y: "current",
        stroke: CHART_PALETTE.ember,
        strokeWidth: 2,
        r: 5,
      }),
      annotation([options.quiescent], {
        x: "voltage",
        y: "current",
        text: () => "quiescent",
        textAnchor: "end",
        dx: -9,
        fill: CHART_PALETTE.ember,
      }),
    );
  }
  return new Chart({
    title,
    description: `${title}: the load comes to ${percent} of the allowed current at ${at}` +
      (over ? ", outside the allowed area" : ""),
    width: options.width,
    notes: [
      `Boundary (crimson) from the device ratings; load path in dark blue; ` +
      `${over ? "worst point over the boundary" : "closest point"} at ${at}.`,
    ],
    panels: [panel({ height: 330, x, y, marks })],
  });
}
