/**
 * The report's style sheet: a calm paper-like page on screen, a plain review document in
 * print. Our own design: warm off-white paper, slate ink, one muted blue for links and
 * cell numbers, and verdicts that carry a word and a mark as well as a colour (so they
 * survive black-and-white printing and colour-blind readers).
 *
 * Every class of the report starts with `lt-`; the sanitiser strips such classes from cell
 * outputs, so an output cannot dress up as a verdict.
 *
 * @module
 */

/** The report's CSS (inlined in a `<style>` element). */
export const REPORT_CSS: string = `
:root {
  --lt-paper: #fbfaf6;
  --lt-ink: #23272b;
  --lt-muted: #5f666d;
  --lt-rule: #dedad0;
  --lt-soft: #f2efe7;
  --lt-accent: #2f5d86;
  --lt-pass: #2b6a3d;
  --lt-pass-bg: #e6f0e7;
  --lt-fail: #9c2f22;
  --lt-fail-bg: #f7e5e0;
  --lt-hold: #75580a;
  --lt-hold-bg: #f5eed8;
  --lt-serif: Charter, "Bitstream Charter", "Sitka Text", Cambria, "DejaVu Serif", Georgia, serif;
  --lt-sans: system-ui, "Segoe UI", "DejaVu Sans", "Helvetica Neue", Arial, sans-serif;
  --lt-mono: ui-monospace, "Cascadia Mono", "DejaVu Sans Mono", Menlo, Consolas, monospace;
}
* { box-sizing: border-box; }
html { background: var(--lt-paper); color: var(--lt-ink); }
body {
  margin: 0 auto;
  max-width: 52rem;
  padding: 2.5rem 1.75rem 4rem;
  font: 17px/1.6 var(--lt-serif);
  -webkit-text-size-adjust: 100%;
}
h1, h2, h3, h4, h5, h6 { font-family: var(--lt-sans); line-height: 1.25; margin: 2rem 0 0.6rem; }
h1 { font-size: 1.9rem; font-weight: 650; }
h2 { font-size: 1.4rem; font-weight: 600; padding-bottom: 0.25rem; border-bottom: 1px solid var(--lt-rule); }
h3 { font-size: 1.15rem; font-weight: 600; }
h4, h5, h6 { font-size: 1rem; font-weight: 600; }
p, ul, ol, blockquote, table { margin: 0 0 1rem; }
a { color: var(--lt-accent); }
code { font-family: var(--lt-mono); font-size: 0.86em; background: var(--lt-soft); padding: 0.05em 0.3em; border-radius: 3px; }
pre { font-family: var(--lt-mono); font-size: 13.5px; line-height: 1.5; overflow-x: auto; margin: 0; }
pre code { background: none; padding: 0; font-size: inherit; }
blockquote { margin-left: 0; padding: 0.1rem 1rem; border-left: 3px solid var(--lt-rule); color: var(--lt-muted); }
table { border-collapse: collapse; font-size: 0.95rem; }
th, td { padding: 0.3rem 0.7rem; border-bottom: 1px solid var(--lt-rule); text-align: left; vertical-align: top; }
th { font-family: var(--lt-sans); font-weight: 600; font-size: 0.85rem; color: var(--lt-muted); }
hr { border: none; border-top: 1px solid var(--lt-rule); margin: 2rem 0; }
img { max-width: 100%; }
math { font-size: 1.08em; font-family: "Latin Modern Math", "STIX Two Math", "Cambria Math", math; }
.lt-math-display { margin: 0.9rem 0; padding: 0.2rem 0; overflow-x: auto; overflow-y: hidden; text-align: center; }
.lt-math-error { color: var(--lt-fail); }
.lt-nowrap { white-space: nowrap; }
.lt-address { font-size: 0.85em; color: var(--lt-muted); word-break: break-all; }
.lt-missing-image { font-style: italic; color: var(--lt-muted); }

/* Header */
.lt-head { margin-bottom: 2.5rem; }
.lt-kicker { font: 600 0.78rem/1 var(--lt-sans); letter-spacing: 0.08em; text-transform: uppercase; color: var(--lt-accent); margin: 0 0 0.6rem; }
.lt-head h1 { margin: 0 0 1rem; }
.lt-facts { display: grid; grid-template-columns: max-content 1fr; gap: 0.2rem 1.2rem; margin: 0 0 1.75rem; font: 0.88rem/1.45 var(--lt-sans); }
.lt-facts dt { color: var(--lt-muted); }
.lt-facts dd { margin: 0; overflow-wrap: anywhere; }
.lt-panel { border: 1px solid var(--lt-rule); border-radius: 6px; background: #fff; padding: 1rem 1.1rem 0.6rem; margin-bottom: 1.2rem; overflow-x: auto; }
.lt-panel h2 { margin: 0 0 0.7rem; border: none; padding: 0; font-size: 1.1rem; }
.lt-tally { font-weight: 400; color: var(--lt-muted); font-size: 0.95rem; margin-left: 0.4rem; }
.lt-checks { width: 100%; font-family: var(--lt-sans); font-size: 0.84rem; line-height: 1.4; margin: 0 0 0.4rem; }
.lt-checks th, .lt-checks td { padding: 0.3rem 0.45rem; }
.lt-checks td:nth-child(2) { min-width: 11rem; }
.lt-checks td.lt-num { text-align: right; font-variant-numeric: tabular-nums; }
.lt-checks th.lt-num { text-align: right; }
.lt-ratio { color: var(--lt-muted); }
.lt-checks tr:last-child td { border-bottom: none; }
.lt-checks tr.lt-row-fail td { background: var(--lt-fail-bg); }
.lt-empty { color: var(--lt-muted); font-family: var(--lt-sans); font-size: 0.9rem; }
.lt-problems { font-family: var(--lt-sans); font-size: 0.9rem; padding-left: 1.2rem; }

/* Verdicts: a word and a mark, not colour alone */
.lt-verdict { display: inline-block; border: 1px solid transparent; font: 600 0.74rem/1.5 var(--lt-sans); letter-spacing: 0.03em; padding: 0 0.45rem; border-radius: 3px; white-space: nowrap; }
.lt-verdict-pass { color: var(--lt-pass); background: var(--lt-pass-bg); }
.lt-verdict-fail { color: var(--lt-fail); background: var(--lt-fail-bg); border: 1px solid currentColor; }
.lt-verdict-hold { color: var(--lt-hold); background: var(--lt-hold-bg); }

/* Cells */
.lt-cell { margin: 1.4rem 0 1.8rem; border-left: 3px solid var(--lt-rule); padding-left: 1rem; }
.lt-cell[data-status="failed"] { border-left-color: var(--lt-fail); }
.lt-cell[data-status="blocked"] { border-left-color: #c9b57a; }
.lt-cell-head { display: flex; flex-wrap: wrap; align-items: baseline; gap: 0.25rem 0.8rem; font: 0.8rem/1.4 var(--lt-sans); color: var(--lt-muted); margin-bottom: 0.35rem; }
.lt-cell-number { font-weight: 650; color: var(--lt-accent); text-decoration: none; }
.lt-code { margin: 0 0 0.6rem; }
.lt-code > summary { cursor: pointer; font: 0.8rem/1.6 var(--lt-sans); color: var(--lt-muted); list-style-position: inside; }
.lt-code > summary:hover { color: var(--lt-ink); }
.lt-code pre { background: var(--lt-soft); border-radius: 5px; padding: 0.75rem 0.9rem; margin-top: 0.35rem; }
.lt-output { contain: paint; overflow: auto; max-width: 100%; margin: 0.5rem 0; position: relative; }
.lt-output > svg { display: block; max-width: 100%; height: auto; }
.lt-output svg text { white-space: pre; }
.lt-figure { margin: 0.8rem 0; background: #fff; border: 1px solid var(--lt-rule); border-radius: 5px; padding: 0.4rem; }
.lt-output-text { background: #fff; border: 1px solid var(--lt-rule); border-radius: 5px; padding: 0.6rem 0.85rem; }
.lt-output-html { font-size: 0.95rem; }
.lt-stream { border-left: 2px solid var(--lt-rule); padding: 0.2rem 0 0.2rem 0.7rem; color: var(--lt-muted); margin: 0.4rem 0; }
.lt-stream-err { border-left-color: var(--lt-hold); color: var(--lt-hold); }
.lt-cell-checks { list-style: none; padding: 0; margin: 0.5rem 0; font: 0.86rem/1.5 var(--lt-sans); }
.lt-cell-checks li { padding-left: 4.2rem; text-indent: -4.2rem; }
.lt-cell-checks .lt-verdict { text-indent: 0; min-width: 3.7rem; text-align: center; margin-right: 0.35rem; }
.lt-cell-checks li { padding-top: 0.15rem; padding-bottom: 0.15rem; scroll-margin-top: 1rem; }
.lt-cell-checks li:target { background: var(--lt-hold-bg); }
.lt-error { border: 1px solid var(--lt-fail); background: var(--lt-fail-bg); border-radius: 5px; padding: 0.6rem 0.85rem; margin: 0.5rem 0; font-family: var(--lt-sans); font-size: 0.9rem; }
.lt-error-title { font-weight: 650; color: var(--lt-fail); margin: 0 0 0.3rem; }
.lt-error pre { white-space: pre-wrap; overflow-wrap: anywhere; }
.lt-error .lt-source { background: #fff; border-radius: 3px; padding: 0.3rem 0.5rem; margin: 0.4rem 0; color: var(--lt-ink); }
.lt-error details { margin-top: 0.3rem; color: var(--lt-muted); }
.lt-note { font: 0.88rem/1.5 var(--lt-sans); color: var(--lt-hold); background: var(--lt-hold-bg); border-radius: 5px; padding: 0.45rem 0.8rem; margin: 0.5rem 0; }
.lt-foot { margin-top: 3rem; padding-top: 0.8rem; border-top: 1px solid var(--lt-rule); font: 0.8rem/1.5 var(--lt-sans); color: var(--lt-muted); }

/* Code colours (our own, quiet) */
.hljs-keyword, .hljs-built_in.hljs-keyword { color: #6b3f86; }
.hljs-string, .hljs-regexp { color: #2f6a3f; }
.hljs-number, .hljs-literal { color: #97500f; }
.hljs-comment { color: #7b8086; font-style: italic; }
.hljs-built_in, .hljs-type { color: #2f5d86; }
.hljs-title, .hljs-title.function_ { color: #1d4e6b; }
.hljs-attr, .hljs-property { color: #3e4d5e; }
.hljs-meta { color: #7b8086; }

@page { margin: 16mm 15mm; }
@media print {
  html, body { background: #fff; }
  body { max-width: none; padding: 0; font-size: 11pt; }
  a { color: inherit; text-decoration: none; }
  h1, h2, h3, h4 { break-after: avoid; }
  .lt-panel, .lt-figure, .lt-output-text, .lt-error, table, pre, .lt-math-display { break-inside: avoid; }
  .lt-figure svg { max-height: 235mm; width: auto; }
  .lt-code > summary { list-style: none; }
  .lt-code > summary::-webkit-details-marker { display: none; }
  details::details-content { content-visibility: visible; display: contents; }
  .lt-output { overflow: visible; }
  pre { white-space: pre-wrap; overflow-wrap: anywhere; }
  .lt-checks tr.lt-row-fail td { background: none; }
  .lt-verdict { border: 1px solid currentColor; }
}
`;
