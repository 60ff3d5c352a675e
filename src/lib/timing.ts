/**
 * User-timing marks for the Explorer's speed bench (`npm run bench:ui`):
 * `start` when the user acts, `finish` after the next paint. Both are no-ops
 * where the Performance API is missing, and cost one entry otherwise.
 */
import { afterNextPaint } from "./after-paint";

const PREFIX = "framefork:";

/** The Explorer's three actions, and a board re-solved after an edit. */
type TimingName = "select" | "recompute" | "layout" | "board-solve";

export function startTiming(name: TimingName): void {
  if (typeof performance === "undefined") return;
  performance.mark(`${PREFIX}${name}:start`);
}

/** Measures from the last `startTiming(name)` to the paint after this call, once. */
export function finishTimingAfterPaint(name: TimingName): void {
  if (typeof performance === "undefined" || typeof requestAnimationFrame === "undefined") return;
  const start = `${PREFIX}${name}:start`;
  if (performance.getEntriesByName(start, "mark").length === 0) return;
  afterNextPaint(() => {
    if (performance.getEntriesByName(start, "mark").length === 0) return;
    performance.measure(`${PREFIX}${name}`, start);
    performance.clearMarks(start);
  });
}
