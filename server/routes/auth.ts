import { Router } from 'express';
import { and, eq, gt, isNull } from 'drizzle-orm';
import { passwordResetConfirmSchema, passwordResetRequestSchema, signInSchema } from '../../shared/api/auth';
import type { AppDeps } from '../deps';
import { newId, newToken } from '../db/ids';
import { passwordResetTokens, sessions, users } from '../db/schema';
import { HttpError, parseBody } from '../errors';
import type { AppLucia } from '../auth/lucia';
import type { SessionCache } from '../auth/session-cache';
import { requireAuth } from '../auth/middleware';
import { hashPassword, hashToken, verifyDummy, verifyPassword } from '../auth/passwords';
import { signInLimiters, tokenLimiter } from '../auth/rate-limit';
import { firstMembership, meOf, startSession } from '../auth/session';
import { passwordResetMail } from '../mail/templates';

export const RESET_TOKEN_TTL_MS = 60 * 60 * 1000;

const invalidCredentials = () => new HttpError(401, 'invalid_credentials', 'The e-mail or password is not right.');

/**
 * POST /sign-in, POST /sign-out, GET /me, POST /password-reset, POST /password-reset/confirm.
 */
export function authRouter(deps: AppDeps, lucia: AppLucia, sessionCache: SessionCache): Router {
  const router = Router();
  const { db, config } = deps;

  router.post('/sign-in', ...signInLimiters(deps.pool), async (req, res) => {
    const body = parseBody(signInSchema, req.body);
    const [user] = await db.select().from(users).where(eq(users.email, body.email)).limit(1);
    if (!user) {
      await verifyDummy(config, body.password);
      throw invalidCredentials();
    }
    if (!(await verifyPassword(user.passwordHash, body.password))) throw invalidCredentials();
    const member = await firstMembership(deps, user.id);
    if (!member) throw new HttpError(403, 'no_shop', 'This account is no longer a member of a shop. Ask the shop owner for an invitation.');
    res.json(await startSession(deps, lucia, sessionCache, req, res, user.id, member.shopId));
  });

  router.post('/sign-out', async (req, res) => {
    const auth = (req as { auth?: { sessionId: string } }).auth;
    if (auth) {
      await lucia.invalidateSession(auth.sessionId);
      sessionCache.forgetSession(auth.sessionId);
    }
    res.append('Set-Cookie', lucia.createBlankSessionCookie().serialize());
    res.status(204).end();
  });

  router.get('/me', requireAuth, (req, res) => {
    res.json(meOf(req.auth, deps.demo));
  });

  router.post('/password-reset', tokenLimiter(deps.pool, 'password-reset'), async (req, res) => {
    const body = parseBody(passwordResetRequestSchema, req.body);
    const [user] = await db.select({ id: users.id, name: users.name, email: users.email }).from(users).where(eq(users.email, body.email)).limit(1);
    // The answer goes out before any token or mail work, so that its timing and content
    // tell nobody which e-mails have accounts.
    res.status(202).json({ ok: true });
    if (!user) return;
    try {
      const token = newToken();
      await db.insert(passwordResetTokens).values({
        id: newId(),
        userId: user.id,
        tokenHash: hashToken(token),
        expiresAt: new Date(Date.now() + RESET_TOKEN_TTL_MS),
      });
      const member = await firstMembership(deps, user.id);
      const link = `${config.publicUrl}/reset-password/${token}`;
      await deps.mailer.send({ to: user.email, shopId: member?.shopId, ...passwordResetMail({ name: user.name, link }) });
    } catch (err) {
      console.error('[mail] password reset mail failed:', (err as Error).message);
    }
  });

  router.post('/password-reset/confirm', tokenLimiter(deps.pool, 'password-reset-confirm'), async (req, res) => {
    const body = parseBody(passwordResetConfirmSchema, req.body);
    const tokenHash = hashToken(body.token);
    const passwordHash = await hashPassword(config, body.password);
    const userId = await db.transaction(async (tx) => {
      const [row] = await tx
        .select({ id: passwordResetTokens.id, userId: passwordResetTokens.userId })
        .from(passwordResetTokens)
        .where(and(eq(passwordResetTokens.tokenHash, tokenHash), isNull(passwordResetTokens.usedAt), gt(passwordResetTokens.expiresAt, new Date())))
        .for('update')
        .limit(1);
      if (!row) throw new HttpError(400, 'invalid_token', 'This reset link was already used or has expired. Ask for a new one.');
      const now = new Date();
      // Single use: this token and every other open one of the same person.
      await tx.update(passwordResetTokens).set({ usedAt: now }).where(and(eq(passwordResetTokens.userId, row.userId), isNull(passwordResetTokens.usedAt)));
      await tx.update(users).set({ passwordHash }).where(eq(users.id, row.userId));
      await tx.delete(sessions).where(eq(sessions.userId, row.userId));
      return row.userId;
    });
    sessionCache.forgetUser(userId);
    res.append('Set-Cookie', lucia.createBlankSessionCookie().serialize());
    res.status(204).end();
  });

  return router;
}
