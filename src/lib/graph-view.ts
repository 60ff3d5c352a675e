/**
 * The Explorer's first view of a graph: readable before it is whole. Fitting a wide graph
 * into the canvas shrinks its text to a few pixels; instead the view keeps the nodes at a
 * zoom where their smallest text is at least {@link READABLE_TEXT_PX} CSS pixels, fits the
 * width when that zoom allows it, and otherwise shows the part around the node that matters
 * (the selected path's end, or the root), leaving the rest to panning.
 */

/** The smallest text inside a node, in CSS pixels at zoom 1 (Tailwind's text-xs). */
export const NODE_TEXT_PX = 12;
/** The smallest text a first view may show. */
export const READABLE_TEXT_PX = 12;
/** Space kept around the graph, in screen pixels. */
export const VIEW_PADDING = 24;
/** A small graph is not blown up past this. */
const MAX_FIRST_ZOOM = 1.25;
/** The canvas is never shorter than this, however short the graph. */
export const MIN_CANVAS_PX = 240;

export interface Bounds {
  x: number;
  y: number;
  width: number;
  height: number;
}

export interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

export interface Viewport {
  x: number;
  y: number;
  zoom: number;
}

/** The smallest box around all nodes. */
export function boundsOf(boxes: Iterable<Box>): Bounds {
  let x0 = Infinity;
  let y0 = Infinity;
  let x1 = -Infinity;
  let y1 = -Infinity;
  for (const b of boxes) {
    x0 = Math.min(x0, b.x);
    y0 = Math.min(y0, b.y);
    x1 = Math.max(x1, b.x + b.width);
    y1 = Math.max(y1, b.y + b.height);
  }
  return x0 === Infinity ? { x: 0, y: 0, width: 0, height: 0 } : { x: x0, y: y0, width: x1 - x0, height: y1 - y0 };
}

/** The canvas height the graph asks for at the readable zoom, in CSS pixels (the page caps it to the screen). */
export function canvasHeight(bounds: Bounds): number {
  return Math.max(MIN_CANVAS_PX, Math.ceil(bounds.height * (READABLE_TEXT_PX / NODE_TEXT_PX) + 2 * VIEW_PADDING));
}

/** Keeps `x` in [lo, hi], or at `hi` when the range is empty. */
const clamp = (x: number, lo: number, hi: number) => Math.min(Math.max(x, lo), hi);

/**
 * The first viewport: zoom at least readable, the whole width when it fits (centred), and
 * otherwise the `focus` box in view with the graph's edge kept at the canvas's edge when
 * near it. Vertically the same: the top of the graph at the top, unless the focus lies below.
 */
export function initialViewport(
  bounds: Bounds,
  canvas: { width: number; height: number },
  focus: Box | null,
): Viewport {
  const readable = READABLE_TEXT_PX / NODE_TEXT_PX;
  const fitWidth = (canvas.width - 2 * VIEW_PADDING) / Math.max(bounds.width, 1);
  const fitHeight = (canvas.height - 2 * VIEW_PADDING) / Math.max(bounds.height, 1);
  const zoom = Math.max(readable, Math.min(fitWidth, fitHeight, MAX_FIRST_ZOOM));
  const place = (start: number, size: number, room: number, focusStart: number | null, focusSize: number) => {
    const span = size * zoom;
    if (span + 2 * VIEW_PADDING <= room) return (room - span) / 2 - start * zoom;
    // Too big: the graph's start at the canvas's start, moved on just enough to show the focus.
    const atStart = VIEW_PADDING - start * zoom;
    const atEnd = room - VIEW_PADDING - (start + size) * zoom;
    if (focusStart === null) return atStart;
    const showFocus = room - VIEW_PADDING - (focusStart + focusSize) * zoom;
    return clamp(Math.min(atStart, showFocus), atEnd, atStart);
  };
  return {
    zoom,
    x: place(bounds.x, bounds.width, canvas.width, focus?.x ?? null, focus?.width ?? 0),
    y: place(bounds.y, bounds.height, canvas.height, focus?.y ?? null, focus?.height ?? 0),
  };
}
