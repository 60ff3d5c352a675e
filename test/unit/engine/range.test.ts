import { fc, test } from "@fast-check/vitest";
import { describe, expect } from "vitest";
import { explainRange, formatRange, parseRange, rangeProblem, reachesAt } from "../../../src/lib/engine";

const M = { kind: "number", unit: "m" } as const;
const L = { kind: "label", unit: null } as const;

describe("range", () => {
  // A move reaches every distance up to its range and whiffs beyond it (common practice, no source).
  test("a 2.0 range reaches at 1.5 and at 2.0, and whiffs at 2.5", () => {
    expect(reachesAt("2.0", 1.5)).toBe(true);
    expect(reachesAt("2.0", 2)).toBe(true);
    expect(reachesAt("2.0", 2.5)).toBe(false);
  });

  test("a label or a missing range is never said to reach", () => {
    expect(reachesAt("close", 0)).toBe(false);
    expect(reachesAt(null, 0)).toBe(false);
    expect(reachesAt("", 0)).toBe(false);
  });

  test("numbers read as numbers; signs, exponents, units and three decimals do not", () => {
    expect(parseRange("1.85")).toBe(1.85);
    expect(parseRange(" 3 ")).toBe(3);
    expect(parseRange("0")).toBe(0);
    expect(parseRange(2.5)).toBe(2.5);
    expect(parseRange(-1)).toBeNull();
    for (const bad of ["-1", "1e2", "1.5m", "1.234", "", "close", ".5", "1."]) expect(parseRange(bad)).toBeNull();
  });

  test("a numeric game refuses a label and says what it wants; a label game takes anything", () => {
    expect(rangeProblem("close", M)).toMatch(/"close" is not a number of m/);
    expect(rangeProblem("1.5", M)).toBeNull();
    expect(rangeProblem(null, M)).toBeNull();
    expect(rangeProblem("close", L)).toBeNull();
  });

  test("a range reads with its unit in a numeric game and as itself in a label game", () => {
    expect(formatRange("1.50", M)).toBe("1.5 m");
    expect(formatRange("close", L)).toBe("close");
    expect(formatRange(null, M)).toBeNull();
    expect(explainRange("2", M)).toBe("This hit reaches an opponent up to 2 m away; farther than that it whiffs.");
  });

  // Any number of hundredths written out reads back as itself.
  test.prop([fc.integer({ min: 0, max: 99_999 })])("a written number of hundredths parses back", (hundredths) => {
    expect(parseRange((hundredths / 100).toFixed(2))).toBeCloseTo(hundredths / 100, 10);
  });

  // Reach is monotone: whatever reaches at d reaches at every shorter distance.
  test.prop([
    fc.integer({ min: 0, max: 99_999 }),
    fc.double({ min: 0, max: 1000, noNaN: true }),
    fc.double({ min: 0, max: 1, noNaN: true }),
  ])("what reaches at d reaches at every shorter distance", (hundredths, d, shrink) => {
    const range = (hundredths / 100).toFixed(2);
    if (reachesAt(range, d)) expect(reachesAt(range, d * shrink)).toBe(true);
    expect(reachesAt(range, d)).toBe(hundredths / 100 >= d);
  });
});
