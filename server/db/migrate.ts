import { fileURLToPath } from 'node:url';
import { migrate } from 'drizzle-orm/mysql2/migrator';
import type { Db } from './client';

export const migrationsFolder = fileURLToPath(new URL('../../drizzle', import.meta.url));

/** Applies every migration in drizzle/ that the database has not seen (drizzle's journal). */
export async function runMigrations(db: Db): Promise<void> {
  await migrate(db, { migrationsFolder });
}
