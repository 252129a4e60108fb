/**
 * Global names: a cell may use them without any cell defining them, and they are never
 * dependencies. The list is read from the running Deno (the sandbox runs the same Deno),
 * plus the few names that exist only inside functions or as language keywords.
 *
 * @module
 */

const EXTRA = ["undefined", "NaN", "Infinity", "globalThis", "arguments", "eval"];

let names: Set<string> | undefined;

/**
 * Whether a name is a global of the runtime (`Math`, `console`, `Deno`, `fetch`, …).
 *
 * @param name An identifier.
 * @returns True for globals.
 *
 * @example
 * ```ts
 * import { isGlobalName } from "./globals.ts";
 * import { equal } from "node:assert/strict";
 * equal(isGlobalName("Math"), true);
 * equal(isGlobalName("Deno"), true);
 * equal(isGlobalName("tailCurrent"), false);
 * ```
 */
export function isGlobalName(name: string): boolean {
  if (!names) {
    names = new Set(EXTRA);
    for (let object: object | null = globalThis; object; object = Object.getPrototypeOf(object)) {
      for (const key of Object.getOwnPropertyNames(object)) names.add(key);
    }
  }
  return names.has(name);
}
