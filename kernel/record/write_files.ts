/**
 * Writing files so that a reader never sees half of one: write a temporary file in the
 * same folder, flush it, then rename it over the old one (a rename within a folder is
 * atomic). Used for notebooks and their chart files.
 *
 * @module
 */
import { basename, dirname, joinPath } from "../_paths.ts";

/**
 * Writes bytes or text to a file atomically, keeping the old file's permissions.
 *
 * @param path The file to write.
 * @param content Text (written as UTF-8) or bytes.
 * @returns When the new file is in place.
 *
 * @example
 * ```ts
 * import { writeFileAtomic } from "./write_files.ts";
 * import { equal } from "node:assert/strict";
 * const dir = await Deno.makeTempDir();
 * await writeFileAtomic(`${dir}/a.md`, "old");
 * await writeFileAtomic(`${dir}/a.md`, "new");
 * equal(await Deno.readTextFile(`${dir}/a.md`), "new");
 * equal([...Deno.readDirSync(dir)].length, 1);
 * await Deno.remove(dir, { recursive: true });
 * ```
 */
export async function writeFileAtomic(path: string, content: string | Uint8Array): Promise<void> {
  const bytes = typeof content === "string" ? new TextEncoder().encode(content) : content;
  const random = crypto.getRandomValues(new Uint32Array(2)).join("");
  const temporary = joinPath(dirname(path), `.${basename(path)}.${random}.tmp`);
  let mode: number | undefined;
  try {
    mode = (await Deno.stat(path)).mode ?? undefined;
  } catch {
    // A new file: default permissions.
  }
  const file = await Deno.open(temporary, { write: true, createNew: true, mode: mode ?? 0o644 });
  try {
    let written = 0;
    while (written < bytes.length) written += await file.write(bytes.subarray(written));
    await file.syncData();
  } catch (error) {
    file.close();
    await Deno.remove(temporary).catch(() => {});
    throw error;
  }
  file.close();
  try {
    await Deno.rename(temporary, path);
  } catch (error) {
    await Deno.remove(temporary).catch(() => {});
    throw error;
  }
}
