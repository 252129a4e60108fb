/**
 * The few DOM members the chart helpers use, written out so that `lib/` type-checks without
 * the browser's DOM type library. A jsdom document and a browser `document` both fit.
 *
 * @module
 */

/** One attribute of an element. */
export interface ChartAttribute {
  /** Attribute name. */
  readonly name: string;
  /** Attribute value. */
  readonly value: string;
}

/** The element members the chart helpers touch. */
export interface ChartElement {
  /** Sets an attribute. */
  setAttribute(name: string, value: string): void;
  /** Reads an attribute, or `null`. */
  getAttribute(name: string): string | null;
  /** Appends a child node and returns it. */
  appendChild(child: ChartElement): unknown;
  /** The element's attributes. */
  readonly attributes: ArrayLike<ChartAttribute>;
  /** The element and its children as markup. */
  readonly outerHTML: string;
  /** Text inside the element. */
  textContent: string | null;
  /** Elements below this one that match a CSS selector. */
  querySelectorAll(selector: string): ArrayLike<ChartElement>;
}

/** The document members the chart helpers touch: a jsdom or browser document both fit. */
export interface ChartDocument {
  /** Creates an element in a namespace (SVG elements need the SVG namespace). */
  createElementNS(namespace: string, name: string): ChartElement;
}

/** The SVG namespace. */
export const SVG_NS = "http://www.w3.org/2000/svg";
