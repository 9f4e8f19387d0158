import { and, desc, eq, inArray } from 'drizzle-orm';
import type { Observation as EngineObservation } from '../../shared/engine';
import { markObservations, toEngineObservation, type MarkedReading, type ReadingObservation as Observation, type Tolerance } from '../../shared/readings';
import type { ReadingSet } from '../../shared/api/readings';
import type { DbOrTx } from '../harness/store';
import type { EngineView } from '../harness/engine';
import { users } from '../db/schema/auth';
import { harnesses } from '../db/schema/harness';
import { pinTolerances, readingSets } from '../db/schema/readings';

/** How many of the ranked suspects a reading set keeps and the API answers. */
export const KEPT_SUSPECTS = 12;

export interface Evaluation {
  readings: MarkedReading[];
  suspects: unknown[];
  nextUnplug: unknown;
}

export async function tolerancesOf(db: DbOrTx, shopId: string, harnessId: string): Promise<Map<string, Tolerance>> {
  const rows = await db
    .select({ pin: pinTolerances.pin, below: pinTolerances.below, above: pinTolerances.above })
    .from(pinTolerances)
    .where(and(eq(pinTolerances.shopId, shopId), eq(pinTolerances.harnessId, harnessId)));
  return new Map(rows.map((r) => [r.pin, { below: r.below, above: r.above }]));
}

/**
 * Marks every reading in or out of range and ranks the single faults that would explain them.
 * The engine view checks every pin, state and fuse name first (400 naming the unknown ones).
 */
export function evaluate(view: EngineView, observations: Observation[], tolerances: ReadonlyMap<string, Tolerance>): Evaluation {
  // Message readings are marked with the checks they imply; the engine's suspects do not take them.
  const engineObservations = observations.map(toEngineObservation).filter((o) => o !== null) as EngineObservation[];
  const ranked = engineObservations.length
    ? (view.suspects(engineObservations) as { suspects: unknown[]; nextUnplug: unknown })
    : { suspects: [], nextUnplug: null };
  return {
    readings: markObservations(view.prepared, observations, tolerances),
    // Nothing out of range explains nothing: every candidate would score alike.
    suspects: ranked.suspects.slice(0, KEPT_SUSPECTS),
    nextUnplug: ranked.nextUnplug,
  };
}

export type ReadingSetRow = typeof readingSets.$inferSelect;


/** Reading sets with their takers' and harnesses' names, newest first. */
export async function readingSetViews(db: DbOrTx, shopId: string, where: { ids?: string[]; repairOrderId?: string; revisionId?: string; harnessId?: string; takenBy?: string }): Promise<ReadingSet[]> {
  const rows = await db
    .select({ set: readingSets, takerName: users.name, harnessName: harnesses.name })
    .from(readingSets)
    .leftJoin(users, eq(users.id, readingSets.takenBy))
    .innerJoin(harnesses, eq(harnesses.id, readingSets.harnessId))
    .where(
      and(
        eq(readingSets.shopId, shopId),
        where.ids ? inArray(readingSets.id, where.ids) : undefined,
        where.repairOrderId ? eq(readingSets.repairOrderId, where.repairOrderId) : undefined,
        where.revisionId ? eq(readingSets.revisionId, where.revisionId) : undefined,
        where.harnessId ? eq(readingSets.harnessId, where.harnessId) : undefined,
        where.takenBy ? eq(readingSets.takenBy, where.takenBy) : undefined,
      ),
    )
    .orderBy(desc(readingSets.takenAt))
    .limit(200);
  return rows.map(({ set, takerName, harnessName }) => {
    const suspects = set.suspects as { suspects?: unknown[]; nextUnplug?: unknown };
    return {
      id: set.id,
      revisionId: set.revisionId,
      harnessId: set.harnessId,
      harnessName,
      repairOrderId: set.repairOrderId,
      unitId: set.unitId,
      title: set.title,
      version: set.version,
      takenBy: set.takenBy ? { id: set.takenBy, name: takerName ?? 'former member' } : null,
      takenAt: set.takenAt.toISOString(),
      updatedAt: set.updatedAt.toISOString(),
      readings: set.marked as MarkedReading[],
      suspects: suspects.suspects ?? [],
      nextUnplug: suspects.nextUnplug ?? null,
    };
  });
}
