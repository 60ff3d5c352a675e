import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { afterAll, describe, expect, test } from "vitest";
import { closeDb, getDb } from "@/server/db";
import { acceptInvite, createInvite } from "@/server/db/queries/invites";
import { createTeam, listMembers } from "@/server/db/queries/teams";
import { users } from "@/server/db/schema";
import { makeUser } from "./fixtures";

// An invite goes to an address; only someone who has proven they own that address may take the
// place it offers (issue: account takeover before the owner arrives). Against the test MariaDB.
afterAll(closeDb);

describe("accepting an invite", () => {
  test("needs a proven address: refused with what to do, then accepted once the address is confirmed", async () => {
    const owner = await makeUser("owner");
    const team = await createTeam({ name: "Proof Crew", ownerId: owner.id });
    const email = `invitee-${randomUUID().slice(0, 8)}@example.test`;
    const { token } = await createInvite({
      teamId: team.id,
      invitedBy: owner.id,
      inviterRole: "owner",
      email,
      role: "player",
    });
    // A password account made with the invited address, never confirmed.
    const id = randomUUID();
    await getDb().insert(users).values({ id, email, name: "Claims To Be Invited", passwordHash: "$argon2id$x" });

    await expect(acceptInvite({ token, userId: id, userEmail: email })).rejects.toMatchObject({
      code: "forbidden",
      message: expect.stringContaining("Confirm your e-mail address") as unknown,
    });
    expect((await listMembers({ teamId: team.id })).map((m) => m.userId)).toEqual([owner.id]);

    const db = getDb();
    await db.update(users).set({ emailVerified: new Date() }).where(eq(users.id, id));
    await expect(acceptInvite({ token, userId: id, userEmail: email })).resolves.toMatchObject({ role: "player" });
  });
});
