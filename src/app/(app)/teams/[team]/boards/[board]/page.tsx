import type { Metadata } from "next";
import { notFound, redirect } from "next/navigation";
import { BoardEditor } from "@/components/boards/board-editor";
import { Breadcrumb } from "@/components/ui/breadcrumb";
import { AppError } from "@/lib/errors";
import { auth } from "@/server/auth";
import { atLeast } from "@/server/authz";
import { getBoard } from "@/server/db/queries/boards";
import { loadTeamFor } from "@/server/teams";

type Props = PageProps<"/teams/[team]/boards/[board]">;

export const metadata: Metadata = { title: "Mix-up board" };

/** One Mix-up board: every member reads it, coaches and owners edit it. */
export default async function BoardPage({ params }: Props) {
  const { team: slug, board: boardParam } = await params;
  const user = await auth();
  if (!user) redirect(`/sign-in?callbackUrl=${encodeURIComponent(`/teams/${slug}/boards/${boardParam}`)}`);
  const boardId = /^[1-9][0-9]{0,9}$/.test(boardParam) ? Number(boardParam) : null;
  if (boardId === null) notFound();
  const notFoundAsNull = (e: unknown) => {
    if (e instanceof AppError && e.code === "not_found") return null;
    throw e;
  };
  const loaded = await loadTeamFor({ slug, user, needed: "viewer" }).catch(notFoundAsNull);
  if (!loaded) notFound();
  const board = await getBoard({ teamId: loaded.team.id, boardId }).catch(notFoundAsNull);
  if (!board) notFound();
  return (
    <div className="space-y-4">
      <Breadcrumb
        trail={[
          { href: "/teams", label: "Teams" },
          { href: `/teams/${loaded.team.slug}`, label: loaded.team.name },
        ]}
      />
      <BoardEditor
        board={board}
        team={{ id: loaded.team.id, slug: loaded.team.slug }}
        canEdit={atLeast(loaded.role, "coach")}
      />
    </div>
  );
}
