import { fc } from "@fast-check/vitest";
import {
  edgeKey,
  orderEdges,
  type PortableCharacter,
  type PortableEdge,
  type PortableMove,
  type PortableOutcome,
} from "../../../src/lib/character-file";
import { LEVELS, STATES } from "../../../src/lib/engine/schema";

/**
 * Random valid characters in the form the parsers give back, with the text a spreadsheet
 * and a CSV writer find hardest: commas, quotes, semicolons, formula starts (= + - @),
 * apostrophes, characters outside ASCII and, in notes, tabs and line breaks.
 */

const LINE_UNITS = ["a", "Z", "7", " ", ",", '"', "'", "=", "+", "-", "@", ":", "~", ">", "é", "漢", "😀"];
const NOTE_UNITS = [...LINE_UNITS, ";", "\n", "\r\n", "\t", "\r"];
const RISKY = ["=", "+", "-", "@", "'", "''"];

/** The longest prefix of whole characters within `max` code units (never half an emoji). */
function fit(s: string, max: number): string {
  let out = "";
  for (const ch of s) {
    if (out.length + ch.length > max) break;
    out += ch;
  }
  return out;
}

/** One line of text, as the schema keeps it: trimmed and not empty. Often starts with a formula character. */
export const lineArb = (max: number, units = LINE_UNITS): fc.Arbitrary<string> =>
  fc
    .tuple(
      fc.option(fc.constantFrom(...RISKY), { nil: "" }),
      fc.string({ unit: fc.constantFrom(...units), minLength: 1, maxLength: Math.min(12, max) }),
    )
    .map(([lead, rest]) => fit(`${lead}${rest}`.trim(), max).trim())
    .filter((s) => s !== "" && !s.startsWith("stance:"));

const notesArb = fc.option(
  fc
    .tuple(
      fc.option(fc.constantFrom(...RISKY, "\t", "\r", "\r\n", " "), { nil: "" }),
      fc.string({ unit: fc.constantFrom(...NOTE_UNITS), minLength: 1, maxLength: 30 }),
    )
    .map(([lead, rest]) => lead + rest)
    .filter((s) => s.trim() !== ""),
  { nil: null },
);

const outcomeArb: fc.Arbitrary<PortableOutcome> = fc.oneof(
  { weight: 4, arbitrary: fc.integer({ min: -999, max: 999 }) },
  {
    weight: 1,
    arbitrary: fc.record(
      { state: fc.constantFrom(...STATES), frames: fc.integer({ min: -999, max: 999 }) },
      { requiredKeys: ["state"] },
    ),
  },
);

const tagArb = lineArb(40, [...LINE_UNITS.filter((u) => u !== ";")]);

export const characterArb = (sizes: { moves: number; stances: number } = { moves: 8, stances: 3 }) =>
  fc
    .record({
      moveCount: fc.integer({ min: 1, max: sizes.moves }),
      stanceCount: fc.integer({ min: 0, max: sizes.stances }),
      keys: fc.uniqueArray(lineArb(24), {
        minLength: sizes.moves + sizes.stances,
        maxLength: sizes.moves + sizes.stances,
      }),
    })
    .chain(({ moveCount, stanceCount, keys }) => {
      const moveKeys = keys.slice(0, moveCount);
      const stanceKeys = keys.slice(sizes.moves, sizes.moves + stanceCount);
      const stanceKeyArb =
        stanceCount === 0 ? fc.constant(null) : fc.option(fc.constantFrom(...stanceKeys), { nil: null });
      const moveArb = (key: string): fc.Arbitrary<PortableMove> =>
        fc.record({
          key: fc.constant(key),
          input: lineArb(64),
          name: lineArb(120),
          level: fc.constantFrom(...LEVELS),
          damage: fc.integer({ min: 0, max: 9999 }),
          startup: fc.option(fc.integer({ min: 1, max: 999 }), { nil: null }),
          onBlock: outcomeArb,
          onHit: outcomeArb,
          onCounterHit: outcomeArb,
          range: fc.option(lineArb(16), { nil: null }),
          tags: fc.array(tagArb, { maxLength: 3 }),
          notes: notesArb,
          fromPosture: fc.constantFrom("standing", "crouching", "any" as const),
          stance: stanceKeyArb,
        });
      // Follows only point to later moves, so they never loop; cancels and enters may.
      const incomingArb = (i: number): fc.Arbitrary<PortableEdge[]> => {
        const options: fc.Arbitrary<PortableEdge>[] = [];
        if (i > 0) {
          options.push(
            fc.record({
              kind: fc.constant("follow" as const),
              from: fc.constantFrom(...moveKeys.slice(0, i)),
              to: fc.constant(moveKeys[i]!),
              input: lineArb(32),
              gapOnBlock: fc.integer({ min: -999, max: 999 }),
              comboOnHit: fc.boolean(),
              comboOnCounterHit: fc.boolean(),
            }),
          );
        }
        if (stanceCount > 0) {
          options.push(
            fc.record({
              kind: fc.constant("enter" as const),
              from: fc.constantFrom(...stanceKeys),
              to: fc.constant(moveKeys[i]!),
              input: lineArb(32),
            }),
          );
        }
        return options.length === 0 ? fc.constant([]) : fc.array(fc.oneof(...options), { maxLength: 2 });
      };
      const cancelArb = (from: string): fc.Arbitrary<PortableEdge[]> =>
        stanceCount === 0
          ? fc.constant([])
          : fc.array(
              fc.record({
                kind: fc.constant("cancel" as const),
                from: fc.constant(from),
                to: fc.constantFrom(...stanceKeys),
                input: lineArb(32),
                onBlock: outcomeArb,
                onHit: outcomeArb,
                onCounterHit: outcomeArb,
                autoGuard: fc.subarray([...LEVELS]),
              }),
              { maxLength: 2 },
            );
      return fc.record({
        character: fc.record({
          slug: fc.stringMatching(/^[a-z0-9]{1,10}(?:-[a-z0-9]{1,8}){0,2}$/),
          name: lineArb(120),
          summary: notesArb,
        }),
        stances: fc.tuple(
          ...stanceKeys.map((key) =>
            fc.record({ key: fc.constant(key), name: lineArb(120), abbreviation: lineArb(12), notes: notesArb }),
          ),
        ),
        moves: fc.tuple(...moveKeys.map(moveArb)),
        incoming: fc.tuple(...moveKeys.map((_, i) => incomingArb(i))),
        cancels: fc.tuple(...moveKeys.map(cancelArb)),
      });
    })
    .map(({ character, stances, moves, incoming, cancels }): PortableCharacter => {
      // Keys must be unique (the database holds them to it), so repeats are dropped.
      const seen = new Set<string>();
      const edges = [...incoming.flat(), ...cancels.flat()].filter((e) => {
        const k = edgeKey(e);
        if (seen.has(k) || k.length > 96) return false;
        seen.add(k);
        return true;
      });
      return { character, stances, moves, edges: orderEdges(moves, edges) };
    });
