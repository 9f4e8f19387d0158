import { and, eq } from 'drizzle-orm';
import type { RequestHandler } from 'express';
import type { Role } from '../../shared/api/auth';
import type { AppDeps } from '../deps';
import { memberships, shops } from '../db/schema';
import { HttpError } from '../errors';
import type { AppLucia } from './lucia';
import type { SessionCache } from './session-cache';

/** Who is asking: put on the request by `loadSession`, guaranteed by `requireAuth`. */
export interface AuthContext {
  userId: string;
  shopId: string;
  shopName: string;
  role: Role;
  email: string;
  name: string;
  sessionId: string;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      /**
       * The signed-in member. Typed as always present for the routes behind `requireAuth`
       * (or `requireRole`); on routes without them it is undefined at run time.
       */
      auth: AuthContext;
    }
  }
}

/**
 * Reads the session cookie (lucia), checks the session's shop membership and sets `req.auth`.
 * Never answers by itself: without a valid session the request goes on unauthenticated.
 * Mounted once on /api by createApp. A session checked in the last few seconds is taken from
 * `cache` (see SessionCache for the bound and what forgets it).
 */
export function loadSession(deps: Pick<AppDeps, 'db'>, lucia: AppLucia, cache: SessionCache): RequestHandler {
  return async (req, res, next) => {
    try {
      const sessionId = lucia.readSessionCookie(req.headers.cookie ?? '');
      if (!sessionId) return next();
      const known = cache.get(sessionId);
      if (known) {
        req.auth = known;
        return next();
      }
      const mark = cache.mark();
      const { session, user } = await lucia.validateSession(sessionId);
      if (!session) {
        res.append('Set-Cookie', lucia.createBlankSessionCookie().serialize());
        return next();
      }
      const [member] = await deps.db
        .select({ role: memberships.role, shopName: shops.name })
        .from(memberships)
        .innerJoin(shops, eq(shops.id, memberships.shopId))
        .where(and(eq(memberships.userId, user.id), eq(memberships.shopId, session.shopId)))
        .limit(1);
      if (!member) {
        // Removed from the shop: the session ends.
        await lucia.invalidateSession(session.id);
        res.append('Set-Cookie', lucia.createBlankSessionCookie().serialize());
        return next();
      }
      if (session.fresh) res.append('Set-Cookie', lucia.createSessionCookie(session.id).serialize());
      // Frozen: the same object serves the next requests from the cache.
      req.auth = Object.freeze({
        userId: user.id,
        shopId: session.shopId,
        shopName: member.shopName,
        role: member.role,
        email: user.email,
        name: user.name,
        sessionId: session.id,
      });
      cache.set(req.auth, session.expiresAt, mark);
      next();
    } catch (err) {
      next(err);
    }
  };
}

const authOrUndefined = (req: { auth?: AuthContext }) => req.auth;

/** 401 `unauthenticated` without a valid session. */
export const requireAuth: RequestHandler = (req, _res, next) => {
  if (!authOrUndefined(req)) return next(new HttpError(401, 'unauthenticated', 'Sign in to continue.'));
  next();
};

/** 401 without a session, 403 `forbidden` when the member's role is not one of `allowed`. */
export function requireRole(...allowed: Role[]): RequestHandler {
  return (req, _res, next) => {
    const auth = authOrUndefined(req);
    if (!auth) return next(new HttpError(401, 'unauthenticated', 'Sign in to continue.'));
    if (!allowed.includes(auth.role)) return next(new HttpError(403, 'forbidden', 'Your role does not allow this.'));
    next();
  };
}
