import { Router } from 'express';
import type { AppDeps } from '../deps';

/** `GET /api/health` → `{ ok, db }`; `GET /api/meta` → `{ outbox, demo, version }` (no auth). */
export function healthRouter(deps: AppDeps): Router {
  const router = Router();
  router.get('/health', async (_req, res) => {
    let db = false;
    try {
      await deps.pool.query('select 1');
      db = true;
    } catch {
      db = false;
    }
    res.status(db ? 200 : 503).json({ ok: db, db });
  });
  router.get('/meta', (_req, res) => {
    res.json({ outbox: deps.outbox, demo: deps.demo, version: deps.config.version });
  });
  return router;
}
