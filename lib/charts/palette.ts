/**
 * The chart colours: our own set, chosen so that every pair a reader must tell apart
 * differs in lightness, not hue alone.
 *
 * Why lightness: a grey-scale print keeps only lightness, and the common colour-vision
 * deficiencies (red-green) lose most of the hue difference between red and green but keep
 * the blue-versus-orange difference and all of the lightness difference. So the series
 * colours step through CIE L* (≈ 22, 54, 72, 37), neighbours at least 15 apart, and the
 * two main series are a dark blue and a mid orange. The limit colour is never told apart by
 * colour alone: limit lines are always dashed and labelled.
 *
 * ```
 *   L*  0 ──────────────────────────────────────── 100 (white)
 *        ink 22   plum 37   ember 54    sea 72   area 89
 *                 limit 37 (dashed)  passFill 55   failFill 83
 * ```
 *
 * @module
 */

/** The named chart colours (sRGB hex). */
export interface ChartPalette {
  /** First series and main traces: dark blue, L* ≈ 22. */
  readonly ink: string;
  /** Second series and ideal or asymptote lines: mid orange, L* ≈ 54. */
  readonly ember: string;
  /** Third series: light blue-green, L* ≈ 72. */
  readonly sea: string;
  /** Fourth series: dark purple, L* ≈ 37. */
  readonly plum: string;
  /** Spec limits: deep crimson, L* ≈ 37, always drawn dashed and labelled. */
  readonly limit: string;
  /** Fill of results that meet the requirement: mid blue, L* ≈ 55. */
  readonly passFill: string;
  /** Fill of results that miss the requirement: pale salmon, L* ≈ 83, crimson outline. */
  readonly failFill: string;
  /** Shaded allowed regions (operating area): very pale blue, L* ≈ 89. */
  readonly areaFill: string;
  /** Guides and reference levels (0 dB, −180°): mid grey. */
  readonly reference: string;
  /** Annotation text: near-black. */
  readonly note: string;
}

/**
 * The chart colours; see the module notes for why each was chosen.
 *
 * @example Series colours in the order the sweep chart uses them
 * ```ts
 * import { CHART_PALETTE, CHART_SERIES } from "./palette.ts";
 * import { equal } from "node:assert/strict";
 * equal(CHART_SERIES[0], CHART_PALETTE.ink);
 * equal(CHART_SERIES.length, 4);
 * ```
 */
export const CHART_PALETTE: ChartPalette = Object.freeze({
  ink: "#1b2f6e",
  ember: "#c8641e",
  sea: "#6fbfae",
  plum: "#7b3f8c",
  limit: "#a8173f",
  passFill: "#6f82c4",
  failFill: "#f2c6b8",
  areaFill: "#d8dff2",
  reference: "#8a8a8a",
  note: "#3a3a3a",
});

/** Series colours in order: lightness alternates so neighbours differ by at least 15 L*. */
export const CHART_SERIES: readonly string[] = Object.freeze([
  CHART_PALETTE.ink,
  CHART_PALETTE.ember,
  CHART_PALETTE.sea,
  CHART_PALETTE.plum,
]);

/** Dash pattern of every spec-limit line. */
export const LIMIT_DASH = "6,3";
