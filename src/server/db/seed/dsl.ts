import type { Level, MoveGraph, Outcome } from "@/lib/engine";

/**
 * A small language for writing a character's frame data as the trade reads it:
 * a string is a root hit with follow-ups and cancels hanging off it. `flatten`
 * turns it into the rows of the `moves`, `stances` and `edges` tables.
 */

export interface Hit {
  name: string;
  level: Level;
  damage: number;
  onBlock: Outcome;
  onHit: Outcome;
  onCounterHit: Outcome;
  startup?: number;
  /** How far the hit reaches, in the demo game's metres. */
  range?: number;
  /** Where the move can be done from; by default read from the input (see `postureOf`). */
  from?: "standing" | "crouching" | "any";
  tags?: string[];
  notes?: string;
}

export interface FollowStep {
  kind: "follow";
  input: string;
  gapOnBlock: number;
  comboOnHit: boolean;
  comboOnCounterHit: boolean;
  hit: Hit;
  next: Step[];
}

export interface CancelStep {
  kind: "cancel";
  input: string;
  stance: string;
  onBlock: Outcome;
  onHit: Outcome;
  onCounterHit: Outcome;
  autoGuard: Level[];
}

export type Step = FollowStep | CancelStep;

export interface Root {
  /** Stance the move is done from, or undefined for neutral. */
  stance?: string;
  /** Neutral: the whole input. From a stance: what is entered there, e.g. `:v`. */
  input: string;
  hit: Hit & { startup: number };
  next: Step[];
}

export interface StanceSpec {
  key: string;
  name: string;
  abbreviation: string;
  notes?: string;
}

export interface CharacterData {
  stances: StanceSpec[];
  roots: Root[];
}

/**
 * The demo game's rule for where a move can be done from: down-direction
 * moves (`sink+`) also come out of a crouch, rising (`rise+`) moves only out of one,
 * everything else from standing.
 */
export function postureOf(input: string): "standing" | "crouching" | "any" {
  if (/^sink\+/.test(input)) return "any";
  if (/^rise\+/.test(input)) return "crouching";
  return "standing";
}

export const hit = (
  name: string,
  level: Level,
  damage: number,
  frames: [onBlock: Outcome, onHit: Outcome, onCounterHit: Outcome],
  extra: Partial<Omit<Hit, "name" | "level" | "damage">> = {},
): Hit => ({ name, level, damage, onBlock: frames[0], onHit: frames[1], onCounterHit: frames[2], ...extra });

export const first = (startup: number, h: Hit): Hit & { startup: number } => ({ ...h, startup });

export const follow = (
  input: string,
  gap: { gap: number; combo: boolean; comboCh?: boolean },
  h: Hit,
  next: Step[] = [],
): FollowStep => ({
  kind: "follow",
  input,
  gapOnBlock: gap.gap,
  comboOnHit: gap.combo,
  comboOnCounterHit: gap.comboCh ?? gap.combo,
  hit: h,
  next,
});

export const cancel = (
  input: string,
  stance: string,
  frames: [onBlock: Outcome, onHit: Outcome, onCounterHit: Outcome],
  autoGuard: Level[] = [],
): CancelStep => ({
  kind: "cancel",
  input,
  stance,
  onBlock: frames[0],
  onHit: frames[1],
  onCounterHit: frames[2],
  autoGuard,
});

export const root = (input: string, h: Hit & { startup: number }, next: Step[] = []): Root => ({ input, hit: h, next });

export const fromStance = (stance: string, input: string, h: Hit & { startup: number }, next: Step[] = []): Root => ({
  stance,
  input,
  hit: h,
  next,
});

export const KD: Outcome = { state: "knockdown" };
export const LAUNCH: Outcome = { state: "launch" };
export const SPLAT: Outcome = { state: "wall-splat" };
export const CRUMPLE: Outcome = { state: "crumple" };
export const THROWN = (frames?: number): Outcome =>
  frames === undefined ? { state: "throw" } : { state: "throw", frames };
export const kd = (frames: number): Outcome => ({ state: "knockdown", frames });

export interface MoveRow {
  key: string;
  input: string;
  hit: Hit;
  stance: string | null;
  sort: number;
}

export interface EdgeRow {
  key: string;
  kind: "follow" | "cancel" | "enter";
  from: { move: string } | { stance: string };
  to: { move: string } | { stance: string };
  input: string;
  follow?: { gapOnBlock: number; comboOnHit: boolean; comboOnCounterHit: boolean };
  cancel?: { onBlock: Outcome; onHit: Outcome; onCounterHit: Outcome; autoGuard: Level[] };
}

/**
 * Rows for one character. A move's key and input are the whole notation that
 * reaches it (a stance move is prefixed with its stance's code), so a
 * key names the same move in every edition.
 */
export function flatten(data: CharacterData): { moves: MoveRow[]; edges: EdgeRow[] } {
  const moves: MoveRow[] = [];
  const edges: EdgeRow[] = [];
  const stanceAbbr = new Map(data.stances.map((s) => [s.key, s.abbreviation]));

  const walk = (key: string, steps: Step[], stance: string | null) => {
    for (const step of steps) {
      if (step.kind === "follow") {
        const childKey = key + step.input;
        moves.push({ key: childKey, input: childKey, hit: step.hit, stance, sort: moves.length });
        edges.push({
          key: `${key}>${childKey}`,
          kind: "follow",
          from: { move: key },
          to: { move: childKey },
          input: step.input,
          follow: {
            gapOnBlock: step.gapOnBlock,
            comboOnHit: step.comboOnHit,
            comboOnCounterHit: step.comboOnCounterHit,
          },
        });
        walk(childKey, step.next, stance);
      } else {
        if (!stanceAbbr.has(step.stance)) throw new Error(`cancel ${key}${step.input}: unknown stance ${step.stance}`);
        edges.push({
          key: `${key}${step.input}>${step.stance}`,
          kind: "cancel",
          from: { move: key },
          to: { stance: step.stance },
          input: step.input,
          cancel: {
            onBlock: step.onBlock,
            onHit: step.onHit,
            onCounterHit: step.onCounterHit,
            autoGuard: step.autoGuard,
          },
        });
      }
    }
  };

  for (const r of data.roots) {
    if (r.stance === undefined) {
      moves.push({ key: r.input, input: r.input, hit: r.hit, stance: null, sort: moves.length });
      walk(r.input, r.next, null);
    } else {
      const abbr = stanceAbbr.get(r.stance);
      if (abbr === undefined) throw new Error(`stance move ${r.input}: unknown stance ${r.stance}`);
      const key = abbr + r.input;
      moves.push({ key, input: key, hit: r.hit, stance: r.stance, sort: moves.length });
      edges.push({
        key: `${r.stance}>${key}`,
        kind: "enter",
        from: { stance: r.stance },
        to: { move: key },
        input: r.input,
      });
      walk(key, r.next, r.stance);
    }
  }

  const seen = new Set<string>();
  for (const m of moves) {
    if (seen.has(m.key)) throw new Error(`move ${m.key} is defined twice`);
    seen.add(m.key);
  }
  return { moves, edges };
}

/** The engine's graph of one character's rows: node ids are move keys and `stance:<key>`. */
export function toMoveGraph(data: CharacterData): MoveGraph {
  const { moves, edges } = flatten(data);
  const end = (e: { move: string } | { stance: string }) => ("move" in e ? e.move : `stance:${e.stance}`);
  return {
    nodes: [
      ...moves.map((m) => ({
        id: m.key,
        kind: "move" as const,
        input: m.input,
        name: m.hit.name,
        level: m.hit.level,
        damage: m.hit.damage,
        ...(m.hit.startup === undefined ? {} : { startup: m.hit.startup }),
        onBlock: m.hit.onBlock,
        onHit: m.hit.onHit,
        onCounterHit: m.hit.onCounterHit,
      })),
      ...data.stances.map((s) => ({ id: `stance:${s.key}`, kind: "stance" as const, name: s.name })),
    ],
    edges: edges.map((e) => {
      const base = { id: e.key, from: end(e.from), to: end(e.to), input: e.input };
      if (e.kind === "follow" && e.follow) return { ...base, kind: "follow" as const, ...e.follow };
      if (e.kind === "cancel" && e.cancel) return { ...base, kind: "cancel" as const, ...e.cancel };
      return { ...base, kind: "enter" as const };
    }),
  };
}
