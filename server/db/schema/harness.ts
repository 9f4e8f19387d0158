import { double, foreignKey, index, int, mysqlEnum, mysqlTable, primaryKey, text, tinyint, uniqueIndex, varchar } from 'drizzle-orm/mysql-core';
import { shops, users } from './auth';
import { at, id, jsonText, now } from '../columns';

export { jsonText };

/**
 * The library (machine and attachment models) and harness documents stored relationally:
 * harness → revisions → components → pins, wires between pins (foreign keys, so a wire can
 * never point at a pin that does not exist), clamps on wires, machine states.
 *
 * Every table carries `shop_id`; child tables also carry `revision_id` so a revision loads
 * and deletes with one indexed query per table. `position` keeps the document's order so an
 * export gives back exactly the document that was imported.
 */


export const modelKinds = ['machine', 'attachment'] as const;
export const revisionStatuses = ['draft', 'published'] as const;

/** A machine model or an attachment model of the shop's library. */
export const equipmentModels = mysqlTable(
  'equipment_models',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    kind: mysqlEnum('kind', modelKinds).notNull(),
    maker: varchar('maker', { length: 100 }).notNull(),
    model: varchar('model', { length: 100 }).notNull(),
    series: varchar('series', { length: 100 }),
    notes: text('notes'),
    createdAt: at('created_at').notNull().$defaultFn(now),
    updatedAt: at('updated_at').notNull().$defaultFn(now),
  },
  (t) => [uniqueIndex('equipment_models_shop_maker_model_unique').on(t.shopId, t.maker, t.model), index('equipment_models_shop_kind_idx').on(t.shopId, t.kind)],
);

export const harnesses = mysqlTable(
  'harnesses',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    modelId: id('model_id').references(() => equipmentModels.id, { onDelete: 'set null' }),
    name: varchar('name', { length: 200 }).notNull(),
    createdBy: id('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: at('created_at').notNull().$defaultFn(now),
    updatedAt: at('updated_at').notNull().$defaultFn(now),
  },
  (t) => [index('harnesses_shop_idx').on(t.shopId, t.name), index('harnesses_model_idx').on(t.modelId)],
);

export const revisions = mysqlTable(
  'revisions',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
    harnessId: id('harness_id').notNull().references(() => harnesses.id, { onDelete: 'cascade' }),
    /** 1, 2, 3 … within the harness. */
    number: int('number').notNull(),
    status: mysqlEnum('status', revisionStatuses).notNull(),
    /** 1 when a draft is made, +1 on every save (optimistic locking). */
    version: int('version').notNull().default(1),
    /** 1 while a draft, NULL once published: the unique key allows one draft per harness. */
    draftSlot: tinyint('draft_slot'),
    parentRevisionId: id('parent_revision_id'),
    // Document-level fields.
    format: varchar('format', { length: 40 }).notNull(),
    formatVersion: int('format_version').notNull(),
    name: varchar('name', { length: 500 }).notNull(),
    nominalVolts: double('nominal_volts').notNull(),
    temperatureC: double('temperature_c'),
    notes: text('notes'),
    /** The optional `messages` section (bus message catalogue), as written. */
    messages: jsonText<unknown>('messages'),
    /** Any further document-level field the contract adds, as written. */
    extra: jsonText<Record<string, unknown>>('extra'),
    createdBy: id('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: at('created_at').notNull().$defaultFn(now),
    updatedBy: id('updated_by').references(() => users.id, { onDelete: 'set null' }),
    updatedAt: at('updated_at').notNull().$defaultFn(now),
    publishedBy: id('published_by').references(() => users.id, { onDelete: 'set null' }),
    publishedAt: at('published_at'),
    publishNote: text('publish_note'),
  },
  (t) => [
    uniqueIndex('revisions_harness_number_unique').on(t.harnessId, t.number),
    uniqueIndex('revisions_one_draft_unique').on(t.harnessId, t.draftSlot),
    index('revisions_shop_status_idx').on(t.shopId, t.status),
    foreignKey({ name: 'revisions_parent_fk', columns: [t.parentRevisionId], foreignColumns: [t.id] }).onDelete('set null'),
  ],
);

export const components = mysqlTable(
  'harness_components',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull(),
    revisionId: id('revision_id').notNull().references(() => revisions.id, { onDelete: 'cascade' }),
    position: int('position').notNull(),
    /** The document's component id (`X12`). */
    key: varchar('component_key', { length: 32 }).notNull(),
    kind: varchar('kind', { length: 20 }).notNull(),
    label: varchar('label', { length: 255 }),
    notes: text('notes'),
    /** Which document key lists the pins: `cavities`, `pins`, or null for fixed pins. */
    pinsKey: varchar('pins_key', { length: 16 }),
    /** The kind-specific fields (amps, ohms, positions, matesWith …), as written. */
    fields: jsonText<Record<string, unknown>>('fields').notNull(),
    x: double('x'),
    y: double('y'),
  },
  (t) => [
    // Also serves search by component id (prefix) within the revisions searched.
    uniqueIndex('harness_components_revision_key_unique').on(t.revisionId, t.key),
  ],
);

export const pinSources = ['fixed', 'string', 'object'] as const;

export const pins = mysqlTable(
  'harness_pins',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull(),
    revisionId: id('revision_id').notNull().references(() => revisions.id, { onDelete: 'cascade' }),
    componentId: id('component_id').notNull().references(() => components.id, { onDelete: 'cascade' }),
    position: int('position').notNull(),
    /** The document's pin id (`3`, `+`, `IGN`). */
    key: varchar('pin_key', { length: 16 }).notNull(),
    /** fixed: the kind's own pins (battery +/-…); string: written as `"3"`; object: `{ id, … }`. */
    source: mysqlEnum('source', pinSources).notNull(),
    role: varchar('role', { length: 20 }),
    function: varchar('function', { length: 255 }),
    /** For `object` pins: every field but `id`, as written. */
    fields: jsonText<Record<string, unknown>>('fields'),
  },
  (t) => [
    uniqueIndex('harness_pins_component_key_unique').on(t.componentId, t.key),
    index('harness_pins_revision_idx').on(t.revisionId),
  ],
);

export const wires = mysqlTable(
  'harness_wires',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull(),
    revisionId: id('revision_id').notNull().references(() => revisions.id, { onDelete: 'cascade' }),
    position: int('position').notNull(),
    key: varchar('wire_key', { length: 32 }).notNull(),
    fromPinId: id('from_pin_id').notNull(),
    toPinId: id('to_pin_id').notNull(),
    color: varchar('color', { length: 16 }),
    /** `{ mm2 }` or `{ awg }`, as written. */
    size: jsonText<Record<string, number>>('size'),
    lengthM: double('length_m'),
    ohms: double('ohms'),
    circuit: varchar('circuit', { length: 64 }),
    label: varchar('label', { length: 255 }),
    notes: text('notes'),
    /** Any further wire field, as written. */
    extra: jsonText<Record<string, unknown>>('extra'),
  },
  (t) => [
    uniqueIndex('harness_wires_revision_key_unique').on(t.revisionId, t.key),
    foreignKey({ name: 'harness_wires_from_pin_fk', columns: [t.fromPinId], foreignColumns: [pins.id] }),
    foreignKey({ name: 'harness_wires_to_pin_fk', columns: [t.toPinId], foreignColumns: [pins.id] }),
    // Search by circuit number and colour code (prefix) within the revisions searched.
    index('harness_wires_revision_circuit_idx').on(t.revisionId, t.circuit),
    index('harness_wires_revision_color_idx').on(t.revisionId, t.color),
  ],
);

export const clamps = mysqlTable(
  'harness_clamps',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull(),
    revisionId: id('revision_id').notNull().references(() => revisions.id, { onDelete: 'cascade' }),
    position: int('position').notNull(),
    key: varchar('clamp_key', { length: 32 }).notNull(),
    label: varchar('label', { length: 255 }),
    /** Everything but id, label and wires (`at`, notes …), as written. */
    fields: jsonText<Record<string, unknown>>('fields').notNull(),
  },
  (t) => [uniqueIndex('harness_clamps_revision_key_unique').on(t.revisionId, t.key)],
);

export const clampWires = mysqlTable(
  'harness_clamp_wires',
  {
    clampId: id('clamp_id').notNull().references(() => clamps.id, { onDelete: 'cascade' }),
    position: int('position').notNull(),
    revisionId: id('revision_id').notNull().references(() => revisions.id, { onDelete: 'cascade' }),
    wireId: id('wire_id').notNull().references(() => wires.id, { onDelete: 'cascade' }),
  },
  (t) => [primaryKey({ name: 'harness_clamp_wires_pk', columns: [t.clampId, t.position] }), index('harness_clamp_wires_revision_idx').on(t.revisionId)],
);

export const states = mysqlTable(
  'harness_states',
  {
    id: id().primaryKey(),
    shopId: id('shop_id').notNull(),
    revisionId: id('revision_id').notNull().references(() => revisions.id, { onDelete: 'cascade' }),
    position: int('position').notNull(),
    key: varchar('state_key', { length: 32 }).notNull(),
    label: varchar('label', { length: 255 }),
    /** switches, sources, outputs, unplugged (and anything further), as written. */
    body: jsonText<Record<string, unknown>>('body').notNull(),
  },
  (t) => [uniqueIndex('harness_states_revision_key_unique').on(t.revisionId, t.key)],
);
