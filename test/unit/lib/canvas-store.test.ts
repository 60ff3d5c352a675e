import { fc, test } from "@fast-check/vitest";
import { describe, expect, vi } from "vitest";
import { changedIds, createCanvasStore, type CanvasMarks } from "@/components/graph/canvas-store";

const marks = (over: Partial<CanvasMarks> = {}): CanvasMarks => ({
  fastest: 10,
  launchAt: 15,
  pathNodes: new Set(),
  pathEdges: new Set(),
  end: null,
  focus: null,
  ...over,
});

const idArb = fc.constantFrom("a", "b", "c", "d", "e", "ab", "bc", "cd");
const marksArb = fc.record({
  pathNodes: fc.uniqueArray(idArb, { maxLength: 5 }),
  pathEdges: fc.uniqueArray(idArb, { maxLength: 5 }),
  end: fc.option(idArb, { nil: null }),
  focus: fc.option(idArb, { nil: null }),
});
const toMarks = (m: { pathNodes: string[]; pathEdges: string[]; end: string | null; focus: string | null }) =>
  marks({ pathNodes: new Set(m.pathNodes), pathEdges: new Set(m.pathEdges), end: m.end, focus: m.focus });

/** What node or edge `id` draws from the marks: the same reading the canvas makes. */
const look = (m: CanvasMarks, id: string) => [m.pathNodes.has(id), m.pathEdges.has(id), m.end === id, m.focus === id].join();

describe("canvas store", () => {
  // The store's promise: every id whose look changes is told, and none other.
  test.prop([marksArb, marksArb])("names exactly the ids whose marks changed", (a, b) => {
    const [prev, next] = [toMarks(a), toMarks(b)];
    const changed = changedIds(prev, next);
    expect(changed).not.toBe("all");
    for (const id of ["a", "b", "c", "d", "e", "ab", "bc", "cd"]) {
      expect((changed as ReadonlySet<string>).has(id), id).toBe(look(prev, id) !== look(next, id));
    }
  });

  test("a rule change tells every node and edge", () => {
    expect(changedIds(marks(), marks({ fastest: 12 }))).toBe("all");
    expect(changedIds(marks(), marks({ launchAt: 16 }))).toBe("all");
  });

  test("calls only the listeners of changed ids, and none after they leave", () => {
    const store = createCanvasStore(marks());
    const [a, b, c] = [vi.fn(), vi.fn(), vi.fn()];
    store.subscribe("a", a);
    const leaveB = store.subscribe("b", b);
    store.subscribe("c", c);

    store.setState(marks({ pathNodes: new Set(["a", "b"]), end: "b" }));
    expect([a.mock.calls.length, b.mock.calls.length, c.mock.calls.length]).toEqual([1, 1, 0]);
    expect(store.getState().end).toBe("b");

    leaveB();
    store.setState(marks({ pathNodes: new Set(["a"]), end: "a", fastest: 11 }));
    expect([a.mock.calls.length, b.mock.calls.length, c.mock.calls.length]).toEqual([2, 1, 1]);
  });
});
