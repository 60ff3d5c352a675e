import { describe, expect, test } from "vitest";
import { cleanName, displayNameSchema, teamNameSchema, unsafeCharacter } from "@/lib/names";

/** Every code point with a Unicode property, read from the JavaScript engine's Unicode tables. */
function withProperty(property: RegExp): string[] {
  const found: string[] = [];
  for (let cp = 0; cp <= 0x10ffff; cp++) {
    if (cp >= 0xd800 && cp <= 0xdfff) continue;
    const c = String.fromCodePoint(cp);
    if (property.test(c)) found.push(c);
  }
  return found;
}

const hex = (c: string) => `U+${c.codePointAt(0)!.toString(16).toUpperCase().padStart(4, "0")}`;

describe("names people type", () => {
  test("every character with Unicode's Bidi_Control property (UAX #9) is refused", () => {
    const bidi = withProperty(/\p{Bidi_Control}/u);
    // Source: Unicode PropList.txt, Bidi_Control: 061C, 200E–200F, 202A–202E, 2066–2069.
    expect(bidi.map(hex)).toEqual([
      "U+061C",
      "U+200E",
      "U+200F",
      "U+202A",
      "U+202B",
      "U+202C",
      "U+202D",
      "U+202E",
      "U+2066",
      "U+2067",
      "U+2068",
      "U+2069",
    ]);
    for (const c of bidi) expect(unsafeCharacter(`Night${c}Shift`), hex(c)).toBe(hex(c));
  });

  test("every control character (general category Cc: C0, DEL, C1) and both separators are refused", () => {
    const controls = withProperty(/\p{Cc}/u);
    expect(controls).toHaveLength(65); // Unicode: U+0000–U+001F, U+007F–U+009F
    for (const c of [...controls, "\u2028", "\u2029"]) expect(unsafeCharacter(`Mara${c}Quell`), hex(c)).toBe(hex(c));
  });

  test("invisible format characters are refused, half a character too", () => {
    for (const c of ["\u200B", "\uFEFF", "\u00AD", "\u2060", "\u{E0041}", "\u{E0001}", "\uD800", "\uDC00"])
      expect(unsafeCharacter(`Player${c}Strattlebee`), hex(c)).toBe(hex(c));
  });

  test("letters of every script, joiners that scripts and emoji need, and flag emoji are kept", () => {
    const fine = [
      "Zoë Ashgrove",
      "Player Vantorel-Okonquix",
      "ليلى الحارث", // Arabic, right to left by its letters, with no control character
      "נועה", // Hebrew
      "می‌خواهم", // Persian with ZWNJ (U+200C)
      "क्‍ष", // Devanagari with ZWJ (U+200D)
      "👩‍💻 Night Crew", // an emoji ZWJ sequence
      "🏴󠁧󠁢󠁷󠁬󠁳󠁿 Valley Club", // a subdivision flag: black flag, tag letters, cancel tag (UTS #51)
      "Tokyo 東京 ⚔",
    ];
    for (const name of fine) {
      expect(unsafeCharacter(name), name).toBeNull();
      expect(cleanName(name)).toBe(name);
    }
    // Tags are allowed only inside a flag: on their own they are hidden text.
    expect(unsafeCharacter("Valley\u{E0076}\u{E0061}\u{E007F}")).toBe("U+E0076");
  });

  test("the schemas refuse them with a message that names the character and says what to do", () => {
    const team = teamNameSchema.safeParse("Night\u202EShift");
    expect(team.success).toBe(false);
    expect(team.error?.issues[0]?.message).toBe(
      "A team name cannot contain line breaks, control characters or invisible formatting characters (it has U+202E). Retype it without them.",
    );
    const person = displayNameSchema.safeParse("Mara\nQuell");
    expect(person.error?.issues[0]?.message).toContain("Your name cannot contain line breaks");
    // Trimmed first: a line break typed at the end is only whitespace around the name.
    expect(displayNameSchema.parse("  Player Quellborn-7\n")).toBe("Player Quellborn-7");
    expect(teamNameSchema.parse("👩‍💻 Night Crew")).toBe("👩‍💻 Night Crew");
    // The length rules stay as they were.
    expect(teamNameSchema.safeParse("x").error?.issues[0]?.message).toBe("A team name needs at least 2 characters.");
    // An empty field asks for the name rather than counting characters.
    expect(teamNameSchema.safeParse("  ").error?.issues[0]?.message).toBe("Give the team a name.");
    expect(displayNameSchema.safeParse("y".repeat(121)).error?.issues[0]?.message).toBe(
      "Use at most 120 characters for your name.",
    );
  });

  test("cleanName makes a stored name safe to show: breaks become spaces, invisible characters go", () => {
    expect(cleanName("Player\r\nQuellborn-7")).toBe("Player Quellborn-7");
    expect(cleanName("Night\u202EtfihS\u202C Crew\u200B")).toBe("NighttfihS Crew");
    expect(cleanName("Player\u2028Strattlebee\tOwner")).toBe("Player Strattlebee Owner");
    expect(cleanName("\u0007\u0085")).toBe("");
    expect(cleanName("🏴󠁧󠁢󠁷󠁬󠁳󠁿 Valley\u{E0041}")).toBe("🏴󠁧󠁢󠁷󠁬󠁳󠁿 Valley");
  });
});
