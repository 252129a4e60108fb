/**
 * File paths and `file:` URLs, without the standard library (JSR is out of reach).
 *
 * @module
 */

/**
 * Converts an absolute path to a `file:` URL, escaping what URLs need escaped.
 *
 * @param path An absolute path.
 * @returns The URL's text.
 *
 * @example
 * ```ts
 * import { fileUrlFromPath } from "./_paths.ts";
 * import { equal } from "node:assert/strict";
 * equal(fileUrlFromPath("/home/amp/my design#2.md"), "file:///home/amp/my%20design%232.md");
 * ```
 */
export function fileUrlFromPath(path: string): string {
  const url = new URL("file:///");
  const slashed = path.replace(/\\/g, "/");
  url.pathname = /^[A-Za-z]:\//.test(slashed) ? "/" + slashed : slashed;
  return url.href;
}

/**
 * Converts a `file:` URL to a path.
 *
 * @param url The URL (text or object).
 * @returns The path.
 *
 * @example
 * ```ts
 * import { pathFromFileUrl } from "./_paths.ts";
 * import { equal } from "node:assert/strict";
 * equal(pathFromFileUrl("file:///home/amp/my%20design.md"), "/home/amp/my design.md");
 * ```
 */
export function pathFromFileUrl(url: string | URL): string {
  const pathname = decodeURIComponent(new URL(url).pathname);
  return /^\/[A-Za-z]:\//.test(pathname) ? pathname.slice(1).replace(/\//g, "\\") : pathname;
}

/**
 * The folder part of a path.
 *
 * @param path A path.
 * @returns Everything before the last separator (`"."` when there is none).
 *
 * @example
 * ```ts
 * import { dirname } from "./_paths.ts";
 * import { equal } from "node:assert/strict";
 * equal(dirname("/home/amp/design.md"), "/home/amp");
 * ```
 */
export function dirname(path: string): string {
  const at = Math.max(path.lastIndexOf("/"), path.lastIndexOf("\\"));
  if (at < 0) return ".";
  return at === 0 ? path.slice(0, 1) : path.slice(0, at);
}

/**
 * The last part of a path.
 *
 * @param path A path.
 * @returns The file or folder name.
 *
 * @example
 * ```ts
 * import { basename } from "./_paths.ts";
 * import { equal } from "node:assert/strict";
 * equal(basename("/home/amp/design.md"), "design.md");
 * ```
 */
export function basename(path: string): string {
  return path.split(/[\\/]/).pop() ?? path;
}

/**
 * Joins path parts with `/` (Deno accepts `/` on every system).
 *
 * @param parts Path parts.
 * @returns The joined path.
 *
 * @example
 * ```ts
 * import { joinPath } from "./_paths.ts";
 * import { equal } from "node:assert/strict";
 * equal(joinPath("/home/amp/", "charts", "a.svg"), "/home/amp/charts/a.svg");
 * ```
 */
export function joinPath(...parts: string[]): string {
  return parts.map((
    part,
    i,
  ) => (i === 0 ? part.replace(/[\\/]+$/, "") : part.replace(/^[\\/]+|[\\/]+$/g, "")))
    .filter((part, i) => part !== "" || i === 0).join("/");
}

/**
 * Makes a path absolute against the working folder.
 *
 * @param path A path.
 * @returns The absolute path, `.` and `..` resolved.
 *
 * @example
 * ```ts
 * import { absolutePath } from "./_paths.ts";
 * import { equal } from "node:assert/strict";
 * equal(absolutePath("/a/b/../c.md"), "/a/c.md");
 * ```
 */
export function absolutePath(path: string): string {
  const isAbsolute = path.startsWith("/") || /^[A-Za-z]:[\\/]/.test(path);
  const base = isAbsolute ? "" : Deno.cwd() + "/";
  return pathFromFileUrl(new URL(fileUrlFromPath(base + path)).href);
}

/** The longtail checkout this code runs from (holds deno.json, lib/, kernel/). */
export const ROOT_DIR: string = pathFromFileUrl(new URL("../", import.meta.url)).replace(/\/$/, "");
