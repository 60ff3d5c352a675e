// Writes the invented demo scenario to DATABASE_URL (idempotent).
import { loadEnvConfig } from "@next/env";

loadEnvConfig(process.cwd());

async function main() {
  const { closeDb, getDb } = await import("../src/server/db");
  const { seedDemo } = await import("../src/server/db/seed");
  try {
    const report = await seedDemo(getDb());
    console.log(
      report.published === 0
        ? `[db] demo already seeded: ${report.editions} published editions, left as they are`
        : `[db] demo seeded: ${report.published} editions published, ${report.characters} characters, ${report.stances} stances, ${report.moves} moves, ${report.edges} edges`,
    );
  } finally {
    await closeDb();
  }
}

main().catch((error: unknown) => {
  console.error("[db] seeding failed:", error instanceof Error ? error.message : error);
  process.exit(1);
});
