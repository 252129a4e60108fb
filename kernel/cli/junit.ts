/**
 * A JUnit XML report of `verify`, the format most CI systems read: one test case per
 * notebook, with the reasons it failed.
 *
 * @module
 */

/** One notebook's line in the report. */
export interface JunitCase {
  /** Test name (the notebook's path). */
  name: string;
  /** Seconds it took. */
  seconds: number;
  /** Failure text, when it failed. */
  failure?: string;
  /** True when it could not be read (an error rather than a failure). */
  error?: boolean;
}

/**
 * Writes the JUnit XML text.
 *
 * @param suite Name of the test suite.
 * @param cases The test cases.
 * @returns The XML document.
 *
 * @example
 * ```ts
 * import { junitXml } from "./junit.ts";
 * import { match } from "node:assert/strict";
 * const xml = junitXml("longtail verify", [{ name: "a.md", seconds: 1.5, failure: "r1 < 5 & more" }]);
 * match(xml, /<testsuite name="longtail verify" tests="1" failures="1" errors="0"/);
 * match(xml, /r1 &lt; 5 &amp; more/);
 * ```
 */
export function junitXml(suite: string, cases: readonly JunitCase[]): string {
  const failures = cases.filter((c) => c.failure !== undefined && !c.error).length;
  const errors = cases.filter((c) => c.error).length;
  const total = cases.reduce((sum, c) => sum + c.seconds, 0);
  const lines = [
    `<?xml version="1.0" encoding="UTF-8"?>`,
    `<testsuites>`,
    `  <testsuite name="${
      xml(suite)
    }" tests="${cases.length}" failures="${failures}" errors="${errors}" time="${
      total.toFixed(3)
    }">`,
  ];
  for (const c of cases) {
    const open = `    <testcase classname="${xml(suite)}" name="${xml(c.name)}" time="${
      c.seconds.toFixed(3)
    }"`;
    if (c.failure === undefined) {
      lines.push(`${open}/>`);
      continue;
    }
    const tag = c.error ? "error" : "failure";
    const first = c.failure.split("\n")[0];
    lines.push(
      `${open}>`,
      `      <${tag} message="${xml(first)}">${xml(c.failure)}</${tag}>`,
      `    </testcase>`,
    );
  }
  lines.push(`  </testsuite>`, `</testsuites>`, ``);
  return lines.join("\n");
}

function xml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`).replace(/&#38;/g, "&amp;")
    .replace(/&#60;/g, "&lt;").replace(/&#62;/g, "&gt;").replace(/&#34;/g, "&quot;")
    // Characters XML 1.0 forbids (control characters) are dropped.
    // deno-lint-ignore no-control-regex
    .replace(/[\x00-\x08\x0b\x0c\x0e-\x1f]/g, "");
}
