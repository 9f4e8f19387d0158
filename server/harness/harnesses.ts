/** Harness lists and details, with their model and their latest published revision and draft. */
import { and, eq, inArray, like, or } from 'drizzle-orm';
import type { HarnessSummary } from '../../shared/api/harness';
import type { Db } from '../db/client';
import { equipmentModels, harnesses, revisions } from '../db/schema/harness';
import { notFound } from '../errors';
import { seesDrafts, type Viewer } from './revisions';
import { harnessesChanged } from './shop-changes';
import { deleteDocumentRows } from './store';

export const modelDisplayName = (m: { maker: string; model: string; series?: string | null }) =>
  [m.maker, m.model].join(' ') + (m.series ? ` (${m.series})` : '');

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

export async function listHarnesses(db: Db, viewer: Viewer, filter: { modelId?: string; q?: string; ids?: string[] } = {}): Promise<HarnessSummary[]> {
  const rows = await db
    .select({
      id: harnesses.id,
      name: harnesses.name,
      modelId: harnesses.modelId,
      maker: equipmentModels.maker,
      model: equipmentModels.model,
      series: equipmentModels.series,
      kind: equipmentModels.kind,
      createdAt: harnesses.createdAt,
      updatedAt: harnesses.updatedAt,
    })
    .from(harnesses)
    .leftJoin(equipmentModels, eq(equipmentModels.id, harnesses.modelId))
    .where(
      and(
        eq(harnesses.shopId, viewer.shopId),
        filter.modelId ? eq(harnesses.modelId, filter.modelId) : undefined,
        filter.ids ? inArray(harnesses.id, filter.ids.length ? filter.ids : ['-']) : undefined,
        filter.q ? or(like(harnesses.name, `%${escapeLike(filter.q)}%`), like(equipmentModels.model, `%${escapeLike(filter.q)}%`)) : undefined,
      ),
    )
    .orderBy(harnesses.name);
  if (!rows.length) return [];
  const revs = await db
    .select({ id: revisions.id, harnessId: revisions.harnessId, number: revisions.number, status: revisions.status, publishedAt: revisions.publishedAt })
    .from(revisions)
    .where(and(eq(revisions.shopId, viewer.shopId), inArray(revisions.harnessId, rows.map((r) => r.id))));
  const published = new Map<string, (typeof revs)[number]>();
  const drafts = new Map<string, string>();
  for (const r of revs) {
    if (r.status === 'draft') drafts.set(r.harnessId, r.id);
    else if ((published.get(r.harnessId)?.number ?? 0) < r.number) published.set(r.harnessId, r);
  }
  const drafty = seesDrafts(viewer);
  return rows
    .filter((r) => drafty || published.has(r.id))
    .map((r) => {
      const p = published.get(r.id);
      return {
        id: r.id,
        name: r.name,
        modelId: r.modelId,
        modelName: r.maker && r.model ? modelDisplayName({ maker: r.maker, model: r.model, series: r.series }) : null,
        modelKind: r.kind ?? null,
        publishedRevisionId: p?.id ?? null,
        publishedNumber: p?.number ?? null,
        publishedAt: p?.publishedAt ? p.publishedAt.toISOString() : null,
        draftRevisionId: drafty ? (drafts.get(r.id) ?? null) : null,
        createdAt: r.createdAt.toISOString(),
        updatedAt: r.updatedAt.toISOString(),
      };
    });
}

export async function getHarness(db: Db, viewer: Viewer, id: string): Promise<HarnessSummary> {
  const [h] = await listHarnesses(db, viewer, { ids: [id] });
  if (!h) throw notFound('The harness');
  return h;
}

/** Deletes a harness with every revision and its content, in one transaction. */
export async function deleteHarness(db: Db, viewer: Viewer, id: string): Promise<void> {
  await db.transaction(async (tx) => {
    const [h] = await tx
      .select({ id: harnesses.id })
      .from(harnesses)
      .where(and(eq(harnesses.id, id), eq(harnesses.shopId, viewer.shopId)))
      .for('update');
    if (!h) throw notFound('The harness');
    const revs = await tx.select({ id: revisions.id }).from(revisions).where(eq(revisions.harnessId, id));
    for (const r of revs) await deleteDocumentRows(tx, r.id);
    await tx.update(revisions).set({ parentRevisionId: null }).where(eq(revisions.harnessId, id));
    await tx.delete(revisions).where(eq(revisions.harnessId, id));
    await tx.delete(harnesses).where(eq(harnesses.id, id));
  });
  harnessesChanged(viewer.shopId);
}

