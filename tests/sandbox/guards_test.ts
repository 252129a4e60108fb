/**
 * The two small guards this folder's issue added to the kernel: the parser guard (a cell
 * nested deeper than the native parser's stack is reported, not fatal) and the wording of
 * permission denials.
 *
 * @module
 */
import {
  DIRECT_PARSE_LIMIT,
  nestingProblem,
  parsesSafely,
} from "../../kernel/analysis/parse_guard.ts";
import { explainDenial, parseDenial } from "../../kernel/sandbox/denial.ts";
import { assert, assertEquals } from "../_assert.ts";

Deno.test("nestingProblem() reports 10,000 parentheses as too deeply nested instead of crashing", () => {
  const code = "const fine = 1;\nconst deep = " + "(".repeat(10_000) + "1" + ")".repeat(10_000) +
    ";\n";
  const problem = nestingProblem(code);
  assert.ok(problem, "a problem is reported");
  assert.equal(problem.kind, "syntax");
  assert.match(problem.message, /too deeply nested/);
  assert.equal(problem.offset, "const fine = 1;\n".length, "it points at the longest line");
});

Deno.test("parsesSafely() lets a long but shallow cell through", () => {
  const code = Array.from({ length: 400 }, (_, i) => `const v${i} = ${i} * 2;`).join("\n");
  assert.ok(code.length > DIRECT_PARSE_LIMIT, "long enough to need the probe");
  assert.equal(parsesSafely(code), true);
});

Deno.test("explainDenial() names what was tried and the option that grants it", () => {
  const cases: Array<[string, string]> = [
    [
      'Requires read access to "/home/amp/.ssh/id_ed25519", run again with the --allow-read flag',
      "this notebook tried to read /home/amp/.ssh/id_ed25519; grant it with " +
      "--allow-read=/home/amp/.ssh/id_ed25519 if you trust it",
    ],
    [
      'Requires net access to "127.0.0.1:4507", run again with the --allow-net flag',
      "this notebook tried to reach 127.0.0.1:4507; grant it with --allow-net=127.0.0.1:4507 if you trust it",
    ],
    [
      'Requires env access to "HOME", run again with the --allow-env flag',
      "this notebook tried to read the environment variable HOME; grant it with --allow-env=HOME if you trust it",
    ],
    [
      'Requires run access to "ls", run again with the --allow-run flag',
      "this notebook tried to start the program ls; notebooks may never start programs",
    ],
    [
      'Requires ffi access to "libc.so.6", run again with the --allow-ffi flag',
      "this notebook tried to load native code from libc.so.6; notebooks may never load native code",
    ],
    [
      'Requires sys access to "hostname", run again with the --allow-sys flag',
      "this notebook tried to read system information (hostname); notebooks may never read it",
    ],
  ];
  for (const [message, expected] of cases) assert.equal(explainDenial(message), expected);
});

Deno.test("explainDenial() shows a relative path as the full path in the notebook's folder", () => {
  assert.equal(
    explainDenial('Requires write access to "./out.txt", run again with the --allow-write flag', {
      notebookDir: "/home/amp/designs/",
    }),
    "this notebook tried to write /home/amp/designs/out.txt; notebooks may never write files " +
      "(longtail record writes their results)",
  );
});

Deno.test("parseDenial() leaves other errors alone", () => {
  assertEquals(parseDenial("TypeError: x is not a function"), undefined);
  assert.equal(explainDenial("RangeError: too big"), "RangeError: too big");
});
