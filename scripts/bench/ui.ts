// npm run bench:ui: the Explorer's speed in Chromium on a generated 300-node
// graph. A benchmark, not a test: it prints figures and targets, never fails
// on them. Starts its own MariaDB (port 3327, .data/bench-mariadb), builds,
// serves on 127.0.0.1:3400, and stops both when done.
import { execFileSync, spawn, type ChildProcess } from "node:child_process";
import { writeFileSync } from "node:fs";
import { chromium, type Page } from "@playwright/test";
import { and, eq } from "drizzle-orm";
import { encode } from "next-auth/jwt";
import type { BoardDocument } from "../../src/lib/board";
import { DEFAULT_VALUE_TABLE } from "../../src/lib/engine";
import { openDb, type Database } from "../../src/server/db";
import { boards, characters, editions, games, memberships, teams, users } from "../../src/server/db/schema";
import { migrateDatabase } from "../../src/server/db/migrate";
import { seedDemo } from "../../src/server/db/seed";
import { flatten } from "../../src/server/db/seed/dsl";
import { DATABASE_URL } from "./bench-db";
import { benchAppEnv, waitFor } from "./bench-server";
import { generateBoard } from "./board";
import { benchCharacter } from "./ui-graph";

const PORT = 3400;
const BASE = `http://127.0.0.1:${PORT}`;
// The app's settings; the bench sends no mail, so nothing listens on the SMTP port.
const { app: APP, env } = benchAppEnv(BASE);
const ROUNDS = 15;

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length === 0
    ? Number.NaN
    : s.length % 2
      ? s[(s.length - 1) / 2]!
      : (s[s.length / 2 - 1]! + s[s.length / 2]!) / 2;
};
const round = (n: number) => Math.round(n * 100) / 100;

/**
 * Waits for the named measure to appear after `act`, and returns its duration.
 * Each act starts on a settled page (two frames and 50 ms after the last), as
 * a person's clicks do, so work a previous act left for later is not counted.
 */
async function measured(page: Page, name: string, act: () => Promise<void>): Promise<number> {
  await page.evaluate(
    (n) =>
      new Promise<void>((settled) => {
        performance.clearMeasures(n);
        requestAnimationFrame(() => requestAnimationFrame(() => setTimeout(settled, 50)));
      }),
    name,
  );
  await act();
  await page.waitForFunction((n) => performance.getEntriesByName(n, "measure").length > 0, name, { timeout: 10_000 });
  return page.evaluate((n) => performance.getEntriesByName(n, "measure").at(-1)!.duration, name);
}

/** Ten measured clicks on nodes spread over the graph, for `--profile` and `--trace`. */
async function tenSelects(page: Page, ids: string[]) {
  for (let i = 0; i < 10; i++) {
    const id = ids[(i * 53 + 11) % ids.length]!;
    await measured(page, "framefork:select", () => page.locator(`[data-node-id="${id}"]`).dispatchEvent("click"));
  }
}

/** `--profile`: a CPU profile of ten clicks, summed by function, to find where a select goes. */
async function profileSelects(page: Page, ids: string[]) {
  const cdp = await page.context().newCDPSession(page);
  await cdp.send("Profiler.enable");
  await cdp.send("Profiler.setSamplingInterval", { interval: 200 });
  await cdp.send("Profiler.start");
  await tenSelects(page, ids);
  const { profile } = (await cdp.send("Profiler.stop")) as {
    profile: {
      nodes: {
        id: number;
        children?: number[];
        callFrame: { functionName: string; url: string; lineNumber: number };
      }[];
      samples: number[];
      timeDeltas: number[];
    };
  };
  if (process.env.BENCH_PROFILE_DUMP) writeFileSync(process.env.BENCH_PROFILE_DUMP, JSON.stringify(profile));
  const self = new Map<number, number>();
  profile.samples.forEach((id, i) => self.set(id, (self.get(id) ?? 0) + (profile.timeDeltas[i] ?? 0)));
  const byId = new Map(profile.nodes.map((n) => [n.id, n]));
  const parent = new Map<number, number>();
  for (const n of profile.nodes) for (const c of n.children ?? []) parent.set(c, n.id);
  const nameOf = (id: number) => {
    const f = byId.get(id)!.callFrame;
    return `${f.functionName || "(anonymous)"} ${f.url.split("/").pop()}:${f.lineNumber}`;
  };
  const selfByName = new Map<string, number>();
  const totalByName = new Map<string, number>();
  for (const [id, us] of self) {
    const ms = us / 1000;
    selfByName.set(nameOf(id), (selfByName.get(nameOf(id)) ?? 0) + ms);
    // Inclusive: each function on the sample's stack, once.
    const onStack = new Set<string>();
    for (let at: number | undefined = id; at !== undefined; at = parent.get(at)) onStack.add(nameOf(at));
    for (const name of onStack) totalByName.set(name, (totalByName.get(name) ?? 0) + ms);
  }
  const top = (m: Map<string, number>, n: number) => [...m].sort((a, b) => b[1] - a[1]).slice(0, n);
  console.log("profile of 10 selects, self time (ms):");
  for (const [name, ms] of top(selfByName, 15)) console.log(`  ${ms.toFixed(1).padStart(8)}  ${name}`);
  console.log("profile of 10 selects, total time with callees (ms):");
  for (const [name, ms] of top(totalByName, Number(process.env.BENCH_PROFILE_LINES ?? 40)))
    console.log(`  ${ms.toFixed(1).padStart(8)}  ${name}`);
}

/**
 * `--trace`: a Chromium trace of ten clicks. Sums the time of each kind of
 * event (main thread, raster and compositor) that starts inside a select's
 * measure, from the click to the paint of the card; nested events count in
 * each of their ancestors.
 */
async function traceSelects(page: Page, ids: string[]) {
  const browser = page.context().browser()!;
  await browser.startTracing(page, {
    categories: ["devtools.timeline", "disabled-by-default-devtools.timeline", "v8.execute", "blink.user_timing"],
  });
  await tenSelects(page, ids);
  type TraceEvent = {
    name: string;
    ph: string;
    ts: number;
    dur?: number;
    pid: number;
    tid: number;
    id2?: { local?: string };
    id?: string;
    args?: { name?: string };
  };
  const { traceEvents } = JSON.parse((await browser.stopTracing()).toString("utf8")) as { traceEvents: TraceEvent[] };
  const windows: [number, number][] = [];
  const open = new Map<string, number>();
  for (const e of traceEvents) {
    if (e.name !== "framefork:select") continue;
    const key = e.id2?.local ?? e.id ?? "";
    if (e.ph === "b") open.set(key, e.ts);
    else if (e.ph === "e" && open.has(key)) windows.push([open.get(key)!, e.ts]);
  }
  const threads = new Map<string, string>();
  for (const e of traceEvents)
    if (e.ph === "M" && e.name === "thread_name") threads.set(`${e.pid}:${e.tid}`, e.args?.name ?? "");
  const inside = traceEvents.filter(
    (e) => e.ph === "X" && e.dur !== undefined && windows.some(([a, b]) => e.ts >= a && e.ts < b),
  );
  const byName = new Map<string, number>();
  for (const e of inside) {
    const key = `${threads.get(`${e.pid}:${e.tid}`) ?? "?"} ${e.name}`;
    byName.set(key, (byName.get(key) ?? 0) + e.dur! / 1000);
  }
  const spans = windows.map(([a, b]) => (b - a) / 1000);
  console.log(
    `trace of ${windows.length} selects (${spans.map((ms) => ms.toFixed(0)).join(", ")} ms), time per event inside them (ms, per select):`,
  );
  for (const [name, ms] of [...byName].sort((a, b) => b[1] - a[1]).slice(0, 25))
    console.log(`  ${(ms / Math.max(1, windows.length)).toFixed(2).padStart(8)}  ${name}`);
  if (process.env.BENCH_TRACE_DUMP) {
    const main = inside.filter((e) => threads.get(`${e.pid}:${e.tid}`) === "CrRendererMain");
    writeFileSync(process.env.BENCH_TRACE_DUMP, JSON.stringify({ windows, events: main }));
  }
}

/**
 * A coach with a 20-situation board of 6x6 games on the demo's Tarrow (generated like
 * `npm run bench`'s 100-situation tree), and the session cookie that signs them in.
 */
async function boardFixture(db: Database) {
  const generated = generateBoard(14, 20);
  const document: BoardDocument = {
    root: generated.root,
    values: DEFAULT_VALUE_TABLE,
    situations: generated.situations.map((s) => ({
      id: s.id,
      name: s.name,
      note: "",
      rows: s.rows,
      cols: s.cols,
      cells: s.payoffs.map((row, i) =>
        row.map((x, j) => ({ basis: null, override: x, next: s.next?.[i]?.[j] ?? null })),
      ),
    })),
  };
  const [pinned] = await db
    .select({ characterId: characters.id, editionId: editions.id })
    .from(characters)
    .innerJoin(games, eq(games.id, characters.gameId))
    .innerJoin(editions, eq(editions.gameId, games.id))
    .where(and(eq(games.slug, "vesper-circuit"), eq(characters.slug, "tarrow"), eq(editions.slug, "1-1")));
  const user = { id: "bench-coach", name: "Bench Coach", email: "bench-coach@example.test" };
  await db.insert(users).values({ ...user, emailVerified: new Date() });
  const [team] = await db.insert(teams).values({ slug: "bench-team", name: "Bench Team" }).$returningId();
  await db.insert(memberships).values({ teamId: team!.id, userId: user.id, role: "coach" });
  const [board] = await db
    .insert(boards)
    .values({ teamId: team!.id, ...pinned!, title: "Bench board", document, createdBy: user.id, updatedBy: user.id })
    .$returningId();
  const token = await encode({
    token: { sub: user.id, email: user.email, name: user.name, sv: 0 },
    secret: APP.NEXTAUTH_SECRET,
  });
  return {
    url: `${BASE}/teams/bench-team/boards/${board!.id}`,
    cookie: { name: "next-auth.session-token", value: token },
  };
}

async function main() {
  const character = benchCharacter();
  const nodes = flatten(character.data("1-1")).moves.length + 4;
  console.log(`Framefork Explorer bench: generated character with ${nodes} nodes`);

  execFileSync("bash", ["scripts/chromium.sh"], { env, stdio: "inherit" });
  execFileSync("bash", ["scripts/db.sh", "start"], { env, stdio: "inherit" });
  let server: ChildProcess | undefined;
  try {
    execFileSync("bash", ["scripts/db.sh", "reset"], { env, stdio: "inherit" });
    await migrateDatabase(DATABASE_URL);
    const { db, close } = openDb(DATABASE_URL);
    await seedDemo(db, { extraCharacters: [character] });
    const board = await boardFixture(db);
    await close();

    if (!process.argv.includes("--no-build")) {
      console.log("building…");
      execFileSync("node", ["node_modules/next/dist/bin/next", "build"], { env, stdio: "ignore" });
    }
    server = spawn("bash", ["scripts/serve.sh", "-p", String(PORT), "-H", "127.0.0.1"], {
      env,
      stdio: "ignore",
    });
    await waitFor(`${BASE}/api/health`, 60_000);

    const browser = await chromium.launch({
      executablePath: "/usr/bin/chromium",
      args: [
        "--no-sandbox",
        "--disable-gpu",
        "--disable-quic",
        "--no-first-run",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
      ],
    });
    const page = await browser.newPage({ viewport: { width: 1400, height: 1000 } });
    const url = `${BASE}/games/vesper-circuit/bench-grid/explore/n`;

    const layouts: number[] = [];
    let jsBytes = 0;
    for (let i = 0; i < 5; i++) {
      await page.goto(url, { waitUntil: "networkidle" });
      await page.locator("[data-node-id]").first().waitFor();
      layouts.push(
        await page.evaluate(
          () => performance.getEntriesByName("framefork:layout", "measure").at(-1)?.duration ?? Number.NaN,
        ),
      );
      if (i === 0) {
        // First load of the route: every script's compressed size as served.
        jsBytes = await page.evaluate(() =>
          performance
            .getEntriesByType("resource")
            .filter((e) => (e as PerformanceResourceTiming).initiatorType === "script" || e.name.endsWith(".js"))
            .reduce((sum, e) => sum + (e as PerformanceResourceTiming).encodedBodySize, 0),
        );
      }
    }
    const shown = await page.locator("[data-node-id]").count();

    const ids = await page
      .locator("[data-node-id]")
      .evaluateAll((els) => els.map((e) => e.getAttribute("data-node-id")!));
    const selects: number[] = [];
    for (let i = 0; i < ROUNDS; i++) {
      const id = ids[(i * 37) % ids.length]!;
      selects.push(
        await measured(page, "framefork:select", () => page.locator(`[data-node-id="${id}"]`).dispatchEvent("click")),
      );
    }

    // A click must not lay the graph out again; say so if it does.
    const layoutsDuringSelects = await page.evaluate(
      () => performance.getEntriesByName("framefork:layout", "measure").length,
    );

    if (process.argv.includes("--profile")) await profileSelects(page, ids);
    if (process.argv.includes("--trace")) await traceSelects(page, ids);

    const recomputes: number[] = [];
    const fastest = page.getByRole("spinbutton", { name: "Opponent's fastest" });
    // Each round types a value other than the one shown, so every round recomputes.
    const typedFrom = Number(await fastest.inputValue());
    for (let i = 0; i < ROUNDS; i++) {
      recomputes.push(await measured(page, "framefork:recompute", () => fastest.fill(String(typedFrom + 1 + (i % 2)))));
    }

    // A Mix-up board of 20 situations: one cell typed, the whole board solved again and painted.
    await page.context().addCookies([{ ...board.cookie, url: BASE }]);
    await page.goto(board.url, { waitUntil: "networkidle" });
    await page.locator('[data-cell="0:0"]').click();
    const resolves: number[] = [];
    for (let i = 0; i < ROUNDS; i++) {
      resolves.push(
        await measured(page, "framefork:board-solve", () => page.getByTestId("cell-payoff").fill(String(20 + (i % 2)))),
      );
    }
    await browser.close();

    const result = {
      layout_ms_300: round(median(layouts)),
      select_ms_300: round(median(selects)),
      recompute_ms_300: round(median(recomputes)),
      first_load_js_kb_gzip: round(jsBytes / 1024),
      board_resolve_ms_20: round(median(resolves)),
    };
    console.log(`nodes drawn: ${shown}; layouts run by the page so far: ${layoutsDuringSelects}`);
    console.log(`layout (dagre)     median ${result.layout_ms_300} ms over ${layouts.length} loads   target < 100 ms`);
    console.log(`select → painted   median ${result.select_ms_300} ms over ${ROUNDS} clicks   target < 16 ms`);
    console.log(`  each click, in order: ${selects.map((ms) => ms.toFixed(1)).join(", ")}`);
    console.log(`option → repainted median ${result.recompute_ms_300} ms over ${ROUNDS} changes  target < 50 ms`);
    console.log(`first-load JS      ${result.first_load_js_kb_gzip} KB compressed            target < 300 KB`);
    console.log(
      `board cell → solved and painted, 20 situations: median ${result.board_resolve_ms_20} ms over ${ROUNDS} edits   target < 16 ms`,
    );
    console.log(JSON.stringify(result));
  } finally {
    server?.kill();
    execFileSync("bash", ["scripts/db.sh", "stop"], { env, stdio: "inherit" });
  }
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
