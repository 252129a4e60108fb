/**
 * The design report: a notebook and its finished run as one self-contained HTML file.
 *
 * @module
 */
export * from "./render_report.ts";
export * from "./report_run.ts";
