/**
 * "Did you mean …?": the defined name closest to a misspelt one.
 *
 * @module
 */

/**
 * Edit distance between two strings: insertions, deletions, substitutions and swaps of
 * two neighbouring characters each count one (the restricted Damerau–Levenshtein distance).
 *
 * @param a First string.
 * @param b Second string.
 * @returns The number of single-character edits that turn `a` into `b`.
 *
 * @example
 * ```ts
 * import { editDistance } from "./closest_name.ts";
 * import { equal } from "node:assert/strict";
 * equal(editDistance("tailCurent", "tailCurrent"), 1); // closed form: one insertion
 * equal(editDistance("gain", "gain"), 0); // closed form
 * equal(editDistance("tial", "tail"), 1); // closed form: one swap
 * ```
 */
export function editDistance(a: string, b: string): number {
  let before: number[] = [];
  let previous = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const current = [i];
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      current[j] = Math.min(previous[j] + 1, current[j - 1] + 1, previous[j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) {
        current[j] = Math.min(current[j], before[j - 2] + 1);
      }
    }
    before = previous;
    previous = current;
  }
  return previous[b.length];
}

/**
 * The candidate closest to `name`, if it is close enough to be a likely typo.
 *
 * A name that differs only in letter case wins; otherwise the smallest edit distance,
 * at most a third of the name's length (and at least 1), ties broken by order.
 *
 * @param name The unknown name.
 * @param candidates Names that exist.
 * @returns The suggestion, or undefined when nothing is close.
 *
 * @example
 * ```ts
 * import { closestName } from "./closest_name.ts";
 * import { equal } from "node:assert/strict";
 * equal(closestName("tailCurent", ["gain", "tailCurrent", "tailResistor"]), "tailCurrent");
 * equal(closestName("xyz", ["gain"]), undefined);
 * ```
 */
export function closestName(name: string, candidates: Iterable<string>): string | undefined {
  const limit = Math.max(1, Math.floor(name.length / 3));
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const candidate of candidates) {
    if (candidate === name) continue;
    if (candidate.toLowerCase() === name.toLowerCase()) return candidate;
    if (Math.abs(candidate.length - name.length) > limit) continue;
    const distance = editDistance(name, candidate);
    if (distance <= limit && distance < bestDistance) {
      best = candidate;
      bestDistance = distance;
    }
  }
  return best;
}
