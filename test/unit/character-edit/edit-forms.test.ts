import { describe, expect, test } from "vitest";
import { linkChanges, moveFormSchema, readQuickField, toLinkForm, toMoveForm } from "@/lib/edit-forms";
import { move } from "../character-io/fixtures";

describe("the edit forms", () => {
  test("a move shown in the form and read back is the same move", () => {
    const m = move("2,1", {
      onHit: { state: "knockdown", frames: 3 },
      onCounterHit: { state: "launch" },
      tags: ["poke", "safe"],
      startup: null,
    });
    const { stance: _stance, fromPosture: _posture, ...fields } = m;
    expect(moveFormSchema.parse(toMoveForm(m))).toMatchObject(fields);
  });

  test("outcomes are typed as in a CSV cell, and a wrong one is reported at its field", () => {
    const form = { ...toMoveForm(move("3")), onBlock: "+2", onHit: "crumple 4", onCounterHit: "-5x", damage: "ten" };
    const r = moveFormSchema.safeParse(form);
    expect(r.success).toBe(false);
    expect(r.error?.issues.map((i) => i.path.join("."))).toEqual(expect.arrayContaining(["onCounterHit", "damage"]));
    const fixed = moveFormSchema.parse({ ...form, onCounterHit: "launch", damage: "12" });
    expect(fixed).toMatchObject({
      onBlock: 2,
      onHit: { state: "crumple", frames: 4 },
      onCounterHit: { state: "launch" },
      damage: 12,
    });
  });

  test("a link form gives only its kind's fields", () => {
    const cancel = {
      kind: "cancel" as const,
      from: "1",
      to: "coil",
      input: "~b",
      onBlock: -3,
      onHit: 5,
      onCounterHit: { state: "launch" as const },
      autoGuard: ["high" as const],
    };
    expect(linkChanges("cancel", toLinkForm(cancel)).data).toEqual({
      input: "~b",
      onBlock: -3,
      onHit: 5,
      onCounterHit: { state: "launch" },
      autoGuard: ["high"],
    });
    const gap = linkChanges("follow", { ...toLinkForm(), input: ",2", gapOnBlock: "1.5" });
    expect(gap.success).toBe(false);
    expect(gap.error?.issues[0]?.path).toEqual(["gapOnBlock"]);
  });
});

describe("fixing one number in place", () => {
  test("reads the text as the form does and names what is wrong", () => {
    expect(readQuickField("onBlock", " -9 ")).toEqual({ ok: true, value: -9 });
    expect(readQuickField("onHit", "knockdown 2")).toEqual({ ok: true, value: { state: "knockdown", frames: 2 } });
    expect(readQuickField("startup", "")).toEqual({ ok: true, value: null });
    const wrong = readQuickField("onBlock", "-9z");
    expect(wrong.ok).toBe(false);
    expect(!wrong.ok && wrong.message).toMatch(/^must be a whole number/);
  });
});
