import { Router } from 'express';
import { and, eq, isNull, sql } from 'drizzle-orm';
import { invitationAcceptSchema } from '../../shared/api/auth';
import type { AppDeps } from '../deps';
import { newId } from '../db/ids';
import { invitations, memberships, sessions, shops, users } from '../db/schema';
import { HttpError, parseBody } from '../errors';
import type { AppLucia } from '../auth/lucia';
import type { SessionCache } from '../auth/session-cache';
import { hashPassword, hashToken } from '../auth/passwords';
import { tokenLimiter } from '../auth/rate-limit';
import { startSession } from '../auth/session';

const notFound = () => new HttpError(404, 'invitation_not_found', 'This invitation does not exist or was withdrawn.');

/** GET /:token and POST /:token/accept: the invitation link, without a session. */
export function invitationsRouter(deps: AppDeps, lucia: AppLucia, sessionCache: SessionCache): Router {
  const router = Router();
  const { db, config } = deps;

  async function find(token: string) {
    const [row] = await db
      .select({
        id: invitations.id,
        shopId: invitations.shopId,
        email: invitations.email,
        role: invitations.role,
        expiresAt: invitations.expiresAt,
        acceptedAt: invitations.acceptedAt,
        shopName: shops.name,
        invitedBy: users.name,
      })
      .from(invitations)
      .innerJoin(shops, eq(shops.id, invitations.shopId))
      .innerJoin(users, eq(users.id, invitations.invitedBy))
      .where(eq(invitations.tokenHash, hashToken(token)))
      .limit(1);
    if (!row) throw notFound();
    if (row.acceptedAt) throw new HttpError(410, 'invitation_used', 'This invitation was already accepted. Sign in instead.');
    if (row.expiresAt.getTime() <= Date.now()) throw new HttpError(410, 'invitation_expired', 'This invitation has expired. Ask the shop owner for a new one.');
    return row;
  }

  router.get('/:token', tokenLimiter(deps.pool, 'invitation-read', 60), async (req, res) => {
    const row = await find(String(req.params.token));
    res.json({ email: row.email, role: row.role, shopName: row.shopName, invitedBy: row.invitedBy });
  });

  router.post('/:token/accept', tokenLimiter(deps.pool, 'invitation-accept'), async (req, res) => {
    const body = parseBody(invitationAcceptSchema, req.body);
    const invitation = await find(String(req.params.token));
    const passwordHash = await hashPassword(config, body.password);
    const userId = await db.transaction(async (tx) => {
      const claimed = await tx
        .update(invitations)
        .set({ acceptedAt: new Date() })
        .where(and(eq(invitations.id, invitation.id), isNull(invitations.acceptedAt)));
      if (claimed[0].affectedRows !== 1) throw new HttpError(410, 'invitation_used', 'This invitation was already accepted. Sign in instead.');
      const [existing] = await tx.select({ id: users.id }).from(users).where(eq(users.email, invitation.email)).for('update').limit(1);
      let id: string;
      if (existing) {
        const [{ count }] = await tx.select({ count: sql<number>`count(*)` }).from(memberships).where(eq(memberships.userId, existing.id));
        if (Number(count) > 0) throw new HttpError(409, 'account_exists', 'This e-mail already has a Wirewalk account. Sign in with it instead.');
        // Someone removed from their shop earlier: the link proves the address; they start afresh.
        id = existing.id;
        await tx.update(users).set({ name: body.name, passwordHash }).where(eq(users.id, id));
        await tx.delete(sessions).where(eq(sessions.userId, id));
      } else {
        id = newId();
        await tx.insert(users).values({ id, email: invitation.email, name: body.name, passwordHash });
      }
      await tx.insert(memberships).values({ id: newId(), shopId: invitation.shopId, userId: id, role: invitation.role });
      return id;
    });
    // A returning person's old sessions ended in the transaction.
    sessionCache.forgetUser(userId);
    res.json(await startSession(deps, lucia, sessionCache, req, res, userId, invitation.shopId));
  });

  return router;
}
