import { fc, test } from "@fast-check/vitest";
import { describe, expect, vi } from "vitest";
import { createCanvasStore, overlayChanged, type CanvasMarks, type DrawnEdge } from "@/components/graph/canvas-store";

const marks = (over: Partial<CanvasMarks> = {}): CanvasMarks => ({
  fastest: 10,
  launchAt: 15,
  pathNodes: new Set(),
  pathEdges: new Set(),
  end: null,
  focus: null,
  ...over,
});

const ids = ["a", "b", "c", "d", "e", "ab", "bc", "cd"];
const idArb = fc.constantFrom(...ids);
const marksArb = fc.record({
  pathNodes: fc.uniqueArray(idArb, { maxLength: 5 }),
  pathEdges: fc.uniqueArray(idArb, { maxLength: 5 }),
  end: fc.option(idArb, { nil: null }),
  focus: fc.option(idArb, { nil: null }),
});
const toMarks = (m: { pathNodes: string[]; pathEdges: string[]; end: string | null; focus: string | null }) =>
  // Sets built in a shuffled order: the overlay compares contents, not insertion order.
  marks({
    pathNodes: new Set([...m.pathNodes].reverse()),
    pathEdges: new Set(m.pathEdges),
    end: m.end,
    focus: m.focus,
  });

/** What the overlay draws from the marks, as a string: the same reading the overlay makes. */
const drawing = (m: CanvasMarks) =>
  ids
    .map((id) => [m.pathNodes.has(id), m.pathEdges.has(id), m.end === id, m.focus === id].map(Number).join(""))
    .join(" ");

const edge = (d: string): DrawnEdge => ({ d, kind: "follow", label: null });

describe("canvas store", () => {
  // The store's promise to the overlay: told exactly when what it draws changes.
  test.prop([marksArb, marksArb])("tells the overlay exactly when what it draws changes", (a, b) => {
    const [prev, next] = [toMarks(a), toMarks(b)];
    expect(overlayChanged(prev, next)).toBe(drawing(prev) !== drawing(next));

    const store = createCanvasStore(prev);
    const overlay = vi.fn();
    store.subscribeOverlay(overlay);
    const before = store.overlayVersion();
    store.setState(next);
    expect(overlay).toHaveBeenCalledTimes(drawing(prev) !== drawing(next) ? 1 : 0);
    expect(store.overlayVersion() !== before).toBe(drawing(prev) !== drawing(next));
    expect(store.getState()).toBe(next);
  });

  test("tells the nodes about a rule change only, and stops telling a listener that left", () => {
    const store = createCanvasStore(marks());
    const [rules, overlay] = [vi.fn(), vi.fn()];
    const leave = store.subscribeRules(rules);
    store.subscribeOverlay(overlay);

    store.setState(marks({ pathNodes: new Set(["a", "b"]), end: "b" }));
    expect([rules.mock.calls.length, overlay.mock.calls.length]).toEqual([0, 1]);
    store.setState(marks({ pathNodes: new Set(["a", "b"]), end: "b", fastest: 12 }));
    expect([rules.mock.calls.length, overlay.mock.calls.length]).toEqual([1, 1]);
    store.setState(marks({ pathNodes: new Set(["a", "b"]), end: "b", fastest: 12, launchAt: 16 }));
    expect(rules).toHaveBeenCalledTimes(2);

    leave();
    store.setState(marks({ fastest: 11 }));
    expect(rules).toHaveBeenCalledTimes(2);
  });

  test("keeps where each edge is drawn, and redraws the overlay only for an edge of the path", () => {
    const store = createCanvasStore(marks({ pathEdges: new Set(["ab"]) }));
    const overlay = vi.fn();
    store.subscribeOverlay(overlay);

    store.setDrawnEdge("cd", edge("M0,0 L1,1"));
    expect(overlay).not.toHaveBeenCalled();
    expect(store.drawnEdge("cd")?.d).toBe("M0,0 L1,1");

    store.setDrawnEdge("ab", edge("M0,0 L2,2"));
    expect(overlay).toHaveBeenCalledTimes(1);
    // The same drawing again is no news.
    store.setDrawnEdge("ab", edge("M0,0 L2,2"));
    expect(overlay).toHaveBeenCalledTimes(1);
    store.setDrawnEdge("ab", { ...edge("M0,0 L2,2"), label: { text: "b~", x: 1, y: 1 } });
    expect(overlay).toHaveBeenCalledTimes(2);

    store.setDrawnEdge("ab", null);
    expect(store.drawnEdge("ab")).toBeUndefined();
    expect(overlay).toHaveBeenCalledTimes(3);
  });
});
