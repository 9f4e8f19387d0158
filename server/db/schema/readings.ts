import { boolean, index, int, mysqlTable, primaryKey, double, varchar } from 'drizzle-orm/mysql-core';
import { shops, users } from './auth';
import { harnesses, jsonText, revisions } from './harness';
import { repairOrders, units } from './orders';
import { at, id, now } from '../columns';

/**
 * What techs measured: reading sets (the meter's values against one harness revision, kept
 * with a repair order or a unit when there is one), the lead's own tolerance bands per pin,
 * and each person's recent and pinned connectors.
 */

export const readingSets = mysqlTable(
  'reading_sets',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    revisionId: id('revision_id').notNull().references(() => revisions.id, { onDelete: 'restrict' }),
    harnessId: id('harness_id').notNull().references(() => harnesses.id, { onDelete: 'cascade' }),
    repairOrderId: id('repair_order_id').references(() => repairOrders.id, { onDelete: 'set null' }),
    unitId: id('unit_id').references(() => units.id, { onDelete: 'set null' }),
    title: varchar('title', { length: 200 }),
    /** The readings as entered (Observation[] of shared/readings). */
    observations: jsonText<unknown[]>('observations').notNull(),
    /** The marks and suspects computed when the set was last saved, kept as they were then. */
    marked: jsonText<unknown[]>('marked').notNull(),
    suspects: jsonText<unknown>('suspects').notNull(),
    version: int('version').notNull().default(1),
    takenBy: id('taken_by').references(() => users.id, { onDelete: 'set null' }),
    takenAt: at('taken_at').notNull().$defaultFn(now),
    updatedAt: at('updated_at').notNull().$defaultFn(now),
  },
  (t) => [
    index('reading_sets_shop_order_idx').on(t.shopId, t.repairOrderId),
    index('reading_sets_shop_revision_idx').on(t.shopId, t.revisionId),
    index('reading_sets_shop_taken_by_idx').on(t.shopId, t.takenBy),
  ],
);

/** A lead's band for one pin of a harness (kept across revisions; the pin ref is the key). */
export const pinTolerances = mysqlTable(
  'pin_tolerances',
  {
    shopId: id('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    harnessId: id('harness_id').notNull().references(() => harnesses.id, { onDelete: 'cascade' }),
    pin: varchar('pin', { length: 49 }).notNull(),
    below: double('below').notNull(),
    above: double('above').notNull(),
    setBy: id('set_by').references(() => users.id, { onDelete: 'set null' }),
    setAt: at('set_at').notNull().$defaultFn(now),
  },
  (t) => [primaryKey({ columns: [t.harnessId, t.pin] }), index('pin_tolerances_shop_idx').on(t.shopId)],
);

export const connectorBookmarks = mysqlTable(
  'connector_bookmarks',
  {
    userId: id('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
    shopId: id('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    harnessId: id('harness_id').notNull().references(() => harnesses.id, { onDelete: 'cascade' }),
    connectorId: varchar('connector_id', { length: 32 }).notNull(),
    pinned: boolean('pinned').notNull().default(false),
    openedAt: at('opened_at'),
  },
  (t) => [primaryKey({ columns: [t.userId, t.harnessId, t.connectorId] }), index('connector_bookmarks_user_opened_idx').on(t.userId, t.openedAt)],
);
