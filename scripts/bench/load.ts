// npm run bench:load: how the production server holds up when fifty people open the same page.
// A benchmark, not a test: it prints figures and targets, never fails on them. Starts its own
// MariaDB (port 3327, .data/bench-mariadb) with the demo data, builds if there is no build (or
// always, without --no-build), serves on 127.0.0.1:3401 and stops both when done.
// Every request asks for gzip as a browser does (the server compresses each answer, static files
// too); --identity measures uncompressed answers instead.
import { execFileSync, spawn, type ChildProcess } from "node:child_process";
import { existsSync, readFileSync } from "node:fs";
import { get } from "node:http";
import autocannon from "autocannon";
import { and, eq } from "drizzle-orm";
import { encode } from "next-auth/jwt";
import { openDb } from "../../src/server/db";
import { characters, games, memberships, teams, users } from "../../src/server/db/schema";
import { migrateDatabase } from "../../src/server/db/migrate";
import { seedDemo } from "../../src/server/db/seed";
import { DATABASE_URL } from "./bench-db";
import { benchAppEnv, waitFor } from "./bench-server";

const PORT = 3401;
const BASE = `http://127.0.0.1:${PORT}`;
const { app: APP, env } = benchAppEnv(BASE);
const CONNECTIONS = 50;
const SECONDS = Number(process.env.LOAD_SECONDS ?? 10);
const WARM_UP_SECONDS = 2;
/** What a browser sends; null with --identity. */
const ACCEPT_ENCODING = process.argv.includes("--identity") ? null : "gzip, deflate, br";

/**
 * The resident memory of a process and its children, in MB, from /proc. Read from files, not by
 * running `ps`: a child process started synchronously every 200 ms would stall autocannon, which
 * runs in this process, and show up in the p99 of the fastest addresses.
 */
function rssMb(pid: number): number {
  const ids = [pid];
  try {
    const children = readFileSync(`/proc/${pid}/task/${pid}/children`, "utf8");
    ids.push(...children.split(" ").filter(Boolean).map(Number));
  } catch {
    // no children
  }
  let kb = 0;
  for (const id of ids) {
    try {
      const m = /VmRSS:\s+(\d+)/.exec(readFileSync(`/proc/${id}/status`, "utf8"));
      kb += Number(m?.[1] ?? 0);
    } catch {
      // gone
    }
  }
  return kb / 1024;
}

/** The demo's Tarrow, a team that shares a public link to his Explorer, and a member's session cookie. */
async function fixtures() {
  const { db, close } = openDb(DATABASE_URL);
  await seedDemo(db);
  const [tarrow] = await db
    .select({ id: characters.id })
    .from(characters)
    .innerJoin(games, eq(games.id, characters.gameId))
    .where(and(eq(games.slug, "vesper-circuit"), eq(characters.slug, "tarrow")));
  const user = { id: "load-coach", name: "Load Coach", email: "load-coach@example.test" };
  await db.insert(users).values({ ...user, emailVerified: new Date() });
  const [team] = await db.insert(teams).values({ slug: "load-team", name: "Load Team" }).$returningId();
  await db.insert(memberships).values({ teamId: team!.id, userId: user.id, role: "coach" });
  await close();

  // The link is made through the app's own query, as the Share button's route makes it.
  Object.assign(process.env, { ...APP, DATABASE_URL });
  const { createPermalink } = await import("../../src/server/db/queries/permalinks");
  const { closeDb } = await import("../../src/server/db");
  const link = await createPermalink({
    teamId: team!.id,
    createdBy: user.id,
    characterId: tarrow!.id,
    editionSlug: "1-1",
    view: { root: "v", path: null, options: { maxDepth: 8, maxStanceVisits: 1, fastest: 11 }, opponent: null },
    visibility: "link",
  });
  await closeDb();
  const token = await encode({
    token: { sub: user.id, email: user.email, name: user.name, sv: 0 },
    secret: APP.NEXTAUTH_SECRET,
  });
  return { characterId: tarrow!.id, link: link.path, cookie: `next-auth.session-token=${token}` };
}

/** How many bytes the server sends for an address, compressed as asked (fetch would decompress them). */
function bytesOnTheWire(url: string, acceptEncoding: string): Promise<number> {
  return new Promise((resolve, reject) => {
    get(url, { headers: { "accept-encoding": acceptEncoding } }, (res) => {
      let bytes = 0;
      res.on("data", (chunk: Buffer) => (bytes += chunk.length));
      res.on("end", () => resolve(bytes));
      res.on("error", reject);
    }).on("error", reject);
  });
}

interface Figure {
  name: string;
  rps: number;
  p50: number;
  p99: number;
  errors: number;
  /** The server's peak resident memory while this address was measured, in MB. */
  rssMb: number;
}

async function hammer(name: string, url: string, extra: Record<string, string> = {}): Promise<Omit<Figure, "rssMb">> {
  const headers = ACCEPT_ENCODING ? { "accept-encoding": ACCEPT_ENCODING, ...extra } : extra;
  // One request first, so a page's first render and a cold cache are not what is measured; then
  // WARM_UP_SECONDS of the same load, not counted, so the server's code for this address is
  // compiled by V8 as it is for the rest of the run.
  const first = await fetch(url, { headers });
  if (!first.ok) throw new Error(`${name}: ${url} answered ${first.status}`);
  await first.arrayBuffer();
  await autocannon({ url, connections: CONNECTIONS, duration: WARM_UP_SECONDS, headers });
  const result = await autocannon({ url, connections: CONNECTIONS, duration: SECONDS, headers });
  return {
    name,
    rps: result.requests.average,
    p50: result.latency.p50,
    p99: result.latency.p99,
    errors: result.errors + result.non2xx,
  };
}

async function main() {
  console.log(
    `Framefork load bench: ${CONNECTIONS} connections, ${SECONDS} s per address after ${WARM_UP_SECONDS} s of warm-up, ${ACCEPT_ENCODING ? `accept-encoding: ${ACCEPT_ENCODING}` : "uncompressed (--identity)"}`,
  );
  execFileSync("bash", ["scripts/db.sh", "start"], { env, stdio: "inherit" });
  let server: ChildProcess | undefined;
  let peak = 0;
  let sampler: NodeJS.Timeout | undefined;
  try {
    execFileSync("bash", ["scripts/db.sh", "reset"], { env, stdio: "inherit" });
    await migrateDatabase(DATABASE_URL);
    const { characterId, link, cookie } = await fixtures();

    if (!process.argv.includes("--no-build") || !existsSync(".next/BUILD_ID")) {
      console.log("building…");
      execFileSync("node", ["node_modules/next/dist/bin/next", "build"], { env, stdio: "ignore" });
    }
    server = spawn("bash", ["scripts/serve.sh", "-p", String(PORT), "-H", "127.0.0.1"], { env, stdio: "ignore" });
    await waitFor(`${BASE}/api/health`, 60_000);
    const pid = server.pid!;
    sampler = setInterval(() => (peak = Math.max(peak, rssMb(pid))), 200);

    const landing = await (await fetch(BASE)).text();
    const chunk = /\/_next\/static\/chunks\/[^"']+\.js/.exec(landing)?.[0];
    if (!chunk) throw new Error("no script chunk on the landing page");

    const moveList = `${BASE}/games/vesper-circuit/tarrow`;
    const moveListGzipKb = (await bytesOnTheWire(moveList, "gzip")) / 1024;

    const figures: Figure[] = [];
    let addressPeak = 0;
    for (const [name, url, headers] of [
      ["static asset", `${BASE}${chunk}`],
      ["move list", moveList],
      ["stance sheet", `${BASE}/games/vesper-circuit/tarrow/stances/drift`],
      ["Explorer page", `${BASE}/games/vesper-circuit/tarrow/explore/v`],
      ["graph API", `${BASE}/api/characters/${characterId}/graph?edition=1-1`],
      ["Permalink page", `${BASE}${link}`],
      ["Permalink image", `${BASE}${link}/opengraph-image`],
      ["team page (signed in)", `${BASE}/teams/load-team`, { cookie }],
    ] as [string, string, Record<string, string>?][]) {
      addressPeak = 0;
      const sample = setInterval(() => (addressPeak = Math.max(addressPeak, rssMb(pid))), 200);
      const figure = await hammer(name, url, headers);
      clearInterval(sample);
      figures.push({ ...figure, rssMb: addressPeak });
    }

    const staticRps = figures[0]!.rps;
    const ratio = (name: string) => figures.find((f) => f.name === name)!.rps / staticRps;
    console.log("");
    console.log("address                  req/s    p50 ms   p99 ms   ratio to static   errors   RSS MB");
    for (const f of figures) {
      console.log(
        `${f.name.padEnd(22)} ${f.rps.toFixed(0).padStart(7)} ${String(f.p50).padStart(9)} ${String(f.p99).padStart(8)}   ${(f.rps / staticRps).toFixed(3).padStart(15)}   ${String(f.errors).padStart(6)}   ${f.rssMb.toFixed(0).padStart(6)}`,
      );
    }
    const pages = figures.filter((f) => f.name !== "static asset");
    const worst = Math.max(...pages.map((f) => f.p99 / Math.max(1, f.p50)));
    console.log("");
    console.log(`move list HTML: ${moveListGzipKb.toFixed(1)} KB gzipped   target < 50 KB`);
    console.log(`server peak RSS: ${peak.toFixed(0)} MB   target < 600 MB`);
    console.log("targets: public pages of a published Edition ≥ 1/3 of static, the graph API ≥ 1/2, p99 ≤ 5x p50");
    console.log(
      JSON.stringify({
        static_rps: Math.round(staticRps),
        movelist_ratio: Number(ratio("move list").toFixed(3)),
        stance_sheet_ratio: Number(ratio("stance sheet").toFixed(3)),
        explorer_ratio: Number(ratio("Explorer page").toFixed(3)),
        graph_api_ratio: Number(ratio("graph API").toFixed(3)),
        permalink_ratio: Number(ratio("Permalink page").toFixed(3)),
        permalink_image_ratio: Number(ratio("Permalink image").toFixed(3)),
        team_page_ratio: Number(ratio("team page (signed in)").toFixed(3)),
        worst_p99_over_p50: Number(worst.toFixed(2)),
        peak_rss_mb: Math.round(peak),
        movelist_gzip_kb: Number(moveListGzipKb.toFixed(1)),
        compressed: ACCEPT_ENCODING !== null,
      }),
    );
  } finally {
    if (sampler) clearInterval(sampler);
    server?.kill();
    execFileSync("bash", ["scripts/db.sh", "stop"], { env, stdio: "inherit" });
  }
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
