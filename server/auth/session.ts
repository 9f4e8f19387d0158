import type { Request, Response } from 'express';
import { and, asc, eq } from 'drizzle-orm';
import type { Me } from '../../shared/api/auth';
import type { AppDeps } from '../deps';
import { memberships, shops, users } from '../db/schema';
import { HttpError } from '../errors';
import type { AppLucia } from './lucia';
import type { AuthContext } from './middleware';
import type { SessionCache } from './session-cache';

/** The member's first shop (one shop per user for now). */
export async function firstMembership(deps: Pick<AppDeps, 'db'>, userId: string) {
  const [member] = await deps.db
    .select({ shopId: memberships.shopId, shopName: shops.name, role: memberships.role })
    .from(memberships)
    .innerJoin(shops, eq(shops.id, memberships.shopId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(memberships.createdAt))
    .limit(1);
  return member ?? null;
}

/**
 * Starts a session in `shopId` for `userId`, sets the cookie and answers `Me`. The session
 * the request came with, if any, ends (a new sign-in never reuses an old session id).
 */
export async function startSession(deps: AppDeps, lucia: AppLucia, sessionCache: SessionCache, req: Request, res: Response, userId: string, shopId: string): Promise<Me> {
  const [row] = await deps.db
    .select({ email: users.email, name: users.name, role: memberships.role, shopName: shops.name })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .innerJoin(shops, eq(shops.id, memberships.shopId))
    .where(and(eq(memberships.userId, userId), eq(memberships.shopId, shopId)))
    .limit(1);
  if (!row) throw new HttpError(403, 'no_shop', 'This account is not a member of a shop.');
  const previous = (req as { auth?: AuthContext }).auth?.sessionId;
  if (previous) {
    await lucia.invalidateSession(previous);
    sessionCache.forgetSession(previous);
  }
  const session = await lucia.createSession(userId, { shopId });
  res.append('Set-Cookie', lucia.createSessionCookie(session.id).serialize());
  return { user: { id: userId, email: row.email, name: row.name }, shop: { id: shopId, name: row.shopName }, role: row.role, demo: deps.demo };
}

export function meOf(auth: AuthContext, demo: boolean): Me {
  return { user: { id: auth.userId, email: auth.email, name: auth.name }, shop: { id: auth.shopId, name: auth.shopName }, role: auth.role, demo };
}
