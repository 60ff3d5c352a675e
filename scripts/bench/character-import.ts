/**
 * Speed and memory of importing a character file end to end: the generated 10,000-row CSV of
 * the parse bench (character-file.ts) read and validated as the import route does
 * (`parseCharacterFile`), then written into an empty draft by `importCharacter` with `apply`,
 * on the benches' own MariaDB (bench-db.ts: started, reset and migrated here, stopped after).
 * `npm run bench` prints its figures as `import_10k_s` and `import_10k_peak_mb`; alone:
 * `npx tsx scripts/bench/character-import.ts`.
 *
 * The import runs in a child process (node --expose-gc --conditions=react-server, as the server
 * code is), one warm-up and then timed runs, each into a new game's empty draft. The peak is the
 * heap sampled every 5 ms and after each step, above the heap before the run; the child's max
 * RSS is printed beside it.
 */
import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { benchDb, DATABASE_URL } from "./bench-db";
import { generateCharacterCsv } from "./character-file";

const REPS = 3;
const APP = {
  DATABASE_URL,
  SMTP_URL: "smtp://127.0.0.1:1127",
  MAIL_FROM: "Framefork bench <no-reply@example.com>",
  NEXTAUTH_URL: "http://127.0.0.1:3400",
  NEXTAUTH_SECRET: "framefork-bench-only-secret-not-for-real-use",
};

const medianOf = (xs: number[]) => [...xs].sort((a, b) => a - b)[xs.length >> 1]!;

export interface ImportBench {
  rows: number;
  moves: number;
  times: number[];
  peakMb: number;
  maxRssMb: number;
}

async function child(path: string, rows: number): Promise<ImportBench> {
  const { parseCharacterFile } = await import("../../src/lib/character-file");
  const { closeDb, getDb } = await import("../../src/server/db");
  const { migrateDatabase } = await import("../../src/server/db/migrate");
  const { createGame } = await import("../../src/server/db/queries/authoring");
  const { importCharacter } = await import("../../src/server/db/queries/character-io");
  const { createTeam } = await import("../../src/server/db/queries/teams");
  const { characters, users } = await import("../../src/server/db/schema");

  await migrateDatabase(DATABASE_URL);
  const actorId = crypto.randomUUID();
  await getDb()
    .insert(users)
    .values({ id: actorId, email: `bench-${actorId}@example.test`, name: "Bench Coach", emailVerified: new Date() });
  const team = await createTeam({ name: `Bench ${actorId.slice(0, 6)}`, ownerId: actorId });
  const bytes = new Uint8Array(readFileSync(path));

  let moves = 0;
  const once = async (i: number) => {
    const { game, edition } = await createGame({ teamId: team.id, actorId, input: { name: `Bench Game ${i}` } });
    const [made] = await getDb()
      .insert(characters)
      .values({ gameId: game.id, slug: "bench-fighter", name: "Bench Fighter" })
      .$returningId();
    globalThis.gc?.();
    const base = process.memoryUsage().heapUsed;
    let peak = base;
    const sample = () => {
      peak = Math.max(peak, process.memoryUsage().heapUsed);
    };
    const timer = setInterval(sample, 5);
    const t0 = process.hrtime.bigint();
    const parsed = parseCharacterFile("bench.csv", bytes);
    sample();
    if (!parsed.ok) throw new Error(`the generated file does not read: ${JSON.stringify(parsed.problems.slice(0, 3))}`);
    const result = await importCharacter({
      teamId: team.id,
      gameId: game.id,
      editionId: edition.id,
      characterId: made!.id,
      actorId,
      character: parsed.characters[0]!,
      apply: true,
    });
    const ms = Number(process.hrtime.bigint() - t0) / 1e6;
    sample();
    clearInterval(timer);
    if (!result.ok) throw new Error(`the import refused the file: ${JSON.stringify(result.problems.slice(0, 3))}`);
    moves = result.counts.moves.added;
    return { ms, peakMb: (peak - base) / 2 ** 20 };
  };
  await once(0); // warm-up
  const runs = [];
  for (let i = 1; i <= REPS; i++) runs.push(await once(i));
  await closeDb();
  return {
    rows,
    moves,
    times: runs.map((r) => r.ms),
    peakMb: Math.max(...runs.map((r) => r.peakMb)),
    maxRssMb: process.resourceUsage().maxRSS / 1024,
  };
}

/** Starts the bench database, imports the generated file in a child process, stops the database; prints a line of detail. */
export function benchImportDb(): ImportBench {
  const { csv, rows } = generateCharacterCsv();
  const dir = mkdtempSync(join(tmpdir(), "framefork-bench-"));
  const path = join(dir, "bench.csv");
  writeFileSync(path, csv);
  benchDb("start");
  try {
    benchDb("reset");
    const out = execFileSync(
      process.execPath,
      [
        "--expose-gc",
        "--conditions=react-server",
        "--import",
        "tsx",
        fileURLToPath(import.meta.url),
        "--child",
        path,
        String(rows),
      ],
      { encoding: "utf8", env: { ...process.env, ...APP }, maxBuffer: 1 << 24 },
    );
    const r = JSON.parse(out.trim().split("\n").pop()!) as ImportBench;
    console.log(
      `character import: ${r.rows} CSV rows (${r.moves} moves) parsed, validated and written into an empty draft in ` +
        `${(medianOf(r.times) / 1000).toFixed(2)} s (median of ${r.times.length}; target < 5 s); heap peak above the start ` +
        `${r.peakMb.toFixed(1)} MB (target < 200 MB), max RSS ${r.maxRssMb.toFixed(0)} MB`,
    );
    return r;
  } finally {
    benchDb("stop");
    rmSync(dir, { recursive: true, force: true });
  }
}

const args = process.argv.slice(2);
const isMain = process.argv[1] === fileURLToPath(import.meta.url);
if (isMain && args[0] === "--child") {
  child(args[1]!, Number(args[2])).then(
    (r) => console.log(JSON.stringify(r)),
    (error: unknown) => {
      console.error(error);
      process.exit(1);
    },
  );
} else if (isMain) {
  const r = benchImportDb();
  console.log(
    JSON.stringify({
      import_10k_s: Number((medianOf(r.times) / 1000).toFixed(3)),
      import_10k_peak_mb: Number(r.peakMb.toFixed(1)),
    }),
  );
}
