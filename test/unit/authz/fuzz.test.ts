import { fc, test } from "@fast-check/vitest";
import { beforeAll, describe, expect, vi } from "vitest";
import type { SessionUser } from "@/server/auth";
import { missingRows, pathParams, routeHandlers, routeUrl, serverActions, type Action } from "./inventory";
import { tableChecksums, runOnPrivateDatabase } from "./private-database";
import { setSession } from "./session-mock";
import { boardSave, newStanceLink, newBoard, newGame, VIEW, world, type World, newLink, newFollowUp } from "./world";
import { ONE_MOVE_PATHS_REQUEST } from "../../fixtures/paths-request";
import { runAfterAnswer } from "../auth/request-mock";

// Every route's path parameters, query and body, and every server action's form, filled with
// arbitrary input by three kinds of caller: signed out, another team's owner, and team A's own
// owner (who gets past every role check, so malformed input reaches the deepest code).
// No answer may be a 500, and an answer that refuses may not have written anything.
// The seed is fixed so CI is repeatable; FUZZ_SEED=<n> and FUZZ_RUNS=<n> explore further, and a
// failure prints its seed and path for fast-check to replay.

vi.mock("@/server/auth", () => import("./session-mock"));
vi.mock("@/server/mail", () => import("./mail-mock"));
vi.mock("next/headers", () => import("./headers-mock"));
// Work an action leaves for after its answer is held, and run before the tables are read again.
vi.mock("next/server", async (original) => ({
  ...(await original<typeof import("next/server")>()),
  after: (await import("../auth/request-mock")).after,
}));

runOnPrivateDatabase();

const SEED = Number(process.env.FUZZ_SEED ?? 1_207_2026);
const RUNS = Number(process.env.FUZZ_RUNS ?? 50);
const settings = { seed: SEED, numRuns: RUNS, endOnFailure: true };

let w: World;
beforeAll(async () => {
  w = await world();
});

// Input of every kind: short text, any code point, control characters, numbers written every
// way, path tricks, broken percent-encoding, and the real ids of the world (so some calls get
// past the first lookup).
const NASTY = [
  "",
  " ",
  "0",
  "-1",
  "1.5",
  "1e309",
  "9007199254740993",
  "18446744073709551616",
  "0x10",
  "NaN",
  "Infinity",
  "null",
  "undefined",
  "true",
  "[]",
  "{}",
  "..",
  "../../etc/passwd",
  "%",
  "%E0%A4%A",
  "%00",
  "\u0000",
  "\ud800",
  "a".repeat(300),
  "x'); DROP TABLE teams; --",
  "<script>alert(1)</script>",
  "__proto__",
  "constructor",
];
/** The world's real ids, so that some calls get past the first lookup and reach deeper code. */
const REFS = {
  teamSlug: () => w.team.slug,
  otherTeamSlug: () => w.other.slug,
  teamId: () => w.team.id,
  otherTeamId: () => w.other.id,
  inviteId: () => w.pending.invite.id,
  inviteToken: () => w.pending.token,
  memberId: () => w.people.extra.id,
  ownerId: () => w.people.owner.id,
  ownerEmail: () => w.people.owner.email,
  permalinkSlug: () => w.shared.slug,
  boardId: () => w.board.id,
  teamCharacterId: () => w.teamCharacterId,
  teamGameSlug: () => w.teamGame.slug,
  teamEdition: () => "0-1",
  teamCharacterSlug: () => "sparring-dummy",
  teamMoveKey: () => "1",
  teamEdgeKey: () => "1>1,1",
  demoCharacterId: () => w.demoCharacterId,
  edition: () => "1-1",
  role: () => "viewer",
} satisfies Record<string, () => string | number>;
type Ref = { ref: keyof typeof REFS };
type Text = string | Ref;
const isRef = (v: unknown): v is Ref => v !== null && typeof v === "object" && "ref" in v;
const ref = fc.constantFrom(...(Object.keys(REFS) as Ref["ref"][])).map((r): Ref => ({ ref: r }));
const resolve = (t: Text): string => (isRef(t) ? String(REFS[t.ref]()) : t);

const text: fc.Arbitrary<Text> = fc.oneof(
  { weight: 3, arbitrary: ref },
  { weight: 2, arbitrary: fc.string({ maxLength: 20 }) },
  { weight: 1, arbitrary: fc.string({ unit: "binary", maxLength: 20 }) },
  { weight: 2, arbitrary: fc.constantFrom(...NASTY) },
  { weight: 1, arbitrary: fc.oneof(fc.integer(), fc.double()).map(String) },
);
const number: fc.Arbitrary<number | Ref> = fc.oneof(
  ref,
  fc.integer(),
  fc.double(),
  fc.constantFrom(0, -1, 1.5, 2 ** 31, 2 ** 53, Number.MAX_VALUE, 1e-9),
);
/** What replaces a body field: most often a value of the field's own type, so the rest of the body still parses. */
const leaf = fc.record({ sameType: fc.boolean(), text, number, json: fc.jsonValue({ maxDepth: 2 }) });
type Leaf = typeof leaf extends fc.Arbitrary<infer T> ? T : never;

function valueFor(original: unknown, l: Leaf): unknown {
  if (!l.sameType) return l.json;
  if (typeof original === "number") return isRef(l.number) ? REFS[l.number.ref]() : l.number;
  if (typeof original === "string") return resolve(l.text);
  if (typeof original === "boolean") return !original;
  return l.json;
}

/** The real ids that fit each path parameter: half the generated parameters are one of them. */
const PARAM_REFS: Record<string, Ref["ref"][]> = {
  team: ["teamSlug", "otherTeamSlug"],
  user: ["memberId", "ownerId"],
  invite: ["inviteId"],
  slug: ["permalinkSlug"],
  id: ["teamCharacterId", "demoCharacterId"],
  game: ["teamGameSlug"],
  edition: ["teamEdition", "edition"],
  character: ["teamCharacterSlug"],
  move: ["teamMoveKey"],
  edge: ["teamEdgeKey"],
  board: ["boardId"],
};
const param = (name: string): fc.Arbitrary<Text> =>
  PARAM_REFS[name]
    ? fc.oneof(
        fc.constantFrom(...PARAM_REFS[name]).map((r): Ref => ({ ref: r })),
        text,
      )
    : text;

type Caller = "anonymous" | "outsider" | "member";
const caller = fc.constantFrom<Caller>("anonymous", "outsider", "member", "member");
const userOf = (who: Caller): SessionUser | null => {
  if (who === "anonymous") return null;
  const p = who === "outsider" ? w.people.outsider : w.people.owner;
  return { id: p.id, email: p.email, name: p.name };
};

interface FuzzRow {
  /** A body the route accepts, which the fuzzer breaks field by field; none for a route that reads no body. */
  good?: () => Record<string, unknown>;
  /** Other kinds of body the route accepts: each call breaks one of `good` and these. */
  alsoGood?: (() => Record<string, unknown>)[];
  /** The query fields the route reads, so generated queries use them often. */
  query?: string[];
  /** The request headers the route reads (beyond the body's type), sent filled with arbitrary text. */
  headers?: string[];
}

/** A request header's value: arbitrary text (what a header cannot carry is left out) or entity-tag look-alikes. */
const headerValue: fc.Arbitrary<Text> = fc.oneof(
  text,
  fc.constantFrom("*", 'W/"x"', '"a", W/"b"', '"', ",,", "W/", '""', '"\u00ff"'),
);
const sendable = (value: string) => /^[\t\x20-\x7e\x80-\xff]*$/.test(value);

/** Every route handler. A new one fails the first test until it has a row. */
const ROUTES: Record<string, FuzzRow | { overHttp: string }> = {
  "GET /api/health": {},
  "POST /api/paths": {
    good: () => ({
      ...ONE_MOVE_PATHS_REQUEST,
      options: { maxDepth: 4 },
      limit: 10,
    }),
  },
  // next-auth reads cookies() from Next's request scope, which only a running server has.
  "GET /api/auth/[...nextauth]": { overHttp: "test/e2e/fuzz-auth.spec.ts" },
  "POST /api/auth/[...nextauth]": { overHttp: "test/e2e/fuzz-auth.spec.ts" },
  "GET /api/characters/[id]/graph": { query: ["edition"], headers: ["if-none-match"] },
  "GET /api/teams": {},
  "POST /api/teams": { good: () => ({ name: "Fuzz Team" }) },
  "GET /api/teams/[team]/members": {},
  "PATCH /api/teams/[team]/members/[user]": { good: () => ({ role: "coach" }) },
  "DELETE /api/teams/[team]/members/[user]": {},
  "GET /api/teams/[team]/invites": {},
  "POST /api/teams/[team]/invites": { good: () => ({ email: "fuzz-invitee@example.test", role: "viewer" }) },
  "DELETE /api/teams/[team]/invites/[invite]": {},
  "GET /api/teams/[team]/audit": {},
  "GET /api/teams/[team]/permalinks": {},
  "POST /api/permalinks": {
    good: () => ({ teamId: w.team.id, characterId: w.demoCharacterId, edition: "1-1", view: VIEW, visibility: "link" }),
    alsoGood: [
      () => ({ kind: "board", teamId: w.team.id, view: { board: w.board.id }, visibility: "link" }),
      () => newStanceLink(w, "link"),
    ],
  },
  "GET /api/teams/[team]/boards": {},
  "POST /api/teams/[team]/boards": { good: () => ({ ...newBoard(w), opponentId: w.teamCharacterId }) },
  "GET /api/teams/[team]/boards/[board]": {},
  "PUT /api/teams/[team]/boards/[board]": { good: boardSave },
  "DELETE /api/teams/[team]/boards/[board]": { query: ["version"] },
  "DELETE /api/permalinks/[slug]": {},
  "POST /api/invites/accept": { good: () => ({ token: w.pending.token }) },
  "POST /api/teams/[team]/games": {
    good: () => ({ ...newGame("Fuzz Rumble"), summary: "x" }),
  },
  "POST /api/games/[game]/characters": { good: () => ({ name: "Fuzz Fighter", summary: "x" }) },
  "POST /api/games/[game]/editions": { good: () => ({ name: "0.2", releasedOn: "2026-12-01", notes: "x" }) },
  "POST /api/games/[game]/editions/[edition]/publish": {},
  "PATCH /api/games/[game]/editions/[edition]/characters/[character]/moves/[move]": {
    good: () => ({ version: 1, changes: { damage: 12, onBlock: -4, name: "Poke", tags: ["poke"] } }),
  },
  "GET /api/games/[game]/editions/[edition]/characters/[character]/moves/[move]": {},
  "DELETE /api/games/[game]/editions/[edition]/characters/[character]/moves/[move]": { query: ["version"] },
  "POST /api/games/[game]/editions/[edition]/characters/[character]/moves": {
    good: newFollowUp,
  },
  "POST /api/games/[game]/editions/[edition]/characters/[character]/edges": {
    good: newLink,
  },
  "GET /api/games/[game]/editions/[edition]/characters/[character]/edges/[edge]": {},
  "PATCH /api/games/[game]/editions/[edition]/characters/[character]/edges/[edge]": {
    good: () => ({ version: 1, changes: { gapOnBlock: 3, input: ",1" } }),
  },
  "DELETE /api/games/[game]/editions/[edition]/characters/[character]/edges/[edge]": { query: ["version"] },
  // Takes a form upload: the fuzzer's JSON and other bodies are refused (415) before anything is read.
  "POST /api/games/[game]/editions/[edition]/characters/[character]/import": {
    good: () => ({ file: "row,key\n" }),
    query: ["preview"],
  },
  "GET /api/games/[game]/editions/[edition]/characters/[character]/export": { query: ["format"] },
  "GET /api/games/[game]/editions/[edition]/export": { query: ["format"] },
  "POST /api/games/[game]/editions/[edition]/characters/[character]/stances": {
    good: () => ({ key: "guard", name: "Low Guard", abbreviation: "LG", notes: "x" }),
  },
};

const sometimes = <T>(arb: fc.Arbitrary<T>) =>
  fc.oneof({ weight: 3, arbitrary: fc.constant(null) }, { weight: 1, arbitrary: arb });
/** How a body is broken: fields replaced (at the top or one level down), dropped or added; or not JSON; or other JSON. */
const bodyArb = fc.oneof(
  {
    weight: 6,
    arbitrary: fc.record({
      replace: fc.array(fc.tuple(fc.nat(), leaf), { maxLength: 2 }),
      nested: fc.array(fc.tuple(fc.nat(), fc.nat(), leaf), { maxLength: 2 }),
      drop: sometimes(fc.nat()),
      extra: sometimes(fc.tuple(fc.string({ maxLength: 10 }), leaf)),
    }),
  },
  { weight: 1, arbitrary: fc.record({ raw: fc.string({ maxLength: 60 }) }) },
  { weight: 1, arbitrary: fc.record({ whole: fc.jsonValue({ maxDepth: 2 }) }) },
);
const typeArb = fc.oneof(
  { weight: 8, arbitrary: fc.constant("application/json") },
  {
    weight: 1,
    arbitrary: fc.constantFrom("application/x-www-form-urlencoded", "text/plain", "application/merge-patch+json", ""),
  },
);

/** The i-th key of an object or array, or null when it has none. */
const keyAt = (o: unknown, i: number): string | null => {
  if (o === null || typeof o !== "object") return null;
  const keys = Object.keys(o);
  return keys.length === 0 ? null : keys[i % keys.length]!;
};

function bodyText(good: Record<string, unknown>, shape: typeof bodyArb extends fc.Arbitrary<infer T> ? T : never) {
  if ("raw" in shape) return shape.raw;
  if ("whole" in shape) return JSON.stringify(shape.whole);
  const body: Record<string, unknown> = structuredClone(good);
  for (const [i, l] of shape.replace) {
    const k = keyAt(body, i);
    if (k !== null) body[k] = valueFor(body[k], l);
  }
  for (const [i, j, l] of shape.nested) {
    const inner = body[keyAt(body, i) ?? ""] as Record<string, unknown> | undefined;
    const k = keyAt(inner, j);
    if (inner && k !== null) inner[k] = valueFor(inner[k], l);
  }
  if (shape.drop !== null) delete body[keyAt(body, shape.drop) ?? ""];
  if (shape.extra) body[shape.extra[0]] = valueFor(undefined, shape.extra[1]);
  return JSON.stringify(body);
}

describe("fuzzing every route and action", () => {
  test("every route handler and every server action has a row, and every row a route or an action", async () => {
    expect(missingRows((await routeHandlers()).keys(), ROUTES)).toEqual({ "no row": [], "row for nothing": [] });
    expect(missingRows((await serverActions()).keys(), ACTIONS)).toEqual({ "no row": [], "row for nothing": [] });
  });

  for (const [key, row] of Object.entries(ROUTES)) {
    if ("overHttp" in row) continue;
    const [method, route] = key.split(" ") as [string, string];
    const names = pathParams(route);
    const queryKey = fc.oneof(fc.constantFrom(...(row.query ?? ["q"])), fc.string({ maxLength: 8 }));
    const answers: number[] = [];

    test.prop(
      {
        who: caller,
        params: fc.tuple(...names.map(param)),
        query: fc.array(fc.tuple(queryKey, text), { maxLength: 3 }),
        body: bodyArb,
        type: typeArb,
        kind: fc.nat(),
        headers: row.headers
          ? fc.array(fc.tuple(fc.constantFrom(...row.headers), headerValue), { maxLength: 2 })
          : fc.constant([]),
      },
      settings,
    )(key, async ({ who, params, query, body, type, kind, headers }) => {
      const values = Object.fromEntries(names.map((name, i) => [name, resolve(params[i]!)]));
      const search = new URLSearchParams(query.map(([k, v]) => [k, resolve(v)]));
      const init: RequestInit = { method };
      const goods = row.good ? [row.good, ...(row.alsoGood ?? [])] : [];
      if (row.good) init.body = bodyText(goods[kind % goods.length]!(), body);
      if (row.good && type) init.headers = { "content-type": type };
      const sent = headers.map(([name, value]) => [name, resolve(value)]).filter(([, value]) => sendable(value!));
      if (sent.length > 0) init.headers = { ...init.headers, ...Object.fromEntries(sent) };
      setSession(userOf(who));

      const before = await tableChecksums();
      const handler = (await routeHandlers()).get(key)!;
      const request = new Request(routeUrl(route, values, search.size ? `?${search}` : ""), init);
      const res = await handler(request, { params: Promise.resolve(values) });
      answers.push(res.status);
      expect(res.status, await res.clone().text()).toBeLessThan(500);
      if (res.status >= 400) expect(await tableChecksums(), "a refusal wrote nothing").toEqual(before);
    });

    // The fuzzer must have been refused at least once, or "a refusal wrote nothing" tested nothing.
    const readsInput = names.length > 0 || row.query !== undefined || row.good !== undefined;
    test.runIf(readsInput)(`${key}: some fuzzed calls were refused`, () => {
      expect(answers.some((s) => s >= 300)).toBe(true);
    });
  }
});

let newAddress = 0;
const PASSWORD = "long enough password";
/** Every server action, with a form it accepts, which the fuzzer breaks field by field. */
const ACTIONS: Record<string, { good: () => Record<string, string> }> = {
  "(auth)/actions.ts signUp": {
    good: () => ({ name: "Fuzz Person", email: `fuzz-${newAddress++}@example.test`, password: PASSWORD }),
  },
  "(auth)/actions.ts requestPasswordReset": { good: () => ({ email: w.people.viewer.email }) },
  "(auth)/actions.ts resetPassword": { good: () => ({ token: "no-such-token", password: PASSWORD }) },
  "(auth)/actions.ts changePassword": { good: () => ({ currentPassword: PASSWORD, newPassword: PASSWORD }) },
  "(auth)/actions.ts resendConfirmation": { good: () => ({ email: w.people.viewer.email }) },
  "(auth)/actions.ts confirmEmail": { good: () => ({ token: "no-such-token" }) },
  "(auth)/actions.ts signOutEverywhere": { good: () => ({}) },
};

/** A form field's value: text of every kind, an address, a long enough password, or a file. */
const formValue = fc.oneof(
  { weight: 4, arbitrary: text.map((t) => ({ text: t })) },
  { weight: 1, arbitrary: fc.emailAddress().map((t) => ({ text: t as Text })) },
  { weight: 1, arbitrary: fc.string({ minLength: 12, maxLength: 24 }).map((t) => ({ text: t as Text })) },
  { weight: 1, arbitrary: fc.record({ file: fc.uint8Array({ maxLength: 64 }), name: fc.string({ maxLength: 12 }) }) },
);
type FormValue = typeof formValue extends fc.Arbitrary<infer T> ? T : never;
const formArb = fc.record({
  replace: fc.array(fc.tuple(fc.nat(), formValue), { maxLength: 2 }),
  drop: sometimes(fc.nat()),
  /** A second value under a field's name, or a field the action does not know. */
  extra: sometimes(fc.tuple(fc.oneof(fc.nat(), fc.string({ maxLength: 10 })), formValue)),
});

function formData(good: Record<string, string>, shape: typeof formArb extends fc.Arbitrary<infer T> ? T : never) {
  const fields: [string, FormValue][] = Object.entries(good).map(([k, v]) => [k, { text: v }]);
  const names = Object.keys(good);
  // An action without fields (a button) gets only fields it does not know.
  if (fields.length > 0) for (const [i, v] of shape.replace) fields[i % fields.length]![1] = v;
  if (fields.length > 0 && shape.drop !== null) fields.splice(shape.drop % fields.length, 1);
  if (shape.extra) {
    const [name, v] = shape.extra;
    fields.push([typeof name === "number" ? (names[name % names.length] ?? `field${name}`) : name, v]);
  }
  const form = new FormData();
  for (const [name, v] of fields) {
    if ("file" in v) form.append(name, new File([v.file], v.name || "upload.bin"));
    else form.append(name, resolve(v.text));
  }
  return form;
}

/** What an action's answer stands for: success (a message or a redirect), a refusal, or our fault. */
async function outcome(action: Action, form: FormData): Promise<"ok" | "refused" | "internal"> {
  try {
    const state = await action(null, form);
    if (state === null || state.ok) return "ok";
    return state.code === "internal" ? "internal" : "refused";
  } catch (error) {
    if (String((error as { digest?: string }).digest ?? "").startsWith("NEXT_REDIRECT")) return "ok";
    throw error;
  }
}

describe("fuzzing every server action's form", () => {
  for (const [key, row] of Object.entries(ACTIONS)) {
    const answers: string[] = [];
    test.prop({ who: caller, form: formArb }, settings)(key, async ({ who, form }) => {
      setSession(userOf(who));
      const action = (await serverActions()).get(key)!;
      const before = await tableChecksums();
      const got = await outcome(action, formData(row.good(), form));
      answers.push(got);
      expect(got, "an action's answer is never our fault").not.toBe("internal");
      // What the action left for after its answer counts as its writing too.
      await runAfterAnswer();
      if (got === "refused") expect(await tableChecksums(), "a refusal wrote nothing").toEqual(before);
    });
    test(`${key}: some fuzzed forms were refused`, () => {
      expect(answers).toContain("refused");
    });
  }
});
