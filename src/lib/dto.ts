/**
 * The shapes the server hands to the client: what the query functions in
 * `src/server/db/queries/` return, route handlers answer with, and client
 * components render. Plain types only, so both sides may import them.
 */
import type { FieldChange, Level, Outcome, RangeScale, StanceSheet } from "@/lib/engine";
import type { GraphResponse } from "@/lib/explorer";
import type { BoardDocument, BoardOrigin } from "@/lib/board";
import type { BoardLinkView, PermalinkKind, PermalinkView, PermalinkVisibility, StanceLinkView } from "@/lib/permalink";
import type { WayInPath } from "@/lib/stance-sheet";
import type { Role } from "@/lib/roles";

// Teams

export interface TeamDto {
  id: number;
  slug: string;
  name: string;
}

export interface MyTeamDto extends TeamDto {
  role: Role;
}

export interface MemberDto {
  userId: string;
  name: string | null;
  email: string;
  role: Role;
  joinedAt: string;
}

export interface InviteDto {
  id: number;
  email: string;
  role: Role;
  invitedBy: string | null;
  expiresAt: string;
  createdAt: string;
}

export interface AuditEntryDto {
  id: number;
  action: string;
  actorName: string | null;
  actorEmail: string | null;
  detail: Record<string, unknown>;
  createdAt: string;
}

// Permalinks

/** What every permalink carries, whatever it shows. */
interface PermalinkBase {
  slug: string;
  /** Where it opens: `/s/<slug>`. */
  path: string;
  teamId: number;
  title: string;
  visibility: PermalinkVisibility;
  /** The character and Edition it is pinned to (a board's link: the board's). */
  characterId: number;
  edition: { id: number; slug: string; name: string };
  createdBy: { id: string; name: string | null };
  createdAt: string;
  revokedAt: string | null;
}

/** A permalink as its team sees it: an Explorer view, or a Mix-up board. */
export type PermalinkDto =
  | (PermalinkBase & { kind: "explorer"; view: PermalinkView })
  | (PermalinkBase & { kind: "board"; view: BoardLinkView })
  | (PermalinkBase & { kind: "stance"; view: StanceLinkView });

/** One row of a team's list of permalinks. */
export interface TeamPermalinkDto {
  slug: string;
  path: string;
  kind: PermalinkKind;
  title: string;
  visibility: PermalinkVisibility;
  edition: { slug: string; name: string };
  createdBy: { id: string; name: string | null };
  createdAt: string;
  revoked: boolean;
  revokedAt: string | null;
}

/** What every shared view carries: who shared it, when, and with whom. */
interface SharedBase {
  slug: string;
  title: string;
  visibility: PermalinkVisibility;
  /** The creator's display name; null when they never gave one (their e-mail is not shown). */
  creatorName: string | null;
  createdAt: string;
}

/** What `/s/[slug]` renders for an Explorer view: the pinned Edition's data and the view, never the team's other data. */
export interface SharedExplorerViewDto extends SharedBase {
  kind: "explorer";
  game: { slug: string; name: string; fastest: number };
  character: { id: number; slug: string; name: string };
  characterId: number;
  edition: { slug: string; name: string };
  /**
   * The Explorer's data for the pinned Edition, as GET /api/characters/[id]/graph answers it,
   * cut to what the view shows: its Edition alone, and in the cast only the character and the opponent.
   */
  data: GraphResponse;
  /** The opponent's data in the same Edition and cut the same way, when the view was shared with one. */
  opponent: GraphResponse | null;
  view: PermalinkView;
}

/**
 * What `/s/[slug]` renders for a board's link: the board's current saved document, read-only.
 * It names neither the team nor who saved it last (a link may be open to anyone).
 */
export interface SharedBoardViewDto extends SharedBase {
  kind: "board";
  board: SharedBoardDto;
}

/** What `/s/[slug]` renders for a stance sheet's link: the sheet in the pinned Edition. */
export interface SharedStanceViewDto extends SharedBase {
  kind: "stance";
  sheet: StanceSheetDto;
}

export type SharedViewDto = SharedExplorerViewDto | SharedBoardViewDto | SharedStanceViewDto;

// Stance sheets

/** One stance of a character in one Edition, as its sheet shows it (DESIGN.md, "Stance sheet"). */
export interface StanceSheetDto {
  game: { slug: string; name: string; fastest: number; launchAt: number; range: RangeScale };
  character: { id: number; slug: string; name: string };
  edition: { slug: string; name: string; status: "draft" | "published" };
  stance: { key: string; name: string };
  sheet: StanceSheet;
  /** By cancel edge id: the Explorer's root and path that end in that way in. */
  paths: Record<string, WayInPath>;
  /** By stance move's node id: its range as the data gives it (read with `game.range`). */
  ranges: Record<string, string | null>;
}

// Mix-up boards

/** One of a team's boards, as its list shows it. */
export interface BoardSummaryDto {
  id: number;
  title: string;
  /** The version a save is based on: a save of an older one is refused (409, with the board as it is now). */
  version: number;
  game: { slug: string; name: string };
  character: { id: number; slug: string; name: string };
  edition: { slug: string; name: string; status: "draft" | "published" };
  opponent: { id: number; slug: string; name: string } | null;
  updatedAt: string;
  updatedBy: { id: string; name: string | null } | null;
}

/** A board as its editor opens it. */
export interface BoardDto extends BoardSummaryDto {
  team: { slug: string; name: string };
  /** Where in the Explorer it was made: a move key and a path key (null: the root alone). */
  origin: BoardOrigin | null;
  document: BoardDocument;
}

/** A board as a permalink shows it: without its team or who saved it last. */
export type SharedBoardDto = Omit<BoardDto, "team" | "updatedBy">;

// The move list

export interface StanceEntry {
  id: number;
  key: string;
  name: string;
  abbreviation: string;
  notes: string | null;
}

export interface MoveEntry {
  id: number;
  /** The row's version: a save based on it is refused once someone else has saved. */
  version: number;
  key: string;
  input: string;
  name: string;
  level: Level;
  damage: number;
  startup: number | null;
  onBlock: Outcome;
  onHit: Outcome;
  onCounterHit: Outcome;
  range: string | null;
  tags: string[];
  notes: string | null;
  /** The stance the move (or the string it belongs to) is done from. */
  stance: StanceEntry | null;
  /** How the move is reached: a follow-up of another hit, entered from a stance, or neither (a root). */
  via:
    | {
        kind: "follow";
        fromId: number;
        input: string;
        gapOnBlock: number;
        comboOnHit: boolean;
        comboOnCounterHit: boolean;
      }
    | { kind: "enter"; input: string }
    | null;
  /** 0 for the first hit of a string, 1 for the next, and so on. */
  depth: number;
}

export interface CancelEntry {
  id: number;
  key: string;
  fromId: number;
  input: string;
  stance: StanceEntry;
  onBlock: Outcome;
  onHit: Outcome;
  onCounterHit: Outcome;
  autoGuard: Level[];
}

export interface MoveList {
  stances: StanceEntry[];
  moves: MoveEntry[];
  cancels: CancelEntry[];
}

// Character files

/** What an import adds, changes (field by field, as `diffGraphs` reports nodes and edges) and removes, by key. */
export interface ImportSection {
  added: string[];
  changed: { key: string; changes: FieldChange[] }[];
  removed: string[];
}

export interface ImportPreview {
  character: string;
  stances: ImportSection;
  moves: ImportSection;
  edges: ImportSection;
  /** Unchanged moves whose place number in the list is written anew (a move added or moved above them shifts them). */
  reordered: number;
  /** Fields of the character the file gives differently; they belong to the game and stay as they are. */
  kept: FieldChange[];
}

export type ImportCounts = Record<"stances" | "moves" | "edges", { added: number; changed: number; removed: number }>;

/** The import route's answer to a file it could read: what it would write (`?preview=1`) or wrote. */
export interface ImportAnswer {
  preview: ImportPreview;
  problems: [];
  applied: boolean;
  counts: ImportCounts;
}
