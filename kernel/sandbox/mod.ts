/**
 * The sandbox: a child `deno run` process with narrow permissions that runs compiled cells
 * and keeps their values, the protocol it speaks, and how values are described.
 *
 * @module
 */
export * from "./protocol.ts";
export * from "./sandbox.ts";
export * from "./describe_value.ts";
