/**
 * The one shared document for displaying charts, created on first use only: jsdom takes
 * about 150 ms to load, and notebooks without charts should never pay for it.
 *
 * @module
 */
import type { ChartDocument } from "./_dom.ts";

let pending: Promise<ChartDocument> | undefined;

/**
 * Returns a server-side (jsdom) document for rendering charts, loading jsdom on the first
 * call only; every later call returns the same document.
 *
 * @returns A promise of the shared document.
 *
 * @example The document is created once and shared
 * ```ts
 * import { chartDocument } from "./chart_document.ts";
 * import { equal } from "node:assert/strict";
 * const first = await chartDocument();
 * equal(await chartDocument(), first);
 * ```
 */
export function chartDocument(): Promise<ChartDocument> {
  pending ??= import("jsdom").then(({ JSDOM }) =>
    new JSDOM("<!DOCTYPE html><html><body></body></html>").window.document as ChartDocument
  );
  return pending;
}
