// Types of scripts/shared-cache.mjs, which runs in plain Node (no TypeScript) beside serve.mjs.
import type { IncomingMessage, ServerResponse } from "node:http";

export declare const MAX_KEPT_ANSWER_BYTES: number;

/** A connect-style middleware: a kept answer, or `next()`'s, kept when it may be. */
export interface SharedCache {
  (req: IncomingMessage, res: ServerResponse, next: () => Promise<void> | void): Promise<void>;
  /** How many addresses have answers kept. */
  size(): number;
}

export declare function createSharedCache(options?: { maxBytes?: number }): SharedCache;
