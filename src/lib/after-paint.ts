import { useEffect, useState } from "react";

/**
 * Runs `fn` once the browser has painted the next frame: a task queued from
 * that frame's animation callback runs after its paint. Returns a cancel.
 * Work that can wait one frame (scrolling a list to a new selection, timing
 * marks) goes here, so what the user acted on is drawn first.
 */
export function afterNextPaint(fn: () => void): () => void {
  let timer: ReturnType<typeof setTimeout> | undefined;
  const frame = requestAnimationFrame(() => {
    timer = setTimeout(fn, 0);
  });
  return () => {
    cancelAnimationFrame(frame);
    if (timer !== undefined) clearTimeout(timer);
  };
}

/**
 * `value`, one painted frame late: for a part of the page that should follow
 * a change without holding up the paint of what the user acted on.
 */
export function useAfterPaint<T>(value: T): T {
  const [shown, setShown] = useState(value);
  useEffect(() => {
    if (Object.is(shown, value)) return;
    return afterNextPaint(() => setShown(value));
  }, [shown, value]);
  return shown;
}
