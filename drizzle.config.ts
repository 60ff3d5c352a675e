import { loadEnvConfig } from "@next/env";
import { defineConfig } from "drizzle-kit";

loadEnvConfig(process.cwd());

// `generate` needs no database; `migrate` goes through scripts/migrate.ts.
export default defineConfig({
  dialect: "mysql",
  schema: "./src/server/db/schema.ts",
  out: "./drizzle",
  dbCredentials: { url: process.env.DATABASE_URL ?? "mysql://unused@127.0.0.1/unused" },
  strict: true,
  verbose: true,
});
