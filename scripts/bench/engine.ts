/**
 * Benchmark of the traversal engine (not a test: it prints figures and asserts nothing).
 *
 *   npm run bench
 *
 * Every case runs in its own child process (node --expose-gc, the same heap flags for all:
 * --max-old-space-size=8192 --max-semi-space-size=64, as materialising 10⁶ paths keeps
 * gigabytes of results alive in both the engine and the peer), so peak memory is that
 * case's alone: heap is sampled every 16384 paths during a separate memory pass, and the
 * child's max RSS is reported beside it. Times are the median of several runs after one
 * warm-up run, on the same graph, in the same run of this script.
 *
 * Cyclic graphs (stances in cycles, default bounds maxDepth 8, maxStanceVisits 1):
 *   walk         bare DFS over the same stopping places, doing nothing (the limit)
 *   stream       engine, every annotation kept on the stack, reused cursor (advance loop)
 *   generator    the same through iteratePaths (a JS generator)
 *   materialise  engine, a full PathResult per path, all kept (explorePaths)
 * The acyclic part of a generated graph (edges pointing back dropped, maxDepth 64 so no
 * bound cuts a path):
 *   engine-stream  the streaming engine as above
 *   engine       explorePaths, materialising
 *   peer         graphology + graphology-simple-path allSimplePaths (one call, through an
 *                added sink node: see peer.ts), then the same annotations per path
 *
 * What changed: diffGraphs between two Editions of a generated ~300-move character, the
 * second a balance patch of the first (diff.ts, patch.ts); printed as diff_300_ms.
 *
 * Mix-up boards: solveBoard on a generated tree of 100 situations of 6x6 (board.ts), and the
 * same games through HiGHS in the same run; printed as board_100x6x6_ms and board_100x6x6_highs_ms.
 *
 * Character files: a generated 10,000-row CSV parsed (character-file.ts, import_parse_10k_s),
 * and imported end to end into a draft on the benches' own MariaDB (character-import.ts,
 * import_10k_s and import_10k_peak_mb).
 */
import { execFileSync } from "node:child_process";
import { fileURLToPath } from "node:url";
import { compileGraph, type CompiledGraph, type ExploreOptions, type PathResult } from "../../src/lib/engine";
import { createPathWalker, explorePaths, iteratePaths, type PathWalker } from "../../src/lib/engine/walk";
import { bareWalk } from "./bare-walk";
import { benchBoard, type BoardBench } from "./board";
import { benchDiff, type DiffBench } from "./diff";
import { benchImportParse } from "./character-file";
import { benchImportDb } from "./character-import";
import { generateGraph } from "./generate";
import { peerPaths } from "./peer";

type Case = "walk" | "stream" | "generator" | "materialise" | "engine-stream" | "engine" | "peer";
const ROOT = "m0";
const CYCLIC = { maxDepth: 8, maxStanceVisits: 1 };
const ACYCLIC = { maxDepth: 64, maxStanceVisits: 1 };

interface ChildResult {
  case: Case;
  paths: number;
  ms: number;
  reps: number;
  baseMb: number;
  peakMb: number;
  maxRssMb: number;
  checksum: string;
}

function heapMb(): number {
  return process.memoryUsage().heapUsed / 2 ** 20;
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)]!;
}

function checksum(paths: PathResult[]): string {
  let damage = 0,
    combos = 0,
    jails = 0,
    gapFrames = 0,
    duck = 0,
    mix = 0,
    saved = 0,
    guard = 0,
    inputs = 0;
  for (const p of paths) {
    damage += p.damage;
    if (p.naturalCombo) combos++;
    if (p.jails) jails++;
    for (const g of p.gaps) gapFrames += g.frames;
    duck += p.duckable.length;
    mix += p.mixupPoints.length;
    saved += p.framesSaved ?? 0;
    guard += p.autoGuard.length;
    inputs += p.input.length + p.blockClass.length + p.nodes.length;
  }
  return [paths.length, damage, combos, jails, gapFrames, duck, mix, saved, guard, inputs].join("/");
}

/**
 * The annotations a ranking or a filter would read, summed so that reading them is not
 * dead code. The streaming cases run in functions of their own, as the bare walk does,
 * and sum into a local: a running total captured by a closure would be boxed on every
 * update, a cost of this script rather than of the engine.
 */
function readAnnotations(w: PathWalker): number {
  let sum = w.damage + w.gapCount;
  if (w.naturalCombo) sum++;
  if (w.jails) sum++;
  if (w.blockClass === "safe") sum++;
  const saved = w.framesSaved;
  if (saved !== null) sum += saved;
  return sum;
}

function streamWalk(g: CompiledGraph, options: ExploreOptions, sample?: () => void): { paths: number; sum: number } {
  const w = createPathWalker(g, ROOT, options);
  let n = 0;
  let sum = 0;
  while (w.advance()) {
    sum += readAnnotations(w);
    if ((++n & 16383) === 0 && sample !== undefined) sample();
  }
  return { paths: n, sum };
}

function generatorWalk(g: CompiledGraph, options: ExploreOptions, sample?: () => void): { paths: number; sum: number } {
  let n = 0;
  let sum = 0;
  for (const w of iteratePaths(g, ROOT, options)) {
    sum += readAnnotations(w);
    if ((++n & 16383) === 0 && sample !== undefined) sample();
  }
  return { paths: n, sum };
}

function runChild(kind: Case, stances: number, seed: number): ChildResult {
  const acyclic = kind === "engine" || kind === "peer" || kind === "engine-stream";
  const graph = generateGraph(stances, seed, acyclic);
  const options = acyclic ? ACYCLIC : CYCLIC;
  const g = compileGraph(graph);
  const root = g.require(ROOT);
  let peak = 0;
  const sample = () => {
    const h = heapMb();
    if (h > peak) peak = h;
  };

  let sink = 0;
  const once = (watch: boolean): { paths: number; kept?: PathResult[] } => {
    switch (kind) {
      case "walk":
        return { paths: bareWalk(g, root, options.maxDepth, options.maxStanceVisits, watch ? sample : undefined) };
      case "stream":
      case "engine-stream": {
        const r = streamWalk(g, options, watch ? sample : undefined);
        sink += r.sum;
        return { paths: r.paths };
      }
      case "generator": {
        const r = generatorWalk(g, options, watch ? sample : undefined);
        sink += r.sum;
        return { paths: r.paths };
      }
      case "materialise":
      case "engine": {
        if (!watch) {
          const kept = explorePaths(g, ROOT, options);
          return { paths: kept.length, kept };
        }
        // explorePaths' own loop, with the heap watched.
        const w = createPathWalker(g, ROOT, options);
        const kept: PathResult[] = [];
        while (w.advance()) {
          kept.push(w.toResult());
          if ((kept.length & 16383) === 0) sample();
        }
        return { paths: kept.length, kept };
      }
      case "peer": {
        const kept = peerPaths(graph, ROOT, options);
        if (watch) sample();
        return { paths: kept.length, kept };
      }
    }
  };

  // The first run warms the JIT up and gives the checksum; it is not timed.
  const first = once(false);
  const heavy = kind === "materialise" || kind === "engine" || kind === "peer";
  const reps = first.paths >= 300_000 ? (heavy ? 3 : 7) : first.paths >= 3_000 ? 15 : 101;
  const times: number[] = [];
  let paths = first.paths;
  const sum = first.kept ? checksum(first.kept) : "";
  // Let the warm-up's results go before timing, for engine and peer alike: a million kept
  // results would otherwise weigh on every timed run's garbage collection.
  first.kept = undefined;
  for (let r = 0; r < reps; r++) {
    globalThis.gc?.();
    const t0 = process.hrtime.bigint();
    paths = once(false).paths;
    times.push(Number(process.hrtime.bigint() - t0) / 1e6);
  }
  globalThis.gc?.();
  const baseMb = heapMb();
  peak = baseMb;
  once(true);
  sample();
  if (sink === Math.PI) console.error("");
  return {
    case: kind,
    paths,
    ms: median(times),
    reps,
    baseMb,
    peakMb: peak,
    maxRssMb: process.resourceUsage().maxRSS / 1024,
    checksum: sum,
  };
}

/** Generator settings that give close to 10², 10⁴, 10⁶ paths; `npm run bench -- --search` finds them again. */
const GRAPHS: Record<string, { stances: number; seed: number }> = {
  "cyclic 100": { stances: 1, seed: 4 },
  "cyclic 10000": { stances: 6, seed: 1 },
  "cyclic 1000000": { stances: 128, seed: 4 },
  "acyclic 100": { stances: 1, seed: 7 },
  "acyclic 10000": { stances: 12, seed: 38 },
  "acyclic 1000000": { stances: 24, seed: 1 },
};

const STANCE_COUNTS = [1, 2, 3, 4, 6, 8, 10, 12, 16, 20, 24, 28, 32, 40, 48, 56, 64, 80, 96, 128];

/** A (stances, seed) pair whose graph has close to `target` paths; counted with a cap. */
function findGraph(target: number, acyclic: boolean): { stances: number; seed: number; paths: number } {
  const options = acyclic ? ACYCLIC : CYCLIC;
  let best = { stances: 1, seed: 1, paths: 0, off: Infinity };
  for (let seed = 1; seed <= 400; seed++) {
    for (const stances of STANCE_COUNTS) {
      const w = createPathWalker(generateGraph(stances, seed, acyclic), ROOT, options);
      let n = 0;
      while (n <= 2 * target && w.advance()) n++;
      const off = Math.abs(Math.log10(n / target));
      if (off < best.off) best = { stances, seed, paths: n, off };
      if (off < 0.05) return best;
    }
  }
  return best;
}

function main(): void {
  const self = fileURLToPath(import.meta.url);
  /** This script in a child process with the given arguments: the JSON of its last line. */
  const inChild = <T>(childArgs: string[]): T => {
    const out = execFileSync(
      process.execPath,
      ["--expose-gc", "--max-old-space-size=8192", "--max-semi-space-size=64", "--import", "tsx", self, ...childArgs],
      { encoding: "utf8", maxBuffer: 1 << 24 },
    );
    return JSON.parse(out.trim().split("\n").pop()!) as T;
  };
  const child = (kind: Case, stances: number, seed: number) =>
    inChild<ChildResult>(["--child", kind, String(stances), String(seed)]);

  const search = process.argv.includes("--search");
  const sizes = [1e2, 1e4, 1e6];
  const rows: (ChildResult & { family: string; target: number; graph: string })[] = [];
  for (const target of sizes) {
    for (const acyclic of [false, true]) {
      const found = search ? findGraph(target, acyclic) : GRAPHS[`${acyclic ? "acyclic" : "cyclic"} ${target}`]!;
      const graph = generateGraph(found.stances, found.seed, acyclic);
      const graphDesc = `${graph.nodes.length} nodes, ${graph.edges.length} edges (stances ${found.stances}, seed ${found.seed})`;
      const cases: Case[] = acyclic
        ? ["engine-stream", "engine", "peer"]
        : ["walk", "stream", "generator", "materialise"];
      for (const kind of cases) {
        const r = child(kind, found.stances, found.seed);
        rows.push({ ...r, family: acyclic ? "acyclic" : "cyclic", target, graph: graphDesc });
        process.stderr.write(`  done ${kind} ${acyclic ? "acyclic" : "cyclic"} ~1e${Math.log10(target)}\n`);
      }
    }
  }

  const pad = (s: string | number, n: number) => String(s).padStart(n);
  console.log("Framefork traversal engine benchmark");
  console.log(`node ${process.version}, ${process.platform}/${process.arch}`);
  let lastGraph = "";
  for (const r of rows) {
    const head = `${r.family} ~1e${Math.log10(r.target)}: ${r.graph}`;
    if (head !== lastGraph) {
      console.log(`\n${head}`);
      console.log(
        `  ${"case".padEnd(12)}${pad("paths", 9)}${pad("median ms", 11)}${pad("reps", 5)}${pad("paths/s", 13)}${pad("heap base MB", 14)}${pad("heap peak MB", 14)}${pad("max RSS MB", 12)}`,
      );
      lastGraph = head;
    }
    const perS = r.ms > 0 ? Math.round(r.paths / (r.ms / 1000)) : 0;
    console.log(
      `  ${r.case.padEnd(12)}${pad(r.paths, 9)}${pad(r.ms.toFixed(3), 11)}${pad(r.reps, 5)}${pad(perS.toLocaleString("en-US"), 13)}${pad(r.baseMb.toFixed(1), 14)}${pad(r.peakMb.toFixed(1), 14)}${pad(r.maxRssMb.toFixed(0), 12)}`,
    );
  }

  const pick = (family: string, target: number, kind: Case) =>
    rows.find((r) => r.family === family && r.target === target && r.case === kind)!;
  console.log("\nratios (same graph, same run)");
  for (const target of sizes) {
    const walk = pick("cyclic", target, "walk");
    const stream = pick("cyclic", target, "stream");
    const gen = pick("cyclic", target, "generator");
    const mat = pick("cyclic", target, "materialise");
    const eng = pick("acyclic", target, "engine");
    const peer = pick("acyclic", target, "peer");
    const engStream = pick("acyclic", target, "engine-stream");
    const same =
      eng.checksum === peer.checksum ? "same paths and annotations" : `MISMATCH ${eng.checksum} vs ${peer.checksum}`;
    console.log(
      `  ~1e${Math.log10(target)}: stream/walk ${(stream.ms / walk.ms).toFixed(2)}, generator/walk ${(gen.ms / walk.ms).toFixed(2)}, materialise/walk ${(mat.ms / walk.ms).toFixed(2)}; ` +
        `peer/engine ${(peer.ms / eng.ms).toFixed(2)} (materialising), peer/engine ${(peer.ms / engStream.ms).toFixed(1)} (streaming); peer check: ${same}`,
    );
  }
  const streamMem = sizes
    .map((t) => `${pick("cyclic", t, "stream").peakMb.toFixed(1)} MB @ ~1e${Math.log10(t)}`)
    .join(", ");
  console.log(`  stream heap peak: ${streamMem}`);

  const diff = inChild<DiffBench>(["--child-diff"]);
  const diffMs = median(diff.times);
  console.log(
    `\nwhat changed (diffGraphs), generated ${diff.moves}-move character and a patch of it: ` +
      `${diff.pathsBefore} and ${diff.pathsAfter} paths, ${diff.listed} listed; median ${diffMs.toFixed(1)} ms over ${diff.times.length} runs`,
  );

  const board = inChild<BoardBench>(["--child-board"]);
  const boardMs = median(board.times);
  const boardHighsMs = median(board.highsTimes);
  console.log(
    `\nMix-up board (solveBoard), generated tree of ${board.situations} situations of 6x6: ` +
      `median ${boardMs.toFixed(1)} ms over ${board.times.length} runs (target < 50 ms); ` +
      `the same games through HiGHS ${boardHighsMs.toFixed(1)} ms (HiGHS/solveBoard ${(boardHighsMs / boardMs).toFixed(1)}); ` +
      `values agree to ${board.largestGap.toExponential(1)}`,
  );

  const parse = benchImportParse();
  const imported = benchImportDb();
  const big = 1e6;
  const stream = pick("cyclic", big, "stream");
  console.log(
    JSON.stringify({
      paths_per_s: Math.round(stream.paths / (stream.ms / 1000)),
      stream_time_over_walk_time: Number((stream.ms / pick("cyclic", big, "walk").ms).toFixed(3)),
      peer_time_over_engine_time: Number(
        (pick("acyclic", big, "peer").ms / pick("acyclic", big, "engine").ms).toFixed(3),
      ),
      peak_mb_stream_1e6: Number(stream.peakMb.toFixed(2)),
      diff_300_ms: Number(diffMs.toFixed(1)),
      board_100x6x6_ms: Number(boardMs.toFixed(2)),
      board_100x6x6_highs_ms: Number(boardHighsMs.toFixed(2)),
      import_parse_10k_s: Number((parse.ms / 1000).toFixed(4)),
      import_10k_s: Number((median(imported.times) / 1000).toFixed(3)),
      import_10k_peak_mb: Number(imported.peakMb.toFixed(1)),
    }),
  );
}

const args = process.argv.slice(2);
if (args[0] === "--child") {
  console.log(JSON.stringify(runChild(args[1] as Case, Number(args[2]), Number(args[3]))));
} else if (args[0] === "--child-diff") {
  console.log(JSON.stringify(benchDiff()));
} else if (args[0] === "--child-board") {
  void benchBoard().then((r) => console.log(JSON.stringify(r)));
} else {
  main();
}
