import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { RequestHandler } from 'express';
import type { Pool } from '../db/client';
import { HttpError } from '../errors';
import { MariaDbRateLimitStore } from './rate-limit-store';

const WINDOW = 15 * 60 * 1000;

function limited(message: string): RequestHandler {
  return (_req, _res, next) => next(new HttpError(429, 'rate_limited', message));
}

const ip = (req: { ip?: string }) => ipKeyGenerator(req.ip ?? 'unknown');
const emailOf = (body: unknown) =>
  typeof body === 'object' && body !== null && typeof (body as { email?: unknown }).email === 'string'
    ? (body as { email: string }).email.trim().toLowerCase()
    : '';

export interface SignInLimits {
  perAccount: number;
  perIp: number;
}

/**
 * Failed sign-ins: at most `perAccount` per e-mail and address, `perIp` per address, per
 * 15 minutes (successful sign-ins do not count). Counted in MariaDB, shared by app instances.
 */
export function signInLimiters(pool: Pool, limits: SignInLimits = { perAccount: 10, perIp: 50 }): RequestHandler[] {
  const handler = limited('Too many sign-in attempts. Wait 15 minutes and try again.');
  return [
    rateLimit({
      windowMs: WINDOW,
      limit: limits.perIp,
      standardHeaders: 'draft-8',
      legacyHeaders: false,
      skipSuccessfulRequests: true,
      keyGenerator: (req) => ip(req),
      store: new MariaDbRateLimitStore(pool, 'sign-in-ip'),
      handler,
    }),
    rateLimit({
      windowMs: WINDOW,
      limit: limits.perAccount,
      standardHeaders: false,
      legacyHeaders: false,
      skipSuccessfulRequests: true,
      keyGenerator: (req) => `${ip(req)}|${emailOf(req.body)}`,
      store: new MariaDbRateLimitStore(pool, 'sign-in-account'),
      handler,
    }),
  ];
}

/** Password-reset and invitation-token requests: `limit` per address per 15 minutes. */
export function tokenLimiter(pool: Pool, name: string, limit = 20): RequestHandler {
  return rateLimit({
    windowMs: WINDOW,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => ip(req),
    store: new MariaDbRateLimitStore(pool, name),
    handler: limited('Too many requests. Wait 15 minutes and try again.'),
  });
}
