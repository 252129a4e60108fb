/**
 * SVG snapshot comparison: normalise volatile detail, then compare with the committed file
 * (or write it when `UPDATE_SNAPSHOTS=1`).
 *
 * @module
 */
import { assertEquals } from "../_assert.ts";

const DIR = new URL("./snapshots/", import.meta.url);

/**
 * Normalises SVG for comparison: numbers in attributes rounded to one decimal, ids (which
 * carry a content hash) renumbered in order of appearance, one element per line so a diff
 * points at the mark that changed.
 */
export function normaliseSvg(svg: string): string {
  const ids = new Map<string, string>();
  const rename = (id: string) => {
    if (!ids.has(id)) ids.set(id, `id${ids.size + 1}`);
    return ids.get(id)!;
  };
  return svg
    .replace(/\sid="([^"]+)"/g, (_, id) => ` id="${rename(id)}"`)
    .replace(/url\(#([^)]+)\)/g, (_, id) => `url(#${rename(id)})`)
    .replace(
      /(\s[\w:-]+=")([^"]*)"/g,
      (_, head: string, value: string) =>
        `${head}${
          value.replace(/-?\d+\.\d+/g, (n) => {
            const r = Math.round(Number(n) * 10) / 10;
            return Object.is(r, -0) ? "0" : String(r);
          })
        }"`,
    )
    .replace(/></g, ">\n<") + "\n";
}

/** Snapshot files start with this, so `deno fmt` leaves their one-element-per-line layout. */
const HEADER = "<!-- deno-fmt-ignore-file -->\n";

function snapshotText(svg: string): string {
  return HEADER + normaliseSvg(svg);
}

/** Compares `svg` (normalised) with `snapshots/<name>.svg`, or writes it when updating. */
export async function assertSnapshot(name: string, svg: string): Promise<void> {
  const file = new URL(`${name}.svg`, DIR);
  const actual = snapshotText(svg);
  if (Deno.env.get("UPDATE_SNAPSHOTS") === "1") {
    await Deno.mkdir(DIR, { recursive: true });
    await Deno.writeTextFile(file, actual);
    return;
  }
  let expected: string;
  try {
    expected = await Deno.readTextFile(file);
  } catch {
    throw new Error(
      `No snapshot ${name}.svg yet: run the chart tests once with UPDATE_SNAPSHOTS=1 and review it`,
    );
  }
  assertEquals(actual, expected, `chart ${name} differs from its snapshot`);
}
