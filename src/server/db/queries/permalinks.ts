import "server-only";
import { and, desc, eq, isNull } from "drizzle-orm";
import { LRUCache } from "lru-cache";
import { AppError } from "@/lib/errors";
import {
  boardLinkViewSchema,
  canRevoke,
  permalinkPath,
  permalinkViewSchema,
  SLUG_PATTERN,
  stanceLinkViewSchema,
  tracePath,
  type BoardLinkView,
  type StanceLinkView,
  type PermalinkView,
  type PermalinkVisibility,
} from "@/lib/permalink";
import { getRole } from "@/server/authz";
import { newSlug } from "@/server/permalinks";
import { getDb } from "../index";
import { editions, permalinks, users } from "../schema";
import { recordAudit } from "./audit";
import { readBoardForLink } from "./boards";
import { getExplorerData } from "./explorer";
import { characterForTeam, gameEdition, opponentInGame } from "./games";
import { getCharacterGraph } from "./moves";
import { getStanceSheet } from "./stance-sheets";
import type { PermalinkDto, SharedViewDto, TeamPermalinkDto } from "@/lib/dto";
import type { GraphResponse } from "@/lib/explorer";

export type SharedViewResult = { status: "ok"; view: SharedViewDto } | { status: "unavailable" };

/** A title says what the link shows at a glance: character, the path's input, the Edition. */
const MAX_TITLE_INPUT = 120;
export function permalinkTitle({
  characterName,
  input,
  editionSlug,
}: {
  characterName: string;
  input: string;
  editionSlug: string;
}) {
  const shown = input.length > MAX_TITLE_INPUT ? `${input.slice(0, MAX_TITLE_INPUT - 1)}…` : input;
  return `${characterName} · ${shown} · edition ${editionSlug}`;
}

const rowColumns = {
  id: permalinks.id,
  slug: permalinks.slug,
  kind: permalinks.kind,
  teamId: permalinks.teamId,
  title: permalinks.title,
  visibility: permalinks.visibility,
  characterId: permalinks.characterId,
  view: permalinks.view,
  createdBy: permalinks.createdBy,
  creatorName: users.name,
  createdAt: permalinks.createdAt,
  revokedAt: permalinks.revokedAt,
  edition: { id: editions.id, slug: editions.slug, name: editions.name },
};

type Row = {
  slug: string;
  kind: string;
  teamId: number;
  title: string;
  visibility: PermalinkVisibility;
  characterId: number;
  view: Record<string, unknown>;
  createdBy: string;
  creatorName: string | null;
  createdAt: Date;
  revokedAt: Date | null;
  edition: { id: number; slug: string; name: string };
};

/** A stored view, read by its kind's schema. */
type KindView =
  | { kind: "explorer"; view: PermalinkView }
  | { kind: "board"; view: BoardLinkView }
  | { kind: "stance"; view: StanceLinkView };

function toDto(row: Row, { kind, view }: KindView): PermalinkDto {
  const base = {
    slug: row.slug,
    path: permalinkPath(row.slug),
    teamId: row.teamId,
    title: row.title,
    visibility: row.visibility,
    characterId: row.characterId,
    edition: row.edition,
    createdBy: { id: row.createdBy, name: row.creatorName },
    createdAt: row.createdAt.toISOString(),
    revokedAt: row.revokedAt?.toISOString() ?? null,
  };
  if (kind === "board") return { ...base, kind, view };
  if (kind === "stance") return { ...base, kind, view };
  return { ...base, kind, view };
}

/** A stored view by its row's kind; null for a kind this code does not know or a view that no longer fits. */
function kindView(row: Pick<Row, "kind" | "view">): KindView | { error: unknown } {
  if (row.kind === "board") {
    const view = boardLinkViewSchema.safeParse(row.view);
    return view.success ? { kind: "board", view: view.data } : { error: view.error.issues };
  }
  if (row.kind === "stance") {
    const view = stanceLinkViewSchema.safeParse(row.view);
    return view.success ? { kind: "stance", view: view.data } : { error: view.error.issues };
  }
  if (row.kind === "explorer") {
    const view = permalinkViewSchema.safeParse(row.view);
    return view.success ? { kind: "explorer", view: view.data } : { error: view.error.issues };
  }
  return { error: `unknown kind ${row.kind}` };
}

/** Permalinks with their Edition and their creator's name. */
const selectRows = () =>
  getDb()
    .select(rowColumns)
    .from(permalinks)
    .innerJoin(editions, eq(editions.id, permalinks.editionId))
    .leftJoin(users, eq(users.id, permalinks.createdBy));

async function findRow(slug: string) {
  if (!SLUG_PATTERN.test(slug)) return null;
  const [row] = await selectRows().where(eq(permalinks.slug, slug)).limit(1);
  if (!row) return null;
  // Stored views went through the schema on the way in; one that no longer fits is treated as gone.
  const view = kindView(row);
  if ("error" in view) {
    console.error(`[permalinks] stored view of ${slug} no longer fits the schema`, view.error);
    return null;
  }
  return { row, view };
}

/** What a link pinned to a character and an Edition is made from; `view` is its kind's. */
interface PinnedLinkInput<View> {
  teamId: number;
  createdBy: string;
  characterId: number;
  editionSlug: string;
  view: View;
  visibility: PermalinkVisibility;
}

/**
 * The character a team may link to (the demo game's or its own) and the published Edition a link
 * is pinned to: a link is pinned to data that never changes, and a draft is still being edited.
 */
async function publishedEditionFor({
  teamId,
  characterId,
  editionSlug,
}: {
  teamId: number;
  characterId: number;
  editionSlug: string;
}) {
  const { character, game } = await characterForTeam({ teamId, characterId });
  const edition = await gameEdition({ game, slug: editionSlug });
  if (edition.status !== "published")
    throw new AppError("conflict", `${edition.name} is a draft: publish it before sharing a link to it.`);
  return { character, game, edition };
}

/**
 * Makes a permalink of a view, pinned to an Edition. The character must be in
 * the public demo game or in a game the team owns; the root and the path must
 * exist in that Edition. The row and its audit entry are written together.
 * The caller has checked that `createdBy` may share in the team (player or higher).
 */
export async function createPermalink({
  teamId,
  createdBy,
  characterId,
  editionSlug,
  view,
  visibility,
}: PinnedLinkInput<PermalinkView>): Promise<PermalinkDto> {
  const checked = permalinkViewSchema.parse(view);
  const { character, game, edition } = await publishedEditionFor({ teamId, characterId, editionSlug });

  const { graph } = await getCharacterGraph({ characterId, editionId: edition.id });
  const traced = tracePath(graph, checked);
  if (!traced.ok) throw new AppError("bad_request", `${traced.error} (${character.name}, ${edition.name})`);
  if (checked.opponent !== null) await opponentInGame({ opponentId: checked.opponent, game });

  const title = permalinkTitle({ characterName: character.name, input: traced.input, editionSlug: edition.slug });
  return insertPermalink({
    teamId,
    createdBy,
    visibility,
    kind: "explorer",
    editionId: edition.id,
    characterId,
    view: checked,
    title,
    edition: edition.slug,
  });
}

/** Writes a permalink and its log entry together, and reads it back. */
async function insertPermalink({
  edition,
  ...values
}: {
  teamId: number;
  createdBy: string;
  visibility: PermalinkVisibility;
  kind: "explorer" | "board" | "stance";
  editionId: number;
  characterId: number;
  view: PermalinkView | BoardLinkView | StanceLinkView;
  title: string;
  /** The Edition's slug, for the log. */
  edition: string;
}): Promise<PermalinkDto> {
  const slug = newSlug();
  await getDb().transaction(async (tx) => {
    await tx.insert(permalinks).values({ ...values, slug });
    await recordAudit(tx, {
      teamId: values.teamId,
      actorId: values.createdBy,
      action: "permalink.created",
      detail: {
        slug,
        title: values.title,
        visibility: values.visibility,
        characterId: values.characterId,
        edition,
        ...("board" in values.view ? { board: values.view.board } : {}),
        ...("stance" in values.view ? { stance: values.view.stance } : {}),
      },
    });
  });
  const created = await findRow(slug);
  if (!created) throw new Error(`permalink ${slug} vanished after its insert`);
  return toDto(created.row, created.view);
}

/** A board link's title: the board's, its character and its Edition. */
export function boardLinkTitle({
  boardTitle,
  characterName,
  editionSlug,
}: {
  boardTitle: string;
  characterName: string;
  editionSlug: string;
}) {
  return `Board: ${boardTitle} · ${characterName} · edition ${editionSlug}`.slice(0, 200);
}

/**
 * Makes a permalink to one of the team's boards, pinned to the board's character and Edition;
 * the link shows the board as it is saved when it is opened. Another team's board answers like
 * one that does not exist. The caller has checked that `createdBy` may share in the team.
 */
export async function createBoardPermalink({
  teamId,
  createdBy,
  view,
  visibility,
}: {
  teamId: number;
  createdBy: string;
  view: BoardLinkView;
  visibility: PermalinkVisibility;
}): Promise<PermalinkDto> {
  const checked = boardLinkViewSchema.parse(view);
  const board = await readBoardForLink({ teamId, boardId: checked.board });
  if (!board) throw new AppError("not_found", `There is no board ${checked.board}.`);
  return insertPermalink({
    teamId,
    createdBy,
    visibility,
    kind: "board",
    editionId: board.editionId,
    characterId: board.characterId,
    view: checked,
    title: boardLinkTitle({
      boardTitle: board.title,
      characterName: board.character.name,
      editionSlug: board.edition.slug,
    }),
    edition: board.edition.slug,
  });
}

/**
 * Makes a permalink to a stance sheet, pinned to its character and a published Edition. The
 * character must be in the public demo game or in a game the team owns, and the stance must
 * exist in that Edition. The caller has checked that `createdBy` may share in the team.
 */
export async function createStancePermalink({
  teamId,
  createdBy,
  characterId,
  editionSlug,
  view,
  visibility,
}: PinnedLinkInput<StanceLinkView>): Promise<PermalinkDto> {
  const checked = stanceLinkViewSchema.parse(view);
  const { character, edition } = await publishedEditionFor({ teamId, characterId, editionSlug });
  const found = await getStanceSheet({ characterId, edition: edition.slug, stanceKey: checked.stance });
  if (!found.ok)
    throw new AppError("bad_request", `There is no stance "${checked.stance}" (${character.name}, ${edition.name}).`);
  return insertPermalink({
    teamId,
    createdBy,
    visibility,
    kind: "stance",
    editionId: edition.id,
    characterId,
    view: checked,
    title: `Stance: ${found.data.stance.name} · ${character.name} · edition ${edition.slug}`.slice(0, 200),
    edition: edition.slug,
  });
}

/** A permalink by its slug, revoked or not; null for a slug that is not one. */
export async function getPermalinkBySlug({ slug }: { slug: string }): Promise<PermalinkDto | null> {
  const found = await findRow(slug);
  return found ? toDto(found.row, found.view) : null;
}

/** A team's permalinks with who made them, newest first; revoked ones stay listed, marked. */
export async function listTeamPermalinks({ teamId }: { teamId: number }): Promise<TeamPermalinkDto[]> {
  const rows = await selectRows()
    .where(eq(permalinks.teamId, teamId))
    .orderBy(desc(permalinks.createdAt), desc(permalinks.id));
  return rows.map((r) => ({
    slug: r.slug,
    path: permalinkPath(r.slug),
    kind: r.kind === "board" || r.kind === "stance" ? r.kind : "explorer",
    title: r.title,
    visibility: r.visibility,
    edition: { slug: r.edition.slug, name: r.edition.name },
    createdBy: { id: r.createdBy, name: r.creatorName },
    createdAt: r.createdAt.toISOString(),
    revoked: r.revokedAt !== null,
    revokedAt: r.revokedAt?.toISOString() ?? null,
  }));
}

/**
 * Revokes a permalink: its creator, or a coach or owner of its team, may.
 * Someone outside the team gets the answer an unknown slug gets. Revoking a
 * revoked link changes nothing and records nothing.
 */
export async function revokePermalink({ slug, actorId }: { slug: string; actorId: string }): Promise<PermalinkDto> {
  const found = await findRow(slug);
  if (!found) throw new AppError("not_found", "There is no such permalink.");
  const { row } = found;
  const role = await getRole({ teamId: row.teamId, userId: actorId });
  if (role === null) throw new AppError("not_found", "There is no such permalink.");
  if (!canRevoke({ role, isCreator: row.createdBy === actorId })) {
    throw new AppError(
      "forbidden",
      "Only the person who made this link, or a coach or owner of the team, can revoke it.",
    );
  }
  if (row.revokedAt !== null) return toDto(row, found.view);

  await getDb().transaction(async (tx) => {
    const result = await tx
      .update(permalinks)
      .set({ revokedAt: new Date(), revokedBy: actorId })
      .where(and(eq(permalinks.slug, slug), isNull(permalinks.revokedAt)));
    // Two revokes at once: the one that changed nothing records nothing.
    if (affectedRows(result) === 0) return;
    await recordAudit(tx, {
      teamId: row.teamId,
      actorId,
      action: "permalink.revoked",
      detail: { slug, title: row.title },
    });
  });
  linkStates.delete(slug);
  const after = await findRow(slug);
  if (!after) throw new Error(`permalink ${slug} vanished while being revoked`);
  return toDto(after.row, after.view);
}

/**
 * What `/s/[slug]` may show to this viewer. Unknown, revoked, and team-only
 * links seen from outside the team (signed in or not) all answer
 * "unavailable", so the answer tells nothing about which it is.
 *
 * The view carries only what it shows: the pinned character in the pinned
 * Edition, and the opponent the view was shared with. A link into a team's
 * private game reveals neither the rest of its cast nor its other Editions.
 */
export async function loadSharedView({
  slug,
  viewerId,
}: {
  slug: string;
  viewerId: string | null;
}): Promise<SharedViewResult> {
  const found = await findRow(slug);
  if (!found || found.row.revokedAt !== null) return { status: "unavailable" };
  const { row } = found;
  if (row.visibility === "team") {
    if (viewerId === null || (await getRole({ teamId: row.teamId, userId: viewerId })) === null)
      return { status: "unavailable" };
  }
  const shared = {
    slug: row.slug,
    title: row.title,
    visibility: row.visibility,
    creatorName: row.creatorName,
    createdAt: row.createdAt.toISOString(),
  };
  if (found.view.kind === "board") {
    // The board as it is saved now; a deleted board's link is gone like a revoked one.
    const board = await readBoardForLink({ teamId: row.teamId, boardId: found.view.view.board });
    if (!board) return { status: "unavailable" };
    const { team: _team, updatedBy: _updatedBy, editionId: _e, characterId: _c, ...shown } = board;
    return { status: "ok", view: { ...shared, kind: "board", board: shown } };
  }
  if (found.view.kind === "stance") {
    const sheet = await getStanceSheet({
      characterId: row.characterId,
      edition: row.edition.slug,
      stanceKey: found.view.view.stance,
    });
    if (!sheet.ok) return { status: "unavailable" };
    return { status: "ok", view: { ...shared, kind: "stance", sheet: sheet.data } };
  }
  const { view } = found.view;
  const explorer = await getExplorerData({ characterId: row.characterId, edition: row.edition.slug });
  if (!explorer.ok) return { status: "unavailable" };
  const opponentId = view.opponent !== null && view.opponent !== row.characterId ? view.opponent : null;
  const opponent =
    opponentId === null ? null : await getExplorerData({ characterId: opponentId, edition: row.edition.slug });
  const shown = new Set([row.characterId, ...(opponent?.ok ? [opponentId] : [])]);
  const pinned = (data: GraphResponse): GraphResponse => ({
    ...data,
    editions: [data.edition],
    cast: data.cast.filter((c) => shown.has(c.id)),
  });
  const data = pinned(explorer.data);
  return {
    status: "ok",
    view: {
      ...shared,
      kind: "explorer",
      game: { slug: data.game.slug, name: data.game.name, fastest: data.game.fastest },
      character: data.character,
      characterId: row.characterId,
      edition: { slug: data.edition.slug, name: data.edition.name },
      data,
      opponent: opponent?.ok ? pinned(opponent.data) : null,
      view,
    },
  };
}

function affectedRows(result: unknown): number {
  const header = Array.isArray(result)
    ? (result[0] as { affectedRows?: number })
    : (result as { affectedRows?: number });
  return header?.affectedRows ?? 0;
}

/** How long a link's state is reused before it is read again, per process. */
export const LINK_STATE_SECONDS = 1;

/**
 * Recent answers of `isCacheableLink`, with the reads in flight: fifty readers
 * opening one link make one read a second, not fifty. Bounded by count, so
 * made-up slugs only push out older answers.
 */
const linkStates = new LRUCache<string, Promise<boolean>>({ max: 10_000, ttl: LINK_STATE_SECONDS * 1000 });

/**
 * Whether a link's page is the same for everyone and never changes, so it may
 * be served from the cache: anyone may open it, it is not revoked, and it is
 * not a board's (a board's link shows the board as saved now). Its Edition is
 * published, as every link's is. Read again at most LINK_STATE_SECONDS after
 * the last read: revoking a link forgets the answer in the process that
 * revoked it, and any other app server stops serving it within that time.
 */
export function isCacheableLink(slug: string): Promise<boolean> {
  if (!SLUG_PATTERN.test(slug)) return Promise.resolve(false);
  let state = linkStates.get(slug);
  if (!state) {
    state = readLinkState(slug);
    linkStates.set(slug, state);
    state.catch(() => linkStates.delete(slug));
  }
  return state;
}

async function readLinkState(slug: string): Promise<boolean> {
  const [row] = await getDb()
    .select({ visibility: permalinks.visibility, revokedAt: permalinks.revokedAt, kind: permalinks.kind })
    .from(permalinks)
    .where(eq(permalinks.slug, slug))
    .limit(1);
  return row !== undefined && row.visibility === "link" && row.revokedAt === null && row.kind !== "board";
}
