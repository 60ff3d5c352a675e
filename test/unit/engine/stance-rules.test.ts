import { describe, expect, test } from "vitest";
import { explainAfterCancel, explainAutoGuard, explainComboAfterCancel, turnsPunishableSafe } from "@/lib/engine";

// The rules the stance sheet page shows beside each cancel and each grid cell (DESIGN.md,
// "Stance sheet", "Frame rules"). Common practice, no source: with the opponent's fastest attack
// at 10f, -10 is punishable, -9 safe; a launch punish from -15.
const rules = { fastest: 10, launchAt: 15 };

describe("turnsPunishableSafe", () => {
  test("a cancel from punishable or launch-punishable into safe, even or plus", () => {
    expect(turnsPunishableSafe(-14, -1, rules)).toBe(true);
    expect(turnsPunishableSafe(-10, -9, rules)).toBe(true);
    expect(turnsPunishableSafe(-18, 0, rules)).toBe(true);
    expect(turnsPunishableSafe(-12, 3, rules)).toBe(true);
  });

  test("no: already safe, still punishable, or a state on either side", () => {
    expect(turnsPunishableSafe(-9, -1, rules)).toBe(false);
    expect(turnsPunishableSafe(-14, -10, rules)).toBe(false);
    expect(turnsPunishableSafe(-18, -12, rules)).toBe(false);
    expect(turnsPunishableSafe({ state: "knockdown" }, -1, rules)).toBe(false);
    expect(turnsPunishableSafe(-14, { state: "crumple" }, rules)).toBe(false);
  });

  test("follows the game's fastest attack", () => {
    expect(turnsPunishableSafe(-11, -9, { fastest: 12, launchAt: 15 })).toBe(false);
    expect(turnsPunishableSafe(-12, -11, { fastest: 12, launchAt: 15 })).toBe(true);
  });
});

describe("explanations after a cancel", () => {
  test("the gap is the follow-up's startup minus the cancel's advantage minus one", () => {
    const e = explainAfterCancel(-2, 14, rules);
    expect(e?.gap).toBe(
      "Gap on block after the cancel: 14 − (-2) − 1 = 15: 15 frames, so a defender move of startup 15 or less hits first.",
    );
    expect(e?.followUp).toMatch(/^Startup 14 is -2 \+ 10 or more/);
    expect(explainAfterCancel(2, 11, rules)?.followUp).toMatch(/^Startup 11 is above \+2 but below \+2 \+ 10/);
    expect(explainAfterCancel({ state: "knockdown" }, 12, rules)).toBeNull();
    expect(explainAfterCancel(-2, null, rules)).toBeNull();
  });

  test("a combo needs startup at most the on-hit advantage", () => {
    expect(explainComboAfterCancel(8, 8)).toBe("If the cancelled hit lands: startup 8 ≤ +8, so it combos.");
    expect(explainComboAfterCancel(7, 8, { counterHit: true })).toBe(
      "If the cancelled hit lands as a counter hit: startup 8 is above +7, so the defender can block it.",
    );
    expect(explainComboAfterCancel({ state: "launch" }, 8)).toMatch(/left in launch/);
    expect(explainComboAfterCancel(8, null)).toMatch(/no startup/);
  });

  test("auto-guard in words", () => {
    expect(explainAutoGuard([])).toBe("Entering the stance guards nothing by itself.");
    expect(explainAutoGuard(["high", "mid"])).toBe("While entering the stance it guards high, mid hits by itself.");
  });
});
