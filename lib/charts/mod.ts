/**
 * Chart helpers: amplifier results as SVG pictures (through Observable Plot), shown in
 * notebooks through the rich-display protocol. Imported separately from the library
 * (`import { gainPhaseChart } from "longtail/charts";`) so notebooks without charts never
 * load Plot or jsdom.
 *
 * @module
 */
export * from "./chart.ts";
export * from "./chart_document.ts";
export * from "./palette.ts";
export * from "./gain_phase_chart.ts";
export * from "./transfer_curve_chart.ts";
export * from "./harmonic_spectrum_chart.ts";
export * from "./thd_chart.ts";
export * from "./monte_carlo_chart.ts";
export * from "./dissipation_chart.ts";
export * from "./operating_area_chart.ts";
export * from "./sweep_chart.ts";
