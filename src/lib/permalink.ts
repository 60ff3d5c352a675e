import { z } from "zod";
import { atLeast, type Role } from "./roles";
import type { MoveGraph } from "@/lib/engine";
import type { ExplorerOptions, ExplorerState } from "@/lib/explorer";

/**
 * A Permalink's view of the Explorer: what it opens on. The Edition is not
 * part of it: a permalink is pinned to the Edition it was made on, stored
 * beside the view.
 *
 * The bounds are the Explorer's own (`explorerSearchSchema` in
 * `lib/explorer.ts`); a test holds the two to the same numbers.
 */
export const VIEW_BOUNDS = {
  maxDepth: { min: 1, max: 16, default: 8 },
  maxStanceVisits: { min: 0, max: 4, default: 1 },
  fastest: { min: 1, max: 30 },
} as const;

/** Move and edge keys are plain text (`n.v>n.v.t`, `drift:v`); control characters never belong in them. */
const plainText = (what: string, max: number) =>
  z
    .string({ error: `${what} must be text.` })
    .max(max, { error: `${what} is longer than ${max} characters.` })
    .regex(/^[^\u0000-\u001f\u007f]*$/, { error: `${what} may not contain control characters.` });

const boundedInt = (what: string, { min, max }: { min: number; max: number }) =>
  z
    .number({ error: `${what} must be a number.` })
    .int({ error: `${what} must be a whole number.` })
    .min(min, { error: `${what} must be at least ${min}.` })
    .max(max, { error: `${what} must be at most ${max}.` });

export const permalinkViewSchema = z
  .object({
    /** The root move's key. */
    root: plainText("The root move", 64).min(1, { error: "Choose the move the view starts from." }),
    /** The selected path's `pathKey` ("" is the root alone), or null for no selection. */
    path: plainText("The selected path", 4000).nullable(),
    options: z
      .object({
        maxDepth: boundedInt("Depth", VIEW_BOUNDS.maxDepth),
        maxStanceVisits: boundedInt("Stance re-entries", VIEW_BOUNDS.maxStanceVisits),
        fastest: boundedInt("The opponent's fastest attack", VIEW_BOUNDS.fastest),
      })
      .strict(),
    /** The opponent whose punishers are shown; null: the same character. */
    opponent: z.number({ error: "The opponent must be a character id." }).int().positive().nullable(),
  })
  .strict();

export type PermalinkView = z.infer<typeof permalinkViewSchema>;

export const PERMALINK_VISIBILITIES = ["team", "link"] as const;
export type PermalinkVisibility = (typeof PERMALINK_VISIBILITIES)[number];

/** The words the product uses for each visibility, in the dialog and on the shared page. */
export const VISIBILITY_TEXT: Record<PermalinkVisibility, { label: string; explain: string }> = {
  team: { label: "Team only", explain: "Only members of the team can open it, after signing in." },
  link: { label: "Anyone with the link", explain: "Anyone who has the address can open it, without an account." },
};

const id = (what: string) =>
  z
    .number({ error: `${what} must be a number.` })
    .int({ error: `${what} must be a whole number.` })
    .positive({ error: `${what} must be positive.` });

/** A link to a Mix-up board: it shows the board's current saved document, read-only. */
export const boardLinkViewSchema = z.object({ board: id("The board") }).strict();
export type BoardLinkView = z.infer<typeof boardLinkViewSchema>;

/** A link to a stance sheet: the stance by its key, in the character and Edition it is pinned to. */
export const stanceLinkViewSchema = z
  .object({ stance: plainText("The stance", 64).min(1, { error: "Say which stance the sheet is of." }) })
  .strict();
export type StanceLinkView = z.infer<typeof stanceLinkViewSchema>;

/** What a permalink shows: an Explorer view (the default), a Mix-up board or a stance sheet. */
export const PERMALINK_KINDS = ["explorer", "board", "stance"] as const;
export type PermalinkKind = (typeof PERMALINK_KINDS)[number];

const editionSlugSchema = z
  .string({ error: "Say which Edition the link is pinned to." })
  .regex(/^[a-z0-9-]{1,32}$/, { error: "An Edition is named by its slug, such as 1-1." });

const visibilitySchema = z.enum(PERMALINK_VISIBILITIES, {
  error: 'Visibility is "team" (members only) or "link" (anyone with the link).',
});

/**
 * The body of POST /api/permalinks: an Explorer view (`kind` "explorer" or left out) names its
 * character and Edition; a board's link (`kind` "board") names the board, whose character and
 * Edition it is pinned to; a stance sheet's (`kind` "stance") names character, Edition and stance key.
 */
export const createPermalinkSchema = z.discriminatedUnion(
  "kind",
  [
    z
      .object({
        kind: z.literal("explorer").optional(),
        teamId: id("The team"),
        characterId: id("The character"),
        edition: editionSlugSchema,
        view: permalinkViewSchema,
        visibility: visibilitySchema,
      })
      .strict(),
    z
      .object({
        kind: z.literal("board"),
        teamId: id("The team"),
        view: boardLinkViewSchema,
        visibility: visibilitySchema,
      })
      .strict(),
    z
      .object({
        kind: z.literal("stance"),
        teamId: id("The team"),
        characterId: id("The character"),
        edition: editionSlugSchema,
        view: stanceLinkViewSchema,
        visibility: visibilitySchema,
      })
      .strict(),
  ],
  {
    error: 'A link shows an Explorer view (kind "explorer"), a board (kind "board") or a stance sheet (kind "stance").',
  },
);

export type CreatePermalinkInput = z.infer<typeof createPermalinkSchema>;

/** 18 random bytes as base64url are 24 characters; anything else is no slug of ours. */
export const SLUG_PATTERN = /^[A-Za-z0-9_-]{24}$/;

export const permalinkPath = (slug: string) => `/s/${slug}`;

/** The Explorer store's starting state for a view pinned to `edition`. */
export function viewToExplorerState(view: PermalinkView, edition: string): ExplorerState {
  return { edition, selected: view.path, options: { ...view.options }, opponent: view.opponent };
}

/** The view a store shows now, to share it. */
export function explorerStateToView(
  state: Pick<ExplorerState, "selected" | "options" | "opponent">,
  root: string,
): PermalinkView {
  const { maxDepth, maxStanceVisits, fastest }: ExplorerOptions = state.options;
  return { root, path: state.selected, options: { maxDepth, maxStanceVisits, fastest }, opponent: state.opponent };
}

/**
 * The live Explorer's address for a view: the same search params the Explorer
 * writes itself (defaults left out), so opening it shows the same view on the
 * chosen Edition.
 */
export function explorerHref({
  gameSlug,
  characterSlug,
  edition,
  view,
  gameFastest,
}: {
  gameSlug: string;
  characterSlug: string;
  edition: string;
  view: PermalinkView;
  gameFastest: number;
}): string {
  const params = new URLSearchParams({ edition });
  if (view.path !== null) params.set("path", view.path);
  if (view.options.maxDepth !== VIEW_BOUNDS.maxDepth.default) params.set("depth", String(view.options.maxDepth));
  if (view.options.maxStanceVisits !== VIEW_BOUNDS.maxStanceVisits.default)
    params.set("visits", String(view.options.maxStanceVisits));
  if (view.options.fastest !== gameFastest) params.set("fastest", String(view.options.fastest));
  if (view.opponent !== null) params.set("vs", String(view.opponent));
  return `/games/${encodeURIComponent(gameSlug)}/${encodeURIComponent(characterSlug)}/explore/${encodeURIComponent(view.root)}?${params.toString()}`;
}

/** The live stance sheet's address for a stance (by its key) in an Edition. */
export function stanceSheetHref({
  gameSlug,
  characterSlug,
  edition,
  stance,
}: {
  gameSlug: string;
  characterSlug: string;
  edition: string;
  stance: string;
}): string {
  return `/games/${encodeURIComponent(gameSlug)}/${encodeURIComponent(characterSlug)}/stances/${encodeURIComponent(stance)}?edition=${encodeURIComponent(edition)}`;
}

/**
 * Who may revoke a permalink: its creator while still in the team, or a
 * coach or owner of the team. Someone outside the team never may.
 */
export function canRevoke({ role, isCreator }: { role: Role | null; isCreator: boolean }): boolean {
  if (role === null) return false;
  return isCreator || atLeast(role, "coach");
}

/**
 * Checks that a view's root and path are in a graph (the path's edges chain
 * from the root) and gives the path's input: the root's input followed by
 * each edge's input, as the engine joins it.
 */
export function tracePath(
  graph: MoveGraph,
  view: Pick<PermalinkView, "root" | "path">,
): { ok: true; input: string } | { ok: false; error: string } {
  const root = graph.nodes.find((n) => n.id === view.root);
  if (!root || root.kind !== "move") return { ok: false, error: `There is no move "${view.root}" to start from.` };
  if (view.path === null || view.path === "") return { ok: true, input: root.input };
  const byId = new Map(graph.edges.map((e) => [e.id, e]));
  let at = root.id;
  let input = root.input;
  for (const edgeId of view.path.split("|")) {
    const edge = byId.get(edgeId);
    if (!edge || edge.from !== at) return { ok: false, error: `The selected path does not continue from "${at}".` };
    at = edge.to;
    input += edge.input;
  }
  return { ok: true, input };
}
