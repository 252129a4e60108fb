/**
 * The error every text parser in `units/` throws for text it cannot read.
 *
 * @module
 */

/**
 * A `SyntaxError` that says where in the text the reading stopped.
 *
 * `column` is 1-based and counts UTF-16 code units, as editors do for the characters used in
 * component values (µ, Ω and − are single code units).
 *
 * @example The column points at the first character that does not fit
 * ```ts
 * import { QuantitySyntaxError } from "./quantity_syntax_error.ts";
 * import { equal, ok } from "node:assert/strict";
 * const error = new QuantitySyntaxError("4.7x", 4, "an SI prefix or a unit");
 * ok(error instanceof SyntaxError);
 * equal(error.column, 4);
 * equal(error.message, 'Expected an SI prefix or a unit at column 4 of "4.7x", but found "x"');
 * ```
 */
export class QuantitySyntaxError extends SyntaxError {
  /** The whole text that was being read. */
  readonly text: string;
  /** 1-based column of the first character that could not be read. */
  readonly column: number;

  /**
   * Builds the error and its one-sentence message.
   *
   * @param text The text that was being read.
   * @param column 1-based column of the offending character (`text.length + 1` for "ended
   *   too early").
   * @param expected What the parser wanted there, e.g. `"a digit"`.
   */
  constructor(text: string, column: number, expected: string) {
    const rest = text.slice(column - 1);
    const found = rest === "" ? "the end of the text" : JSON.stringify(rest);
    super(
      `Expected ${expected} at column ${column} of ${JSON.stringify(text)}, but found ${found}`,
    );
    this.name = "QuantitySyntaxError";
    this.text = text;
    this.column = column;
  }
}
