import { describe, expect, it } from "vitest";
import { moveNode, stanceNodeId } from "../../../src/lib/character-file";
import type { CancelEntry, MoveEntry, MoveList, StanceEntry } from "../../../src/lib/dto";
import { explorePaths, type MoveGraph, type Outcome } from "../../../src/lib/engine";
import {
  DEFAULT_MOVE_LIST_VIEW,
  endingLabel,
  moveListSearch,
  readMoveListView,
  stringRows,
  viewStrings,
  type HitStep,
  type MoveListView,
} from "../../../src/lib/move-list";

// The move list groups a character's moves into strings, one row per first hit, and sums up how
// each string's endings leave the attacker on block. The counts are checked against the engine's
// own walk (every place a path may stop is one ending), so the list and the Explorer agree.

const RULES = { fastest: 10, launchAt: 15 };
const drift: StanceEntry = { id: 1, key: "drift", name: "Drift", abbreviation: "DRF", notes: null };

let nextId = 1;
function hit(
  input: string,
  level: MoveEntry["level"],
  damage: number,
  [onBlock, onHit, onCounterHit]: [Outcome, Outcome, Outcome],
  over: Partial<MoveEntry> = {},
): MoveEntry {
  return {
    id: nextId++,
    version: 1,
    key: input,
    input,
    name: `move ${input}`,
    level,
    damage,
    startup: null,
    onBlock,
    onHit,
    onCounterHit,
    range: null,
    tags: [],
    notes: null,
    stance: null,
    via: null,
    depth: 0,
    ...over,
  };
}
const after = (from: MoveEntry, input: string, gapOnBlock = 0) => ({
  via: { kind: "follow" as const, fromId: from.id, input, gapOnBlock, comboOnHit: true, comboOnCounterHit: true },
  depth: from.depth + 1,
});

// Tarrow-like, invented: 1 ,2 then a guess of ,1 (high) ,3 (mid) or ,4 (low), or ~b into Drift.
function sample(): MoveList {
  const a = hit("1", "high", 7, [1, 8, 8], { startup: 10, range: "1.2" });
  const b = hit("1,2", "high", 9, [-3, 5, 5], after(a, ",2"));
  const c = hit("1,2,1", "high", 8, [-4, 6, 7], after(b, ",1", 2));
  const d = hit("1,2,3", "mid", 14, [-8, 4, { state: "knockdown" }], after(b, ",3", 3));
  const e = hit("1,2,4", "low", 12, [-13, 3, 3], after(b, ",4", 5));
  const lash = hit("DRF:2", "mid", 13, [-2, 7, 7], {
    startup: 11,
    range: "2.4",
    stance: drift,
    via: { kind: "enter", input: ":2" },
  });
  const jab = hit("d+1", "special-mid", 5, [-5, 6, 6], { startup: 10, range: "0.9" });
  const toss = hit("1+3", "throw", 35, [{ state: "throw" }, 2, 2], { startup: 12 });
  const cancel: CancelEntry = {
    id: 100,
    key: "1,2~b>drift",
    fromId: b.id,
    input: "~b",
    stance: drift,
    onBlock: -1,
    onHit: 5,
    onCounterHit: 7,
    autoGuard: ["high"],
  };
  return { stances: [drift], moves: [a, b, c, d, e, jab, toss, lash], cancels: [cancel] };
}

/** The same moves as the engine's graph (no stance moves: every path from a root then stops at one ending). */
function graphOf(list: MoveList): MoveGraph {
  const key = new Map(list.moves.map((m) => [m.id, m.key]));
  return {
    nodes: [
      ...list.moves.filter((m) => m.stance === null).map(moveNode),
      ...list.stances.map((s) => ({ id: stanceNodeId(s.key), kind: "stance" as const, name: s.name })),
    ],
    edges: [
      ...list.moves.flatMap((m) =>
        m.via?.kind === "follow"
          ? [
              {
                id: `${m.key}<`,
                kind: "follow" as const,
                from: key.get(m.via.fromId)!,
                to: m.key,
                input: m.via.input,
                gapOnBlock: m.via.gapOnBlock,
                comboOnHit: m.via.comboOnHit,
                comboOnCounterHit: m.via.comboOnCounterHit,
              },
            ]
          : [],
      ),
      ...list.cancels.map((c) => ({
        id: c.key,
        kind: "cancel" as const,
        from: key.get(c.fromId)!,
        to: stanceNodeId(c.stance.key),
        input: c.input,
        onBlock: c.onBlock,
        onHit: c.onHit,
        onCounterHit: c.onCounterHit,
        autoGuard: c.autoGuard,
      })),
    ],
  };
}

describe("stringRows", () => {
  it("makes one row per first hit, each child showing only the step it adds, cancels after their hit", () => {
    const rows = stringRows(sample(), RULES);
    expect(rows.map((r) => [r.root.key, r.section])).toEqual([
      ["1", "neutral"],
      ["d+1", "neutral"],
      ["1+3", "neutral"],
      ["DRF:2", "stance-drift"],
    ]);
    const [one] = rows;
    expect(one!.steps.map((s) => [s.input, s.depth])).toEqual([
      ["1", 0],
      [",2", 1],
      ["~b", 2],
      [",1", 2],
      [",3", 2],
      [",4", 2],
    ]);
    expect(one!.mainLine.map((m) => m.key)).toEqual(["1", "1,2", "1,2,1"]);
    expect(one!.levels).toEqual(["high", "mid", "low"]);
    expect(one!.startup).toBe(10);
    // 7 + 9 + 14 through 1,2,3, the most of any way through.
    expect(one!.bestDamage).toBe(30);
    // The defender must guess after 1,2 (stand for the high and mid... duck or crouch for the low), not after 1.
    const guess = one!.steps.filter((s): s is HitStep => s.kind === "hit" && s.guessPoint).map((s) => s.move.key);
    expect(guess).toEqual(["1,2"]);
    const cancel = one!.steps.find((s) => s.kind === "cancel");
    // -1 on block instead of -3 when stopping at 1,2: 2 frames saved, punishable? no: safe either way.
    expect(cancel).toMatchObject({ blockClass: "safe", framesSaved: 2 });
  });

  it("sums the endings by class, best first, a cancel's ending apart from a stop's", () => {
    const [one, , toss] = stringRows(sample(), RULES);
    // By hand: +1 plus; -3, -4, -8 safe; -13 punishable (fastest 10); the cancel's -1 safe.
    expect(one!.endings.map((e) => endingLabel(e, e.blockClass))).toEqual([
      "1 plus",
      "3 safe",
      "1 safe via cancel",
      "1 punishable",
    ]);
    expect(one!.bestEnding).toBe("plus");
    expect(toss!.endings).toEqual([{ blockClass: "state", viaCancel: false, count: 1 }]);
  });

  it("counts the same endings as the engine's walk of every path from each first hit", () => {
    const list = sample();
    const graph = graphOf(list);
    for (const row of stringRows(list, RULES).filter((r) => r.section === "neutral")) {
      const paths = explorePaths(graph, row.root.key, RULES);
      const fromEngine = new Map<string, number>();
      for (const p of paths) {
        const id = `${p.blockClass} ${p.endsIn === "stance"}`;
        fromEngine.set(id, (fromEngine.get(id) ?? 0) + 1);
      }
      const ours = new Map(row.endings.map((e) => [`${e.blockClass} ${e.viaCancel}`, e.count]));
      expect(ours).toEqual(fromEngine);
      expect(row.bestDamage).toBe(Math.max(...paths.filter((p) => p.endsIn === "move").map((p) => p.damage)));
    }
  });

  it("gives every move exactly one step, even a follow-up whose parent is missing", () => {
    const list = sample();
    const orphan = hit("9,9", "mid", 3, [-1, 1, 1], {
      via: { kind: "follow", fromId: 999, input: ",9", gapOnBlock: 2, comboOnHit: false, comboOnCounterHit: false },
      depth: 1,
    });
    list.moves.push(orphan);
    const steps = stringRows(list, RULES).flatMap((r) => r.steps.filter((s) => s.kind === "hit"));
    expect(steps.map((s) => s.move.id).sort((a, b) => a - b)).toEqual(
      list.moves.map((m) => m.id).sort((a, b) => a - b),
    );
  });
});

describe("the view", () => {
  const rows = stringRows(sample(), RULES);
  const keys = (view: Partial<MoveListView>) =>
    viewStrings(rows, { ...DEFAULT_MOVE_LIST_VIEW, ...view }).map((r) => r.root.key);

  it("filters by a hit's level, an ending's class, the stance and the first hit's startup", () => {
    expect(keys({})).toEqual(["1", "d+1", "1+3", "DRF:2"]);
    expect(keys({ level: "low" })).toEqual(["1"]);
    expect(keys({ level: "mid" })).toEqual(["1", "DRF:2"]);
    expect(keys({ ending: "punishable" })).toEqual(["1"]);
    expect(keys({ ending: "state" })).toEqual(["1+3"]);
    expect(keys({ stance: "drift" })).toEqual(["DRF:2"]);
    expect(keys({ stance: "neutral" })).toEqual(["1", "d+1", "1+3"]);
    expect(keys({ startupFrom: 11 })).toEqual(["1+3", "DRF:2"]);
    expect(keys({ startupFrom: 10, startupTo: 11 })).toEqual(["1", "d+1", "DRF:2"]);
    expect(keys({ level: "throw", ending: "plus" })).toEqual([]);
  });

  it("keeps the strings whose first hit reaches the distance; a string with no range never does", () => {
    expect(keys({ reach: 0 })).toEqual(["1", "d+1", "DRF:2"]);
    expect(keys({ reach: 1 })).toEqual(["1", "DRF:2"]);
    expect(keys({ reach: 1.2 })).toEqual(["1", "DRF:2"]);
    expect(keys({ reach: 1.21 })).toEqual(["DRF:2"]);
    expect(keys({ reach: 3 })).toEqual([]);
  });

  it("sorts fastest, least damage, best ending first, ties in list order; desc turns it round", () => {
    expect(keys({ sort: "startup" })).toEqual(["1", "d+1", "DRF:2", "1+3"]);
    expect(keys({ sort: "startup", dir: "desc" })).toEqual(["1+3", "DRF:2", "1", "d+1"]);
    expect(keys({ sort: "damage", dir: "desc" })).toEqual(["1+3", "1", "DRF:2", "d+1"]);
    expect(keys({ sort: "damage" })).toEqual(["d+1", "DRF:2", "1", "1+3"]);
    // plus; safe (-2, -5); state last.
    expect(keys({ sort: "ending" })).toEqual(["1", "d+1", "DRF:2", "1+3"]);
  });

  it("round-trips through the address, keeping the Edition and dropping what it cannot read", () => {
    const view: MoveListView = {
      level: "low",
      ending: "safe",
      stance: "drift",
      startupFrom: 10,
      startupTo: 14,
      reach: 1.5,
      sort: "damage",
      dir: "desc",
    };
    const search = moveListSearch(new URLSearchParams("edition=1-0&sort=startup"), view);
    expect(search).toBe(
      "?edition=1-0&level=low&ending=safe&stance=drift&startupFrom=10&startupTo=14&reach=1.5&sort=damage&dir=desc",
    );
    expect(readMoveListView(new URLSearchParams(search))).toEqual(view);
    expect(moveListSearch(new URLSearchParams("level=mid"), DEFAULT_MOVE_LIST_VIEW)).toBe("");
    expect(
      readMoveListView(
        new URLSearchParams("level=sideways&ending=1&startupFrom=-3&startupTo=abc&reach=-1&sort=x&stance=<b>"),
      ),
    ).toEqual(DEFAULT_MOVE_LIST_VIEW);
  });
});
