/**
 * The demo library into a seeded shop: the invented machine and attachment models of
 * seeds/library.ts, their harness documents imported, filed under their models and
 * published by the lead, and one draft in progress on top of the loader's main harness. Every
 * revision is stored laid out (the editor's layout, run here), as if the lead had opened it.
 */
import { eq } from 'drizzle-orm';
import type { SeededShop } from '../../seeds/shop';
import { harnessDraft, harnessDocument, harnessLinks, makers, models } from '../../seeds/library';
import type { Db } from '../db/client';
import { newId } from '../db/ids';
import { equipmentModels, harnesses } from '../db/schema/harness';
import { layOutDocument } from './layout';
import { importHarness, publishDraft, saveDraft, startDraft, type Viewer } from './revisions';

export interface SeededLibrary {
  /** Database id of each library model, by its id in seeds/library.ts. */
  modelIds: Record<string, string>;
  /** Per demo harness key: the harness, its published revision and the draft where there is one. */
  harnesses: Record<string, { harnessId: string; publishedRevisionId: string; draftRevisionId?: string }>;
}

export async function seedLibrary(deps: { db: Db }, shop: SeededShop): Promise<SeededLibrary> {
  const { db } = deps;
  const lead: Viewer = { userId: shop.users.lead.id, shopId: shop.shopId, role: 'lead' };
  const makerName = new Map(makers.map((m) => [m.id, m.name]));
  const modelIds: Record<string, string> = {};
  const now = new Date();
  for (const m of models) {
    const id = newId();
    modelIds[m.id] = id;
    await db.insert(equipmentModels).values({
      id,
      shopId: shop.shopId,
      kind: m.kind,
      maker: makerName.get(m.makerId) ?? m.makerId,
      model: m.model,
      series: m.series || null,
      notes: [m.category, m.notes].filter(Boolean).join('. '),
      createdAt: now,
      updatedAt: now,
    });
  }
  const out: SeededLibrary['harnesses'] = {};
  for (const link of harnessLinks) {
    const doc = harnessDocument(link.key);
    const { harnessId, revisionId } = await importHarness(db, lead, doc, { modelId: modelIds[link.modelId], positions: await layOutDocument(doc) });
    await db.update(harnesses).set({ name: link.title }).where(eq(harnesses.id, harnessId));
    await publishDraft(db, lead, revisionId, 'Documented from the service manual and checked on a unit in the shop (demo).');
    out[link.key] = { harnessId, publishedRevisionId: revisionId };
    const draftDoc = link.status === 'published_with_draft' ? harnessDraft(link.key) : null;
    if (draftDoc) {
      const { revision } = await startDraft(db, lead, harnessId);
      // Laid out whole, as the editor lays out a draft that opens without positions.
      const positions = await layOutDocument(draftDoc);
      await saveDraft(db, lead, revision.id, revision.version, async () => ({ document: draftDoc as unknown as Record<string, unknown>, positions }));
      out[link.key].draftRevisionId = revision.id;
    }
  }
  return { modelIds, harnesses: out };
}
