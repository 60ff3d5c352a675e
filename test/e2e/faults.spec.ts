import { execFile } from "node:child_process";
import { randomUUID } from "node:crypto";
import { promisify } from "node:util";
import mysql from "mysql2/promise";
import { expect, test, type APIRequestContext, type Page } from "@playwright/test";
import { query } from "./db";
import { signUpAs, TeamsPage } from "./pages/team-pages";

// MariaDB stops while the app serves, and while team creations (a team, its owner's
// membership and an audit entry, one transaction each) are in flight. The app must say the
// database is not answering (503, no 500, no stack), lose no half-written change, and serve
// again by itself once MariaDB is back. Runs last (its own Playwright project): it stops the
// test database through scripts/db.sh, and always starts it again.

const run = promisify(execFile);

/** scripts/db.sh with this run's settings (DB_DIR, DB_PORT, … as `npm test` exports them). */
async function db(command: "start" | "stop") {
  const port = process.env.DB_PORT;
  if (!process.env.DB_DIR || !port || !process.env.DATABASE_URL?.includes(`:${port}/`)) {
    throw new Error("DB_DIR and DB_PORT must name the test database (run through `npm test`)");
  }
  await run("bash", ["scripts/db.sh", command], { timeout: 60_000 });
}

test.describe.configure({ mode: "serial", timeout: 180_000 });

test.afterEach(async () => {
  // Whatever happened, the tests after this one find the database running.
  await db("start");
});

const DOWN = /database is not answering/;
/** What must never reach a client: a stack, a driver's error code, our SQL. */
const LEAK = /\bat .+:\d+:\d+|ECONNREFUSED|PROTOCOL_|ER_[A-Z_]+|select |insert into/i;

async function expectDown(request: APIRequestContext, method: "get" | "post", path: string, data?: unknown) {
  const res = method === "get" ? await request.get(path) : await request.post(path, { data });
  const text = await res.text();
  expect(res.status(), `${method.toUpperCase()} ${path}: ${text.slice(0, 200)}`).toBe(503);
  expect(text, path).not.toMatch(LEAK);
  return { res, text };
}

async function tarrowId(): Promise<number> {
  const [row] = await query<{ id: number }>(
    "select c.id from characters c join games g on g.id = c.game_id where g.slug = 'vesper-circuit' and c.slug = 'tarrow'",
  );
  return row!.id;
}

/** Signs a new person up in the browser; their e-mail. */
async function signedIn(page: Page): Promise<string> {
  await query("delete from rate_limits");
  const email = `faults-${randomUUID().slice(0, 8)}@example.test`;
  await signUpAs(page, "Fault Tester", email);
  return email;
}

test("while MariaDB is stopped, pages, routes and forms say the database is not answering; once it is back the app serves again without a restart", async ({
  page,
  browser,
}) => {
  const tarrow = await tarrowId();
  await signedIn(page);
  // Forms loaded while the database answered (in tabs of their own), and submitted after it stopped.
  const teamsTab = await page.context().newPage();
  await new TeamsPage(teamsTab).goto();
  const stranger = await (await browser.newContext()).newPage();
  await stranger.goto("/sign-up");
  // Pages the shared cache in front of Next keeps (scripts/shared-cache.mjs): a published page
  // five minutes, a page Next prerenders at build (the landing page) as long as the build.
  const kept = ["/games/vesper-circuit/tarrow?edition=1-1", "/"];
  const keptBefore = await Promise.all(kept.map(async (path) => (await page.request.get(path)).text()));

  await db("stop");

  // What a shared cache keeps is still sent, the same page, without a word to the database.
  for (const [i, path] of kept.entries()) {
    const whileDown = await page.request.get(path);
    expect(whileDown.status(), path).toBe(200);
    expect(whileDown.headers()["cache-status"], path).toMatch(/^framefork; hit\b/);
    expect(await whileDown.text(), path).toBe(keptBefore[i]);
  }

  // Pages: our 503 page, in the browser and over plain HTTP.
  const shown = await page.goto("/games/vesper-circuit");
  expect(shown?.status()).toBe(503);
  await expect(page.getByRole("heading", { name: "The database is not answering" })).toBeVisible();
  for (const path of [
    "/games",
    // Characters no published Edition has: the live route, which reads the database.
    "/games/vesper-circuit/nobody",
    "/games/vesper-circuit/nobody/explore/n",
    "/teams",
    "/s/AAAAAAAAAAAAAAAAAAAAAAAA",
    "/sign-in",
  ]) {
    const { res, text } = await expectDown(page.request, "get", path);
    expect(res.headers()["content-type"], path).toContain("text/html");
    expect(res.headers()["retry-after"], path).toBe("5");
    expect(text, path).toMatch(DOWN);
  }

  // Routes: 503 in our JSON error format.
  for (const [method, path, data] of [
    // An Edition no one published: the route, which reads the database.
    ["get", `/api/characters/${tarrow}/graph?edition=no-such-edition`],
    ["get", "/api/teams"],
    ["post", "/api/teams", { name: "Written While Down" }],
    ["get", "/api/auth/session"],
  ] as const) {
    const { text } = await expectDown(page.request, method, path, data);
    const body = JSON.parse(text) as { error: { code: string; message: string } };
    expect(body.error.code, path).toBe("unavailable");
    expect(body.error.message, path).toMatch(DOWN);
  }
  // The health route says it in its own shape.
  const health = await expectDown(page.request, "get", "/api/health");
  expect(JSON.parse(health.text)).toMatchObject({ status: "unavailable" });

  // Forms: a fetch to a route and a server action both show the sentence beside the form.
  const form = teamsTab.getByRole("form", { name: "Start a team" });
  await form.getByLabel("Team name").fill("Written While Down");
  await form.getByRole("button", { name: "Create team" }).click();
  await expect(form.getByRole("alert")).toContainText(DOWN);
  const signUp = stranger.getByRole("form", { name: "Create your account" });
  await signUp.getByLabel("Name").fill("Late Arrival");
  await signUp.getByLabel("E-mail").fill(`late-${randomUUID().slice(0, 8)}@example.test`);
  await signUp.getByLabel("Password").fill("long enough password");
  await stranger.getByRole("button", { name: "Create account" }).click();
  await expect(stranger.getByText(DOWN)).toBeVisible();

  // Back up: measure from the moment MariaDB accepts connections until a page and a route
  // that read it answer 200 again, with the same app process.
  await db("start");
  const started = performance.now();
  let recoveredMs: number | null = null;
  while (performance.now() - started < 15_000) {
    const [pageRes, apiRes] = await Promise.all([
      page.request.get("/games/vesper-circuit"),
      page.request.get("/api/teams"),
    ]);
    if (pageRes.status() === 200 && apiRes.status() === 200) {
      recoveredMs = Math.round(performance.now() - started);
      break;
    }
    await new Promise((done) => setTimeout(done, 50));
  }
  console.log(`[faults] the app served again ${recoveredMs ?? "never (15 s)"} ms after MariaDB was back`);
  test.info().annotations.push({ type: "recovery", description: `${recoveredMs} ms` });
  expect(recoveredMs, "recovery time in ms").not.toBeNull();
  expect(recoveredMs!).toBeLessThan(5_000);
  await page.goto("/games/vesper-circuit");
  await expect(page.getByRole("heading", { level: 1, name: "Vesper Circuit" })).toBeVisible();
});

test("team creations in flight when MariaDB stops are each written whole or not at all", async ({ page }) => {
  const email = await signedIn(page);
  const tag = randomUUID().slice(0, 6);
  const answers = new Map<string, number>();
  let sent = 0;
  /** Sends one creation; its name at once, its answer when it comes. */
  const create = () => {
    const name = `Flight ${tag} ${sent++}`;
    const done = page.request.post("/api/teams", { data: { name } }).then((res) => {
      answers.set(name, res.status());
    });
    return { name, done };
  };

  // A few written before anything happens.
  await Promise.all(Array.from({ length: 3 }, () => create().done));

  // Five caught midway for sure: another session holds the owner's user row, so each creation
  // has written its team row and waits to write the membership (whose foreign key reads that
  // row) when MariaDB stops. More follow, one every 10 ms, while it shuts down.
  const url = process.env.DATABASE_URL!;
  const locker = await mysql.createConnection(url);
  const watcher = await mysql.createConnection(url);
  let caught: string[] = [];
  try {
    await locker.query("begin");
    await locker.query("select id from users where email = ? for update", [email]);
    const blocked = Array.from({ length: 5 }, create);
    caught = blocked.map((b) => b.name);
    // Read uncommitted: the half-written teams are visible to this session only.
    await watcher.query("set session transaction isolation level read uncommitted");
    await expect
      .poll(async () => {
        const [rows] = await watcher.query("select count(*) as n from teams where name in (?)", [caught]);
        return Number((rows as { n: number }[])[0]!.n);
      })
      .toBe(caught.length);
    await watcher.end();

    let stopping = true;
    const stop = db("stop").finally(() => (stopping = false));
    const during: Promise<void>[] = [];
    while (stopping) {
      during.push(create().done);
      await new Promise((done) => setTimeout(done, 10));
    }
    await Promise.all([stop, ...blocked.map((b) => b.done), ...during]);
  } finally {
    locker.destroy();
    watcher.destroy();
  }
  await db("start");

  // Every answer was "made" or "the database is not answering": no 500.
  const statuses = [...answers.values()];
  expect(statuses.filter((s) => s !== 201 && s !== 503)).toEqual([]);
  for (const name of caught) expect(answers.get(name), name).toBe(503);

  // Every team that exists has its owner and its audit entry; the ones caught midway left
  // nothing; every 201 is a team that exists.
  const rows = await query<{ name: string; members: number; audits: number }>(
    `select t.name,
            (select count(*) from memberships m where m.team_id = t.id and m.role = 'owner') as members,
            (select count(*) from audit_log a where a.team_id = t.id and a.action = 'team.created') as audits
       from teams t where t.name like ?`,
    [`Flight ${tag} %`],
  );
  for (const row of rows) expect(row, row.name).toMatchObject({ members: 1, audits: 1 });
  const names = rows.map((r) => r.name);
  for (const name of caught) expect(names).not.toContain(name);
  for (const [name, status] of answers) if (status === 201) expect(names).toContain(name);
  console.log(
    `[faults] ${answers.size} team creations: ${statuses.filter((s) => s === 201).length} written, ${statuses.filter((s) => s === 503).length} refused with 503 (${caught.length} caught with their team row written), ${rows.length} teams whole in the database`,
  );
});
