import { randomUUID } from "node:crypto";
import { getDb } from "@/server/db";
import { users } from "@/server/db/schema";

/** A user of our own for one test, with an address no other test uses, proven (as after a sign-in link). */
export async function makeUser(label = "member"): Promise<{ id: string; email: string; name: string }> {
  const id = randomUUID();
  const email = `${label}-${id.slice(0, 8)}@example.test`;
  const name = `${label[0]!.toUpperCase()}${label.slice(1)} ${id.slice(0, 4)}`;
  await getDb().insert(users).values({ id, email, name, emailVerified: new Date() });
  return { id, email, name };
}
