import { describe, expect, test } from "vitest";
import { boardReferenceIssues, savedBoardDocumentSchema } from "@/lib/board";
import { boardDocument } from "../authz/world";

// The references a board's shape cannot check, each named where the editor can point at it.
// Common practice, no source: ids unique, and every reference names something that exists.
describe("boardReferenceIssues", () => {
  test("a sound board has none", () => {
    expect(boardReferenceIssues(boardDocument())).toEqual([]);
    expect(savedBoardDocumentSchema.safeParse(boardDocument()).success).toBe(true);
  });

  test("names every wrong reference at its place: a repeated id, a missing root, each unknown next", () => {
    const doc = boardDocument();
    doc.root = "nowhere";
    doc.situations[1]!.id = "after-poke";
    doc.situations[0]!.cells[0]![0]!.next = "gone";
    doc.situations[1]!.cells[0]![1]!.next = "also-gone";
    expect(boardReferenceIssues(doc)).toEqual([
      { path: ["situations", 1, "id"], message: 'Two situations have the id "after-poke"; give each its own.' },
      { path: ["root"], message: 'The board starts at "nowhere", which is not one of its situations.' },
      {
        path: ["situations", 0, "cells", 0, 0, "next"],
        message: 'A cell of "after-poke" leads to "gone", which is not one of the board\'s situations.',
      },
      {
        path: ["situations", 1, "cells", 0, 1, "next"],
        message: 'A cell of "after-poke" leads to "also-gone", which is not one of the board\'s situations.',
      },
    ]);
    const parsed = savedBoardDocumentSchema.safeParse(doc);
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues.map((i) => i.path)).toEqual([
      ["situations", 1, "id"],
      ["root"],
      ["situations", 0, "cells", 0, 0, "next"],
      ["situations", 1, "cells", 0, 1, "next"],
    ]);
  });

  test("a cycle is not this check's to find (the engine's solveBoard refuses it)", () => {
    const doc = boardDocument();
    doc.situations[1]!.cells[0]![0]!.next = "after-poke";
    expect(boardReferenceIssues(doc)).toEqual([]);
  });
});
