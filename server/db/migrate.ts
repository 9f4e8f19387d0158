import { fileURLToPath } from 'node:url';
import { drizzle } from 'drizzle-orm/mysql2';
import { migrate } from 'drizzle-orm/mysql2/migrator';
import type { RowDataPacket } from 'mysql2';
import type { Db, Pool } from './client';
import * as schema from './schema';

export const migrationsFolder = fileURLToPath(new URL('../../drizzle', import.meta.url));

/**
 * Applies every migration in drizzle/ that the database has not seen (drizzle's journal),
 * on one connection. Into an empty database (a fresh install, each test file) it runs with
 * foreign_key_checks off: every table is empty then, and MariaDB adds a foreign key in place
 * instead of copying the table once per key. A database with tables keeps the checks on.
 */
export async function runMigrations(db: Db): Promise<void> {
  // createDb's Drizzle instance carries its mysql2 pool as $client.
  const pool = (db as unknown as { $client: Pool }).$client;
  const conn = await pool.getConnection();
  try {
    const [rows] = await conn.query<RowDataPacket[]>('SELECT COUNT(*) AS n FROM information_schema.tables WHERE table_schema = DATABASE()');
    const fresh = Number(rows[0]?.n ?? 0) === 0;
    if (fresh) await conn.query('SET SESSION foreign_key_checks = 0');
    try {
      await migrate(drizzle(conn, { schema, mode: 'default' }), { migrationsFolder });
    } finally {
      if (fresh) await conn.query('SET SESSION foreign_key_checks = 1');
    }
  } finally {
    conn.release();
  }
}
