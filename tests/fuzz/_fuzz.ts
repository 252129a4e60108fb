/**
 * Shared settings for the fuzz tests: a fixed seed and a bounded number of runs, so CI
 * sees the same inputs every time and the whole folder stays within a few seconds.
 *
 * To search further by hand, set `LONGTAIL_FUZZ_SEED` and `LONGTAIL_FUZZ_RUNS`, e.g.
 * `LONGTAIL_FUZZ_SEED=7 LONGTAIL_FUZZ_RUNS=5000 deno task test tests/fuzz/`; a failure
 * prints the seed and path that reproduce it.
 *
 * @module
 */
import fc from "fast-check";

function fromEnv(name: string): number | undefined {
  try {
    const text = Deno.env.get(name);
    return text === undefined ? undefined : Number(text);
  } catch {
    return undefined; // No env permission: the fixed defaults apply.
  }
}

const seed = fromEnv("LONGTAIL_FUZZ_SEED") ?? 20_240_611;
const runScale = fromEnv("LONGTAIL_FUZZ_RUNS");

/**
 * Parameters for `fc.assert`: the fixed seed and `numRuns` (or the override from the
 * environment). No time budget: a slow input should show up as a slow test, not be hidden.
 *
 * @param numRuns Runs in CI.
 * @returns fast-check parameters.
 */
export function fuzzParameters<T>(numRuns: number): fc.Parameters<T> {
  return { seed, numRuns: runScale ?? numRuns };
}
