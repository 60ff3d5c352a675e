import { describe, expect, test } from "vitest";
import {
  BLOCK_CLASS_WORD,
  advantageSide,
  blockClassRange,
  classifyBlock,
  effectiveLaunchAt,
  explainAdvantage,
  explainBlockClass,
  explainFollowUp,
  explainFramesSaved,
  explainGap,
  explainOnBlock,
  explainPunisher,
  followUp,
  framesSavedLabel,
  gapAtAdvantageSum,
  gapJails,
  punishWindow,
  punishersFor,
  type PunisherMove,
} from "../../../src/lib/engine";

// The rules are DESIGN.md's "Frame rules" (common practice in the trade, no source); these
// tests check that each explanation says what the rule beside it computes.

const RULES = { fastest: 10, launchAt: 15 };

describe("punishWindow", () => {
  test("at a < 0 on block a defender move of startup -a or less punishes, and nothing does at 0 or more", () => {
    expect(punishWindow(-14)).toBe(14);
    expect(punishWindow(-1)).toBe(1);
    expect(punishWindow(0)).toBeNull();
    expect(punishWindow(3)).toBeNull();
    expect(punishWindow({ state: "knockdown", frames: -20 })).toBeNull();
  });

  test("agrees with punishersFor: the window's startup punishes, one frame slower does not", () => {
    for (let a = -20; a <= -1; a++) {
      const limit = punishWindow(a)!;
      const moves: PunisherMove[] = [
        { id: "in", startup: limit, damage: 10, from: "any" },
        { id: "out", startup: limit + 1, damage: 10, from: "any" },
      ];
      expect(punishersFor(a, "standing", moves).map((m) => m.id)).toEqual(["in"]);
      expect(explainPunisher(limit, a)).toBe(`Startup ${limit} ≤ ${limit}: it lands before you recover.`);
      expect(explainPunisher(limit + 1, a)).toContain("too slow");
    }
  });
});

describe("block class words and sentences", () => {
  test("each figure on block is explained with the class the engine gives it", () => {
    for (let a = -30; a <= 10; a++) {
      const cls = classifyBlock(a, RULES);
      const text = explainOnBlock(a, RULES);
      expect(text.startsWith(`${a > 0 ? "+" : ""}${a} on block. `)).toBe(true);
      expect(text.toLowerCase()).toContain(`${BLOCK_CLASS_WORD[cls]} (`);
    }
  });

  test("the ranges name the thresholds the classes switch at (-9 safe, -10 punishable, -15 launch-punishable)", () => {
    expect(explainOnBlock(-9, RULES)).toContain("Safe (below 0, above -10)");
    expect(explainOnBlock(-10, RULES)).toContain("Punishable (-10 or less, above -15)");
    expect(explainOnBlock(-14, RULES)).toContain("any defender move of startup 14 or less lands");
    expect(explainOnBlock(-15, RULES)).toContain("Launch-punishable (-15 or less)");
    expect(explainOnBlock(1, RULES)).toContain("Plus (+1 or more): you act first");
    expect(explainOnBlock(0, RULES)).toContain("Even (0): both sides act at once");
    expect(explainOnBlock({ state: "knockdown" }, RULES)).toBe(
      "knockdown on block. State (a state, not a frame count): no block class, what follows depends on the state.",
    );
    expect(blockClassRange("punishable", { fastest: 12, launchAt: 18 })).toBe("-12 or less, above -18");
  });

  test("a class the paths were computed with is explained as given, with the figure's own punish window", () => {
    expect(explainBlockClass("punishable", -12, RULES)).toBe(
      "Punishable (-10 or less, above -15): their fastest attack (10f) lands; any defender move of startup 12 or less lands before you recover.",
    );
  });

  test("a launch threshold below the fastest attack counts as the fastest attack", () => {
    expect(effectiveLaunchAt(8, 10)).toBe(10);
    expect(effectiveLaunchAt(15, 10)).toBe(15);
  });
});

describe("frames saved", () => {
  test("a cancel from -14 to -1 saves 13 frames, written out", () => {
    expect(explainFramesSaved(-1, -14)).toBe(
      "Cancelled: -1 on block instead of -14 when stopping at the hit: -1 − (-14) = 13 frames saved.",
    );
    expect(explainFramesSaved(-8, -5)).toContain("-8 − (-5) = -3 frames lost");
    expect(explainFramesSaved({ state: "knockdown" }, -5)).toContain("no frames saved can be counted");
    expect(framesSavedLabel(13)).toBe("saves 13f");
    expect(framesSavedLabel(0)).toBe("saves 0f");
    expect(framesSavedLabel(-3)).toBe("costs 3f");
  });
});

describe("gaps and follow-ups", () => {
  test("a gap of 0 or less jails; a gap of g lets a move of startup g or less hit first", () => {
    expect(gapJails(0)).toBe(true);
    expect(gapJails(-2)).toBe(true);
    expect(gapJails(1)).toBe(false);
    expect(explainGap(0)).toContain("jails");
    expect(explainGap(4)).toBe("4 frames, so a defender move of startup 4 or less hits first");
    // A stance move of startup 12 after a cancel at -4: 12 - (-4) - 1.
    expect(gapAtAdvantageSum(-4, 12)).toBe("12 − (-4) − 1 = 15");
  });

  test("the follow-up sentence names the class followUp gives", () => {
    const sentence = { guaranteed: "lands before", "frame-trap": "hits first or trades", interruptible: "hits first." };
    for (let s = 1; s <= 20; s++) {
      expect(explainFollowUp(3, s)).toContain(sentence[followUp(3, s)]);
    }
    expect(explainFollowUp(3, 3)).toBe("Startup 3 ≤ advantage +3: it lands before the opponent can act.");
    expect(explainFollowUp(3, 12)).toContain("below +3 + 10");
    // At +3 a 13-frame move leaves 13 - 3 - 1 = 9 frames for the defender.
    expect(explainFollowUp(3, 13)).toContain("startup 9 or less hits first");
  });
});

describe("advantage", () => {
  test("who acts first, and by how much", () => {
    expect([3, 0, -2, { state: "launch" as const }].map(advantageSide)).toEqual([
      "attacker",
      "even",
      "defender",
      "state",
    ]);
    expect(explainAdvantage(3)).toBe("the attacker acts 3 frames before the defender");
    expect(explainAdvantage(-2)).toBe("the attacker acts 2 frames after the defender");
    expect(explainAdvantage(0)).toBe("both sides act at once");
    expect(explainAdvantage({ state: "crumple", frames: 5 })).toBe("the defender is left in crumple at +5 frames");
  });
});
