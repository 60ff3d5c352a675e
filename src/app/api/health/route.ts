import { checkDatabase } from "@/server/db/queries/health";

export const dynamic = "force-dynamic";

/** Liveness and readiness in one: the app answers and MariaDB answers it. */
export async function GET() {
  const db = await checkDatabase();
  const body = { status: db.ok ? "ok" : "unavailable", database: db };
  return Response.json(body, { status: db.ok ? 200 : 503, headers: { "cache-control": "no-store" } });
}
