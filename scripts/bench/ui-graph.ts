import type { Level } from "../../src/lib/engine";
import type { DemoCharacter } from "../../src/server/db/seed/demo";
import { cancel, first, follow, fromStance, hit, root, type Root, type Step } from "../../src/server/db/seed/dsl";
import { rng } from "./generate";

const LEVELS: Level[] = ["high", "mid", "low", "mid", "special-mid"];
const STANCES = ["s1", "s2", "s3", "s4"];
/** Follow-up buttons and stance inputs in the demo game's notation (src/server/db/seed/demo.ts). */
const FOLLOW = ["n", "v", "t"];
const FROM_STANCE = ["n", "v", "t", "r", "c", "nv", "nt", "nr", "vt", "vr", "tr"];

/**
 * An invented character for the UI bench: one string that branches three
 * ways to five hits (121 moves), cancels into four stances, and eleven
 * stance strings of two hits per stance (176 moves): 301 nodes in all.
 */
export function benchCharacter(seed = 7): DemoCharacter {
  const r = rng(seed);
  const int = (lo: number, hi: number) => lo + Math.floor(r() * (hi - lo + 1));
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(r() * xs.length)]!;
  const h = (name: string) => hit(name, pick(LEVELS), int(5, 20), [int(-16, 3), int(-2, 8), int(0, 10)]);

  let cancels = 0;
  const tree = (depth: number, label: string): Step[] => {
    if (depth === 5) return [];
    const steps: Step[] = FOLLOW.map((b) =>
      follow(`.${b}`, { gap: int(-2, 6), combo: r() < 0.5 }, h(`${label}-${b}`), tree(depth + 1, `${label}-${b}`)),
    );
    if (depth >= 2 && depth <= 3 && r() < 0.4) {
      steps.push(
        cancel(
          "~ebb",
          STANCES[cancels++ % STANCES.length]!,
          [int(-6, 3), int(0, 8), int(2, 10)],
          r() < 0.3 ? ["high"] : [],
        ),
      );
    }
    return steps;
  };

  const stanceMoves: Root[] = STANCES.flatMap((s) =>
    FROM_STANCE.map((input, i) =>
      fromStance(
        s,
        `:${input}`,
        first(int(10, 20), h(`${s}-${i}`)),
        FOLLOW.map((b) => follow(`.${b}`, { gap: int(-1, 5), combo: r() < 0.5 }, h(`${s}-${i}-${b}`))),
      ),
    ),
  );

  return {
    slug: "bench-grid",
    name: "Bench Grid",
    summary: "Generated for the Explorer speed bench.",
    data: () => ({
      stances: STANCES.map((key, i) => ({ key, name: `Grid Stance ${i + 1}`, abbreviation: `grid${i + 1}` })),
      roots: [root("n", first(11, h("grid")), tree(1, "grid")), ...stanceMoves],
    }),
  };
}
