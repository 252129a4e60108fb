/**
 * Gain and phase against log frequency, two stacked panels sharing the frequency axis,
 * with the crossover, the phase margin and (optionally) the gain-bandwidth marked.
 *
 * ```
 *  gain dB │‾‾‾‾‾‾‾‾‾╲                    phase margin = 180° + phase at crossover
 *          │          ╲ ← −20 dB/decade
 *  ref ────┼───────────●──────  crossover fc
 *  phase   │‾‾‾‾‾‾╲    ┃ margin
 *   −180° ─┼────────────┸─────
 * ```
 *
 * @module
 */
import * as Plot from "@observablehq/plot";
import { requireFinite, requirePositive } from "../_validate.ts";
import { formatSi } from "../units/format.ts";
import { Chart } from "./chart.ts";
import { firstCrossing, interpolateAt, requirePoints } from "./_interpolate.ts";
import {
  annotation,
  limitRuleY,
  linearAxis,
  logAxis,
  padExtent,
  panel,
  PANEL_HEIGHT,
} from "./_panel.ts";
import { CHART_PALETTE } from "./palette.ts";

/** One point of a frequency response. */
export interface FrequencyPoint {
  /** Frequency in Hz (> 0). */
  frequency: number;
  /** Gain magnitude in dB. */
  gainDb: number;
  /**
   * Phase in degrees, unwrapped, 0° where the gain is flat (a non-inverting view of the
   * loop), falling with frequency.
   */
  phaseDeg: number;
}

/**
 * A response as parallel arrays: the shape of the cascade's `FrequencySweep` (written out
 * here so charts do not depend on the cascade module).
 */
export interface FrequencySweepLike {
  /** Frequencies in Hz, ascending. */
  frequencies: ArrayLike<number>;
  /** Gain magnitudes in dB. */
  magnitudeDb: ArrayLike<number>;
  /** Unwrapped phases in degrees. */
  phaseDegrees: ArrayLike<number>;
}

function toPoints(response: readonly FrequencyPoint[] | FrequencySweepLike): FrequencyPoint[] {
  if (Array.isArray(response)) return response as FrequencyPoint[];
  const sweep = response as FrequencySweepLike;
  if (sweep === null || typeof sweep !== "object" || sweep.frequencies === undefined) {
    throw new TypeError(
      `Expected response to be frequency points or a frequency sweep, but found ${response}`,
    );
  }
  return Array.from(sweep.frequencies, (frequency, i) => ({
    frequency,
    gainDb: sweep.magnitudeDb[i],
    phaseDeg: sweep.phaseDegrees[i],
  }));
}

/** Options for {@linkcode gainPhaseChart}. */
export interface GainPhaseChartOptions {
  /**
   * Chart title.
   * @default {"Gain and phase"}
   */
  title?: string;
  /**
   * Gain level whose crossing defines the crossover, in dB: 0 dB for a loop-gain plot, the
   * closed-loop gain for an open-loop gain plot.
   * @default {0}
   */
  referenceGainDb?: number;
  /** Gain-bandwidth in Hz: draws the −20 dB/decade line that meets 0 dB there. */
  gainBandwidth?: number;
  /** Smallest acceptable phase margin in degrees: draws the limit on the phase panel. */
  minPhaseMargin?: number;
  /**
   * Width in px.
   * @default {640}
   */
  width?: number;
}

/**
 * Charts a frequency response as gain and phase against log frequency, marking the
 * crossover (where the gain falls through the reference level), the phase margin there,
 * and the gain-bandwidth and phase-margin limit when given.
 *
 * @param response The response: points, or a frequency sweep (`{frequencies, magnitudeDb,
 * phaseDegrees}`, as the cascade's `sweepResponse` returns).
 * @param options Reference level, gain-bandwidth, limit, title.
 * @returns The chart; its description states the crossover and phase margin.
 * @throws {TypeError} If there are fewer than 2 points or a value is not finite.
 * @throws {RangeError} If a frequency or the gain-bandwidth is not positive.
 *
 * @example The same chart from a sweep held as parallel arrays
 * ```ts
 * import { gainPhaseChart } from "./gain_phase_chart.ts";
 * import { ok } from "node:assert/strict";
 * const frequencies = [1e3, 1e4, 1e5, 1e6, 1e7];
 * const chart = gainPhaseChart({
 *   frequencies,
 *   magnitudeDb: frequencies.map((f) => 20 * Math.log10(1e6 / f)),
 *   phaseDegrees: frequencies.map(() => -90),
 * });
 * ok(chart.description.includes("crossover 1 MHz, phase margin 90°"));
 * ```
 *
 * @example A single-pole loop gain: 60 dB, pole at 1 kHz
 * ```ts
 * import { gainPhaseChart } from "./gain_phase_chart.ts";
 * import { chartDocument } from "./chart_document.ts";
 * import { ok } from "node:assert/strict";
 * const points = [];
 * for (let k = 0; k <= 60; k++) {
 *   const f = 10 ** (1 + k / 10);
 *   const x = f / 1e3;
 *   points.push({ frequency: f, gainDb: 60 - 10 * Math.log10(1 + x * x), phaseDeg: -Math.atan(x) * 180 / Math.PI });
 * }
 * const chart = gainPhaseChart(points, { minPhaseMargin: 45 });
 * ok(chart.description.includes("crossover 1 MHz"));
 * ok(chart.toSvg({ document: await chartDocument() }).includes("Frequency (Hz)"));
 * ```
 */
export function gainPhaseChart(
  response: readonly FrequencyPoint[] | FrequencySweepLike,
  options: GainPhaseChartOptions = {},
): Chart {
  const points = toPoints(response);
  requirePoints("points", points);
  for (const [i, p] of points.entries()) {
    requirePositive(`points[${i}].frequency`, p.frequency, "Hz");
    requireFinite(`points[${i}].gainDb`, p.gainDb);
    requireFinite(`points[${i}].phaseDeg`, p.phaseDeg);
  }
  const reference = options.referenceGainDb ?? 0;
  requireFinite("referenceGainDb", reference);
  if (options.gainBandwidth !== undefined) {
    requirePositive("gainBandwidth", options.gainBandwidth, "Hz");
  }
  if (options.minPhaseMargin !== undefined) requireFinite("minPhaseMargin", options.minPhaseMargin);
  const data = [...points].sort((a, b) => a.frequency - b.frequency);
  const f = data.map((p) => p.frequency);
  const fMin = f[0];
  const fMax = f[f.length - 1];
  const crossover = firstCrossing(f, data.map((p) => p.gainDb), reference, true);
  const phaseAtCrossover = crossover === undefined
    ? undefined
    : interpolateAt(f, data.map((p) => p.phaseDeg), crossover, true);
  const margin = phaseAtCrossover === undefined ? undefined : 180 + phaseAtCrossover;
  const limit = options.minPhaseMargin;
  const pass = margin !== undefined && (limit === undefined || margin >= limit);

  const xAxis = logAxis("Frequency", "Hz", fMin, fMax);
  const [xLo, xHi] = xAxis.domain as [number, number];
  // Labels on the right third of the plot would run off the edge: anchor them leftwards.
  const leftward = (x: number) => Math.log(x / xLo) / Math.log(xHi / xLo) > 0.62;
  const side = (x: number) =>
    leftward(x) ? { textAnchor: "end" as const, dx: -8 } : { textAnchor: "start" as const, dx: 8 };

  const gainMarks: Plot.Markish[] = [
    Plot.ruleY([reference], { stroke: CHART_PALETTE.reference }),
  ];
  const gainValues = [...data.map((p) => p.gainDb), reference];
  if (options.gainBandwidth !== undefined) {
    const gbw = options.gainBandwidth;
    const asymptote = [xLo, xHi].map((x) => ({ frequency: x, gainDb: 20 * Math.log10(gbw / x) }));
    gainMarks.push(
      Plot.line(asymptote, {
        x: "frequency",
        y: "gainDb",
        stroke: CHART_PALETTE.ember,
        strokeWidth: 1.5,
        strokeDasharray: "2,3",
        clip: true,
      }),
      Plot.dot([{ frequency: gbw, gainDb: 0 }], {
        x: "frequency",
        y: "gainDb",
        fill: CHART_PALETTE.ember,
        r: 3.5,
      }),
      annotation([`gain-bandwidth ${formatSi(gbw, "Hz", { digits: 3 })} (dotted, −20 dB/decade)`], {
        // A falling response leaves the top-right corner empty.
        frameAnchor: "top-right",
        textAnchor: "end",
        dx: -6,
        dy: 6,
        fill: CHART_PALETTE.ember,
      }),
    );
    gainValues.push(0);
  }
  gainMarks.push(
    Plot.line(data, { x: "frequency", y: "gainDb", stroke: CHART_PALETTE.ink, strokeWidth: 2 }),
  );
  const phaseMarks: Plot.Markish[] = [
    Plot.ruleY([-180], { stroke: CHART_PALETTE.reference }),
    Plot.line(data, { x: "frequency", y: "phaseDeg", stroke: CHART_PALETTE.ink, strokeWidth: 2 }),
  ];
  const phaseValues = [...data.map((p) => p.phaseDeg), -180, 0];
  if (limit !== undefined) {
    phaseMarks.push(
      limitRuleY([-180 + limit]),
      annotation([{ frequency: xLo, phaseDeg: -180 + limit }], {
        x: "frequency",
        y: "phaseDeg",
        text: () => `limit: phase margin ${formatSi(limit, "°", { digits: 3 })}`,
        textAnchor: "start",
        dx: 6,
        dy: -8,
        fill: CHART_PALETTE.limit,
      }),
    );
    phaseValues.push(-180 + limit);
  }
  if (crossover !== undefined && phaseAtCrossover !== undefined && margin !== undefined) {
    const at = { frequency: crossover, gainDb: reference, phaseDeg: phaseAtCrossover };
    const guide = { stroke: CHART_PALETTE.reference, strokeDasharray: "3,3" };
    gainMarks.push(
      Plot.ruleX([crossover], guide),
      Plot.dot([at], { x: "frequency", y: "gainDb", fill: CHART_PALETTE.ink, r: 4 }),
      annotation([at], {
        x: "frequency",
        y: "gainDb",
        text: () => `crossover ${formatSi(crossover, "Hz", { digits: 3 })}`,
        // Left of the crossover the gain is above the reference, so below-left is empty.
        textAnchor: "end",
        dx: -8,
        dy: 14,
      }),
    );
    phaseMarks.splice(
      1,
      0,
      Plot.ruleX([crossover], guide),
      Plot.ruleX([at], {
        x: "frequency",
        y1: -180,
        y2: "phaseDeg",
        stroke: pass ? CHART_PALETTE.ink : CHART_PALETTE.limit,
        strokeWidth: 4,
      }),
    );
    phaseMarks.push(
      annotation([{ frequency: crossover, phaseDeg: (-180 + phaseAtCrossover) / 2 }], {
        x: "frequency",
        y: "phaseDeg",
        text: () =>
          `phase margin ${formatSi(margin, "°", { digits: 3 })}${pass ? "" : " (too small)"}`,
        ...side(crossover),
        fill: pass ? CHART_PALETTE.note : CHART_PALETTE.limit,
        fontWeight: "bold",
      }),
    );
  }
  const [phLo, phHi] = padExtent(phaseValues, 0.06);
  const phaseTicks: number[] = [];
  const step = phHi - phLo > 400 ? 90 : 45;
  for (let t = Math.ceil(phLo / step) * step; t <= phHi; t += step) phaseTicks.push(t);

  const span = `${formatSi(fMin, "Hz", { digits: 3 })} … ${formatSi(fMax, "Hz", { digits: 3 })}`;
  const summary = crossover === undefined || margin === undefined
    ? `the gain does not cross ${formatSi(reference, "dB", { digits: 3 })} in the data`
    : `crossover ${formatSi(crossover, "Hz", { digits: 3 })}, phase margin ${
      formatSi(margin, "°", { digits: 3 })
    }${limit === undefined ? "" : ` (limit ${formatSi(limit, "°", { digits: 3 })})`}`;
  const title = options.title ?? "Gain and phase";
  return new Chart({
    title,
    description: `${title}, ${span}: ${summary}`,
    width: options.width,
    panels: [
      panel({
        height: PANEL_HEIGHT - 20,
        marginBottom: 12,
        x: { ...xAxis, label: null, tickFormat: () => "" },
        y: linearAxis("Gain", "dB", { domain: padExtent(gainValues, 0.06) }),
        marks: gainMarks,
      }),
      panel({
        x: xAxis,
        y: linearAxis("Phase", "°", { domain: [phLo, phHi], ticks: phaseTicks, nice: false }),
        marks: phaseMarks,
      }),
    ],
    notes: crossover === undefined ? [`Note: ${summary}.`] : [],
  });
}
