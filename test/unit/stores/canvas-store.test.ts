import { fc, test } from "@fast-check/vitest";
import { describe, expect, vi } from "vitest";
import { shallow } from "zustand/vanilla/shallow";
import { classifyBlock } from "@/lib/engine";
import {
  createCanvasStore,
  overlayChanged,
  selectOverlay,
  type CanvasMarks,
  type CanvasStore,
  type DrawnEdge,
} from "@/stores/canvas-store";

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
  fastest: fc.integer({ min: 8, max: 14 }),
});
const toMarks = (m: {
  pathNodes: string[];
  pathEdges: string[];
  end: string | null;
  focus: string | null;
  fastest: number;
}) =>
  // Sets built in a shuffled order: the overlay compares contents, not insertion order.
  marks({
    pathNodes: new Set([...m.pathNodes].reverse()),
    pathEdges: new Set(m.pathEdges),
    end: m.end,
    focus: m.focus,
    fastest: m.fastest,
  });

/** What the overlay draws from the marks, as a string: the same reading the overlay makes. */
const drawing = (m: CanvasMarks) =>
  ids
    .map((id) => [m.pathNodes.has(id), m.pathEdges.has(id), m.end === id, m.focus === id].map(Number).join(""))
    .join(" ");

/** What a node on -12 on block selects, as `nodes.tsx` does: its block class. */
const nodeClass = (s: CanvasStore) => classifyBlock(-12, s);

/**
 * Whether a reader re-renders when the store goes from `before` to `after`: zustand's `useStore`
 * compares the selection with `Object.is`, `useShallow` key by key.
 */
const overlayRerenders = (before: CanvasStore, after: CanvasStore) =>
  !shallow(selectOverlay(before), selectOverlay(after));
const nodeRerenders = (before: CanvasStore, after: CanvasStore) => !Object.is(nodeClass(before), nodeClass(after));

const edge = (d: string): DrawnEdge => ({ d, kind: "follow", label: null });

describe("canvas store", () => {
  // The store's promise to the overlay: it re-renders exactly when what it draws changes.
  test.prop([marksArb, marksArb])("re-renders the overlay exactly when what it draws changes", (a, b) => {
    const [prev, next] = [toMarks(a), toMarks(b)];
    expect(overlayChanged(prev, next)).toBe(drawing(prev) !== drawing(next));

    const store = createCanvasStore(prev);
    const before = store.getState();
    store.getState().setMarks(next);
    const after = store.getState();
    expect(overlayRerenders(before, after)).toBe(drawing(prev) !== drawing(next));
    expect(drawing(after)).toBe(drawing(next));
    expect(after.fastest).toBe(next.fastest);
  });

  test("a click re-renders no node; a rule change re-renders the nodes and not the overlay", () => {
    const store = createCanvasStore(marks());
    const listener = vi.fn();
    store.subscribe(listener);

    // A click: the path changes, the rules do not.
    let before = store.getState();
    store.getState().setMarks(marks({ pathNodes: new Set(["a", "b"]), pathEdges: new Set(["ab"]), end: "b" }));
    expect([nodeRerenders(before, store.getState()), overlayRerenders(before, store.getState())]).toEqual([
      false,
      true,
    ]);

    // The opponent's fastest attack goes from 10 to 13 frames: -12 on block is no longer punishable.
    before = store.getState();
    store
      .getState()
      .setMarks(marks({ pathNodes: new Set(["b", "a"]), pathEdges: new Set(["ab"]), end: "b", fastest: 13 }));
    expect(nodeClass(before)).toBe("punishable");
    expect(nodeClass(store.getState())).toBe("safe");
    expect([nodeRerenders(before, store.getState()), overlayRerenders(before, store.getState())]).toEqual([
      true,
      false,
    ]);

    // The same marks again (new sets, same ids) are no news to anyone.
    const calls = listener.mock.calls.length;
    store
      .getState()
      .setMarks(marks({ pathNodes: new Set(["a", "b"]), pathEdges: new Set(["ab"]), end: "b", fastest: 13 }));
    expect(listener).toHaveBeenCalledTimes(calls);
  });

  test("keeps where each edge is drawn, and redraws the overlay only for an edge of the path", () => {
    const store = createCanvasStore(marks({ pathEdges: new Set(["ab"]) }));
    const overlay = vi.fn();
    store.subscribe((state, prev) => {
      if (overlayRerenders(prev, state)) overlay();
    });
    const { setDrawnEdge, drawnEdge } = store.getState();

    setDrawnEdge("cd", edge("M0,0 L1,1"));
    expect(overlay).not.toHaveBeenCalled();
    expect(drawnEdge("cd")?.d).toBe("M0,0 L1,1");

    setDrawnEdge("ab", edge("M0,0 L2,2"));
    expect(overlay).toHaveBeenCalledTimes(1);
    // The same drawing again is no news.
    setDrawnEdge("ab", edge("M0,0 L2,2"));
    expect(overlay).toHaveBeenCalledTimes(1);
    setDrawnEdge("ab", { ...edge("M0,0 L2,2"), label: { text: "b~", x: 1, y: 1 } });
    expect(overlay).toHaveBeenCalledTimes(2);
    expect(selectOverlay(store.getState()).drawnEdge("ab")?.label?.text).toBe("b~");

    setDrawnEdge("ab", null);
    expect(drawnEdge("ab")).toBeUndefined();
    expect(overlay).toHaveBeenCalledTimes(3);
  });

  test("each canvas has its own store", () => {
    const [one, two] = [createCanvasStore(marks()), createCanvasStore(marks())];
    one.getState().setDrawnEdge("ab", edge("M0,0 L1,1"));
    one.getState().setMarks(marks({ end: "a" }));
    expect(two.getState().drawnEdge("ab")).toBeUndefined();
    expect(two.getState().end).toBeNull();
  });
});
