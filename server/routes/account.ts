import { Router } from 'express';
import { and, eq, ne } from 'drizzle-orm';
import { accountUpdateSchema, passwordChangeSchema } from '../../shared/api/auth';
import type { AppDeps } from '../deps';
import { sessions, users } from '../db/schema';
import { HttpError, parseBody } from '../errors';
import type { AppLucia } from '../auth/lucia';
import type { SessionCache } from '../auth/session-cache';
import { requireAuth } from '../auth/middleware';
import { hashPassword, verifyPassword } from '../auth/passwords';

/** The signed-in member's own account: any role. */
export function accountRouter(deps: AppDeps, _lucia: AppLucia, sessionCache: SessionCache): Router {
  const router = Router();
  const { db, config } = deps;
  router.use(requireAuth);

  router.get('/', (req, res) => {
    const { name, email, role, shopName } = req.auth;
    res.json({ name, email, role, shopName });
  });

  router.patch('/', async (req, res) => {
    const body = parseBody(accountUpdateSchema, req.body);
    await db.update(users).set({ name: body.name }).where(eq(users.id, req.auth.userId));
    sessionCache.forgetUser(req.auth.userId);
    const { email, role, shopName } = req.auth;
    res.json({ name: body.name, email, role, shopName });
  });

  router.post('/password', async (req, res) => {
    const body = parseBody(passwordChangeSchema, req.body);
    const [user] = await db.select({ passwordHash: users.passwordHash }).from(users).where(eq(users.id, req.auth.userId)).limit(1);
    if (!user || !(await verifyPassword(user.passwordHash, body.currentPassword))) {
      throw new HttpError(400, 'wrong_password', 'The current password is not right.', [{ path: '$.currentPassword', message: 'The current password is not right.' }]);
    }
    const passwordHash = await hashPassword(config, body.newPassword);
    await db.transaction(async (tx) => {
      await tx.update(users).set({ passwordHash }).where(eq(users.id, req.auth.userId));
      // Every other session of this person ends; this one stays.
      await tx.delete(sessions).where(and(eq(sessions.userId, req.auth.userId), ne(sessions.id, req.auth.sessionId)));
    });
    sessionCache.forgetUser(req.auth.userId);
    res.status(204).end();
  });

  return router;
}
