/**
 * Notebook sessions: requests in, events out, no knowledge of any front-end.
 *
 * @module
 */
export * from "./events.ts";
export * from "./session.ts";
