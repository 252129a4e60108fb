/**
 * fast-check generators of cell code for the analysis fuzz tests: statements of every
 * declaration form, with the names each one defines and uses known by construction.
 *
 * Names come from three pools so the expected answer is easy to compute:
 *
 *     d0, d1, …   declared at the cell's top level (fresh for each declaration)
 *     fa … ff     free: used without being declared at the top level
 *     Ta … Tc     free types: used only in type positions
 *
 * Local names (parameters, block `const`s, catch bindings) are drawn from the *free* pool
 * on purpose: inside their scope they shadow, so an occurrence there must not count as a
 * use, while the same name used outside still does.
 *
 * @module
 */
import fc from "fast-check";

/** Free value names a statement may use. */
export const FREE_NAMES: readonly string[] = ["fa", "fb", "fc", "fd", "fe", "ff"];
/** Free type names a statement may use in type positions. */
export const FREE_TYPES: readonly string[] = ["Ta", "Tb", "Tc"];

/** A generated statement with what it must define and use. */
export interface GeneratedStatement {
  /** The code. */
  code: string;
  /** Top-level names it declares, in source order, with whether they are types only. */
  defines: Array<{ name: string; typeOnly: boolean }>;
  /** Free value names it reads (outside any scope that shadows them). */
  uses: string[];
  /** Free value names it writes (`fa = 1`, `fa++`). */
  writes: string[];
  /** Free names it uses only as types. */
  typeUses: string[];
  /** For an expression statement last in the statement: its expression (the shown value). */
  shown?: string;
}

/** Declaration and statement templates: (fresh declared names, free names, a shadow) → statement. */
type Template = (d: string[], f: string[], s: string, t: string) => GeneratedStatement;

const value = (name: string) => ({ name, typeOnly: false });
const typeName = (name: string) => ({ name, typeOnly: true });
const stmt = (
  code: string,
  defines: GeneratedStatement["defines"],
  uses: string[] = [],
  extra: Partial<GeneratedStatement> = {},
): GeneratedStatement => ({ code, defines, uses, writes: [], typeUses: [], ...extra });

const TEMPLATES: readonly Template[] = [
  (d, f) => stmt(`const ${d[0]} = ${f[0]} + 1;`, [value(d[0])], [f[0]]),
  (d, f) => stmt(`let ${d[0]} = Math.max(${f[0]}, 2);`, [value(d[0])], [f[0]]),
  (d) => stmt(`var ${d[0]};`, [value(d[0])]),
  (d, f) => stmt(`let ${d[0]}: number, ${d[1]} = ${f[0]};`, [value(d[0]), value(d[1])], [f[0]]),
  (d, f) =>
    stmt(`const { ${d[0]}, key: ${d[1]}, ...${d[2]} } = ${f[0]};`, [
      value(d[0]),
      value(d[1]),
      value(d[2]),
    ], [f[0]]),
  (d, f) =>
    stmt(`const [${d[0]}, , ${d[1]} = ${f[1]}, ...${d[2]}] = ${f[0]};`, [
      value(d[0]),
      value(d[1]),
      value(d[2]),
    ], [f[1], f[0]]),
  (d, f) =>
    stmt(`const { a: { b: ${d[0]} }, c: [${d[1]}], [${f[1]}]: ${d[2]} } = ${f[0]};`, [
      value(d[0]),
      value(d[1]),
      value(d[2]),
    ], [f[1], f[0]]),
  (d, f, s) =>
    stmt(`function ${d[0]}(${s}: number) { return ${s} * ${f[0]}; }`, [value(d[0])], [f[0]]),
  (d, f, s) =>
    stmt(`function ${d[0]}(${s} = ${f[0]}, ...rest: number[]) { return rest.length + ${s}; }`, [
      value(d[0]),
    ], [f[0]]),
  (d, f, s) =>
    stmt(`async function ${d[0]}() { const ${s} = await ${f[0]}; return ${s}; }`, [value(d[0])], [
      f[0],
    ]),
  (d, f) => stmt(`function* ${d[0]}() { yield ${f[0]}; }`, [value(d[0])], [f[0]]),
  (d, f, s) =>
    stmt(
      `class ${d[0]} { #p = 1; m(${s}: number) { return ${s} + ${f[0]} + this.#p; } static q = ${
        f[1]
      }; }`,
      [value(d[0])],
      [f[0], f[1]],
    ),
  (d, f) => stmt(`class ${d[0]} extends ${f[0]} {}`, [value(d[0])], [f[0]]),
  (d) => stmt(`enum ${d[0]} { A = 1, B, C = A * 2 }`, [value(d[0])]),
  (d, f) => stmt(`namespace ${d[0]} { export const v = ${f[0]}; }`, [value(d[0])], [f[0]]),
  (d) => stmt(`type ${d[0]} = { x: number };`, [typeName(d[0])]),
  (d, _f, _s, t) =>
    stmt(`interface ${d[0]} extends ${t} { x: number }`, [typeName(d[0])], [], { typeUses: [t] }),
  (d) => stmt(`import ${d[0]} from "./parts.ts";`, [value(d[0])]),
  (d) => stmt(`import { gain as ${d[0]}, ${d[1]} } from "./parts.ts";`, [value(d[0]), value(d[1])]),
  (d) => stmt(`import * as ${d[0]} from "./parts.ts";`, [value(d[0])]),
  (d) => stmt(`import type { ${d[0]} } from "./parts.ts";`, [typeName(d[0])]),
  (d) => stmt(`declare const ${d[0]}: number;`, [typeName(d[0])]),
  (d, f) => stmt(`using ${d[0]} = ${f[0]};`, [value(d[0])], [f[0]]),
  (_d, f, s) => stmt(`{ const ${s} = ${f[0]}; console.log(${s}); }`, [], [f[0]]),
  (d, f) => stmt(`{ var ${d[0]} = ${f[0]}; }`, [value(d[0])], [f[0]]),
  (_d, f, s) => stmt(`for (const ${s} of ${f[0]}) { console.log(${s}); }`, [], [f[0]]),
  (_d, f, s) => stmt(`try { ${f[0]}(); } catch (${s}) { console.log(${s}); }`, [], [f[0]]),
  (_d, f, s) => stmt(`if (${f[0]}) { function ${s}() { return 1; } ${s}(); }`, [], [f[0]]),
  (_d, f) => stmt(`${f[0]}.prop = 3;`, [], [f[0]], { shown: `${f[0]}.prop = 3` }),
  (_d, f) => stmt(`${f[0]} = 5;`, [], [], { writes: [f[0]], shown: `${f[0]} = 5` }),
  (_d, f) => stmt(`${f[0]}++;`, [], [f[0]], { writes: [f[0]], shown: `${f[0]}++` }),
  (d, f) => stmt(`const ${d[0]} = { ${f[0]}, key: 1, [${f[1]}]: 2 };`, [value(d[0])], [f[0], f[1]]),
  (d, f) => stmt("const " + d[0] + " = `gain ${" + f[0] + "} dB`;", [value(d[0])], [f[0]]),
  (_d, f) => stmt(`outer: for (;;) { if (${f[0]}) break outer; }`, [], [f[0]]),
  (d, f, s) => stmt(`const ${d[0]} = (${s}: number) => ${s} + ${f[0]};`, [value(d[0])], [f[0]]),
  (d, f) => stmt(`const ${d[0]} = ${f[0]}?.x ?? ${f[1]};`, [value(d[0])], [f[0], f[1]]),
  (d, f) => stmt(`const ${d[0]} = new ${f[0]}();`, [value(d[0])], [f[0]]),
  (d, f) => stmt(`const ${d[0]} = typeof ${f[0]};`, [value(d[0])], [f[0]]),
  (d, _f, _s, t) =>
    stmt(`const ${d[0]}: ${t} = 1 as unknown as ${t};`, [value(d[0])], [], { typeUses: [t] }),
  (_d, f) => stmt(`await ${f[0]};`, [], [f[0]], { shown: `await ${f[0]}` }),
  (d) => stmt(`let ${d[0]} = 1; ${d[0]}++;`, [value(d[0])], [], { shown: `${d[0]}++` }),
  (d, _f, s) =>
    stmt(`const ${d[0]} = function ${s}(): number { return ${s}.length; };`, [value(d[0])]),
  (d) => stmt(`const ${d[0]} = <T,>(x: T): T => x;`, [value(d[0])]),
  (_d, f) => stmt(`${f[0]} * 2`, [], [f[0]], { shown: `${f[0]} * 2` }),
  (_d, f) => {
    const shown = `Math.sqrt(${f[0]}) / Deno.pid`;
    return stmt(shown, [], [f[0]], { shown });
  },
  (d, f) =>
    stmt(`const ${d[0]} = await import("./parts.ts").then((m) => m.x + ${f[0]});`, [value(d[0])], [
      f[0],
    ]),
  (_d, f, s) =>
    stmt(`switch (${f[0]}) { case 1: { const ${s} = 2; console.log(${s}); } }`, [], [f[0]]),
];

/** Per-template shape: template index, a shadow name and free names to fill in. */
const statementShape = fc.record({
  template: fc.integer({ min: 0, max: TEMPLATES.length - 1 }),
  free: fc.array(fc.constantFrom(...FREE_NAMES), { minLength: 2, maxLength: 2 }),
  shadow: fc.constantFrom(...FREE_NAMES),
  type: fc.constantFrom(...FREE_TYPES),
});

/** A generated cell and everything the analysis must find in it. */
export interface GeneratedCell {
  /** The code. */
  code: string;
  /** Top-level names, in source order. */
  defines: Array<{ name: string; typeOnly: boolean }>;
  /** Free value names read. */
  uses: Set<string>;
  /** Free value names written. */
  writes: Set<string>;
  /** Free names used only as types. */
  typeUses: Set<string>;
  /** The last statement's text when it is an expression statement. */
  lastExpression?: string;
}

/**
 * A cell of 0–`maxStatements` generated statements, one per line, with its expected analysis.
 *
 * @param maxStatements Upper bound on statements.
 * @returns An arbitrary of cells.
 */
export function generatedCell(maxStatements = 8): fc.Arbitrary<GeneratedCell> {
  return fc.array(statementShape, { maxLength: maxStatements }).map((shapes) => {
    let counter = 0;
    const statements = shapes.map((shape) => {
      const declared = [0, 1, 2].map(() => `d${counter++}`);
      // Keep a free name from colliding with the shadow in templates that use both.
      const free = shape.free.map((name) => (name === shape.shadow ? "fz" : name));
      return TEMPLATES[shape.template](declared, free, shape.shadow, shape.type);
    });
    const code = statements.map((statement) => statement.code).join("\n");
    const defines = statements.flatMap((statement) => statement.defines);
    const last = statements[statements.length - 1];
    return {
      code,
      defines,
      uses: new Set(statements.flatMap((statement) => statement.uses)),
      writes: new Set(statements.flatMap((statement) => statement.writes)),
      typeUses: new Set(statements.flatMap((statement) => statement.typeUses)),
      lastExpression: last?.shown,
    };
  });
}

/** Tokens that break code when spliced into it. */
export const BREAKING_TOKENS: readonly string[] = [
  "(",
  ")",
  "{",
  "}",
  "[",
  "const",
  "=>",
  "@",
  "#",
  "`",
  "/*",
  "'",
  '"',
  ";;let",
  "\\",
  "\0",
  "\uD800",
  "export",
  "import(",
  "<",
  "?.",
  "...",
  "yield",
  "enum {",
];
