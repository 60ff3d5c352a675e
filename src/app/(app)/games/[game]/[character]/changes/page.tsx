import type { Metadata } from "next";
import Link from "next/link";
import { z } from "zod";
import { Breadcrumb } from "@/components/ui/breadcrumb";
import { ChangedPathsTable } from "@/components/changes/changed-paths-table";
import { EditionPicker } from "@/components/changes/edition-picker";
import { ItemChanges } from "@/components/changes/item-changes";
import { changedPathsViewSchema, changesSearch, pickEditions, viewChangedPaths } from "@/lib/changes";
import { compareEditions } from "@/server/changes";
import { listEditions } from "@/server/db/queries/games";
import { loadCharacter } from "../../../data";

type Props = PageProps<"/games/[game]/[character]/changes">;

/**
 * Rows of the paths table sent per page. A 300-move character's patch changes tens of thousands
 * of paths: sending them all would be megabytes of HTML, so the server filters and sorts every
 * changed path (the view is in the address: a reload or a shared link keeps it) and sends one
 * page of the result. A coach filtering for "now punishable" expects every such path, not the
 * ones that happened to fall on the page open.
 */
const ROWS_PER_PAGE = 500;

const slug = z
  .string()
  .regex(/^[a-z0-9-]{1,32}$/)
  .optional()
  .catch(undefined);
const editionsSchema = z.object({ from: slug, to: slug });

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
  const flat = Object.fromEntries(Object.entries(raw).map(([k, v]) => [k, Array.isArray(v) ? v[0] : v]));
  const search = editionsSchema.parse(flat);
  const view = changedPathsViewSchema.parse(flat);
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

  const comparison =
    from.id === to.id
      ? null
      : await compareEditions({
          characterId: character.id,
          from,
          to,
          options: { fastest: game.fastest, launchAt: game.launchAt },
        });
  const phrases = comparison?.phrases ?? [];
  const allRows = comparison?.rows ?? [];
  const shown = viewChangedPaths(allRows, view, ROWS_PER_PAGE);
  const editionSlugs = { from: from.slug, to: to.slug };
  const pageHref = (n: number) => changesSearch(editionSlugs, { ...view, page: n });

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
      {comparison === null ? (
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
          <ItemChanges title="Moves" kindWord="move" items={comparison.moves} />
          <ItemChanges title="Follow-ups and cancels" kindWord="link" items={comparison.links} />
          <ItemChanges title="Stances" kindWord="stance" items={comparison.stances} />
          {allRows.length === 0 ? (
            <p className="text-sm text-ink-300">No path&apos;s ending, on-hit outcome, combo or jail changed.</p>
          ) : (
            <ChangedPathsTable
              rows={shown.rows}
              total={allRows.length}
              matching={shown.matching}
              firstRow={(shown.page - 1) * ROWS_PER_PAGE + 1}
              view={{ ...view, page: shown.page }}
              address={`${base}/changes`}
              from={{ slug: from.slug, name: from.name }}
              to={{ slug: to.slug, name: to.name }}
              exploreBase={`${base}/explore`}
            />
          )}
          {shown.pageCount > 1 && (
            <nav aria-label="Pages of changed paths" className="flex flex-wrap items-center gap-3 text-sm">
              <span className="text-ink-400">
                Page {shown.page} of {shown.pageCount} ({ROWS_PER_PAGE} paths a page)
              </span>
              {shown.page > 1 && <Link href={pageHref(shown.page - 1)}>Previous page</Link>}
              {shown.page < shown.pageCount && <Link href={pageHref(shown.page + 1)}>Next page</Link>}
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
