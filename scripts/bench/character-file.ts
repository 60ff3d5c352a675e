/**
 * Speed and memory of reading a character file: a generated 10,000-row CSV parsed and
 * validated (papaparse, then every check the importer makes), without the database.
 * Run alone with `npx tsx scripts/bench/character-file.ts`; `npm run bench` prints its
 * figure as `import_parse_10k_s`.
 *
 * The parse runs in a child process of its own (node --expose-gc) that reads the CSV from
 * a file, so its max RSS is the parse's, not the generator's.
 */
import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import {
  edgeKey,
  exportCharacterCsv,
  parseCharactersCsv,
  type PortableCharacter,
  type PortableEdge,
} from "../../src/lib/character-file";
import type { MoveGraph } from "../../src/lib/engine";
import { generateGraph } from "./generate";

const TARGET_ROWS = 10_000;

/** The generator's graph as a character file's data: ids become keys, stance ids `s<n>` stance keys. */
export function characterOf(graph: MoveGraph, slug: string): PortableCharacter {
  const stanceKey = (id: string) => `stance-${id}`;
  const isStance = new Set(graph.nodes.filter((n) => n.kind === "stance").map((n) => n.id));
  const seen = new Set<string>();
  const edges: PortableEdge[] = [];
  for (const e of graph.edges) {
    const edge: PortableEdge =
      e.kind === "follow"
        ? {
            kind: "follow",
            from: e.from,
            to: e.to,
            input: e.input,
            gapOnBlock: e.gapOnBlock,
            comboOnHit: e.comboOnHit,
            comboOnCounterHit: e.comboOnCounterHit,
          }
        : e.kind === "cancel"
          ? {
              kind: "cancel",
              from: e.from,
              to: stanceKey(e.to),
              input: e.input,
              onBlock: e.onBlock,
              onHit: e.onHit,
              onCounterHit: e.onCounterHit,
              autoGuard: e.autoGuard,
            }
          : { kind: "enter", from: stanceKey(e.from), to: e.to, input: e.input };
    // The generator may cancel twice into one stance with one input; a file holds each edge once.
    if (seen.has(edgeKey(edge))) continue;
    seen.add(edgeKey(edge));
    edges.push(edge);
  }
  const moves = graph.nodes.flatMap((n) =>
    n.kind !== "move"
      ? []
      : [
          {
            key: n.id,
            input: n.input,
            name: `Move ${n.id}`,
            level: n.level,
            damage: n.damage,
            startup: n.startup ?? null,
            onBlock: n.onBlock,
            onHit: n.onHit,
            onCounterHit: n.onCounterHit,
            range: null,
            tags: [],
            notes: null,
            fromPosture: "standing" as const,
            stance: null,
          },
        ],
  );
  return {
    character: { slug, name: "Bench Fighter", summary: "Generated for the import bench." },
    stances: [...isStance].map((id) => ({
      key: stanceKey(id),
      name: `Stance ${id}`,
      abbreviation: id.toUpperCase(),
      notes: null,
    })),
    moves,
    edges,
  };
}

/** A CSV of at least `rows` data rows, from the engine bench's generator (seeded, so every run reads the same file). */
export function generateCharacterCsv(rows = TARGET_ROWS): { csv: string; rows: number } {
  for (let stances = 64; ; stances += 64) {
    const csv = exportCharacterCsv(characterOf(generateGraph(stances, 1), "bench-fighter"));
    const count = csv.split("\r\n").length - 2; // the header and the final line break
    if (count >= rows) return { csv, rows: count };
  }
}

interface ChildResult {
  rows: number;
  ms: number;
  reps: number;
  heapAfterMb: number;
  maxRssMb: number;
}

function child(path: string, rows: number): ChildResult {
  const csv = readFileSync(path, "utf8");
  const once = () => {
    const r = parseCharactersCsv(csv);
    if (!r.ok) throw new Error(`the generated file does not read: ${JSON.stringify(r.problems.slice(0, 3))}`);
    return r;
  };
  once(); // warm-up
  const times: number[] = [];
  const reps = 7;
  for (let i = 0; i < reps; i++) {
    globalThis.gc?.();
    const t0 = process.hrtime.bigint();
    once();
    times.push(Number(process.hrtime.bigint() - t0) / 1e6);
  }
  globalThis.gc?.();
  const kept = once();
  const heapAfterMb = process.memoryUsage().heapUsed / 2 ** 20;
  if (kept.ok && kept.characters.length === 0) console.error("");
  times.sort((a, b) => a - b);
  return { rows, ms: times[reps >> 1]!, reps, heapAfterMb, maxRssMb: process.resourceUsage().maxRSS / 1024 };
}

/** Generates the file, parses it in a child process, prints a line of detail and returns the figures. */
export function benchImportParse(): ChildResult {
  const { csv, rows } = generateCharacterCsv();
  const dir = mkdtempSync(join(tmpdir(), "framefork-bench-"));
  const path = join(dir, "bench.csv");
  writeFileSync(path, csv);
  try {
    const out = execFileSync(
      process.execPath,
      ["--expose-gc", "--import", "tsx", fileURLToPath(import.meta.url), "--child", path, String(rows)],
      { encoding: "utf8" },
    );
    const r = JSON.parse(out.trim().split("\n").pop()!) as ChildResult;
    console.log(
      `character file: ${r.rows} CSV rows (${(csv.length / 2 ** 20).toFixed(2)} MB) parsed and validated in ${r.ms.toFixed(1)} ms (median of ${r.reps}); heap with the result kept ${r.heapAfterMb.toFixed(1)} MB, max RSS ${r.maxRssMb.toFixed(0)} MB`,
    );
    return r;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

// Only when run as a script: the engine bench imports this file and has a --child of its own.
const args = process.argv.slice(2);
const isMain = process.argv[1] === fileURLToPath(import.meta.url);
if (isMain && args[0] === "--child") {
  console.log(JSON.stringify(child(args[1]!, Number(args[2]))));
} else if (isMain) {
  const r = benchImportParse();
  console.log(JSON.stringify({ import_parse_10k_s: Number((r.ms / 1000).toFixed(4)) }));
}
