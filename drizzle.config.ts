import { defineConfig } from 'drizzle-kit';

// Migrations are generated from server/db/schema.ts and committed in drizzle/.
export default defineConfig({
  dialect: 'mysql',
  schema: './server/db/schema.ts',
  out: './drizzle',
  dbCredentials: { url: process.env.DATABASE_URL ?? 'mysql://root@127.0.0.1:3307/wirewalk' },
});
