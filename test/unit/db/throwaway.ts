import { randomBytes } from "node:crypto";
import mysql from "mysql2/promise";

export function testDatabaseUrl(): URL {
  const raw = process.env.DATABASE_URL;
  if (!raw) throw new Error("DATABASE_URL is not set: run the database tests through `npm test`");
  return new URL(raw);
}

/**
 * An empty database beside the test one (`<name>_<random>`), for tests that
 * must start from nothing. The test user may create databases with that prefix.
 */
export async function createThrowawayDatabase(): Promise<{ url: string; name: string; drop: () => Promise<void> }> {
  const base = testDatabaseUrl();
  const name = `${base.pathname.slice(1)}_${randomBytes(4).toString("hex")}`;
  const admin = new URL(base);
  admin.pathname = "/";
  const conn = await mysql.createConnection(admin.toString());
  await conn.query(`create database \`${name}\` character set utf8mb4 collate utf8mb4_unicode_ci`);
  await conn.end();
  const url = new URL(base);
  url.pathname = `/${name}`;
  return {
    url: url.toString(),
    name,
    drop: async () => {
      const c = await mysql.createConnection(admin.toString());
      await c.query(`drop database if exists \`${name}\``);
      await c.end();
    },
  };
}
