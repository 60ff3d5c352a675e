import type { Metadata } from "next";
import Link from "next/link";
import { z } from "zod";
import { Breadcrumb } from "@/components/ui/breadcrumb";
import { ChangedPathsTable } from "@/components/changes/changed-paths-table";
import { EditionPicker } from "@/components/changes/edition-picker";
import { ItemChanges, type ItemChange } from "@/components/changes/item-changes";
import { changedPathRows, pickEditions, summariseChanges, summaryPhrases } from "@/lib/changes";
import { diffGraphs, type GraphEdge, type GraphNode, type MoveGraph } from "@/lib/engine";
import { listEditions } from "@/server/db/queries/games";
import { getCharacterGraph } from "@/server/db/queries/moves";
import { loadCharacter } from "../../../data";

type Props = PageProps<"/games/[game]/[character]/changes">;

/** Rows of the paths table sent per page: a big patch is read a page at a time, not as megabytes of HTML. */
const ROWS_PER_PAGE = 500;

const slug = z
  .string()
  .regex(/^[a-z0-9-]{1,32}$/)
  .optional()
  .catch(undefined);
const searchSchema = z.object({
  from: slug,
  to: slug,
  page: z.coerce.number().int().min(1).max(100_000).optional().catch(undefined),
});

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { game, character } = await params;
  const found = await loadCharacter(game, character);
  return { title: `What changed · ${found.character.name} · ${found.game.name}` };
}

/** What changed for one character between two Editions: moves field by field, and every path whose ending moved. */
export default async function ChangesPage({ params, searchParams }: Props) {
  const slugs = await params;
  const { game, character } = await loadCharacter(slugs.game, slugs.character);
  const raw = await searchParams;
  const search = searchSchema.parse(
    Object.fromEntries(Object.entries(raw).map(([k, v]) => [k, Array.isArray(v) ? v[0] : v])),
  );
  // A team's members (the only ones who read its game) may compare its drafts too; the public
  // game shows its published Editions only.
  const editions = (await listEditions({ gameId: game.id })).filter(
    (e) => e.status === "published" || game.teamId !== null,
  );
  const base = `/games/${game.slug}/${character.slug}`;
  const trail = [
    { href: "/games", label: "Games" },
    { href: `/games/${game.slug}`, label: game.name },
    { href: base, label: character.name },
  ];
  const picked = pickEditions(editions, { from: search.from, to: search.to });
  const { from, to } = picked;

  const heading = (
    <>
      <Breadcrumb trail={trail} />
      <h1 className="text-2xl font-semibold">
        What changed <span className="text-ink-400">for</span> {character.name}
      </h1>
    </>
  );
  if (from === null || to === null) {
    return (
      <div className="space-y-6">
        {heading}
        <p className="rounded-lg border border-dashed border-ink-700 p-6 text-ink-300" role="status">
          {game.name} has {editions.length === 0 ? "no Edition" : "one Edition"} yet: there is nothing to compare. Once
          a second Edition is out, this page shows what it changed.
        </p>
      </div>
    );
  }

  const [before, after] = await Promise.all([
    getCharacterGraph({ characterId: character.id, editionId: from.id }),
    getCharacterGraph({ characterId: character.id, editionId: to.id }),
  ]);
  const options = { fastest: game.fastest, launchAt: game.launchAt };
  const diff = diffGraphs(before.graph, after.graph, options);
  const summary = summariseChanges(diff, before.graph, after.graph);
  const phrases = summaryPhrases(summary);

  const pageCount = Math.max(1, Math.ceil(diff.paths.length / ROWS_PER_PAGE));
  const page = Math.min(search.page ?? 1, pageCount);
  const shown = { ...diff, paths: diff.paths.slice((page - 1) * ROWS_PER_PAGE, page * ROWS_PER_PAGE) };
  const rows = changedPathRows(shown, before.graph, after.graph, options);
  const pageHref = (n: number) => `?from=${from.slug}&to=${to.slug}${n > 1 ? `&page=${n}` : ""}`;

  const nodeChanges = itemChanges(diff.nodes, before.graph, after.graph);
  const moveChanges = nodeChanges.filter((c) => c.kind === "move");
  const stanceChanges = nodeChanges.filter((c) => c.kind === "stance");
  const linkChanges = edgeChanges(diff.edges, before.graph, after.graph);

  return (
    <div className="space-y-6">
      {heading}
      <EditionPicker
        editions={editions.map((e) => ({ slug: e.slug, name: e.name, draft: e.status === "draft" }))}
        from={from.slug}
        to={to.slug}
      />
      {picked.unknown.length > 0 && (
        <p role="status" className="rounded border border-block-punishable/50 px-3 py-2 text-sm text-block-punishable">
          No Edition named {picked.unknown.map((s) => `“${s}”`).join(" or ")}: showing {from.name} → {to.name}.
        </p>
      )}
      {from.id === to.id ? (
        <p className="rounded-lg border border-dashed border-ink-700 p-6 text-ink-300" role="status">
          Both sides are {to.name}: pick two different Editions to compare.
        </p>
      ) : phrases.length === 0 ? (
        <p
          className="rounded-lg border border-dashed border-ink-700 p-6 text-ink-300"
          role="status"
          data-testid="changes-summary"
        >
          Nothing changed for {character.name} between {from.name} and {to.name}.
        </p>
      ) : (
        <>
          <section
            aria-labelledby="summary-title"
            className="space-y-2 rounded-lg border border-ink-800 bg-ink-900 p-4"
            data-testid="changes-summary"
          >
            <h2 id="summary-title" className="text-sm text-ink-400">
              From <span className="text-ink-100">{from.name}</span> to <span className="text-ink-100">{to.name}</span>
            </h2>
            <p className="text-lg text-ink-100">{capitalise(phrases.join(", "))}.</p>
            <p className="text-xs text-ink-400">
              Paths are compared with the game&apos;s rules on both sides (fastest attack {game.fastest}f, launch punish
              from -{game.launchAt}), up to 8 moves deep, matched by the moves and links along them.
            </p>
          </section>
          <ItemChanges title="Moves" kindWord="move" items={moveChanges} />
          <ItemChanges title="Follow-ups and cancels" kindWord="link" items={linkChanges} />
          <ItemChanges title="Stances" kindWord="stance" items={stanceChanges} />
          {diff.paths.length === 0 ? (
            <p className="text-sm text-ink-300">No path&apos;s ending, on-hit outcome, combo or jail changed.</p>
          ) : (
            <ChangedPathsTable
              rows={rows}
              total={diff.paths.length}
              from={{ slug: from.slug, name: from.name }}
              to={{ slug: to.slug, name: to.name }}
              exploreBase={`${base}/explore`}
            />
          )}
          {pageCount > 1 && (
            <nav aria-label="Pages of changed paths" className="flex flex-wrap items-center gap-3 text-sm">
              <span className="text-ink-400">
                Page {page} of {pageCount} ({ROWS_PER_PAGE} paths a page)
              </span>
              {page > 1 && <Link href={pageHref(page - 1)}>Previous page</Link>}
              {page < pageCount && <Link href={pageHref(page + 1)}>Next page</Link>}
            </nav>
          )}
        </>
      )}
      <p className="text-sm">
        <Link href={`${base}?edition=${to.slug}`}>
          Back to {character.name}&apos;s moves in {to.name}
        </Link>
      </p>
    </div>
  );
}

const capitalise = (s: string) => (s === "" ? s : `${s[0]!.toUpperCase()}${s.slice(1)}`);

type ItemsDiff = ReturnType<typeof diffGraphs>["nodes"];

/** Nodes added, removed and changed, each with its input and name from the side that has it. */
function itemChanges(
  diff: ItemsDiff,
  before: MoveGraph,
  after: MoveGraph,
): (ItemChange & { kind: GraphNode["kind"] })[] {
  const was = new Map(before.nodes.map((n) => [n.id, n]));
  const now = new Map(after.nodes.map((n) => [n.id, n]));
  const describe = (n: GraphNode) =>
    n.kind === "move" ? { input: n.input, name: n.name ?? null } : { input: null, name: n.name };
  const of = (id: string, status: ItemChange["status"], changes: ItemChange["changes"] = []) => {
    const node = (status === "removed" ? was.get(id) : now.get(id)) ?? was.get(id)!;
    return { id, status, changes, kind: node.kind, ...describe(node) };
  };
  return [
    ...diff.changed.map((c) => of(c.id, "changed", c.changes)),
    ...diff.added.map((id) => of(id, "added")),
    ...diff.removed.map((id) => of(id, "removed")),
  ];
}

/** Links (follow-ups, cancels, stance moves) by what is entered: the input of the move they leave and their own. */
function edgeChanges(diff: ItemsDiff, before: MoveGraph, after: MoveGraph): ItemChange[] {
  const describe = (graph: MoveGraph, id: string) => {
    const edge = graph.edges.find((e) => e.id === id);
    if (!edge) return null;
    const start = graph.nodes.find((n) => n.id === edge.from);
    const startInput = start?.kind === "move" ? start.input : (start?.name ?? edge.from);
    return { input: `${startInput}${start?.kind === "stance" ? " " : ""}${edge.input}`, name: EDGE_KIND[edge.kind] };
  };
  const of = (id: string, status: ItemChange["status"], changes: ItemChange["changes"] = []): ItemChange => {
    const side = (status === "removed" ? describe(before, id) : describe(after, id)) ?? describe(before, id);
    return { id, status, changes, input: side?.input ?? id, name: side?.name ?? null };
  };
  return [
    ...diff.changed.map((c) => of(c.id, "changed", c.changes)),
    ...diff.added.map((id) => of(id, "added")),
    ...diff.removed.map((id) => of(id, "removed")),
  ];
}

const EDGE_KIND: Record<GraphEdge["kind"], string> = {
  follow: "follow-up",
  cancel: "stance cancel",
  enter: "move from a stance",
};
