import { readdirSync, readFileSync } from "node:fs";
import { join, relative } from "node:path";
import { describe, expect, test } from "vitest";
import { findFrameArithmetic } from "./frame-arithmetic";

// Every frame rule lives in the engine (src/lib/engine, DESIGN.md "Frame rules"); the rest of
// the app calls it. Common practice, no source: one home per rule, so a rule changes in one place.

const root = join(__dirname, "../../..");
const ENGINE = join(root, "src/lib/engine");

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((d) => {
    const path = join(dir, d.name);
    if (d.isDirectory()) return path === ENGINE ? [] : sourceFiles(path);
    return /\.tsx?$/.test(d.name) && !/\.test\.tsx?$/.test(d.name) ? [path] : [];
  });
}

const flags = (code: string, file = "snippet.tsx") => findFrameArithmetic(file, code).map((f) => f.text);

describe("the detector", () => {
  test("flags code that computes a frame figure itself", () => {
    // Each of these once stood in a component: a rule recomputed outside the engine.
    expect(flags("const raw = (p.onBlock as number) - p.framesSaved;")).toEqual([
      "(p.onBlock as number) - p.framesSaved",
    ]);
    expect(flags("const jails = via.gapOnBlock <= 0;")).toEqual(["via.gapOnBlock <= 0"]);
    expect(flags("const label = `${saves >= 0 ? 'saves' : 'costs'} ${Math.abs(saves)}f`;")).toEqual([
      "saves >= 0",
      "Math.abs(saves)",
    ]);
    // Through local names: `a` and `s` hold frame figures because of what they were given.
    expect(
      flags(`
        const a = typeof path.onBlock === "number" ? path.onBlock : null;
        const limit = -a;
        const s = target.startup;
        const gap = s - a - 1;`),
    ).toEqual(["-a", "s - a - 1", "s - a"]);
    expect(flags("function tone(o: Outcome) { return o > 0 ? 'plus' : 'minus'; }")).toEqual(["o > 0"]);
    expect(flags("const a = outcomeFrames(advantage); const next = a + 1;")).toEqual(["a + 1"]);
    expect(flags("let total = 0; for (const g of path.gaps) total += g.frames;")).toEqual(["total += g.frames"]);
    expect(flags("const limit = `startup ${-Number(onBlock)}f or less`;")).toEqual(["-Number(onBlock)"]);
    expect(flags("const next = framesSaved(c.onBlock, m.onBlock) + 1;")).toEqual([
      "framesSaved(c.onBlock, m.onBlock) + 1",
    ]);
    expect(flags("const launch = Math.max(game.launchAt, options.fastest);")).toEqual([
      "Math.max(game.launchAt, options.fastest)",
    ]);
  });

  test("passes code that only shows or passes frame figures on", () => {
    expect(
      flags(`
        const saved = framesSaved(cancel.onBlock, from.onBlock);
        const text = \`Punishable from -\${rules.fastest}: \${formatFrames(a)} on block\`;
        const label = "gap " + formatOutcome(path.onBlock);
        const next = g.after + 1;
        const last = path.nodes.length - 1;
        const any = path.gaps.length > 0;
        const cast = (x as GapSegment).width * 2;
        const sorted = rows.sort((x, y) => x.damage - y.damage);
        const id = Number(e.target.value) + 0;`),
    ).toEqual([]);
  });
});

describe("frame rules have one home", () => {
  const files = sourceFiles(join(root, "src"));

  test("the scan sees the UI and the helpers, and not the engine", () => {
    const names = files.map((f) => relative(root, f));
    expect(names).toContain("src/components/explorer/path-card.tsx");
    expect(names).toContain("src/lib/timeline.ts");
    expect(names.some((n) => n.startsWith("src/lib/engine/"))).toBe(false);
  });

  test("no code outside the engine does arithmetic or ordering on frame figures", () => {
    const findings = files.flatMap((f) =>
      findFrameArithmetic(relative(root, f), readFileSync(f, "utf8")).map((x) => `${x.file}:${x.line}: ${x.text}`),
    );
    // Call the engine instead (src/lib/engine/frames.ts); there are no exceptions.
    expect(findings).toEqual([]);
  });
});
