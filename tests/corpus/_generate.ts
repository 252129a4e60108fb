/**
 * Bad-input notebooks that are generated, not committed: too big, binary, or depending on
 * file modes. Each function writes into a folder (a temporary one in the tests) and
 * returns the path to hand to the command line.
 *
 * @module
 */

function join(dir: string, name: string): string {
  return `${dir.replace(/[\\/]$/, "")}/${name}`;
}

/** A small seeded generator (mulberry32), so "random" bytes are the same on every run. */
export function seededBytes(seed: number, length: number): Uint8Array {
  let state = seed >>> 0;
  const bytes = new Uint8Array(length);
  for (let i = 0; i < length; i++) {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    bytes[i] = ((t ^ (t >>> 14)) >>> 0) & 0xff;
  }
  return bytes;
}

/** A path that does not exist. */
export function missingFile(dir: string): Promise<string> {
  return Promise.resolve(join(dir, "does_not_exist.md"));
}

/** A folder with files but no notebook in it. */
export async function folderWithoutNotebooks(dir: string): Promise<string> {
  const folder = join(dir, "no_notebooks_here");
  await Deno.mkdir(folder, { recursive: true });
  await Deno.writeTextFile(join(folder, "parts_list.txt"), "R1 4k7\nR2 10k\n");
  await Deno.writeTextFile(join(folder, "data.csv"), "f,gain\n1000,40\n");
  return folder;
}

/** A notebook that the current user may not read (mode 000). */
export async function unreadableFile(dir: string): Promise<string> {
  const path = join(dir, "locked.md");
  await Deno.writeTextFile(path, "# Locked\n\n```ts\nconst a = 1;\n```\n");
  await Deno.chmod(path, 0o000);
  return path;
}

/**
 * Whether a file really cannot be read. As root (as CI runs), mode 000 does not stop a
 * read, so the unreadable case has nothing to test there.
 */
export async function isReallyUnreadable(path: string): Promise<boolean> {
  try {
    await Deno.readFile(path);
    return false;
  } catch {
    return true;
  }
}

/** Valid Markdown with invalid UTF-8 on line 6 (a Latin-1 "µ" and a stray 0xff). */
export async function nonUtf8File(dir: string): Promise<string> {
  const path = join(dir, "latin1.md");
  const head = new TextEncoder().encode("# Bias\n\n```ts\nconst bias = 1e-3;\n```\n");
  const bad = new Uint8Array([0x42, 0x69, 0x61, 0x73, 0x20, 0x31, 0x20, 0xb5, 0x41, 0xff, 0x0a]);
  await Deno.writeFile(path, new Uint8Array([...head, ...bad]));
  return path;
}

/** Four kilobytes of seeded random bytes. */
export async function binaryGarbage(dir: string): Promise<string> {
  const path = join(dir, "garbage.md");
  await Deno.writeFile(path, seededBytes(5, 4096));
  return path;
}

/**
 * A notebook saved as UTF-16 without a byte-order mark: every byte is valid UTF-8 (ASCII
 * and NUL), so only the NUL bytes give it away.
 */
export async function utf16WithoutMark(dir: string): Promise<string> {
  const path = join(dir, "utf16.md");
  const text = "# Gain\n\n```ts\nconst gain = 10;\ngain\n```\n";
  const bytes = new Uint8Array(text.length * 2);
  for (let i = 0; i < text.length; i++) bytes[2 * i] = text.charCodeAt(i);
  await Deno.writeFile(path, bytes);
  return path;
}

/** The cell_throws case with CRLF line breaks: the reported lines must not move. */
export async function crlfThrows(dir: string, corpusDir: string): Promise<string> {
  const path = join(dir, "crlf_throws.md");
  const text = await Deno.readTextFile(join(corpusDir, "cell_throws.md"));
  await Deno.writeTextFile(path, text.replace(/\r?\n/g, "\r\n"));
  return path;
}

/** A notebook that starts with a UTF-8 byte-order mark right before its first fence. */
export async function byteOrderMark(dir: string): Promise<string> {
  const path = join(dir, "bom_start.md");
  await Deno.writeTextFile(path, "\uFEFF```ts\nconst answer = 6 * 7;\nanswer\n```\n");
  return path;
}

/** 10,000 cells in a chain: each adds one to the previous cell's value. */
export async function tenThousandCells(dir: string): Promise<string> {
  const path = join(dir, "ten_thousand_cells.md");
  const parts = ["# Ten thousand cells\n\n```ts\nconst v0 = 0;\n```\n"];
  for (let i = 1; i < 10_000; i++) parts.push(`\n\`\`\`ts\nconst v${i} = v${i - 1} + 1;\n\`\`\`\n`);
  parts.push("\n```ts\nv9999 * 1\n```\n");
  await Deno.writeTextFile(path, parts.join(""));
  return path;
}

/** One prose line of 1 MB and one code line of 1 MB (a string literal). */
export async function megabyteLines(dir: string): Promise<string> {
  const path = join(dir, "megabyte_line.md");
  const prose = "gain ".repeat(200_000);
  const literal = "x".repeat(1_000_000);
  await Deno.writeTextFile(
    path,
    `# Long lines\n\n${prose}\n\n\`\`\`ts\nconst long = "${literal}";\nlong.length\n\`\`\`\n`,
  );
  return path;
}

/** A code line of 1 MB that is one long sum: 500,000 terms for the parser to nest. */
export async function megabyteExpression(dir: string): Promise<string> {
  const path = join(dir, "megabyte_expression.md");
  const sum = "1" + "+1".repeat(500_000);
  await Deno.writeTextFile(
    path,
    `# A long sum\n\n\`\`\`ts\nconst fine = 1;\nfine\n\`\`\`\n\n\`\`\`ts\nconst total = ${sum};\n\`\`\`\n\n\`\`\`ts\nfine * 2\n\`\`\`\n`,
  );
  return path;
}

/** Ten thousand nested parentheses in one cell. */
export async function deepNesting(dir: string): Promise<string> {
  const path = join(dir, "deep_nesting.md");
  const nested = "(".repeat(10_000) + "1" + ")".repeat(10_000);
  await Deno.writeTextFile(
    path,
    `# Deep nesting\n\n\`\`\`ts\nconst deep = ${nested};\n\`\`\`\n\n\`\`\`ts\nconst shallow = (1 + 2) * 3;\nshallow\n\`\`\`\n`,
  );
  return path;
}
