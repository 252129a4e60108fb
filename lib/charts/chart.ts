/**
 * The chart value: a picture described as data, rendered to SVG when a document is given,
 * and shown through the rich-display protocol (creating a server-side document lazily).
 *
 * ```
 *  ┌───────────────────────────── width ─┐
 *  │ Title                               │  title band
 *  │ ┌─ panel 1 (one Plot figure) ─────┐ │
 *  │ └─────────────────────────────────┘ │
 *  │ ┌─ panel 2 (shares the x axis) ───┐ │  panels stacked, left margins equal,
 *  │ └─────────────────────────────────┘ │  so plotting areas line up
 *  │ note line …                         │  notes band
 *  └─────────────────────────────────────┘
 * ```
 *
 * @module
 */
import * as Plot from "@observablehq/plot";
import { DISPLAY, type MimeBundle } from "../display.ts";
import { type ChartDocument, type ChartElement, SVG_NS } from "./_dom.ts";
import { renumberIds, roundGeometry } from "./_tidy.ts";
import { chartDocument } from "./chart_document.ts";
import { CHART_PALETTE } from "./palette.ts";

export type { ChartDocument, ChartElement } from "./_dom.ts";

/** One panel: Observable Plot options without the document (given at render time). */
export type ChartPanel = Omit<Plot.PlotOptions, "document">;

/** What a chart is made of. */
export interface ChartSpec {
  /** Title drawn above the panels. */
  title: string;
  /** One or two lines of plain text that say what the chart shows (the `text/plain` view). */
  description: string;
  /** Panels, stacked top to bottom. */
  panels: ChartPanel[];
  /** Lines of text under the panels (yield, worst case, THD). */
  notes?: string[];
  /**
   * Width in px; panels without their own width get this one.
   * @default {640}
   */
  width?: number;
}

/** Options for rendering a chart. */
export interface ChartRenderOptions {
  /** The document to build SVG elements with (jsdom on a server, `document` in a page). */
  document: ChartDocument;
}

const FONT = "Helvetica, Arial, sans-serif";
const TITLE_BAND = 28;
const NOTE_LINE = 16;

/**
 * A chart: a value that renders to SVG given a document and displays itself richly.
 *
 * Chart helpers (`gainPhaseChart`, `sweepChart`, …) build these; the constructor is public
 * for one-off charts.
 *
 * @example Render a one-panel chart to SVG
 * ```ts
 * import { Chart } from "./chart.ts";
 * import { chartDocument } from "./chart_document.ts";
 * import * as Plot from "@observablehq/plot";
 * import { ok } from "node:assert/strict";
 * const chart = new Chart({
 *   title: "A straight line",
 *   description: "y = x",
 *   panels: [{ marks: [Plot.line([[0, 0], [1, 1]])] }],
 * });
 * const svg = chart.toSvg({ document: await chartDocument() });
 * ok(svg.startsWith("<svg") && svg.includes("A straight line"));
 * ```
 */
export class Chart {
  /** Title drawn above the panels. */
  readonly title: string;
  /** Plain-text description (the `text/plain` view). */
  readonly description: string;
  /** Width in px. */
  readonly width: number;
  readonly #panels: ChartPanel[];
  readonly #notes: string[];

  /**
   * Creates a chart from its parts.
   *
   * @param spec Title, description, panels and notes.
   */
  constructor(spec: ChartSpec) {
    this.title = spec.title;
    this.description = spec.description;
    this.width = spec.width ?? 640;
    this.#panels = spec.panels;
    this.#notes = spec.notes ?? [];
  }

  /**
   * Renders the chart to an SVG element, coordinates unrounded and ids as Plot made them
   * (use {@linkcode Chart.toSvg} for stable markup).
   *
   * @param options The document to render with.
   * @returns The `<svg>` element (not attached to the document).
   */
  toElement(options: ChartRenderOptions): ChartElement {
    const { document } = options;
    const make = (name: string, attributes: Record<string, string | number>) => {
      const element = document.createElementNS(SVG_NS, name);
      for (const [key, value] of Object.entries(attributes)) {
        element.setAttribute(key, String(value));
      }
      return element;
    };
    const figures = this.#panels.map((panel) =>
      // `as never`: Plot types `document` as the DOM lib's Document, which is present or
      // absent depending on what else a program loads; ChartDocument is what we rely on.
      Plot.plot({
        width: this.width,
        ...panel,
        document: document as never,
      }) as unknown as ChartElement
    );
    const heights = figures.map((figure) => Number(figure.getAttribute("height")));
    const height = TITLE_BAND + heights.reduce((a, b) => a + b, 0) +
      (this.#notes.length > 0 ? this.#notes.length * NOTE_LINE + 8 : 0);
    const root = make("svg", {
      xmlns: SVG_NS,
      width: this.width,
      height,
      viewBox: `0 0 ${this.width} ${height}`,
      "font-family": FONT,
      "font-size": 11,
      role: "img",
      "aria-label": this.title,
    });
    root.appendChild(make("rect", { width: this.width, height, fill: "white" }));
    const title = make("text", {
      x: 12,
      y: 19,
      "font-size": 14,
      "font-weight": "bold",
      fill: CHART_PALETTE.note,
    });
    title.textContent = this.title;
    root.appendChild(title);
    let y = TITLE_BAND;
    figures.forEach((figure, index) => {
      figure.setAttribute("x", "0");
      figure.setAttribute("y", String(y));
      figure.setAttribute("font-family", FONT);
      figure.setAttribute("font-size", "11");
      root.appendChild(figure);
      y += heights[index];
    });
    for (const line of this.#notes) {
      y += NOTE_LINE;
      const note = make("text", { x: 12, y, "font-size": 12, fill: CHART_PALETTE.note });
      note.textContent = line;
      root.appendChild(note);
    }
    return root;
  }

  /**
   * Renders the chart to SVG markup: deterministic (rounded coordinates, ids from a hash of
   * the picture), standalone (carries its namespace), and safe to inline in HTML.
   *
   * @param options The document to render with.
   * @returns The SVG markup.
   */
  toSvg(options: ChartRenderOptions): string {
    return renumberIds(roundGeometry(this.toElement(options).outerHTML));
  }

  /**
   * The rich-display view: SVG plus the plain-text description. Loads jsdom on first use.
   *
   * @returns A promise of the MIME bundle.
   */
  async [DISPLAY](): Promise<MimeBundle> {
    const document = await chartDocument();
    return { "image/svg+xml": this.toSvg({ document }), "text/plain": this.description };
  }
}
