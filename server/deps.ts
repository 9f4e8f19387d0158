import type { Config } from './config';
import type { Db, Pool } from './db/client';
import type { Mailer } from './mail/mailer';
import type { Storage } from './storage';

/** Everything a router needs; made by server/index.ts (or tests/support/server-context.ts). */
export interface AppDeps {
  /** Drizzle over mysql2 with the whole schema (server/db/schema.ts). */
  db: Db;
  pool: Pool;
  config: Config;
  mailer: Mailer;
  storage: Storage;
  /** true while the local fake SMTP server receives the mail (the Outbox page exists). */
  outbox: boolean;
  /** Demo mode: the demo accounts exist and sign-in hints may show them. */
  demo: boolean;
}
