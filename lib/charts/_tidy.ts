/**
 * Makes rendered SVG deterministic and compact: coordinates rounded to 0.01 px, and the
 * element ids that Plot numbers from a global counter (clip paths, markers) renamed from a
 * hash of the picture, so the same chart always gives the same bytes and two different
 * charts inlined in one page never share an id.
 *
 * @module
 */
const GEOMETRY =
  /(\s(?:d|transform|x|y|x1|x2|y1|y2|cx|cy|r|width|height|points|viewBox)=")([^"]*)"/g;
const NUMBER = /-?(?:\d+\.\d*|\.\d+|\d+)(?:e[-+]?\d+)?/gi;

function round(token: string): string {
  if (!/[.e]/i.test(token)) return token;
  const value = Math.round(Number(token) * 100) / 100;
  return Object.is(value, -0) ? "0" : String(value);
}

/**
 * Rounds every number in the geometry attributes of serialised SVG. Done on the text, not
 * the DOM: walking jsdom attributes costs more than drawing the chart.
 */
export function roundGeometry(svg: string): string {
  return svg.replace(
    GEOMETRY,
    (_, head: string, value: string) => `${head}${value.replace(NUMBER, round)}"`,
  );
}

/** FNV-1a, 32 bit: a tiny stable hash for id prefixes. */
function hash(text: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return (h >>> 0).toString(36);
}

/** Renames every `id` in serialised SVG to `lt<hash>-<n>` and rewrites the references. */
export function renumberIds(svg: string): string {
  const names = new Map<string, string>();
  for (const match of svg.matchAll(/\sid="([^"]+)"/g)) {
    if (!names.has(match[1])) names.set(match[1], `@${names.size + 1}`);
  }
  if (names.size === 0) return svg;
  const rename = (id: string) => names.get(id) ?? id;
  const placeholder = svg
    .replace(/(\sid=")([^"]+)"/g, (_, head, id) => `${head}${rename(id)}"`)
    .replace(/url\(#([^)]+)\)/g, (_, id) => `url(#${rename(id)})`)
    .replace(/(href=")#([^"]+)"/g, (_, head, id) => `${head}#${rename(id)}"`);
  const prefix = `lt${hash(placeholder)}-`;
  return placeholder.replace(/([#"])@(\d+)/g, (_, head, n) => `${head}${prefix}${n}`);
}
