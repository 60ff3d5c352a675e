import {
  byDamageThenSpeed,
  compileGraph,
  followUp,
  outcomeFrames,
  punishersFor,
  topPaths,
  type FollowUpClass,
  type MoveGraph,
  type PathResult,
} from "./engine";
import type { Starter } from "./explorer";

/** A starter with the most damage it guarantees: its best natural combo. */
export interface Option extends Starter {
  /** Input of the natural combo that deals `damage` (the starter's own input when it is a single hit). */
  comboInput: string;
}

/**
 * For each starter, its most damaging natural combo (a single hit counts),
 * found with the engine's top-k walk on the character's graph.
 */
export function withBestCombos(graph: MoveGraph, starters: readonly Starter[], maxDepth = 6): Option[] {
  const compiled = compileGraph(graph);
  return starters.map((s) => {
    const [best] = topPaths(
      compiled,
      s.id,
      { k: 1, by: (p) => p.damage, filter: (p) => p.naturalCombo && p.endsIn === "move" },
      { maxDepth, maxStanceVisits: 0 },
    );
    return { ...s, damage: best?.damage ?? s.damage, comboInput: best?.input ?? s.input };
  });
}

/** The opponent's neutral moves that punish this ending, best damage first (empty when not punishable). */
export function punishesFor(path: PathResult, opponent: readonly Option[]): Option[] {
  return punishersFor(
    path.onBlock,
    path.defenderStance,
    opponent.filter((o) => o.stance === null),
  );
}

export interface FollowUpOption extends Option {
  kind: Exclude<FollowUpClass, "interruptible">;
}

/**
 * The attacker's own moves that are guaranteed or frame traps at the path's
 * advantage: from neutral after a hit, or from the stance a cancel ended in.
 * Guaranteed first, then by damage.
 */
export function followUpsAt(
  path: PathResult,
  advantage: PathResult["onHit"],
  own: readonly Option[],
  fastest: number,
): FollowUpOption[] {
  const a = outcomeFrames(advantage);
  if (Number.isNaN(a)) return [];
  const from = path.endsIn === "stance" ? path.nodes[path.nodes.length - 1]! : null;
  const out: FollowUpOption[] = [];
  for (const o of own) {
    if (o.stance !== from) continue;
    const kind = followUp(a, o.startup, { fastest });
    if (kind !== "interruptible") out.push({ ...o, kind });
  }
  return out.sort((x, y) => (x.kind === y.kind ? byDamageThenSpeed(x, y) : x.kind === "guaranteed" ? -1 : 1));
}
