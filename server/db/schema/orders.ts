import { boolean, date, double, index, int, mysqlEnum, mysqlTable, primaryKey, text, uniqueIndex, varchar } from 'drizzle-orm/mysql-core';
import { orderStatuses, timeKinds, unitKinds, type Contact, type Highlight, type Marker, type Viewport } from '../../../shared/api/orders';
import { shops, users } from './auth';
import { equipmentModels, revisions } from './harness';
import { at, id, jsonText as json, now } from '../columns';

/**
 * Customers, their units, repair orders and what hangs on an order: time entries, procedures
 * (templates and the ticked copies), marked-up drawings, photos and files, report sends and
 * customer links. Every table carries `shop_id`; every query filters by it.
 */


/** One row per shop: the order counter, the stalled-order limits and the customer-link key. */
export const orderSettings = mysqlTable('order_settings', {
  shopId: id('shop_id').primaryKey().references(() => shops.id, { onDelete: 'cascade' }),
  /** The last repair-order number handed out (numbers are per shop, 1, 2, 3 …). */
  lastOrderNumber: int('last_order_number').notNull().default(0),
  stalledDiagnosisHours: double('stalled_diagnosis_hours').notNull().default(4),
  stalledDays: int('stalled_days'),
  linkDays: int('link_days').notNull().default(14),
  /** HMAC-SHA256 key (hex) that signs the shop's customer links; replacing it voids them all. */
  linkKey: varchar('link_key', { length: 64 }).notNull(),
  updatedAt: at('updated_at').notNull().$defaultFn(now),
});

export const customers = mysqlTable(
  'customers',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    name: varchar('name', { length: 120 }).notNull(),
    company: varchar('company', { length: 120 }),
    email: varchar('email', { length: 254 }),
    phone: varchar('phone', { length: 40 }),
    contacts: json<Contact[]>('contacts').notNull(),
    notes: text('notes'),
    version: int('version').notNull().default(1),
    createdAt: at('created_at').notNull().$defaultFn(now),
    updatedAt: at('updated_at').notNull().$defaultFn(now),
  },
  (t) => [index('customers_shop_name_idx').on(t.shopId, t.name), index('customers_shop_company_idx').on(t.shopId, t.company)],
);

export const units = mysqlTable(
  'units',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    customerId: id('customer_id').notNull().references(() => customers.id, { onDelete: 'restrict' }),
    kind: mysqlEnum('kind', unitKinds).notNull(),
    modelId: id('model_id').references(() => equipmentModels.id, { onDelete: 'set null' }),
    description: varchar('description', { length: 200 }),
    serialNumber: varchar('serial_number', { length: 60 }).notNull(),
    hourMeter: double('hour_meter'),
    notes: text('notes'),
    version: int('version').notNull().default(1),
    createdAt: at('created_at').notNull().$defaultFn(now),
    updatedAt: at('updated_at').notNull().$defaultFn(now),
  },
  (t) => [index('units_shop_customer_idx').on(t.shopId, t.customerId), index('units_shop_serial_idx').on(t.shopId, t.serialNumber)],
);

export const repairOrders = mysqlTable(
  'repair_orders',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    number: int('number').notNull(),
    customerId: id('customer_id').notNull().references(() => customers.id, { onDelete: 'restrict' }),
    status: mysqlEnum('status', orderStatuses).notNull(),
    complaint: text('complaint').notNull(),
    cause: text('cause'),
    correction: text('correction'),
    labourNotes: text('labour_notes'),
    /** The shop's own notes; never in the report or the customer view. */
    internalNotes: text('internal_notes'),
    /** Text for the customer: printed in the report and shown by the customer link. */
    customerNotes: text('customer_notes'),
    assignedTechId: id('assigned_tech_id').references(() => users.id, { onDelete: 'set null' }),
    openedBy: id('opened_by').references(() => users.id, { onDelete: 'set null' }),
    openedAt: at('opened_at').notNull().$defaultFn(now),
    closedAt: at('closed_at'),
    /** Set in the same UPDATE that claims the stalled-order e-mail: sent once, by one instance. */
    stalledNotifiedAt: at('stalled_notified_at'),
    version: int('version').notNull().default(1),
    updatedAt: at('updated_at').notNull().$defaultFn(now),
  },
  (t) => [
    uniqueIndex('repair_orders_shop_number_unique').on(t.shopId, t.number),
    index('repair_orders_shop_status_idx').on(t.shopId, t.status),
    index('repair_orders_shop_tech_idx').on(t.shopId, t.assignedTechId),
    index('repair_orders_shop_customer_idx').on(t.shopId, t.customerId),
    index('repair_orders_shop_opened_idx').on(t.shopId, t.openedAt),
  ],
);

export const repairOrderUnits = mysqlTable(
  'repair_order_units',
  {
    orderId: id('order_id').notNull().references(() => repairOrders.id, { onDelete: 'cascade' }),
    unitId: id('unit_id').notNull().references(() => units.id, { onDelete: 'restrict' }),
    shopId: id('shop_id').notNull(),
    position: int('position').notNull(),
  },
  (t) => [primaryKey({ name: 'repair_order_units_pk', columns: [t.orderId, t.unitId] }), index('repair_order_units_unit_idx').on(t.unitId)],
);

export const timeEntries = mysqlTable(
  'time_entries',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    orderId: id('order_id').notNull().references(() => repairOrders.id, { onDelete: 'cascade' }),
    techId: id('tech_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
    kind: mysqlEnum('kind', timeKinds).notNull(),
    minutes: int('minutes').notNull(),
    workDate: date('work_date', { mode: 'string' }).notNull(),
    note: varchar('note', { length: 1000 }),
    createdBy: id('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: at('created_at').notNull().$defaultFn(now),
  },
  (t) => [index('time_entries_order_idx').on(t.orderId, t.kind), index('time_entries_shop_tech_idx').on(t.shopId, t.techId, t.workDate)],
);

/** A checklist template a lead writes once. */
export const procedures = mysqlTable(
  'procedures',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    title: varchar('title', { length: 200 }).notNull(),
    notes: text('notes'),
    steps: json<string[]>('steps').notNull(),
    version: int('version').notNull().default(1),
    createdBy: id('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: at('created_at').notNull().$defaultFn(now),
    updatedAt: at('updated_at').notNull().$defaultFn(now),
  },
  (t) => [index('procedures_shop_title_idx').on(t.shopId, t.title)],
);

/** A procedure attached to an order: a copy of its steps, so later edits of the template leave ticked work alone. */
export const orderProcedures = mysqlTable(
  'order_procedures',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    orderId: id('order_id').notNull().references(() => repairOrders.id, { onDelete: 'cascade' }),
    procedureId: id('procedure_id').references(() => procedures.id, { onDelete: 'set null' }),
    title: varchar('title', { length: 200 }).notNull(),
    notes: text('notes'),
    attachedBy: id('attached_by').references(() => users.id, { onDelete: 'set null' }),
    attachedAt: at('attached_at').notNull().$defaultFn(now),
  },
  (t) => [index('order_procedures_order_idx').on(t.orderId)],
);

export const orderProcedureSteps = mysqlTable(
  'order_procedure_steps',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull(),
    orderProcedureId: id('order_procedure_id').notNull().references(() => orderProcedures.id, { onDelete: 'cascade' }),
    position: int('position').notNull(),
    text: text('text').notNull(),
    doneBy: id('done_by').references(() => users.id, { onDelete: 'set null' }),
    doneAt: at('done_at'),
  },
  (t) => [uniqueIndex('order_procedure_steps_position_unique').on(t.orderProcedureId, t.position)],
);

/**
 * A marked-up drawing: a frozen view of a harness revision. `snapshot` keeps the document and
 * its layout positions as they were when the view was attached, so the image never changes
 * when the draft is edited later; `revisionId` still names the revision it came from.
 */
export const orderDrawings = mysqlTable(
  'order_drawings',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    orderId: id('order_id').notNull().references(() => repairOrders.id, { onDelete: 'cascade' }),
    revisionId: id('revision_id').notNull().references(() => revisions.id, { onDelete: 'restrict' }),
    harnessName: varchar('harness_name', { length: 500 }).notNull(),
    revisionNumber: int('revision_number'),
    title: varchar('title', { length: 200 }).notNull(),
    viewport: json<Viewport | null>('viewport'),
    highlight: json<Highlight>('highlight').notNull(),
    markers: json<Marker[]>('markers').notNull(),
    notes: text('notes'),
    snapshot: json<{ document: unknown; positions: Record<string, { x: number; y: number }> }>('snapshot').notNull(),
    inReport: boolean('in_report').notNull().default(true),
    version: int('version').notNull().default(1),
    createdBy: id('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: at('created_at').notNull().$defaultFn(now),
    updatedAt: at('updated_at').notNull().$defaultFn(now),
  },
  (t) => [index('order_drawings_order_idx').on(t.orderId), index('order_drawings_revision_idx').on(t.revisionId)],
);

export const orderAttachments = mysqlTable(
  'order_attachments',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    orderId: id('order_id').notNull().references(() => repairOrders.id, { onDelete: 'cascade' }),
    kind: mysqlEnum('kind', ['photo', 'file']).notNull(),
    /** The name as uploaded, checked (no path parts, no control characters). */
    filename: varchar('filename', { length: 200 }).notNull(),
    contentType: varchar('content_type', { length: 100 }).notNull(),
    size: int('size').notNull(),
    storageKey: varchar('storage_key', { length: 200 }).notNull(),
    thumbKey: varchar('thumb_key', { length: 200 }),
    width: int('width'),
    height: int('height'),
    caption: varchar('caption', { length: 300 }),
    inReport: boolean('in_report').notNull().default(false),
    uploadedBy: id('uploaded_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: at('created_at').notNull().$defaultFn(now),
  },
  (t) => [index('order_attachments_order_idx').on(t.orderId)],
);

/** Who sent the report to whom and when. */
export const reportSends = mysqlTable(
  'report_sends',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    orderId: id('order_id').notNull().references(() => repairOrders.id, { onDelete: 'cascade' }),
    sentBy: id('sent_by').references(() => users.id, { onDelete: 'set null' }),
    sentAt: at('sent_at').notNull().$defaultFn(now),
    to: varchar('to_addr', { length: 254 }).notNull(),
    subject: varchar('subject', { length: 300 }).notNull(),
    filename: varchar('filename', { length: 200 }).notNull(),
    bytes: int('bytes').notNull(),
    messageId: varchar('message_id', { length: 255 }),
    linkId: id('link_id'),
  },
  (t) => [index('report_sends_order_idx').on(t.orderId, t.sentAt)],
);

/** A read-only customer view of one order's report: signed token, expiry, revocable. */
export const customerLinks = mysqlTable(
  'customer_links',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    orderId: id('order_id').notNull().references(() => repairOrders.id, { onDelete: 'cascade' }),
    expiresAt: at('expires_at').notNull(),
    revokedAt: at('revoked_at'),
    revokedBy: id('revoked_by').references(() => users.id, { onDelete: 'set null' }),
    createdBy: id('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: at('created_at').notNull().$defaultFn(now),
    lastOpenedAt: at('last_opened_at'),
  },
  (t) => [index('customer_links_order_idx').on(t.orderId)],
);
