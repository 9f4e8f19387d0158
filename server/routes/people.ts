import { Router } from 'express';
import { and, asc, desc, eq, isNull, ne } from 'drizzle-orm';
import { z } from 'zod';
import { invitationCreateSchema, roleChangeSchema } from '../../shared/api/auth';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import { newId, newToken } from '../db/ids';
import { invitations, memberships, sessions, users } from '../db/schema';
import { HttpError, parseBody, parseParams } from '../errors';
import type { AppLucia } from '../auth/lucia';
import type { SessionCache } from '../auth/session-cache';
import { requireRole } from '../auth/middleware';
import { hashToken } from '../auth/passwords';
import { invitationMail } from '../mail/templates';

export const INVITATION_TTL_MS = 7 * 24 * 60 * 60 * 1000;

const idParams = z.object({ id: z.string().min(1).max(26) });
const userParams = z.object({ userId: z.string().min(1).max(26) });
const personNotFound = () => new HttpError(404, 'not_found', 'That person is not in this shop.');
const lastOwner = () => new HttpError(409, 'last_owner', 'A shop needs at least one owner: make someone else owner first.');

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

async function person(db: Db | Tx, shopId: string, userId: string) {
  const [row] = await db
    .select({ userId: users.id, name: users.name, email: users.email, role: memberships.role, joinedAt: memberships.createdAt })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.shopId, shopId), eq(memberships.userId, userId)))
    .limit(1);
  return row ?? null;
}

/** Locks the shop's owner memberships and counts them (other than `exceptUserId`). */
async function otherOwners(tx: Tx, shopId: string, exceptUserId: string): Promise<number> {
  const rows = await tx
    .select({ id: memberships.id })
    .from(memberships)
    .where(and(eq(memberships.shopId, shopId), eq(memberships.role, 'owner'), ne(memberships.userId, exceptUserId)))
    .for('update');
  return rows.length;
}

/** The shop's people and open invitations; owner only. */
export function peopleRouter(deps: AppDeps, _lucia: AppLucia, sessionCache: SessionCache): Router {
  const router = Router();
  const { db, config } = deps;
  router.use(requireRole('owner'));

  router.get('/', async (req, res) => {
    const shopId = req.auth.shopId;
    const [people, open] = await Promise.all([
      db
        .select({ userId: users.id, name: users.name, email: users.email, role: memberships.role, joinedAt: memberships.createdAt })
        .from(memberships)
        .innerJoin(users, eq(users.id, memberships.userId))
        .where(eq(memberships.shopId, shopId))
        .orderBy(asc(users.name)),
      db
        .select({ id: invitations.id, email: invitations.email, role: invitations.role, invitedAt: invitations.createdAt, expiresAt: invitations.expiresAt })
        .from(invitations)
        .where(and(eq(invitations.shopId, shopId), isNull(invitations.acceptedAt)))
        .orderBy(desc(invitations.createdAt)),
    ]);
    res.json({ people, invitations: open });
  });

  router.post('/invitations', async (req, res) => {
    const body = parseBody(invitationCreateSchema, req.body);
    const shopId = req.auth.shopId;
    const [existing] = await db
      .select({ id: users.id, shopId: memberships.shopId })
      .from(users)
      .innerJoin(memberships, eq(memberships.userId, users.id))
      .where(eq(users.email, body.email))
      .limit(1);
    if (existing?.shopId === shopId) throw new HttpError(409, 'already_member', `${body.email} is already in this shop.`);
    if (existing) throw new HttpError(409, 'account_exists', `${body.email} already has a Wirewalk account with another shop.`);
    const token = newToken();
    const id = newId();
    const now = new Date();
    const expiresAt = new Date(now.getTime() + INVITATION_TTL_MS);
    await db.transaction(async (tx) => {
      // A new invitation to the same address replaces the open ones.
      await tx.delete(invitations).where(and(eq(invitations.shopId, shopId), eq(invitations.email, body.email), isNull(invitations.acceptedAt)));
      await tx.insert(invitations).values({ id, shopId, email: body.email, role: body.role, tokenHash: hashToken(token), invitedBy: req.auth.userId, createdAt: now, expiresAt });
    });
    try {
      await deps.mailer.send({
        to: body.email,
        shopId,
        ...invitationMail({ inviter: req.auth.name, shopName: req.auth.shopName, role: body.role, link: `${config.publicUrl}/invite/${token}`, expiresAt }),
      });
    } catch (err) {
      await db.delete(invitations).where(eq(invitations.id, id));
      console.error('[mail] invitation mail failed:', (err as Error).message);
      throw new HttpError(502, 'mail_failed', 'The invitation e-mail could not be sent, so no invitation was made. Try again later.');
    }
    res.status(201).json({ id, email: body.email, role: body.role, invitedAt: now, expiresAt });
  });

  router.delete('/invitations/:id', async (req, res) => {
    const { id } = parseParams(idParams, req.params);
    const result = await db.delete(invitations).where(and(eq(invitations.id, id), eq(invitations.shopId, req.auth.shopId), isNull(invitations.acceptedAt)));
    if (result[0].affectedRows !== 1) throw new HttpError(404, 'not_found', 'That invitation is not open in this shop.');
    res.status(204).end();
  });

  router.patch('/:userId', async (req, res) => {
    const { userId } = parseParams(userParams, req.params);
    const body = parseBody(roleChangeSchema, req.body);
    const shopId = req.auth.shopId;
    const updated = await db.transaction(async (tx) => {
      const current = await person(tx, shopId, userId);
      if (!current) throw personNotFound();
      if (current.role === 'owner' && body.role !== 'owner' && (await otherOwners(tx, shopId, userId)) === 0) throw lastOwner();
      await tx.update(memberships).set({ role: body.role }).where(and(eq(memberships.shopId, shopId), eq(memberships.userId, userId)));
      return { ...current, role: body.role };
    });
    // The new role counts from their next request (on other instances within SESSION_CACHE_MS).
    sessionCache.forgetUser(userId);
    res.json(updated);
  });

  router.delete('/:userId', async (req, res) => {
    const { userId } = parseParams(userParams, req.params);
    const shopId = req.auth.shopId;
    await db.transaction(async (tx) => {
      const current = await person(tx, shopId, userId);
      if (!current) throw personNotFound();
      if (current.role === 'owner' && (await otherOwners(tx, shopId, userId)) === 0) throw lastOwner();
      await tx.delete(memberships).where(and(eq(memberships.shopId, shopId), eq(memberships.userId, userId)));
      await tx.delete(sessions).where(and(eq(sessions.userId, userId), eq(sessions.shopId, shopId)));
    });
    sessionCache.forgetUser(userId);
    res.status(204).end();
  });

  return router;
}
