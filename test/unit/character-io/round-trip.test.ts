import { fc, test } from "@fast-check/vitest";
import { afterAll, describe, expect } from "vitest";
import {
  exportCharacterCsv,
  exportCharacterJson,
  parseCharacterFile,
  type PortableCharacter,
} from "@/lib/character-file";
import { closeDb } from "@/server/db";
import { loadPortableCharacter } from "@/server/db/queries/character-io";
import { characterArb } from "../character-file/arbitraries";
import { importInto, teamWithDraft } from "./fixtures";

// Random valid characters (the file layer's generator: formula starts, quotes, line breaks in
// notes, characters outside ASCII) written as CSV and as JSON, read again, imported into an
// empty draft and read back from the database: the same data comes out.

afterAll(closeDb);

const parsed = (name: string, text: string): PortableCharacter => {
  const r = parseCharacterFile(name, new TextEncoder().encode(text));
  if (!r.ok) throw new Error(JSON.stringify(r.problems.slice(0, 3)));
  return r.characters[0]!;
};

describe("a character through a file and the database", () => {
  test.prop({ c: characterArb({ moves: 6, stances: 3 }), format: fc.constantFrom("csv", "json") }, { numRuns: 12 })(
    "export, import into an empty draft, load: the same character",
    async ({ c, format }) => {
      const text = format === "csv" ? exportCharacterCsv(c) : exportCharacterJson(c);
      const file = parsed(`fighter.${format}`, text);
      const t = await teamWithDraft(c.character);
      const scope = { editionId: t.edition.id, characterId: t.characterId };
      const run = () => importInto(t, file);
      const result = await run();
      expect(result.ok ? result.counts.moves.added : result.problems).toBe(c.moves.length);
      expect(await loadPortableCharacter(scope)).toEqual(c);

      // The same file again changes nothing.
      const again = await run();
      expect(again.ok && again.counts).toEqual({
        stances: { added: 0, changed: 0, removed: 0 },
        moves: { added: 0, changed: 0, removed: 0 },
        edges: { added: 0, changed: 0, removed: 0 },
      });
    },
  );
});
