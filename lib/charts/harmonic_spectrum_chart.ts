/**
 * Harmonic spectrum as bars in dB relative to the fundamental (dBc), fundamental shown as
 * the 0 dB reference bar, with each level printed above its bar and the THD in a note.
 *
 * @module
 */
import * as Plot from "@observablehq/plot";
import { requireFinite, requireNonNegative } from "../_validate.ts";
import { formatSi } from "../units/format.ts";
import { Chart } from "./chart.ts";
import { annotation, limitRuleY, linearAxis, panel } from "./_panel.ts";
import { CHART_PALETTE } from "./palette.ts";

/** The spectrum to draw: the shape of the library's `Harmonics` result. */
export interface SpectrumChartInput {
  /** Peak amplitude of harmonic n at index n; index 0 is the DC term (not drawn). */
  amplitudes: ArrayLike<number>;
}

/** Options for {@linkcode harmonicSpectrumChart}. */
export interface HarmonicSpectrumChartOptions {
  /**
   * Chart title.
   * @default {"Harmonic spectrum"}
   */
  title?: string;
  /**
   * Highest harmonic drawn.
   * @default {min(amplitudes.length − 1, 10)}
   */
  maxOrder?: number;
  /**
   * Bottom of the bars, in dBc. By default 10 dB under the lowest harmonic drawn, rounded
   * down to 20 dB, but not under −160 dBc. Harmonics below it sit on the floor, labelled
   * "< floor" (e.g. "< −160").
   */
  floorDb?: number;
  /** Largest acceptable level of any harmonic, in dBc: draws the limit line. */
  maxHarmonicDb?: number;
  /**
   * Width in px.
   * @default {640}
   */
  width?: number;
}

/** Level of each harmonic in dBc, from amplitudes; `-Infinity` for a zero amplitude. */
function levels(amplitudes: ArrayLike<number>, maxOrder: number): number[] {
  const fundamental = amplitudes[1];
  const out: number[] = [];
  for (let n = 1; n <= maxOrder; n++) {
    out.push(20 * Math.log10(Math.abs(amplitudes[n]) / Math.abs(fundamental)));
  }
  return out;
}

/**
 * Charts a harmonic spectrum: one bar per harmonic, in dB below the fundamental.
 *
 * @param spectrum Harmonic amplitudes (the library's `Harmonics` result fits).
 * @param options Highest order, floor, limit, title.
 * @returns The chart; its description states the THD over the harmonics drawn.
 * @throws {TypeError} If fewer than 2 amplitudes are given or one is not finite.
 * @throws {RangeError} If the fundamental amplitude is zero.
 *
 * @example Second harmonic at 1 % of the fundamental reads −40 dBc
 * ```ts
 * import { harmonicSpectrumChart } from "./harmonic_spectrum_chart.ts";
 * import { ok } from "node:assert/strict";
 * const chart = harmonicSpectrumChart({ amplitudes: [0, 1, 0.01, 0.001] });
 * ok(chart.description.includes("H2 −40 dBc"));
 * ```
 *
 * @example A harmonic lost in rounding noise reads "< −160", not "−318"
 * ```ts
 * import { harmonicSpectrumChart } from "./harmonic_spectrum_chart.ts";
 * import { ok } from "node:assert/strict";
 * const chart = harmonicSpectrumChart({ amplitudes: [0, 1, 1e-16, 0.001] });
 * ok(chart.description.includes("H2 < −160 dBc"));
 * ```
 */
export function harmonicSpectrumChart(
  spectrum: SpectrumChartInput,
  options: HarmonicSpectrumChartOptions = {},
): Chart {
  const amplitudes = spectrum?.amplitudes;
  if (amplitudes === undefined || amplitudes.length < 3) {
    throw new TypeError(
      `Expected amplitudes to hold DC, the fundamental and at least one harmonic, but found ${
        amplitudes === undefined ? "none" : `${amplitudes.length} values`
      }`,
    );
  }
  for (let n = 0; n < amplitudes.length; n++) requireFinite(`amplitudes[${n}]`, amplitudes[n]);
  if (amplitudes[1] === 0) {
    throw new RangeError("Expected amplitudes[1] (the fundamental) to be non-zero, but found 0");
  }
  const maxOrder = Math.min(options.maxOrder ?? 10, amplitudes.length - 1);
  requireNonNegative("maxOrder", maxOrder - 2);
  const db = levels(amplitudes, maxOrder);
  const harmonicsDb = db.slice(1).filter(Number.isFinite);
  const lowest = harmonicsDb.length > 0 ? Math.min(...harmonicsDb) : -60;
  const floor = options.floorDb ?? Math.max(-160, Math.floor((lowest - 10) / 20) * 20);
  requireFinite("floorDb", floor);
  const dbText = (x: number) => formatSi(x, "", { digits: 3 }).replace("-", "\u2212");
  // A level under the floor (or a zero amplitude, −∞ dBc) is drawn at the floor and labelled
  // "< floor": printing "−318 dBc" for a numerically empty bin would claim a precision the
  // record does not have.
  const bars = db.map((level, i) => ({
    order: i + 1,
    level,
    shown: Math.max(floor, Number.isFinite(level) ? level : floor),
    label: level >= floor ? dbText(level) : `< ${dbText(floor)}`,
  }));
  let sum = 0;
  for (let n = 2; n <= maxOrder; n++) sum += amplitudes[n] ** 2;
  const thd = Math.sqrt(sum) / Math.abs(amplitudes[1]);
  const limit = options.maxHarmonicDb;
  const worst = bars.slice(1).reduce((a, b) => (b.level > a.level ? b : a));
  const marks: Plot.Markish[] = [
    Plot.barY(bars, {
      x: "order",
      y1: floor,
      y2: "shown",
      fill: (d: { order: number; level: number }) =>
        d.order === 1
          ? CHART_PALETTE.ember
          : limit !== undefined && d.level > limit
          ? CHART_PALETTE.failFill
          : CHART_PALETTE.passFill,
      stroke: (d: { order: number; level: number }) =>
        limit !== undefined && d.order > 1 && d.level > limit ? CHART_PALETTE.limit : "none",
      inset: 0.5,
    }),
    annotation(bars, { x: "order", y: "shown", text: "label", dy: -8, fontSize: 10 }),
  ];
  if (limit !== undefined) {
    requireFinite("maxHarmonicDb", limit);
    marks.push(
      limitRuleY([limit]),
      annotation([`limit ${formatSi(limit, "dBc", { digits: 3 })}`], {
        frameAnchor: "top-right",
        textAnchor: "end",
        dx: -6,
        dy: 6,
        fill: CHART_PALETTE.limit,
      }),
    );
  }
  const thdText = `THD ${formatSi(thd * 100, "%", { digits: 3 })} (harmonics 2–${maxOrder})`;
  const title = options.title ?? "Harmonic spectrum";
  return new Chart({
    title,
    description: `${title}: ${thdText}; largest H${worst.order} ${worst.label} dBc` +
      (limit === undefined ? "" : ` (limit ${formatSi(limit, "dBc", { digits: 3 })})`) +
      bars.slice(1, 3).map((b) => `; H${b.order} ${b.label} dBc`).join(""),
    width: options.width,
    notes: [`${thdText}. Fundamental = 0 dBc (orange bar).`],
    panels: [
      panel({
        x: {
          type: "band",
          label: "Harmonic number",
          labelAnchor: "center",
          labelArrow: "none",
          padding: 0.25,
        },
        y: linearAxis("Level relative to fundamental", "dBc", {
          domain: [floor, 8],
          nice: false,
        }),
        marks,
      }),
    ],
  });
}
