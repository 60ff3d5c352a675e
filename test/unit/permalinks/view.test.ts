import type { Role } from "@/lib/roles";
import { describe, expect, test } from "vitest";
import { fc, test as prop } from "@fast-check/vitest";
import { parseExplorerSearch } from "@/lib/explorer";
import {
  canRevoke,
  createPermalinkSchema,
  explorerHref,
  explorerStateToView,
  permalinkViewSchema,
  viewToExplorerState,
  VIEW_BOUNDS,
  type PermalinkView,
} from "@/lib/permalink";
import { newSlug, SLUG_BYTES } from "@/server/permalinks";

const good: PermalinkView = {
  root: "v",
  path: "v>v.v|v.v>v.v.t",
  options: { maxDepth: 8, maxStanceVisits: 1, fastest: 10 },
  opponent: null,
};

describe("newSlug", () => {
  test("is 24 base64url characters from 18 random bytes (144 bits)", () => {
    const slug = newSlug();
    expect(slug).toMatch(/^[A-Za-z0-9_-]{24}$/);
    expect(Buffer.from(slug, "base64url")).toHaveLength(SLUG_BYTES);
    expect(SLUG_BYTES * 8).toBeGreaterThanOrEqual(128);
  });

  test("10,000 slugs are all different and use the whole alphabet about evenly", () => {
    const slugs = Array.from({ length: 10_000 }, newSlug);
    expect(new Set(slugs).size).toBe(slugs.length);
    // Each of the 64 symbols should appear about 240,000 / 64 = 3,750 times; a broken
    // generator (a constant, a counter, hex only) lands far outside ±20 %.
    const counts = new Map<string, number>();
    for (const s of slugs) for (const ch of s) counts.set(ch, (counts.get(ch) ?? 0) + 1);
    expect(counts.size).toBe(64);
    for (const n of counts.values()) expect(Math.abs(n - 3750)).toBeLessThan(750);
  });
});

describe("permalinkViewSchema", () => {
  test("accepts a view the Explorer writes, and a root with no selection", () => {
    expect(permalinkViewSchema.parse(good)).toEqual(good);
    expect(permalinkViewSchema.parse({ ...good, path: null, opponent: 3 })).toMatchObject({ path: null, opponent: 3 });
  });

  test.each([
    ["no root", { ...good, root: "" }, /the view starts from/],
    [
      "depth past the Explorer's bound",
      { ...good, options: { ...good.options, maxDepth: 17 } },
      /Depth must be at most 16/,
    ],
    ["fractional stance re-entries", { ...good, options: { ...good.options, maxStanceVisits: 1.5 } }, /whole number/],
    ["fastest as text", { ...good, options: { ...good.options, fastest: "10; drop table" } }, /must be a number/],
    ["an opponent as a script", { ...good, opponent: "<script>alert(1)</script>" }, /opponent must be a character id/],
    ["a control character in the path", { ...good, path: "v>v.v\u0000" }, /control characters/],
    ["an extra field", { ...good, edition: "1-0" }, /Unrecognized key/i],
  ])("refuses %s with a clear message", (_what, view, message) => {
    const parsed = permalinkViewSchema.safeParse(view);
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues.map((i) => i.message).join(" ")).toMatch(message);
  });

  test("keeps SQL- and script-looking keys as plain text (they are looked up, never run)", () => {
    const odd = { ...good, root: "1'; drop table moves; --", path: "<img src=x onerror=alert(1)>" };
    expect(permalinkViewSchema.parse(odd)).toEqual(odd);
  });

  // The permalink's bounds are the Explorer's: whatever the address accepts, a permalink accepts.
  prop.prop([fc.constantFrom("maxDepth", "maxStanceVisits", "fastest"), fc.integer({ min: -5, max: 40 })])(
    "agrees with the Explorer's search params on every option",
    (key, value) => {
      const param = { maxDepth: "depth", maxStanceVisits: "visits", fastest: "fastest" }[key];
      const explorerTakes = parseExplorerSearch({ [param]: String(value) })[param as "depth"] === value;
      const viewTakes = permalinkViewSchema.safeParse({ ...good, options: { ...good.options, [key]: value } }).success;
      expect(viewTakes).toBe(explorerTakes);
    },
  );
});

describe("createPermalinkSchema", () => {
  const body = { teamId: 4, characterId: 2, edition: "1-1", view: good, visibility: "team" };
  test("accepts a complete request", () => {
    expect(createPermalinkSchema.parse(body)).toEqual(body);
  });
  test.each([
    ["a visibility of its own", { ...body, visibility: "public" }, /"team" \(members only\) or "link"/],
    ["an Edition that is no slug", { ...body, edition: "1.1'--" }, /slug, such as 1-1/],
    ["a team by name", { ...body, teamId: "mine" }, /The team must be a number/],
    ["no view", { ...body, view: undefined }, /expected object|Invalid input/i],
  ])("refuses %s", (_what, input, message) => {
    const parsed = createPermalinkSchema.safeParse(input);
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues.map((i) => i.message).join(" ")).toMatch(message);
  });
});

describe("views and the Explorer", () => {
  test("a view becomes the Explorer store's starting state on the pinned Edition, and back", () => {
    const state = viewToExplorerState({ ...good, opponent: 7 }, "1-0");
    expect(state).toEqual({ edition: "1-0", selected: good.path, options: good.options, opponent: 7 });
    expect(explorerStateToView(state, good.root)).toEqual({ ...good, opponent: 7 });
  });

  test("the live Explorer's address opens the same view (its own search-param parser reads it back)", () => {
    const view: PermalinkView = {
      root: "drift:v",
      path: "drift:v>drift:v.n|drift:v.n~ebb>drift",
      options: { maxDepth: 5, maxStanceVisits: 2, fastest: 12 },
      opponent: 9,
    };
    const href = explorerHref({
      gameSlug: "vesper-circuit",
      characterSlug: "tarrow",
      edition: "1-0",
      view,
      gameFastest: 10,
    });
    const url = new URL(href, "http://localhost");
    expect(url.pathname).toBe("/games/vesper-circuit/tarrow/explore/drift%3Av");
    expect(parseExplorerSearch(Object.fromEntries(url.searchParams))).toEqual({
      edition: "1-0",
      path: view.path,
      depth: 5,
      visits: 2,
      fastest: 12,
      vs: 9,
    });
    // Defaults are left out, as the Explorer leaves them out of its own address.
    const plain = explorerHref({
      gameSlug: "g",
      characterSlug: "c",
      edition: "1-1",
      view: { ...good, path: null },
      gameFastest: 10,
    });
    expect(plain).toBe("/games/g/c/explore/v?edition=1-1");
    expect(VIEW_BOUNDS.maxDepth.default).toBe(8);
  });
});

describe("canRevoke", () => {
  // The rule from the product brief: the creator, or a coach or owner of the team.
  const table: [Role | null, boolean, boolean][] = [
    ["owner", false, true],
    ["coach", false, true],
    ["player", false, false],
    ["viewer", false, false],
    ["owner", true, true],
    ["coach", true, true],
    ["player", true, true],
    ["viewer", true, true],
    [null, false, false],
    [null, true, false],
  ];
  test.each(table)("role %s, creator %s → %s", (role, isCreator, allowed) => {
    expect(canRevoke({ role, isCreator })).toBe(allowed);
  });
});
