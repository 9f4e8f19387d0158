import { drizzle, type MySql2Database } from 'drizzle-orm/mysql2';
import mysql from 'mysql2/promise';
import * as schema from './schema';

export type Schema = typeof schema;
export type Db = MySql2Database<Schema>;
export type Pool = mysql.Pool;

/** A mysql2 pool (UTC, 10 connections) and Drizzle over it with the whole schema. */
export function createDb(url: string, options: { connectionLimit?: number } = {}): { db: Db; pool: Pool } {
  const pool = mysql.createPool({
    uri: url,
    connectionLimit: options.connectionLimit ?? 10,
    timezone: 'Z',
    dateStrings: false,
    supportBigNumbers: true,
    bigNumberStrings: true,
  });
  const db = drizzle(pool, { schema, mode: 'default' });
  return { db, pool };
}
