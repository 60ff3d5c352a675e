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
