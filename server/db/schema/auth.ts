import { char, customType, datetime, index, int, json, longtext, mysqlEnum, mysqlTable, uniqueIndex, varchar } from 'drizzle-orm/mysql-core';
import { roles } from '../../../shared/api/auth';

/**
 * Ids: varchar(26) random base32 made by `newId()` (server/db/ids.ts), never autoincrement.
 * Times: datetime(3) in UTC (the mysql2 pool runs with timezone 'Z').
 * Every table after `shops` carries `shopId`, except the account-level ones (`users`,
 * `password_reset_tokens`: a person's login is not a shop's record) and `rate_limits`.
 */
const id = (name = 'id') => varchar(name, { length: 26 });
const at = (name: string) => datetime(name, { mode: 'date', fsp: 3 });
export const now = () => new Date();

/** Binary data (MariaDB LONGBLOB) as a Buffer. */
export const longblob = customType<{ data: Buffer; driverData: Buffer }>({
  dataType: () => 'longblob',
});

export const shops = mysqlTable('shops', {
  id: id().primaryKey(),
  name: varchar('name', { length: 120 }).notNull(),
  createdAt: at('created_at').notNull().$defaultFn(now),
});

export const users = mysqlTable(
  'users',
  {
    id: id().primaryKey(),
    /** Stored trimmed and lower-cased. */
    email: varchar('email', { length: 254 }).notNull(),
    name: varchar('name', { length: 100 }).notNull(),
    /** argon2id, PHC string from @node-rs/argon2. */
    passwordHash: varchar('password_hash', { length: 255 }).notNull(),
    createdAt: at('created_at').notNull().$defaultFn(now),
  },
  (t) => [uniqueIndex('users_email_unique').on(t.email)],
);

export const memberships = mysqlTable(
  'memberships',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    userId: id('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
    role: mysqlEnum('role', roles).notNull(),
    createdAt: at('created_at').notNull().$defaultFn(now),
  },
  (t) => [uniqueIndex('memberships_user_shop_unique').on(t.userId, t.shopId), index('memberships_shop_idx').on(t.shopId)],
);

/** lucia 3 sessions (DrizzleMySQLAdapter: id, userId, expiresAt) plus the shop signed in to. */
export const sessions = mysqlTable(
  'sessions',
  {
    id: varchar('id', { length: 255 }).primaryKey(),
    userId: id('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
    shopId: id('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    expiresAt: datetime('expires_at', { mode: 'date' }).notNull(),
  },
  (t) => [index('sessions_user_idx').on(t.userId)],
);

export const invitations = mysqlTable(
  'invitations',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    email: varchar('email', { length: 254 }).notNull(),
    role: mysqlEnum('role', roles).notNull(),
    /** sha256 hex of the token in the link; the token itself is never stored. */
    tokenHash: varchar('token_hash', { length: 64 }).notNull(),
    invitedBy: id('invited_by').notNull().references(() => users.id, { onDelete: 'cascade' }),
    createdAt: at('created_at').notNull().$defaultFn(now),
    expiresAt: at('expires_at').notNull(),
    acceptedAt: at('accepted_at'),
  },
  (t) => [uniqueIndex('invitations_token_unique').on(t.tokenHash), index('invitations_shop_idx').on(t.shopId)],
);

export const passwordResetTokens = mysqlTable(
  'password_reset_tokens',
  {
    id: id().primaryKey(),
    userId: id('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
    tokenHash: varchar('token_hash', { length: 64 }).notNull(),
    createdAt: at('created_at').notNull().$defaultFn(now),
    expiresAt: at('expires_at').notNull(),
    usedAt: at('used_at'),
  },
  (t) => [uniqueIndex('password_reset_tokens_token_unique').on(t.tokenHash), index('password_reset_tokens_user_idx').on(t.userId)],
);

export interface OutboxAttachmentMeta {
  index: number;
  filename: string;
  contentType: string;
  size: number;
}

/** Every message the local fake SMTP server received (only while it is in use). */
export const outboxMessages = mysqlTable(
  'outbox_messages',
  {
    id: id().primaryKey(),
    /** From the X-Wirewalk-Shop header when the sender named a shop; null ones are listed to no one. */
    shopId: id('shop_id').references(() => shops.id, { onDelete: 'cascade' }),
    messageId: varchar('message_id', { length: 255 }),
    to: varchar('to_addr', { length: 1000 }).notNull(),
    from: varchar('from_addr', { length: 500 }).notNull(),
    subject: varchar('subject', { length: 1000 }).notNull(),
    date: at('date').notNull(),
    text: longtext('text').notNull(),
    html: longtext('html'),
    attachments: json('attachments').$type<OutboxAttachmentMeta[]>().notNull(),
    /** The message as received (RFC 5322), for attachment downloads. */
    raw: longblob('raw').notNull(),
    receivedAt: at('received_at').notNull().$defaultFn(now),
  },
  (t) => [index('outbox_shop_received_idx').on(t.shopId, t.receivedAt)],
);

/**
 * Counters of express-rate-limit, shared by every app instance on the database
 * (server/auth/rate-limit-store.ts). The key is the sha256 of limiter prefix + client key.
 */
export const rateLimits = mysqlTable(
  'rate_limits',
  {
    key: char('key_hash', { length: 64 }).primaryKey(),
    hits: int('hits').notNull(),
    resetAt: datetime('reset_at', { mode: 'date', fsp: 3 }).notNull(),
  },
  (t) => [index('rate_limits_reset_idx').on(t.resetAt)],
);
