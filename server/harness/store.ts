/**
 * Storing and loading harness documents: insert a document's rows in batches, load them back,
 * replace a draft's content. Every function takes the Drizzle handle it should use, so the
 * callers run them inside their transaction.
 */
import { asc, eq, getTableColumns, getTableName, sql, type Column } from 'drizzle-orm';
import type { MySqlTable } from 'drizzle-orm/mysql-core';
import mysql from 'mysql2';
import type { Db } from '../db/client';
import { clamps, clampWires, components, pins, revisions, states, wires } from '../db/schema/harness';
import { documentToRows, rowsToDocument, type Positions } from './rows';

/** Drizzle over the pool, or a transaction of it. */
export type DbOrTx = Db | Parameters<Parameters<Db['transaction']>[0]>[0];
type Obj = Record<string, unknown>;

/** Rows per INSERT statement: a few hundred kilobytes of SQL, far below max_allowed_packet. */
const BATCH = 2000;

/**
 * Multi-row INSERTs of plain rows. The SQL is written by mysql2's escaping (`INSERT … VALUES ?`)
 * rather than Drizzle's query builder, which takes a third of a second per thousand rows;
 * values still pass through each column's own driver mapping (JSON columns are stringified).
 */
async function bulkInsert<T extends Record<string, unknown>>(tx: DbOrTx, table: MySqlTable, rows: T[]): Promise<void> {
  if (!rows.length) return;
  const columns = Object.entries(getTableColumns(table)) as Array<[string, Column]>;
  const names = columns.map(([, c]) => c.name);
  for (let i = 0; i < rows.length; i += BATCH) {
    const values = rows.slice(i, i + BATCH).map((row) =>
      columns.map(([prop, col]) => {
        const v = row[prop];
        return v === null || v === undefined ? null : col.mapToDriverValue(v);
      }),
    );
    await tx.execute(sql.raw(mysql.format('INSERT INTO ?? (??) VALUES ?', [getTableName(table), names, values] as never)));
  }
}

/** Writes the document's rows for `revisionId` (the revision row itself exists already). */
export async function insertDocumentRows(tx: DbOrTx, shopId: string, revisionId: string, document: Obj, positions: Positions = {}) {
  const rows = documentToRows(document, { shopId, revisionId }, positions);
  await bulkInsert(tx, components, rows.components);
  await bulkInsert(tx, pins, rows.pins);
  await bulkInsert(tx, wires, rows.wires);
  await bulkInsert(tx, clamps, rows.clamps);
  await bulkInsert(tx, clampWires, rows.clampWires);
  await bulkInsert(tx, states, rows.states);
  return rows.revision;
}

/** Removes a revision's content (not the revision row), children first. */
export async function deleteDocumentRows(tx: DbOrTx, revisionId: string): Promise<void> {
  await tx.delete(clampWires).where(eq(clampWires.revisionId, revisionId));
  await tx.delete(clamps).where(eq(clamps.revisionId, revisionId));
  await tx.delete(states).where(eq(states.revisionId, revisionId));
  await tx.delete(wires).where(eq(wires.revisionId, revisionId));
  await tx.delete(pins).where(eq(pins.revisionId, revisionId));
  await tx.delete(components).where(eq(components.revisionId, revisionId));
}

/** The document and drawing positions of one revision; null when the revision does not exist. */
export async function loadDocument(tx: DbOrTx, revisionId: string): Promise<{ document: Obj; positions: Positions } | null> {
  const [rev] = await tx
    .select({
      format: revisions.format,
      formatVersion: revisions.formatVersion,
      name: revisions.name,
      nominalVolts: revisions.nominalVolts,
      temperatureC: revisions.temperatureC,
      notes: revisions.notes,
      messages: revisions.messages,
      extra: revisions.extra,
    })
    .from(revisions)
    .where(eq(revisions.id, revisionId))
    .limit(1);
  if (!rev) return null;
  const [componentRows, pinRows, wireRows, clampRows, clampWireRows, stateRows] = await Promise.all([
    tx
      .select({
        id: components.id,
        position: components.position,
        key: components.key,
        kind: components.kind,
        label: components.label,
        notes: components.notes,
        pinsKey: components.pinsKey,
        fields: components.fields,
        x: components.x,
        y: components.y,
      })
      .from(components)
      .where(eq(components.revisionId, revisionId))
      .orderBy(asc(components.position)),
    tx
      .select({ id: pins.id, componentId: pins.componentId, position: pins.position, key: pins.key, source: pins.source, fields: pins.fields })
      .from(pins)
      .where(eq(pins.revisionId, revisionId)),
    tx
      .select({
        id: wires.id,
        position: wires.position,
        key: wires.key,
        fromPinId: wires.fromPinId,
        toPinId: wires.toPinId,
        color: wires.color,
        size: wires.size,
        lengthM: wires.lengthM,
        ohms: wires.ohms,
        circuit: wires.circuit,
        label: wires.label,
        notes: wires.notes,
        extra: wires.extra,
      })
      .from(wires)
      .where(eq(wires.revisionId, revisionId))
      .orderBy(asc(wires.position)),
    tx.select({ id: clamps.id, position: clamps.position, key: clamps.key, label: clamps.label, fields: clamps.fields }).from(clamps).where(eq(clamps.revisionId, revisionId)),
    tx.select({ clampId: clampWires.clampId, position: clampWires.position, wireId: clampWires.wireId }).from(clampWires).where(eq(clampWires.revisionId, revisionId)),
    tx.select({ id: states.id, position: states.position, key: states.key, label: states.label, body: states.body }).from(states).where(eq(states.revisionId, revisionId)),
  ]);
  return rowsToDocument({
    revision: rev,
    components: componentRows,
    pins: pinRows,
    wires: wireRows,
    clamps: clampRows,
    clampWires: clampWireRows,
    states: stateRows,
  });
}

/** Only the drawing positions of a revision. */
export async function loadPositions(tx: DbOrTx, revisionId: string): Promise<Positions> {
  const rows = await tx.select({ key: components.key, x: components.x, y: components.y }).from(components).where(eq(components.revisionId, revisionId));
  const out: Positions = {};
  for (const r of rows) if (r.x !== null && r.y !== null) out[r.key] = { x: r.x, y: r.y };
  return out;
}

/** Sets x, y of the named components (one UPDATE per component, inside the caller's transaction). */
export async function writePositions(tx: DbOrTx, revisionId: string, positions: Positions): Promise<void> {
  const keys = Object.keys(positions);
  if (!keys.length) return;
  const rows = await tx.select({ id: components.id, key: components.key }).from(components).where(eq(components.revisionId, revisionId));
  const idOf = new Map(rows.map((r) => [r.key, r.id]));
  for (const key of keys) {
    const id = idOf.get(key);
    if (!id) continue;
    await tx.update(components).set({ x: positions[key].x, y: positions[key].y }).where(eq(components.id, id));
  }
}

