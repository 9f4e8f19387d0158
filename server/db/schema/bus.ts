import { bigint, double, index, int, mysqlTable, varchar } from 'drizzle-orm/mysql-core';
import { shops, users } from './auth';
import { harnesses, jsonText, revisions } from './harness';
import { at, id } from '../columns';

/**
 * Uploaded candump captures of a harness's bus: the file kept in storage (`storage_key`),
 * the summary computed while it streamed in (identifiers, counts, rates, per-byte values;
 * shared/can/candump.ts CaptureSummary), and the line counts for lists.
 */

export const captures = mysqlTable(
  'bus_captures',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    harnessId: id('harness_id').notNull().references(() => harnesses.id, { onDelete: 'cascade' }),
    /** The revision open when it was uploaded (kept for reference; a capture belongs to the harness). */
    revisionId: id('revision_id').references(() => revisions.id, { onDelete: 'set null' }),
    name: varchar('name', { length: 200 }).notNull(),
    fileName: varchar('file_name', { length: 255 }).notNull(),
    sizeBytes: bigint('size_bytes', { mode: 'number' }).notNull(),
    lines: int('lines').notNull(),
    frames: int('frames').notNull(),
    badLineCount: int('bad_line_count').notNull(),
    identifierCount: int('identifier_count').notNull(),
    durationS: double('duration_s'),
    summary: jsonText<unknown>('summary').notNull(),
    storageKey: varchar('storage_key', { length: 200 }).notNull(),
    uploadedBy: id('uploaded_by').references(() => users.id, { onDelete: 'set null' }),
    uploadedAt: at('uploaded_at').notNull(),
  },
  (t) => [index('bus_captures_shop_harness_idx').on(t.shopId, t.harnessId, t.uploadedAt)],
);
