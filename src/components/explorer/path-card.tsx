import { memo } from "react";
import { BlockClassTag, type BlockRules } from "@/components/ui/block-class";
import { Explained } from "@/components/ui/explained";
import { Frames } from "@/components/ui/frames";
import { LevelBadge } from "@/components/ui/level-badge";
import {
  BLOCK_CLASS_WORD,
  classifyBlock,
  explainFramesSaved,
  explainGap,
  explainOnBlock,
  explainOnHit,
  explainRange,
  formatOutcome,
  formatRange,
  type MoveGraph,
  type PathResult,
  type RangeScale,
} from "@/lib/engine";
import { hitOnBlockBeforeCancel } from "@/lib/explorer";

const GUARD_WORD = { stand: "stand", duck: "duck", crouch: "crouch", break: "break", evade: "evade" } as const;

function Row({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div className="flex items-baseline justify-between gap-3 border-t border-ink-800 py-1.5 first:border-t-0">
      <dt className="text-xs tracking-wider text-ink-400 uppercase">{label}</dt>
      <dd className="text-right text-sm">{children}</dd>
    </div>
  );
}

/** Everything the engine computes for one path, each figure with where it came from. */
function PathCardView({
  path,
  graph,
  rules,
  range,
  alternatives,
  onPickAlternative,
}: {
  path: PathResult;
  graph: MoveGraph;
  rules: BlockRules;
  /** How the game measures range: each hit's range reads in it. */
  range: RangeScale;
  alternatives: PathResult[];
  onPickAlternative: (p: PathResult) => void;
}) {
  const byId = new Map(graph.nodes.map((n) => [n.id, n]));
  const hits = path.nodes.map((id) => byId.get(id)).filter((n) => n?.kind === "move");
  const raw = hitOnBlockBeforeCancel(path, byId);
  const cls = path.blockClass;

  return (
    <section
      aria-labelledby="path-card-title"
      className="space-y-3 rounded-lg border border-ink-800 bg-ink-900 p-4"
      data-testid="path-card"
    >
      <header>
        <h2 id="path-card-title" className="text-xs tracking-wider text-ink-400 uppercase">
          Path card
        </h2>
        <p className="mt-1 font-mono text-lg break-all text-ink-100">
          <Explained field="input" explain="The root's input followed by the input of each step taken, as entered.">
            {path.input}
          </Explained>
        </p>
        <p className="text-xs text-ink-400">
          ends {path.endsIn === "stance" ? "in a stance (cancelled)" : "on a hit"} ·{" "}
          <span data-field="endsIn">{path.endsIn}</span>
        </p>
      </header>

      <ol className="space-y-1" aria-label="Hits on this path">
        {hits.map((n, i) =>
          n?.kind === "move" ? (
            // Keyed by place: the next path's rows reuse these elements, so a click changes text, not the tree.
            <li key={i} className="flex items-center gap-2 text-sm">
              <span className="w-5 text-right font-mono text-xs text-ink-400">{i + 1}</span>
              <LevelBadge level={path.levels[i]!} />
              <span className="truncate text-ink-200">{n.name ?? n.input}</span>
              {formatRange(n.range, range) !== null && (
                <span className="shrink-0 font-mono text-xs text-ink-400" data-field="range">
                  <Explained explain={explainRange(n.range, range)}>{formatRange(n.range, range)}</Explained>
                </span>
              )}
              <span className="ml-auto text-xs text-ink-400" data-field="guards">
                <Explained explain={`A ${path.levels[i]} is stopped by: ${path.guards[i]!.join(", ")}.`}>
                  {path.guards[i]!.map((g) => GUARD_WORD[g]).join(" / ")}
                </Explained>
              </span>
            </li>
          ) : null,
        )}
      </ol>

      <dl>
        <Row label="On block">
          <Explained field="onBlock" explain={explainOnBlock(path.onBlock, rules)}>
            <Frames value={path.onBlock} />
          </Explained>
          <span data-field="blockClass" className="ml-1">
            {cls === "state" ? (
              <span className="text-xs text-block-state">state</span>
            ) : (
              <BlockClassTag onBlock={path.onBlock} rules={rules} />
            )}
          </span>
        </Row>
        <Row label="On hit">
          <Explained field="onHit" explain={explainOnHit(path.onHit)}>
            <Frames value={path.onHit} />
          </Explained>
        </Row>
        <Row label="On counter hit">
          <Explained field="onCounterHit" explain={explainOnHit(path.onCounterHit, { counterHit: true })}>
            <Frames value={path.onCounterHit} />
          </Explained>
        </Row>
        {path.framesSaved !== null && raw !== null && (
          <Row label="Cancel saves">
            <Explained field="framesSaved" explain={explainFramesSaved(path.onBlock, raw)}>
              <span className="font-mono">{path.framesSaved}f</span>
            </Explained>
            <span className="ml-2 text-xs text-ink-400">
              without it <span className="font-mono">{formatOutcome(raw)}</span> (
              {BLOCK_CLASS_WORD[classifyBlock(raw, rules)]})
            </span>
          </Row>
        )}
        <Row label="Damage">
          <Explained
            field="damage"
            explain={`The sum of the hits' damage (${hits.map((n) => (n?.kind === "move" ? n.damage : 0)).join(" + ")}), with no scaling.`}
          >
            <span className="font-mono">{path.damage}</span>
          </Explained>
        </Row>
        <Row label="Natural combo">
          <Explained
            field="naturalCombo"
            explain="Yes when every hit after the first is guaranteed once the previous one connects."
          >
            {path.naturalCombo ? "yes" : "no"}
          </Explained>
        </Row>
        <Row label="Jails on block">
          <Explained
            field="jails"
            explain="Yes when no step on the path leaves the defender a frame to act (every gap is 0 or less)."
          >
            {path.jails ? "yes" : "no"}
          </Explained>
        </Row>
        <Row label="Gaps">
          <span data-field="gaps">
            {path.gaps.length === 0
              ? "none"
              : path.gaps.map((g) => (
                  <Explained key={g.after} explain={`Gap on block after hit ${g.after + 1}: ${explainGap(g.frames)}.`}>
                    <span className="ml-2 font-mono">
                      after {g.after + 1}: {g.frames}f
                    </span>
                  </Explained>
                ))}
          </span>
        </Row>
        <Row label="Duckable highs">
          <Explained
            field="duckable"
            explain="Highs that open the path or come after a gap: the defender can duck them on reaction to the gap."
          >
            {path.duckable.length === 0 ? "none" : path.duckable.map((i) => `hit ${i + 1}`).join(", ")}
          </Explained>
        </Row>
        <Row label="Guess points">
          <Explained
            field="mixupPoints"
            explain="Hits after which the string can go on with hits that need different guards: the defender must guess there."
          >
            {path.mixupPoints.length === 0
              ? "none"
              : path.mixupPoints
                  .map((id) => (byId.get(id)?.kind === "move" ? (byId.get(id) as { input: string }).input : id))
                  .join(", ")}
          </Explained>
        </Row>
        <Row label="Auto-guard">
          <Explained field="autoGuard" explain="Hit levels guarded automatically by the cancels on this path.">
            {path.autoGuard.length === 0 ? "none" : path.autoGuard.join(", ")}
          </Explained>
        </Row>
        <Row label="Defender after block">
          <Explained
            field="defenderStance"
            explain="Crouching when the last hit is a low (they blocked it crouching), else standing: it decides which punishers apply."
          >
            {path.defenderStance}
          </Explained>
        </Row>
      </dl>

      {alternatives.length > 1 && (
        <div className="border-t border-ink-800 pt-2">
          <p className="text-xs text-ink-400">{alternatives.length} paths reach this node:</p>
          <ul className="mt-1 space-y-1">
            {alternatives.map((alt) => (
              <li key={alt.edges.join("|")}>
                <button
                  type="button"
                  onClick={() => onPickAlternative(alt)}
                  aria-pressed={alt === path}
                  className={`w-full truncate rounded px-2 py-1 text-left font-mono text-xs ${alt === path ? "bg-ink-800 text-accent" : "text-ink-300 hover:bg-ink-850"}`}
                >
                  {alt.input}
                </button>
              </li>
            ))}
          </ul>
        </div>
      )}
    </section>
  );
}

/** Memoised: it re-renders when its path, graph, rules or alternatives change, not with every render of the Explorer. */
export const PathCard = memo(PathCardView);
