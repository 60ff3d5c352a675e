import { z } from "zod";

/**
 * Names people type (their display name, a team's name) are shown to others: on the team page,
 * in the log, in invite e-mails. So a name may hold any letter, mark, symbol or emoji, but
 * nothing invisible that changes how the text around it reads or lays out:
 *
 * - `\p{Cc}`: control characters: C0 (tab, line feed …), DEL and C1;
 * - `\p{Cf}`: format characters: the bidirectional embeddings, overrides and isolates
 *   (U+202A–U+202E, U+2066–U+2069) that make text read in another order, zero-width space,
 *   byte order mark, soft hyphen, invisible tags. Two are allowed: ZWNJ and ZWJ (U+200C, U+200D),
 *   which Persian and Indic names and emoji sequences (👩‍💻) need; and tags inside a flag emoji
 *   (🏴 + tags + cancel tag, Unicode UTS #51), which is how subdivision flags are spelt;
 * - `\p{Zl}`, `\p{Zp}`: the line and paragraph separators (U+2028, U+2029);
 * - `\p{Cs}`: half of a character (a lone surrogate).
 */
const UNSAFE = /(?![\u200C\u200D])[\p{Cc}\p{Cf}\p{Zl}\p{Zp}\p{Cs}]/u;
const UNSAFE_ALL = new RegExp(UNSAFE.source, "gu");
/** A flag emoji spelt with tags; split on it, the parts at odd places are these flags. */
const FLAG_TAGS = /(\u{1F3F4}[\u{E0020}-\u{E007E}]+\u{E007F})/u;
/** Characters that end a line: read as a space when a stored name is cleaned, not glued away. */
const BREAKS = /[\p{Cc}\p{Zl}\p{Zp}]/u;

const codePoint = (c: string) => `U+${c.codePointAt(0)!.toString(16).toUpperCase().padStart(4, "0")}`;

/** The first character a name may not hold, as "U+202E", or null when the name is fine. */
export function unsafeCharacter(name: string): string | null {
  for (const [i, part] of name.split(FLAG_TAGS).entries()) {
    const found = i % 2 === 0 ? UNSAFE.exec(part) : null;
    if (found) return codePoint(found[0]);
  }
  return null;
}

/**
 * A stored name made safe to show, for names written before the schemas below refused these
 * characters: line breaks and other controls become spaces, the rest is removed.
 */
export function cleanName(name: string): string {
  return name
    .split(FLAG_TAGS)
    .map((part, i) => (i % 2 === 0 ? part.replace(UNSAFE_ALL, (c) => (BREAKS.test(c) ? " " : "")) : part))
    .join("")
    .replace(/\s+/g, " ")
    .trim();
}

export function nameSchema({
  missing,
  min,
  tooShort,
  tooLong,
  what,
}: {
  missing: string;
  min: number;
  tooShort: string;
  tooLong: string;
  what: string;
}) {
  return z
    .string({ error: missing })
    .trim()
    .min(1, { error: missing })
    .min(min, { error: tooShort })
    .max(120, { error: tooLong })
    .superRefine((name, ctx) => {
      const bad = unsafeCharacter(name);
      if (bad)
        ctx.addIssue({
          code: "custom",
          message: `${what} cannot contain line breaks, control characters or invisible formatting characters (it has ${bad}). Retype it without them.`,
        });
    });
}

/** The name a person shows to their teams. */
export const displayNameSchema = nameSchema({
  missing: "Enter the name your team will see.",
  min: 1,
  tooShort: "Enter the name your team will see.",
  tooLong: "Use at most 120 characters for your name.",
  what: "Your name",
});

/** A team's name. */
export const teamNameSchema = nameSchema({
  missing: "Give the team a name.",
  min: 2,
  tooShort: "A team name needs at least 2 characters.",
  tooLong: "A team name can be at most 120 characters.",
  what: "A team name",
});
