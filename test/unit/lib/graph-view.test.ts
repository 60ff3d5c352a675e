import { fc, test } from "@fast-check/vitest";
import { describe, expect } from "vitest";
import {
  NODE_TEXT_PX,
  READABLE_TEXT_PX,
  VIEW_PADDING,
  boundsOf,
  canvasHeight,
  initialViewport,
} from "../../../src/lib/graph-view";

const node = (x: number, y: number) => ({ x, y, width: 200, height: 64 });

describe("the Explorer's first view", () => {
  test("a graph wider than the canvas stays readable: zoom 1, the root at the left edge, centred in height", () => {
    const bounds = boundsOf([node(0, 0), node(2800, 400)]);
    const v = initialViewport(bounds, { width: 1000, height: 600 }, node(0, 0));
    expect(v.zoom).toBe(1);
    expect(NODE_TEXT_PX * v.zoom).toBeGreaterThanOrEqual(READABLE_TEXT_PX);
    expect(v.x).toBe(VIEW_PADDING);
    expect(v.y).toBe((600 - 464) / 2);
  });

  test("a selected path's end far to the right is brought into view, and no further than the graph's end", () => {
    const bounds = boundsOf([node(0, 0), node(2800, 400)]);
    const end = node(2000, 400);
    const v = initialViewport(bounds, { width: 1000, height: 600 }, end);
    expect(end.x * v.zoom + v.x).toBeGreaterThanOrEqual(0);
    expect((end.x + end.width) * v.zoom + v.x).toBeLessThanOrEqual(1000 - VIEW_PADDING);
    const last = node(2800, 0);
    const atEnd = initialViewport(bounds, { width: 1000, height: 600 }, last);
    expect((last.x + last.width) * atEnd.zoom + atEnd.x).toBe(1000 - VIEW_PADDING);
  });

  test("a small graph fits the width, centred, and is not blown up past 1.25", () => {
    const bounds = boundsOf([node(0, 0), node(200, 0)]);
    const v = initialViewport(bounds, { width: 1000, height: 600 }, null);
    expect(v.zoom).toBe(1.25);
    expect(v.x + (bounds.width * v.zoom) / 2).toBeCloseTo(500, 9);
  });

  test("the canvas is as tall as the graph at the readable zoom, never under 240 px", () => {
    expect(canvasHeight(boundsOf([node(0, 0), node(0, 900)]))).toBe(964 + 2 * VIEW_PADDING);
    expect(canvasHeight(boundsOf([node(0, 0)]))).toBe(240);
  });

  const box = fc.record({
    x: fc.integer({ min: -2000, max: 4000 }),
    y: fc.integer({ min: -2000, max: 4000 }),
    width: fc.integer({ min: 50, max: 6000 }),
    height: fc.integer({ min: 50, max: 6000 }),
  });
  const canvas = fc.record({ width: fc.integer({ min: 320, max: 2400 }), height: fc.integer({ min: 240, max: 1400 }) });
  const focusIn = (b: { x: number; y: number; width: number; height: number }) =>
    fc.record({
      x: fc.integer({ min: b.x, max: b.x + b.width - 40 }),
      y: fc.integer({ min: b.y, max: b.y + b.height - 40 }),
      width: fc.constant(40),
      height: fc.constant(40),
    });

  test.prop([box.chain((b) => fc.tuple(fc.constant(b), canvas, focusIn(b)))], { numRuns: 300 })(
    "whatever the graph and canvas: text at least 12 px, and the focus node on screen",
    ([b, c, f]) => {
      const v = initialViewport(b, c, f);
      expect(NODE_TEXT_PX * v.zoom).toBeGreaterThanOrEqual(READABLE_TEXT_PX);
      expect(f.x * v.zoom + v.x).toBeGreaterThanOrEqual(-1e-9);
      expect((f.x + f.width) * v.zoom + v.x).toBeLessThanOrEqual(c.width + 1e-9);
      expect(f.y * v.zoom + v.y).toBeGreaterThanOrEqual(-1e-9);
      expect((f.y + f.height) * v.zoom + v.y).toBeLessThanOrEqual(c.height + 1e-9);
    },
  );
});
