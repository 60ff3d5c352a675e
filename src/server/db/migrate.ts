import path from "node:path";
import { migrate } from "drizzle-orm/mysql2/migrator";
import { openDb } from "./index";

export const MIGRATIONS_FOLDER = path.join(process.cwd(), "drizzle");

/** Applies every migration in drizzle/ that the database has not seen yet. */
export async function migrateDatabase(url: string): Promise<void> {
  const { db, close } = openDb(url);
  try {
    await migrate(db, { migrationsFolder: MIGRATIONS_FOLDER });
  } finally {
    await close();
  }
}
