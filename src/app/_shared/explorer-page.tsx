import type { Metadata } from "next";
import { Suspense, type ComponentProps } from "react";
import { Breadcrumb } from "@/components/ui/breadcrumb";
import { ExplorerFromAddress, ExplorerWithData } from "@/components/explorer/explorer-with-data";
import type { GraphResponse } from "@/lib/explorer";

export function explorerTitle(root: string, characterName: string): Metadata {
  return { title: `${root} · ${characterName} Explorer` };
}

/** What the Explorer shows while it reads its address in the browser. */
export function ExplorerSkeleton() {
  return (
    <div role="status" aria-live="polite" className="space-y-3 py-2">
      <span className="sr-only">Loading the Explorer…</span>
      <div className="h-6 w-64 animate-pulse rounded bg-ink-800" />
      <div className="h-[55vh] animate-pulse rounded-lg bg-ink-900" />
    </div>
  );
}

/**
 * The Explorer page: one string (or stance move) of a character drawn as a
 * graph, with the Path card beside it. `live` is what the live route read for
 * this request (the address's view, the reader's teams and role); without it
 * the page is the cached copy of a published Edition, which reads both in the
 * browser.
 */
export function ExplorerPage({
  data,
  root,
  live,
}: {
  data: GraphResponse;
  root: string;
  live?: Omit<ComponentProps<typeof ExplorerWithData>, "data" | "root">;
}) {
  const { game, character, edition, graph } = data;
  const rootMove = graph.nodes.find((n) => n.id === root);
  return (
    <div className="space-y-4">
      <Breadcrumb
        trail={[
          { href: "/games", label: "Games" },
          { href: `/games/${game.slug}`, label: game.name },
          { href: `/games/${game.slug}/${character.slug}?edition=${edition.slug}`, label: character.name },
        ]}
      />
      <h1 className="text-xl font-semibold">
        Explorer · <span className="font-mono">{root}</span>
        {rootMove?.kind === "move" && rootMove.name && (
          <span className="ml-2 text-base font-normal text-ink-300">{rootMove.name}</span>
        )}
      </h1>
      {live ? (
        <ExplorerWithData data={data} root={root} {...live} />
      ) : (
        <Suspense fallback={<ExplorerSkeleton />}>
          <ExplorerFromAddress data={data} root={root} />
        </Suspense>
      )}
    </div>
  );
}
