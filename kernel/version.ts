/**
 * The longtail version, read from deno.json so there is one place to change it.
 *
 * @module
 */
import config from "../deno.json" with { type: "json" };

/**
 * The version that records results (written on each recorded notebook's version line).
 *
 * @example
 * ```ts
 * import { LONGTAIL_VERSION } from "./version.ts";
 * import { match } from "node:assert/strict";
 * match(LONGTAIL_VERSION, /^\d+\.\d+\.\d+/);
 * ```
 */
export const LONGTAIL_VERSION: string = (config as { version?: string }).version ?? "0.0.0";
