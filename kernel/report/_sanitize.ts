/**
 * The sanitiser for cell outputs (`text/html`, `image/svg+xml`).
 *
 * Why sanitise at all: a report is often made from a colleague's notebook, and cell code
 * can return any markup it likes. No output is trusted, not even one that our own chart
 * helpers made, because the report cannot tell who made it. The markup is parsed with a
 * spec-compliant HTML parser (so unclosed tags are closed inside the output's own
 * container, exactly as a browser would close them), then rebuilt from an allowlist:
 *
 * - kept: text formatting, lists, tables, figures, inline SVG drawing elements, MathML;
 * - dropped with their content: scripts, style sheets, frames, objects, forms, media,
 *   `foreignObject`, SVG animation, anything that can run code or load a resource;
 * - unwrapped (children kept): any other element;
 * - attributes: event handlers, namespace declarations and every address are removed,
 *   except same-document references (`#id`, `url(#id)`) and `data:` images;
 * - ids are prefixed per output (and references to them rewritten), so two charts that
 *   both call their clip path `clip-1` do not clash, and no output can take over an
 *   anchor of the report; class names of the report's own (`lt-…`) are removed.
 *
 * The report's own CSS adds `contain: paint` to each output container, so even allowed
 * inline styles cannot draw outside it.
 *
 * @module
 */
import { parseFragment, serialize } from "parse5";

const HTML_NS = "http://www.w3.org/1999/xhtml";
const SVG_NS = "http://www.w3.org/2000/svg";
const MATHML_NS = "http://www.w3.org/1998/Math/MathML";

const HTML_KEEP = new Set(
  ("a abbr article aside b bdi bdo blockquote br caption cite code col colgroup data dd del details dfn div dl dt " +
    "em figcaption figure h1 h2 h3 h4 h5 h6 hr i img ins kbd li mark ol p pre q s samp section small span strong " +
    "sub summary sup table tbody td tfoot th thead time tr u ul var wbr").split(" "),
);
const SVG_KEEP = new Set(
  ("svg g defs symbol use path line rect circle ellipse polyline polygon text tspan textPath title desc " +
    "clipPath mask marker pattern linearGradient radialGradient stop image a").split(" "),
);
const MATHML_KEEP = new Set(
  ("math annotation semantics mi mn mo ms mspace mtext menclose merror mfrac mpadded mphantom mroot mrow msqrt " +
    "mstyle mmultiscripts mover mprescripts msub msubsup msup mtable mtd mtr munder munderover none")
    .split(" "),
);
/** Dropped with everything inside them. */
const DROP = new Set(
  ("script style template iframe frame frameset object embed applet noscript noembed noframes link meta base " +
    "form input button textarea select option optgroup datalist output canvas audio video source track picture " +
    "portal title head xmp plaintext dialog slot foreignobject animate animatemotion animatetransform set " +
    "feimage annotation-xml handler listener discard").split(" "),
);
/** Attributes that hold addresses; only same-document references and data images survive. */
const ADDRESS_ATTRIBUTES = new Set(
  ("href xlink:href src srcset action formaction background poster ping cite longdesc usemap data codebase " +
    "lowsrc dynsrc xml:base manifest profile archive classid").split(" "),
);
/** Attributes that can change behaviour or leave the page. */
const DROP_ATTRIBUTES = new Set(
  ("is slot autofocus popover popovertarget popovertargetaction contenteditable srcdoc sandbox http-equiv " +
    "target download formtarget nonce name form accesskey tabindex").split(" "),
);
/** Attributes that hold id references (space-separated). */
const ID_REFERENCE_ATTRIBUTES = new Set(
  ("for headers list aria-labelledby aria-describedby aria-controls aria-owns aria-activedescendant " +
    "aria-details aria-errormessage aria-flowto").split(" "),
);
const DATA_IMAGE =
  /^data:image\/(png|jpeg|gif|webp|svg\+xml)(;base64)?,[A-Za-z0-9+/=%\s._~:;,-]*$/i;

interface Attribute {
  name: string;
  value: string;
  prefix?: string;
  namespace?: string;
}

interface Node {
  nodeName: string;
  tagName?: string;
  namespaceURI?: string;
  attrs?: Attribute[];
  childNodes?: Node[];
  parentNode?: Node | null;
  value?: string;
}

/** Options for {@linkcode sanitizeMarkup}. */
export interface SanitizeOptions {
  /** Put before every id (and every reference to one), e.g. `"o3-"`. */
  idPrefix: string;
}

/**
 * Parses untrusted markup and rebuilds it from the allowlist.
 *
 * @param markup HTML or inline SVG from a cell output.
 * @param options The id prefix for this output.
 * @returns Markup that is safe to place inside the report, balanced and self-contained.
 *
 * @example A script, a handler and an address are removed; the drawing stays
 * ```ts
 * import { sanitizeMarkup } from "./_sanitize.ts";
 * import { equal } from "node:assert/strict";
 * const clean = sanitizeMarkup(
 *   `<svg xmlns="http://www.w3.org/2000/svg" onload="go()"><clipPath id="c"/>` +
 *     `<rect clip-path="url(#c)" width="2"/><script>go()</script>` +
 *     `<image href="https://example.org/x.png"/></svg>`,
 *   { idPrefix: "o1-" },
 * );
 * equal(clean, `<svg><clipPath id="o1-c"></clipPath><rect clip-path="url(#o1-c)" width="2"></rect><image></image></svg>`);
 * ```
 */
export function sanitizeMarkup(markup: string, options: SanitizeOptions): string {
  const fragment = parseFragment(markup) as unknown as Node;
  cleanChildren(fragment, options.idPrefix);
  return serialize(fragment as never);
}

function cleanChildren(parent: Node, prefix: string): void {
  const children = parent.childNodes ?? [];
  const kept: Node[] = [];
  for (const child of children) {
    if (child.nodeName === "#text") {
      kept.push(child);
      continue;
    }
    if (child.tagName === undefined) continue; // Comments, doctypes, processing instructions.
    const name = child.tagName.toLowerCase();
    if (DROP.has(name)) continue;
    cleanChildren(child, prefix);
    if (isAllowed(child)) {
      child.attrs = cleanAttributes(child, prefix);
      kept.push(child);
    } else {
      for (const grandchild of child.childNodes ?? []) {
        grandchild.parentNode = parent;
        kept.push(grandchild);
      }
    }
  }
  parent.childNodes = kept;
}

function isAllowed(element: Node): boolean {
  const name = element.tagName!;
  switch (element.namespaceURI) {
    case HTML_NS:
      return HTML_KEEP.has(name.toLowerCase());
    case SVG_NS:
      return SVG_KEEP.has(name);
    case MATHML_NS:
      return MATHML_KEEP.has(name);
    default:
      return false;
  }
}

function cleanAttributes(element: Node, prefix: string): Attribute[] {
  const kept: Attribute[] = [];
  for (const attribute of element.attrs ?? []) {
    const name = (attribute.prefix ? `${attribute.prefix}:${attribute.name}` : attribute.name)
      .toLowerCase();
    let value = attribute.value;
    if (name.startsWith("on") || name.startsWith("xmlns") || DROP_ATTRIBUTES.has(name)) continue;
    if (!/^[a-z][a-z0-9:._-]*$/.test(name)) continue;
    if (ADDRESS_ATTRIBUTES.has(name)) {
      const trimmed = value.trim();
      if ((name === "href" || name === "xlink:href") && /^#[^\s]*$/.test(trimmed)) {
        kept.push({ ...attribute, value: "#" + prefix + trimmed.slice(1) });
      } else if (name === "src" || name === "href" || name === "xlink:href") {
        // Images (HTML img, SVG image) may carry their picture inline.
        const tag = element.tagName!.toLowerCase();
        if ((tag === "img" || tag === "image") && DATA_IMAGE.test(trimmed)) kept.push(attribute);
      }
      continue;
    }
    if (name === "style") {
      if (
        /url\s*\(|expression\s*\(|@|\\|javascript:|behavior|binding|image-set|image\s*\(/i.test(
          value,
        )
      ) continue;
    } else if (/url\s*\(/i.test(value)) {
      // Paint servers and clip paths: `url(#id)` within this output only.
      if (/url\s*\(\s*(?!['"]?#)/i.test(value)) continue;
      value = value.replace(/url\s*\(\s*(['"]?)#/gi, (_all, quote) => `url(${quote}#${prefix}`);
    }
    if (name === "id") {
      value = prefix + value;
    } else if (ID_REFERENCE_ATTRIBUTES.has(name)) {
      value = value.split(/\s+/).filter(Boolean).map((id) => prefix + id).join(" ");
    } else if (name === "class") {
      value = value.split(/\s+/).filter((token) => token !== "" && !token.startsWith("lt-")).join(
        " ",
      );
      if (value === "") continue;
    }
    kept.push({ ...attribute, value });
  }
  return kept;
}
