import { expect, test, vi } from "vitest";
import { eq } from "drizzle-orm";
import { getDb } from "@/server/db";
import * as audit from "@/server/db/queries/audit";
import { auditLog, permalinks } from "@/server/db/schema";
import { createPermalink } from "@/server/db/queries/permalinks";
import { playerInTeam, stringView } from "./fixtures";

// The audit writer fails once, after the permalink's insert: the insert must not stay behind.
vi.mock(import("@/server/db/queries/audit"), async (original) => {
  const real = await original();
  return { ...real, recordAudit: vi.fn(real.recordAudit) };
});

const ctx = playerInTeam("Player Eve");

test("a permalink whose audit entry cannot be written is not written either", async () => {
  vi.mocked(audit.recordAudit).mockRejectedValueOnce(new Error("audit log unavailable"));
  const { team } = ctx;
  const args = {
    teamId: team,
    createdBy: ctx.player,
    characterId: ctx.characterId,
    editionSlug: "1-1",
    view: stringView(),
    visibility: "team" as const,
  };
  await expect(createPermalink(args)).rejects.toThrow("audit log unavailable");
  expect(await getDb().select().from(permalinks).where(eq(permalinks.teamId, team))).toEqual([]);

  // The same request succeeds once the log can be written, and both rows are there.
  const made = await createPermalink(args);
  expect((await getDb().select().from(permalinks).where(eq(permalinks.teamId, team))).map((r) => r.slug)).toEqual([
    made.slug,
  ]);
  expect(await getDb().select().from(auditLog).where(eq(auditLog.teamId, team))).toHaveLength(1);
});
