/**
 * Harnesses and their revisions: import, visibility by role, saves with optimistic locking,
 * publish, new drafts. Every write runs in one transaction; a draft's row is locked
 * (SELECT … FOR UPDATE) for the whole save, so concurrent saves of one version serialise and
 * all but the first see a newer version and answer 409 without changing anything.
 */
import { and, desc, eq, isNotNull, max, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/mysql-core';
import { validateDocument, type HarnessDocument } from '../../shared/harness';
import type { PersonRef, Positions, RevisionSummary } from '../../shared/api/harness';
import type { AuthContext } from '../auth/middleware';
import type { Db } from '../db/client';
import { newId } from '../db/ids';
import { users } from '../db/schema/auth';
import { equipmentModels, harnesses, revisions } from '../db/schema/harness';
import { HttpError, notFound } from '../errors';
import { layOutOffThread } from './layout-thread';
import { RowsError } from './rows';
import { harnessesChanged, ShopCache, shopGeneration } from './shop-changes';
import { deleteDocumentRows, insertDocumentRows, loadDocument, loadPositions, writePositions, type DbOrTx } from './store';

type Obj = Record<string, unknown>;
export type Viewer = Pick<AuthContext, 'userId' | 'shopId' | 'role'>;

/** Leads and owners see drafts; techs and writers only published revisions. */
export const seesDrafts = (viewer: Pick<AuthContext, 'role'>) => viewer.role === 'lead' || viewer.role === 'owner';

/** 422 `invalid_document` with every problem, or the valid document. */
export function validOrThrow(input: unknown): Obj {
  const result = validateDocument(input);
  if (result.ok) return result.doc as unknown as Obj;
  const first = result.problems[0];
  const n = result.problems.length;
  throw new HttpError(
    422,
    'invalid_document',
    `The harness document has ${n} problem${n === 1 ? '' : 's'}${first ? `; the first: ${first.path} ${first.message}` : ''}.`,
    result.problems,
  );
}

function rowsErrorToHttp(err: unknown): never {
  if (err instanceof RowsError) throw new HttpError(422, 'invalid_document', `The harness document cannot be stored: ${err.path} ${err.message}.`, [{ path: err.path, message: err.message }]);
  throw err;
}

const createdByUser = alias(users, 'created_by_user');
const updatedByUser = alias(users, 'updated_by_user');
const publishedByUser = alias(users, 'published_by_user');

const person = (id: string | null, name: string | null): PersonRef | null => (id ? { id, name: name ?? '' } : null);
const iso = (d: Date | null) => (d ? d.toISOString() : null);

/** Revisions with the names of who made, saved and published them. */
function revisionQuery(db: DbOrTx) {
  return db
    .select({
      id: revisions.id,
      shopId: revisions.shopId,
      harnessId: revisions.harnessId,
      number: revisions.number,
      status: revisions.status,
      version: revisions.version,
      parentRevisionId: revisions.parentRevisionId,
      name: revisions.name,
      createdBy: revisions.createdBy,
      createdByName: createdByUser.name,
      createdAt: revisions.createdAt,
      updatedBy: revisions.updatedBy,
      updatedByName: updatedByUser.name,
      updatedAt: revisions.updatedAt,
      publishedBy: revisions.publishedBy,
      publishedByName: publishedByUser.name,
      publishedAt: revisions.publishedAt,
      publishNote: revisions.publishNote,
    })
    .from(revisions)
    .leftJoin(createdByUser, eq(createdByUser.id, revisions.createdBy))
    .leftJoin(updatedByUser, eq(updatedByUser.id, revisions.updatedBy))
    .leftJoin(publishedByUser, eq(publishedByUser.id, revisions.publishedBy));
}
type RevisionRow = Awaited<ReturnType<ReturnType<typeof revisionQuery>['execute']>>[number];

export function toSummary(r: RevisionRow): RevisionSummary {
  return {
    id: r.id,
    harnessId: r.harnessId,
    number: r.number,
    status: r.status,
    version: r.version,
    parentRevisionId: r.parentRevisionId,
    name: r.name,
    createdBy: person(r.createdBy, r.createdByName),
    createdAt: r.createdAt.toISOString(),
    updatedBy: person(r.updatedBy, r.updatedByName),
    updatedAt: r.updatedAt.toISOString(),
    publishedBy: person(r.publishedBy, r.publishedByName),
    publishedAt: iso(r.publishedAt),
    publishNote: r.publishNote,
  };
}

export async function revisionSummary(db: DbOrTx, id: string): Promise<RevisionSummary> {
  const [row] = await revisionQuery(db).where(eq(revisions.id, id)).limit(1);
  if (!row) throw notFound('The revision');
  return toSummary(row);
}

/** The revision if this viewer may see it (same shop; drafts for leads and owners), else 404. */
export async function visibleRevision(db: DbOrTx, viewer: Viewer, id: string): Promise<RevisionRow> {
  const [row] = await revisionQuery(db)
    .where(and(eq(revisions.id, id), eq(revisions.shopId, viewer.shopId)))
    .limit(1);
  if (!row || (row.status === 'draft' && !seesDrafts(viewer))) throw notFound('The revision');
  return row;
}

type RevisionKeyRow = { id: string; shopId: string; status: 'draft' | 'published'; version: number };

/**
 * Published revisions' keys, which only a harness deletion changes (see shop-changes.ts for
 * the bound). Drafts are never kept: every request reads a draft's current version.
 */
const publishedKeys = new ShopCache<RevisionKeyRow>(10_000);

/** The same check with only what the engine needs (one primary-key lookup, no joins): for the hot read routes. */
export async function visibleRevisionKey(db: DbOrTx, viewer: Viewer, id: string): Promise<{ id: string; status: 'draft' | 'published'; version: number }> {
  let row = publishedKeys.get(id);
  if (!row) {
    const generation = shopGeneration(viewer.shopId);
    [row] = await db
      .select({ id: revisions.id, shopId: revisions.shopId, status: revisions.status, version: revisions.version })
      .from(revisions)
      .where(eq(revisions.id, id))
      .limit(1);
    // Kept under its own shop: a change there (a deletion) voids it. The generation read is the
    // viewer's shop's, so a row of another shop is stored only when that is the same shop.
    if (row?.status === 'published' && row.shopId === viewer.shopId) publishedKeys.set(id, row.shopId, row, generation);
  }
  if (!row || row.shopId !== viewer.shopId || (row.status === 'draft' && !seesDrafts(viewer))) throw notFound('The revision');
  return row;
}

export async function revisionsOfHarness(db: DbOrTx, viewer: Viewer, harnessId: string): Promise<RevisionSummary[]> {
  const rows = await revisionQuery(db)
    .where(and(eq(revisions.harnessId, harnessId), eq(revisions.shopId, viewer.shopId), seesDrafts(viewer) ? undefined : eq(revisions.status, 'published')))
    .orderBy(desc(revisions.number));
  return rows.map(toSummary);
}

/** A revision's document, read in one consistent snapshot (a draft may be saved meanwhile). */
export async function readDocument(db: Db, revisionId: string): Promise<{ document: Obj; positions: Positions }> {
  const loaded = await db.transaction(async (tx) => loadDocument(tx, revisionId), { isolationLevel: 'repeatable read', withConsistentSnapshot: true });
  if (!loaded) throw notFound('The revision');
  return loaded;
}

async function modelInShop(db: DbOrTx, shopId: string, modelId: string): Promise<void> {
  const [m] = await db
    .select({ id: equipmentModels.id })
    .from(equipmentModels)
    .where(and(eq(equipmentModels.id, modelId), eq(equipmentModels.shopId, shopId)))
    .limit(1);
  if (!m) throw new HttpError(404, 'not_found', 'The machine or attachment model was not found.');
}

function documentColumns(rev: Awaited<ReturnType<typeof insertDocumentRows>>) {
  return {
    format: rev.format,
    formatVersion: rev.formatVersion,
    name: rev.name,
    nominalVolts: rev.nominalVolts ?? 0,
    temperatureC: rev.temperatureC,
    notes: rev.notes,
    messages: rev.messages ?? null,
    extra: rev.extra,
  };
}

/**
 * A new harness whose first revision is a draft holding the document. Nothing is stored when it is
 * invalid. Without positions given it is laid out first (off the request thread), so its drawing
 * opens laid out; a harness too big or too slow for that is stored without them.
 */
export async function importHarness(db: Db, viewer: Viewer, input: unknown, options: { modelId?: string; positions?: Positions } = {}) {
  const doc = validOrThrow(input);
  if (options.modelId) await modelInShop(db, viewer.shopId, options.modelId);
  const positions = options.positions ?? (await layOutOffThread(doc as unknown as HarnessDocument));
  const harnessId = newId();
  const revisionId = newId();
  const now = new Date();
  try {
    await db.transaction(async (tx) => {
      await tx.insert(harnesses).values({
        id: harnessId,
        shopId: viewer.shopId,
        modelId: options.modelId ?? null,
        name: String(doc.name || 'Untitled harness').slice(0, 200),
        createdBy: viewer.userId,
        createdAt: now,
        updatedAt: now,
      });
      // The revision row first with placeholders, then its content, then the document fields.
      await tx.insert(revisions).values({
        id: revisionId,
        shopId: viewer.shopId,
        harnessId,
        number: 1,
        status: 'draft',
        version: 1,
        draftSlot: 1,
        format: 'wirewalk-harness',
        formatVersion: 1,
        name: '',
        nominalVolts: 0,
        createdBy: viewer.userId,
        createdAt: now,
        updatedBy: viewer.userId,
        updatedAt: now,
      });
      const rev = await insertDocumentRows(tx, viewer.shopId, revisionId, doc, positions);
      await tx.update(revisions).set(documentColumns(rev)).where(eq(revisions.id, revisionId));
    });
  } catch (err) {
    rowsErrorToHttp(err);
  }
  harnessesChanged(viewer.shopId);
  return { harnessId, revisionId };
}

export interface DraftContent {
  document: Obj;
  positions: Positions;
}

/**
 * One save of a draft: lock the revision row, check it is a draft at `version`, compute the new
 * content from the current one, validate it (422 with every problem), replace the rows, bump
 * the version. Everything in one transaction: a failure leaves the draft as it was.
 */
export async function saveDraft(
  db: Db,
  viewer: Viewer,
  revisionId: string,
  version: number,
  change: (current: () => Promise<DraftContent>) => Promise<{ document?: Obj; positions?: Positions; positionsOnly?: boolean }>,
): Promise<RevisionSummary> {
  try {
    await db.transaction(async (tx) => {
      const [row] = await tx
        .select({ id: revisions.id, status: revisions.status, version: revisions.version, updatedBy: revisions.updatedBy, updatedAt: revisions.updatedAt, harnessId: revisions.harnessId })
        .from(revisions)
        .where(and(eq(revisions.id, revisionId), eq(revisions.shopId, viewer.shopId)))
        .for('update');
      if (!row) throw notFound('The revision');
      if (row.status !== 'draft') {
        throw new HttpError(409, 'revision_published', 'This revision is published and cannot change. Start a new draft to edit the harness.');
      }
      if (row.version !== version) {
        const [who] = row.updatedBy ? await tx.select({ id: users.id, name: users.name }).from(users).where(eq(users.id, row.updatedBy)) : [];
        throw new HttpError(
          409,
          'version_conflict',
          `The draft was saved by ${who?.name ?? 'someone else'} since you opened it (version ${row.version}, yours ${version}). Reload it and make your change again.`,
          { current: { version: row.version, updatedBy: who ? { id: who.id, name: who.name } : null, updatedAt: row.updatedAt.toISOString() } },
        );
      }
      const loadCurrent = async () => {
        const loaded = await loadDocument(tx, revisionId);
        if (!loaded) throw notFound('The revision');
        return loaded;
      };
      const next = await change(loadCurrent);
      const now = new Date();
      if (next.positionsOnly) {
        await writePositions(tx, revisionId, next.positions ?? {});
        await tx.update(revisions).set({ version: sql`${revisions.version} + 1`, updatedBy: viewer.userId, updatedAt: now }).where(eq(revisions.id, revisionId));
      } else {
        const doc = validOrThrow(next.document);
        const positions = next.positions ?? (await loadPositions(tx, revisionId));
        await deleteDocumentRows(tx, revisionId);
        const rev = await insertDocumentRows(tx, viewer.shopId, revisionId, doc, positions);
        await tx
          .update(revisions)
          .set({ ...documentColumns(rev), version: sql`${revisions.version} + 1`, updatedBy: viewer.userId, updatedAt: now })
          .where(eq(revisions.id, revisionId));
      }
      await tx.update(harnesses).set({ updatedAt: now }).where(eq(harnesses.id, row.harnessId));
    });
  } catch (err) {
    rowsErrorToHttp(err);
  }
  harnessesChanged(viewer.shopId);
  return revisionSummary(db, revisionId);
}

/** Freezes a draft: published, with who and when and the note. Immutable from then on. */
export async function publishDraft(db: Db, viewer: Viewer, revisionId: string, note: string, version?: number): Promise<RevisionSummary> {
  await db.transaction(async (tx) => {
    const [row] = await tx
      .select({ status: revisions.status, version: revisions.version, harnessId: revisions.harnessId })
      .from(revisions)
      .where(and(eq(revisions.id, revisionId), eq(revisions.shopId, viewer.shopId)))
      .for('update');
    if (!row) throw notFound('The revision');
    if (row.status !== 'draft') throw new HttpError(409, 'revision_published', 'This revision is published already.');
    if (version !== undefined && row.version !== version) {
      throw new HttpError(409, 'version_conflict', `The draft changed since you opened it (version ${row.version}, yours ${version}). Review it before publishing.`, {
        current: { version: row.version },
      });
    }
    const now = new Date();
    await tx
      .update(revisions)
      .set({ status: 'published', draftSlot: null, publishedBy: viewer.userId, publishedAt: now, publishNote: note || null })
      .where(eq(revisions.id, revisionId));
    await tx.update(harnesses).set({ updatedAt: now }).where(eq(harnesses.id, row.harnessId));
  });
  harnessesChanged(viewer.shopId);
  return revisionSummary(db, revisionId);
}

/** The harness's draft, or a new one copied from its latest published revision. */
export async function startDraft(db: Db, viewer: Viewer, harnessId: string): Promise<{ created: boolean; revision: RevisionSummary }> {
  const [h] = await db
    .select({ id: harnesses.id })
    .from(harnesses)
    .where(and(eq(harnesses.id, harnessId), eq(harnesses.shopId, viewer.shopId)))
    .limit(1);
  if (!h) throw notFound('The harness');
  const existing = async () => {
    const [d] = await db
      .select({ id: revisions.id })
      .from(revisions)
      .where(and(eq(revisions.harnessId, harnessId), eq(revisions.status, 'draft')))
      .limit(1);
    return d?.id;
  };
  const draftId = await existing();
  if (draftId) return { created: false, revision: await revisionSummary(db, draftId) };

  const [latest] = await db
    .select({ id: revisions.id })
    .from(revisions)
    .where(and(eq(revisions.harnessId, harnessId), eq(revisions.status, 'published')))
    .orderBy(desc(revisions.number))
    .limit(1);
  if (!latest) throw new HttpError(409, 'no_published_revision', 'The harness has no published revision to start a draft from.');
  const source = await loadDocument(db, latest.id);
  if (!source) throw notFound('The revision');
  const revisionId = newId();
  try {
    await db.transaction(async (tx) => {
      const [n] = await tx.select({ n: max(revisions.number) }).from(revisions).where(eq(revisions.harnessId, harnessId));
      const now = new Date();
      await tx.insert(revisions).values({
        id: revisionId,
        shopId: viewer.shopId,
        harnessId,
        number: Number(n?.n ?? 0) + 1,
        status: 'draft',
        version: 1,
        draftSlot: 1,
        parentRevisionId: latest.id,
        format: 'wirewalk-harness',
        formatVersion: 1,
        name: '',
        nominalVolts: 0,
        createdBy: viewer.userId,
        createdAt: now,
        updatedBy: viewer.userId,
        updatedAt: now,
      });
      const rev = await insertDocumentRows(tx, viewer.shopId, revisionId, source.document, source.positions);
      await tx.update(revisions).set(documentColumns(rev)).where(eq(revisions.id, revisionId));
    });
  } catch (err) {
    // Someone else started the draft at the same moment (the one-draft unique key): answer theirs.
    if (isDuplicate(err)) {
      const id = await existing();
      if (id) return { created: false, revision: await revisionSummary(db, id) };
    }
    throw err;
  }
  harnessesChanged(viewer.shopId);
  return { created: true, revision: await revisionSummary(db, revisionId) };
}

export function isDuplicate(err: unknown): boolean {
  for (let e: unknown = err; e; e = (e as { cause?: unknown }).cause) {
    if ((e as { code?: string }).code === 'ER_DUP_ENTRY' || (e as { errno?: number }).errno === 1062) return true;
  }
  return false;
}

/** Discards a draft (its content goes with it). */
export async function discardDraft(db: Db, viewer: Viewer, revisionId: string): Promise<void> {
  await db.transaction(async (tx) => {
    const [row] = await tx
      .select({ status: revisions.status, harnessId: revisions.harnessId, number: revisions.number })
      .from(revisions)
      .where(and(eq(revisions.id, revisionId), eq(revisions.shopId, viewer.shopId)))
      .for('update');
    if (!row) throw notFound('The revision');
    if (row.status !== 'draft') throw new HttpError(409, 'revision_published', 'A published revision cannot be deleted.');
    const [others] = await tx
      .select({ n: sql<number>`count(*)` })
      .from(revisions)
      .where(and(eq(revisions.harnessId, row.harnessId), isNotNull(revisions.publishedAt)));
    if (Number(others?.n ?? 0) === 0) {
      throw new HttpError(409, 'only_revision', 'This draft is the harness’s only revision: delete the harness instead.');
    }
    await deleteDocumentRows(tx, revisionId);
    await tx.delete(revisions).where(eq(revisions.id, revisionId));
  });
  harnessesChanged(viewer.shopId);
}

