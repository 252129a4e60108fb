/**
 * The rich-display protocol between library values and any front-end.
 *
 * A value shows itself richly by having a method under `Symbol.for("longtail.display")` that
 * returns (or resolves to) a MIME bundle. The kernel looks the symbol up by name, so neither
 * side imports the other.
 *
 * @module
 */

/** The well-known symbol of the display method. */
export const DISPLAY: unique symbol = Symbol.for("longtail.display") as never;

/** MIME type → content. `text/plain` should always be present. */
export type MimeBundle = Record<string, string>;

/** A value that knows how to display itself. */
export interface Displayable {
  /** Returns the value's MIME bundle; may be async (charts load their document lazily). */
  [DISPLAY](): MimeBundle | Promise<MimeBundle>;
}
