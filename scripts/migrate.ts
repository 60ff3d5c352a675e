// Applies the committed migrations in drizzle/ to DATABASE_URL.
import { loadEnvConfig } from "@next/env";
import { migrateDatabase } from "../src/server/db/migrate";

loadEnvConfig(process.cwd());

const url = process.env.DATABASE_URL;
if (!url) {
  console.error("DATABASE_URL is not set (copy .env.example to .env, or run `npm start`).");
  process.exit(1);
}
migrateDatabase(url)
  .then(() => console.log("[db] migrations applied"))
  .catch((error: unknown) => {
    console.error("[db] migration failed:", error instanceof Error ? error.message : error);
    process.exit(1);
  });
