/**
 * Large-signal transfer curve with its error from the ideal straight line, in two stacked
 * panels: the curve on top, the error (output − ideal) underneath, where a crossover notch
 * or the onset of clipping stands out far more than on the curve itself.
 *
 * @module
 */
import * as Plot from "@observablehq/plot";
import { requireFinite, requirePositive } from "../_validate.ts";
import { formatSi } from "../units/format.ts";
import { Chart } from "./chart.ts";
import { interpolateAt, requirePoints } from "./_interpolate.ts";
import { annotation, limitRuleY, linearAxis, padExtent, panel, PANEL_HEIGHT } from "./_panel.ts";
import { CHART_PALETTE } from "./palette.ts";

/** One point of a transfer curve. */
export interface TransferPoint {
  /** Input quantity (e.g. differential input voltage, V). */
  input: number;
  /** Output quantity (e.g. differential output current, A, or output voltage, V). */
  output: number;
}

/** Options for {@linkcode transferCurveChart}. */
export interface TransferCurveChartOptions {
  /**
   * Chart title.
   * @default {"Transfer curve"}
   */
  title?: string;
  /**
   * Input axis name.
   * @default {"Input"}
   */
  inputLabel?: string;
  /**
   * Input unit.
   * @default {"V"}
   */
  inputUnit?: string;
  /**
   * Output axis name.
   * @default {"Output"}
   */
  outputLabel?: string;
  /**
   * Output unit.
   * @default {"V"}
   */
  outputUnit?: string;
  /**
   * Slope of the ideal line, output unit per input unit. When omitted, the slope of the
   * curve at the input nearest zero (central difference), i.e. the small-signal gain.
   */
  idealGain?: number;
  /**
   * Output of the ideal line at zero input.
   * @default {0}
   */
  idealOffset?: number;
  /** Largest acceptable |error| in the output unit: draws ± limit lines on the error panel. */
  maxError?: number;
  /**
   * Width in px.
   * @default {640}
   */
  width?: number;
}

/**
 * Charts a large-signal transfer curve (differential pair, output stage) against the ideal
 * line, with a second panel of the error from ideal and the worst error marked.
 *
 * @param points The curve, any order (sorted by input here).
 * @param options Axis names and units, the ideal line, the error limit, title.
 * @returns The chart; its description states the worst error.
 * @throws {TypeError} If there are fewer than 2 points or a value is not finite.
 * @throws {RangeError} If `maxError` is not positive.
 *
 * @example A bipolar pair's tanh curve against its small-signal line
 * ```ts
 * import { transferCurveChart } from "./transfer_curve_chart.ts";
 * import { ok } from "node:assert/strict";
 * const vt = 0.025852;
 * const points = Array.from({ length: 41 }, (_, i) => {
 *   const input = (i - 20) * 0.005;
 *   return { input, output: 1e-3 * Math.tanh(input / (2 * vt)) };
 * });
 * const chart = transferCurveChart(points, { outputLabel: "Output current", outputUnit: "A" });
 * ok(chart.description.includes("worst error"));
 * ```
 */
export function transferCurveChart(
  points: readonly TransferPoint[],
  options: TransferCurveChartOptions = {},
): Chart {
  requirePoints("points", points, 3);
  for (const [i, p] of points.entries()) {
    requireFinite(`points[${i}].input`, p.input);
    requireFinite(`points[${i}].output`, p.output);
  }
  if (options.maxError !== undefined) requirePositive("maxError", options.maxError);
  const inputUnit = options.inputUnit ?? "V";
  const outputUnit = options.outputUnit ?? "V";
  const inputLabel = options.inputLabel ?? "Input";
  const outputLabel = options.outputLabel ?? "Output";
  const data = [...points].sort((a, b) => a.input - b.input);
  const xs = data.map((p) => p.input);
  const ys = data.map((p) => p.output);
  const offset = options.idealOffset ?? 0;
  requireFinite("idealOffset", offset);
  let gain = options.idealGain;
  if (gain === undefined) {
    // Small-signal slope at the sample nearest zero input.
    let k = 0;
    for (let i = 1; i < xs.length; i++) if (Math.abs(xs[i]) < Math.abs(xs[k])) k = i;
    const a = Math.max(0, k - 1);
    const b = Math.min(xs.length - 1, k + 1);
    gain = (ys[b] - ys[a]) / (xs[b] - xs[a]);
  }
  requireFinite("idealGain", gain);
  const ideal = (x: number) => offset + gain! * x;
  const errors = data.map((p) => ({ input: p.input, error: p.output - ideal(p.input) }));
  let worst = errors[0];
  for (const e of errors) if (Math.abs(e.error) > Math.abs(worst.error)) worst = e;

  const show = (v: number, unit: string) => formatSi(v, unit, { digits: 3 });
  const x = linearAxis(inputLabel, inputUnit, { domain: [xs[0], xs[xs.length - 1]], nice: false });
  const outDomain = padExtent(ys, 0.06);
  // The ideal line is clipped to the curve's own output range so it does not set the scale.
  const idealLine = [xs[0], xs[xs.length - 1]].map((v) => ({ input: v, output: ideal(v) }));
  const errorValues = errors.map((e) => e.error);
  const limit = options.maxError;
  if (limit !== undefined) errorValues.push(limit, -limit);
  const errorMarks: Plot.Markish[] = [
    Plot.ruleY([0], { stroke: CHART_PALETTE.reference }),
    Plot.line(errors, { x: "input", y: "error", stroke: CHART_PALETTE.ink, strokeWidth: 2 }),
    Plot.dot([worst], { x: "input", y: "error", fill: CHART_PALETTE.ink, r: 4 }),
    annotation([worst], {
      x: "input",
      y: "error",
      text: () => `worst ${show(worst.error, outputUnit)} at ${show(worst.input, inputUnit)}`,
      textAnchor: interpolateAt([xs[0], xs[xs.length - 1]], [0, 1], worst.input) > 0.6
        ? "end"
        : "start",
      dx: interpolateAt([xs[0], xs[xs.length - 1]], [0, 1], worst.input) > 0.6 ? -8 : 8,
      dy: worst.error > 0 ? -10 : 12,
      fontWeight: "bold",
    }),
  ];
  if (limit !== undefined) {
    errorMarks.splice(
      1,
      0,
      limitRuleY([limit, -limit]),
      // Right end: the worst-error label usually sits at the left end.
      annotation([{ input: xs[xs.length - 1], error: worst.input > 0 ? -limit : limit }], {
        x: "input",
        y: "error",
        text: () => `limit ±${show(limit, outputUnit)}`,
        textAnchor: "end",
        dx: -4,
        dy: -7,
        fill: CHART_PALETTE.limit,
      }),
    );
  }
  const title = options.title ?? "Transfer curve";
  const gainUnit = inputUnit === outputUnit ? "" : `${outputUnit}/${inputUnit}`;
  const gainText = gainUnit === ""
    ? Number(gain.toPrecision(4)).toString()
    : formatSi(gain, gainUnit, { digits: 4 });
  return new Chart({
    title,
    // A given title already says what is plotted; the default one needs the axes named.
    description: `${options.title ?? `${title}: ${outputLabel} against ${inputLabel}`}, ` +
      `ideal slope ${gainText}; ` +
      `worst error ${show(worst.error, outputUnit)} at ${show(worst.input, inputUnit)}` +
      (limit === undefined ? "" : ` (limit ±${show(limit, outputUnit)})`),
    width: options.width,
    notes: [`Ideal (dashed): slope ${gainText}, offset ${show(offset, outputUnit)}.`],
    panels: [
      panel({
        marginBottom: 12,
        x: { ...x, label: null, tickFormat: () => "" },
        y: linearAxis(outputLabel, outputUnit, { domain: outDomain }),
        marks: [
          Plot.ruleY([0], { stroke: CHART_PALETTE.reference }),
          Plot.ruleX([0], { stroke: CHART_PALETTE.reference }),
          Plot.line(idealLine, {
            x: "input",
            y: "output",
            stroke: CHART_PALETTE.ember,
            strokeWidth: 1.5,
            strokeDasharray: "5,4",
            clip: true,
          }),
          Plot.line(data, { x: "input", y: "output", stroke: CHART_PALETTE.ink, strokeWidth: 2 }),
        ],
      }),
      panel({
        height: PANEL_HEIGHT - 50,
        x,
        y: linearAxis("Error from ideal", outputUnit, { domain: padExtent(errorValues, 0.12) }),
        marks: errorMarks,
      }),
    ],
  });
}
