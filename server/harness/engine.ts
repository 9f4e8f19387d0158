/**
 * The engine behind the API. Published revisions never change, so each one's prepared
 * harness (and the readings per state, once computed) is kept in a bounded in-memory LRU,
 * one per app instance (safe across instances because published content is immutable).
 * Drafts are cached by revision id + version, so a save makes a new entry and the old one
 * ages out.
 */
import type { Db } from '../db/client';
import { HttpError } from '../errors';
import { Lru } from './lru';
import { readDocument } from './revisions';

type Obj = Record<string, unknown>;

export interface RevisionKey {
  id: string;
  status: 'draft' | 'published';
  version: number;
}

export interface EngineView {
  readings(state: string): unknown;
  ohms(a: string, b: string, state: string): unknown;
  walk(from: string, to: string, state?: string): unknown;
  suspects(observations: unknown[]): unknown;
  fault(fault: { kind: string; ref: string; at?: number; ohms?: number }, state?: string): unknown;
}

const published = new Lru<string, Promise<EngineView>>(64);
const drafts = new Lru<string, Promise<EngineView>>(16);

export function clearEngineCache(): void {
  for (const lru of [published, drafts]) while (lru.size) lru.delete([...(lru as unknown as { map: Map<string, unknown> }).map.keys()][0]);
}

/** The engine over a revision the caller may see (see visibleRevision). */
export function engineFor(db: Db, rev: RevisionKey): Promise<EngineView> {
  const cache = rev.status === 'published' ? published : drafts;
  const key = rev.status === 'published' ? rev.id : `${rev.id}@${rev.version}`;
  let view = cache.get(key);
  if (!view) {
    view = readDocument(db, rev.id).then(({ document }) => makeView(document));
    // A failed load is not kept.
    view.catch(() => cache.delete(key));
    cache.set(key, view);
  }
  return view;
}

function makeView(document: Obj): EngineView {
  void document;
  const unavailable = () => {
    throw new HttpError(503, 'engine_unavailable', 'The engine is not wired in yet.');
  };
  return { readings: unavailable, ohms: unavailable, walk: unavailable, suspects: unavailable, fault: unavailable };
}
