import mysql from "mysql2/promise";

/** Reads the test database directly, so browser tests compare the page with what MariaDB holds. */
export async function query<T>(sql: string, params: unknown[] = []): Promise<T[]> {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set: run the browser tests through `npm test`");
  const conn = await mysql.createConnection(url);
  try {
    const [rows] = await conn.query(sql, params);
    return rows as T[];
  } finally {
    await conn.end();
  }
}
