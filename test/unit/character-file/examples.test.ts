import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, test } from "vitest";
import {
  exportCharacterCsv,
  exportCharacterJson,
  parseCharacterFile,
  toMoveGraph,
  type PortableCharacter,
} from "../../../src/lib/character-file";
import { explorePaths } from "../../../src/lib/engine";

// The example files a coach downloads to start from (public/examples/). Both must read,
// carry the same character, and show every part of the format.

const dir = join(__dirname, "../../../public/examples");
const read = (name: string): PortableCharacter => {
  const r = parseCharacterFile(name, readFileSync(join(dir, name)));
  if (!r.ok) throw new Error(JSON.stringify(r.problems, null, 2));
  expect(r.characters).toHaveLength(1);
  return r.characters[0]!;
};

describe("the example character, Merrith", () => {
  const csv = read("merrith.csv");
  const json = read("merrith.json");

  test("a file without a known extension is told apart by its content", () => {
    const bytes = readFileSync(join(dir, "merrith.json"));
    expect(parseCharacterFile("merrith", bytes)).toEqual(parseCharacterFile("merrith.JSON", bytes));
    expect(parseCharacterFile("merrith", readFileSync(join(dir, "merrith.csv")))).toEqual({
      ok: true,
      characters: [csv],
    });
  });

  test("the CSV and the JSON file hold the same character", () => {
    expect(csv).toEqual(json);
  });

  test("the files are what the exporters write, so they never drift from the format", () => {
    expect(readFileSync(join(dir, "merrith.csv"), "utf8")).toBe(exportCharacterCsv(json));
    expect(JSON.parse(readFileSync(join(dir, "merrith.json"), "utf8"))).toEqual(JSON.parse(exportCharacterJson(json)));
  });

  test("it has a stance, cancels into it with auto-guard, stance moves and a 3-hit string", () => {
    const lantern = json.stances.find((s) => s.key === "lantern");
    expect(lantern).toBeDefined();
    const cancels = json.edges.filter((e) => e.kind === "cancel" && e.to === "lantern");
    expect(cancels.some((e) => e.kind === "cancel" && e.autoGuard.length > 0)).toBe(true);
    expect(json.moves.filter((m) => m.stance === "lantern").length).toBeGreaterThanOrEqual(2);
    const graph = toMoveGraph(json);
    const longest = Math.max(
      ...explorePaths(graph, "n", { maxDepth: 3 })
        .filter(
          (p) => p.endsIn === "move" && p.edges.every((id) => graph.edges.find((e) => e.id === id)?.kind === "follow"),
        )
        .map((p) => p.levels.length),
    );
    expect(longest).toBe(3);
    // A path from a string through a cancel into Lantern and on into a stance move.
    const through = explorePaths(graph, "n", { maxDepth: 3 }).map((p) => p.nodes.join(" "));
    expect(through).toContain("n n.v stance:lantern lantern:n");
  });
});
