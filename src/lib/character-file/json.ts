import { z } from "zod";
import { capProblems, coachErrorMap, formatPath, type FileProblem, type ParseResult } from "./problems";
import { CHARACTER_FORMAT, EDITION_FORMAT, FORMAT_VERSION, type PortableCharacter } from "./schema";
import { jsonNestingDepth, stripBom } from "./text";
import { validateCharacter, type Locate, type ReadOptions } from "./validate";

/**
 * Framefork's JSON format. One character:
 *
 *   { "format": "framefork-character", "version": 1,
 *     "character": {...}, "stances": [...], "moves": [...], "edges": [...] }
 *
 * A whole Edition: { "format": "framefork-edition", "version": 1, "characters": [ {character, stances, moves, edges}, ... ] }
 */

/** Our format nests six levels at most; anything much deeper is not one of our files. */
export const MAX_JSON_DEPTH = 16;

const body = {
  character: z.unknown(),
  stances: z.array(z.unknown()),
  moves: z.array(z.unknown()),
  edges: z.array(z.unknown()),
};
const characterEnvelope = z.strictObject({
  format: z.literal(CHARACTER_FORMAT),
  version: z.literal(FORMAT_VERSION),
  ...body,
});
const editionEnvelope = z.strictObject({
  format: z.literal(EDITION_FORMAT),
  version: z.literal(FORMAT_VERSION),
  characters: z.array(z.strictObject(body)).min(1),
});

function fail(problems: FileProblem[]): ParseResult {
  return { ok: false, problems: capProblems(problems) };
}

/** Parses a character or an Edition file (one or several characters) from JSON text. */
export function parseCharactersJson(input: string, options: ReadOptions = {}): ParseResult {
  const text = stripBom(input);
  if (text.trim() === "") return fail([{ message: "the file is empty" }]);
  if (jsonNestingDepth(text, MAX_JSON_DEPTH) > MAX_JSON_DEPTH) {
    return fail([
      {
        message: `the JSON nests deeper than ${MAX_JSON_DEPTH} levels; a Framefork file never does, so this is not one`,
      },
    ]);
  }
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (e) {
    const detail = e instanceof SyntaxError ? e.message : "unreadable";
    return fail([{ message: `the file is not valid JSON (${detail})` }]);
  }

  const format = typeof data === "object" && data !== null && "format" in data ? data.format : undefined;
  if (format !== CHARACTER_FORMAT && format !== EDITION_FORMAT) {
    return fail([
      {
        path: "format",
        message: `this is not a Framefork file: "format" must be "${CHARACTER_FORMAT}" or "${EDITION_FORMAT}"`,
      },
    ]);
  }
  const version = (data as { version?: unknown }).version;
  if (version !== FORMAT_VERSION) {
    return fail([
      {
        path: "version",
        message: `this file is format version ${JSON.stringify(version)}; this Framefork reads version ${FORMAT_VERSION}`,
      },
    ]);
  }

  const envelope = (format === CHARACTER_FORMAT ? characterEnvelope : editionEnvelope).safeParse(data, {
    error: coachErrorMap,
  });
  if (!envelope.success) {
    return fail(envelope.error.issues.map((i) => ({ path: formatPath(i.path) || "(top level)", message: i.message })));
  }
  const raws = "characters" in envelope.data ? envelope.data.characters : [envelope.data];
  const prefix = "characters" in envelope.data ? (i: number) => [`characters`, i] : () => [];

  const problems: FileProblem[] = [];
  const characters: PortableCharacter[] = [];
  raws.forEach((raw, i) => {
    const locate: Locate = (part, index, field = []) => ({
      path: formatPath([...prefix(i), part, ...(part === "character" ? [] : [index]), ...field]),
    });
    const r = validateCharacter(raw, locate, options);
    if (r.character) characters.push(r.character);
    else problems.push(...r.problems);
  });
  problems.push(...duplicateSlugs(characters, (i) => ({ path: formatPath([...prefix(i), "character", "slug"]) })));
  return problems.length > 0 ? fail(problems) : { ok: true, characters };
}

export function duplicateSlugs(
  characters: readonly PortableCharacter[],
  where: (index: number) => Omit<FileProblem, "message">,
): FileProblem[] {
  const seen = new Set<string>();
  const out: FileProblem[] = [];
  characters.forEach((c, i) => {
    if (seen.has(c.character.slug)) {
      out.push({ ...where(i), message: `the character "${c.character.slug}" appears twice in this file` });
    }
    seen.add(c.character.slug);
  });
  return out;
}

const body_ = (c: PortableCharacter) => ({
  character: c.character,
  stances: c.stances,
  moves: c.moves,
  edges: c.edges,
});

/** One character as JSON text (pretty-printed: people read and diff these files). */
export function exportCharacterJson(c: PortableCharacter): string {
  return `${JSON.stringify({ format: CHARACTER_FORMAT, version: FORMAT_VERSION, ...body_(c) }, null, 2)}\n`;
}

/** A whole Edition (several characters) as one JSON text. */
export function exportEditionJson(characters: readonly PortableCharacter[]): string {
  return `${JSON.stringify({ format: EDITION_FORMAT, version: FORMAT_VERSION, characters: characters.map(body_) }, null, 2)}\n`;
}
