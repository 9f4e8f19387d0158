import { createHash } from 'node:crypto';
import { Router } from 'express';
import { and, eq, inArray, like, or } from 'drizzle-orm';
import { alias } from 'drizzle-orm/mysql-core';
import { searchQuerySchema, type SearchResult } from '../../shared/api/harness';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import { components, equipmentModels, harnesses, pins, revisions, wires } from '../db/schema/harness';
import { parseQuery } from '../errors';
import { requireAuth } from '../auth/middleware';
import { modelDisplayName } from '../harness/harnesses';
import { Lru } from '../harness/lru';
import { seesDrafts, type Viewer } from '../harness/revisions';
import { ShopCache, shopGeneration } from '../harness/shop-changes';

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

interface Scope {
  revisionIds: string[];
  /** Everything the results depend on besides content that never changes at a given version. */
  fingerprint: string;
  info: Map<string, { harnessId: string; harnessName: string; status: 'draft' | 'published'; modelName?: string }>;
}

/**
 * Scopes by shop and whether drafts count, for a moment (every harness write in the shop on
 * this instance voids them; shop-changes.ts has the bound for the others).
 */
const scopeCache = new ShopCache<Scope>(1000);

/** The revisions a viewer searches: each harness's latest published one, and its draft for leads and owners. */
async function searchScope(db: Db, viewer: Viewer): Promise<Scope> {
  const key = `${viewer.shopId}|${seesDrafts(viewer) ? 'drafts' : 'published'}`;
  const kept = scopeCache.get(key);
  if (kept) return kept;
  const generation = shopGeneration(viewer.shopId);
  const scope = await readScope(db, viewer);
  scopeCache.set(key, viewer.shopId, scope, generation);
  return scope;
}

async function readScope(db: Db, viewer: Viewer): Promise<Scope> {
  const rows = await db
    .select({
      id: revisions.id,
      harnessId: revisions.harnessId,
      number: revisions.number,
      status: revisions.status,
      version: revisions.version,
      harnessName: harnesses.name,
      maker: equipmentModels.maker,
      model: equipmentModels.model,
      series: equipmentModels.series,
    })
    .from(revisions)
    .innerJoin(harnesses, eq(harnesses.id, revisions.harnessId))
    .leftJoin(equipmentModels, eq(equipmentModels.id, harnesses.modelId))
    .where(and(eq(revisions.shopId, viewer.shopId), seesDrafts(viewer) ? undefined : eq(revisions.status, 'published')));
  const latest = new Map<string, (typeof rows)[number]>();
  const drafts: typeof rows = [];
  for (const r of rows) {
    if (r.status === 'draft') drafts.push(r);
    else if ((latest.get(r.harnessId)?.number ?? 0) < r.number) latest.set(r.harnessId, r);
  }
  const chosen = [...latest.values(), ...drafts];
  const info: Scope['info'] = new Map();
  for (const r of chosen) {
    info.set(r.id, {
      harnessId: r.harnessId,
      harnessName: r.harnessName,
      status: r.status,
      ...(r.maker && r.model ? { modelName: modelDisplayName({ maker: r.maker, model: r.model, series: r.series }) } : {}),
    });
  }
  const fingerprint = chosen
    .map((r) => `${r.id}@${r.version}:${r.harnessName}:${r.maker ?? ''}:${r.model ?? ''}:${r.series ?? ''}`)
    .sort()
    .join('|');
  return { revisionIds: chosen.map((r) => r.id), info, fingerprint };
}

/**
 * Results by query and scope fingerprint. A published revision's content never changes and a
 * draft's changes only with its version, both part of the fingerprint (as are the harness and
 * model names shown), so an entry can never be stale; each app instance keeps its own.
 */
const resultCache = new Lru<string, SearchResult[]>(1000);

const pinRefRe = /^([A-Za-z0-9_-]{1,32})\.([A-Za-z0-9_+-]{1,16})$/;

/**
 * Search across the shop's harnesses: a pin by `COMPONENT.PIN`, a circuit number, an IEC 60757
 * colour code (`RD`, `RD/WH`), a component or connector id or label, a cavity function.
 * Id, circuit and colour matches use indexes (prefix matches); label and function match anywhere.
 */
export async function searchHarnesses(db: Db, viewer: Viewer, q: string, limit: number): Promise<SearchResult[]> {
  const scope = await searchScope(db, viewer);
  if (!scope.revisionIds.length) return [];
  const key = createHash('sha256').update(`${viewer.shopId}\n${q}\n${limit}\n${scope.fingerprint}`).digest('base64url');
  const cached = resultCache.get(key);
  if (cached) return cached;
  const results = await runSearch(db, viewer, scope, q, limit);
  resultCache.set(key, results);
  return results;
}

async function runSearch(db: Db, viewer: Viewer, scope: Scope, q: string, limit: number): Promise<SearchResult[]> {
  const ids = scope.revisionIds;
  const prefix = `${escapeLike(q)}%`;
  const anywhere = `%${escapeLike(q)}%`;
  const fromPin = alias(pins, 'from_pin');
  const fromComponent = alias(components, 'from_component');
  const results: SearchResult[] = [];
  const seen = new Set<string>();
  const push = (r: SearchResult) => {
    const key = `${r.revisionId}|${r.kind}|${r.componentId}|${r.pinId ?? ''}|${r.label}`;
    if (seen.has(key) || results.length >= limit) return;
    seen.add(key);
    results.push(r);
  };
  const base = (revisionId: string) => {
    const i = scope.info.get(revisionId)!;
    return { harnessId: i.harnessId, harnessName: i.harnessName, revisionId, revisionStatus: i.status, ...(i.modelName ? { modelName: i.modelName } : {}) };
  };

  const ref = pinRefRe.exec(q);
  const [pinHits, wireHits, componentHits, functionHits] = await Promise.all([
    // An exact pin reference, `X12.3`.
    ref
      ? db
          .select({ revisionId: pins.revisionId, componentKey: components.key, componentLabel: components.label, pinKey: pins.key, function: pins.function })
          .from(pins)
          .innerJoin(components, eq(components.id, pins.componentId))
          .where(and(eq(components.shopId, viewer.shopId), eq(components.key, ref[1]), eq(pins.key, ref[2]), inArray(components.revisionId, ids)))
          .limit(limit)
      : Promise.resolve([]),
    // Circuit numbers, colour codes, wire ids (each on its own index); linked to the wire's first pin.
    Promise.all(
      [
        like(wires.circuit, prefix),
        or(eq(wires.color, q), like(wires.color, `${escapeLike(q)}/%`)),
        eq(wires.key, q),
      ].map((match) =>
        db
          .select({
            revisionId: wires.revisionId,
            key: wires.key,
            circuit: wires.circuit,
            color: wires.color,
            label: wires.label,
            componentKey: fromComponent.key,
            pinKey: fromPin.key,
            function: fromPin.function,
          })
          .from(wires)
          .innerJoin(fromPin, eq(fromPin.id, wires.fromPinId))
          .innerJoin(fromComponent, eq(fromComponent.id, fromPin.componentId))
          .where(and(eq(wires.shopId, viewer.shopId), match, inArray(wires.revisionId, ids)))
          .orderBy(wires.circuit, wires.key)
          .limit(limit),
      ),
    ).then(([byCircuit, byColor, byKey]) => [...byKey, ...byCircuit.sort((a, b) => Number(b.circuit === q) - Number(a.circuit === q)), ...byColor]),
    // Component and connector ids (prefix, indexed) and labels (anywhere).
    Promise.all(
      [like(components.key, prefix), like(components.label, anywhere)].map((match) =>
        db
          .select({ revisionId: components.revisionId, key: components.key, kind: components.kind, label: components.label })
          .from(components)
          .where(and(eq(components.shopId, viewer.shopId), match, inArray(components.revisionId, ids)))
          .orderBy(components.key)
          .limit(limit),
      ),
    ).then(([byKey, byLabel]) => [...byKey.sort((a, b) => Number(b.key === q) - Number(a.key === q)), ...byLabel]),
    // Cavity and pin functions (anywhere).
    q.length >= 2
      ? db
          .select({ revisionId: pins.revisionId, componentKey: components.key, componentLabel: components.label, pinKey: pins.key, function: pins.function })
          .from(pins)
          .innerJoin(components, eq(components.id, pins.componentId))
          .where(and(eq(pins.shopId, viewer.shopId), like(pins.function, anywhere), inArray(pins.revisionId, ids)))
          .orderBy(components.key, pins.position)
          .limit(limit)
      : Promise.resolve([]),
  ]);

  for (const p of pinHits) {
    push({ kind: 'pin', ...base(p.revisionId), componentId: p.componentKey, pinId: p.pinKey, label: p.function ?? p.componentLabel ?? `${p.componentKey}.${p.pinKey}`, ...(p.function ? { function: p.function } : {}), matched: 'pin' });
  }
  for (const w of wireHits) {
    const matched = w.key === q ? 'wire' : w.circuit && w.circuit.toLowerCase().startsWith(q.toLowerCase()) ? 'circuit' : 'color';
    push({
      kind: 'wire',
      ...base(w.revisionId),
      componentId: w.componentKey,
      pinId: w.pinKey,
      label: w.label ?? w.key,
      ...(w.circuit ? { circuit: w.circuit } : {}),
      ...(w.color ? { color: w.color } : {}),
      ...(w.function ? { function: w.function } : {}),
      matched,
    });
  }
  for (const c of componentHits) {
    push({ kind: 'component', ...base(c.revisionId), componentId: c.key, label: c.label ?? c.key, matched: c.key.toLowerCase().startsWith(q.toLowerCase()) ? 'component' : 'label' });
  }
  for (const p of functionHits) {
    push({ kind: 'pin', ...base(p.revisionId), componentId: p.componentKey, pinId: p.pinKey, label: p.function ?? `${p.componentKey}.${p.pinKey}`, ...(p.function ? { function: p.function } : {}), matched: 'function' });
  }
  return results;
}

/** `GET /api/search?q=…&limit=` → `{ results: SearchResult[] }` */
export function searchRouter(deps: AppDeps): Router {
  const router = Router();
  router.get('/', requireAuth, async (req, res) => {
    const q = parseQuery(searchQuerySchema, req.query);
    res.json({ q: q.q, results: await searchHarnesses(deps.db, req.auth, q.q, q.limit) });
  });
  return router;
}
