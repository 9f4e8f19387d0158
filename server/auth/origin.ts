import type { RequestHandler } from 'express';
import type { Config } from '../config';
import { HttpError } from '../errors';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

function hostOf(value: string): string | null {
  try {
    return new URL(value).host.toLowerCase();
  } catch {
    return null;
  }
}

/**
 * State-changing requests whose Origin (or, without it, Referer) names another host get 403
 * `foreign_origin`. Requests with neither header (scripts, curl) pass. Our own host is the
 * request's Host (X-Forwarded-Host too when TRUST_PROXY is set), PUBLIC_URL's host, or one of
 * ALLOWED_ORIGINS (npm run dev sets it to the Vite dev server, whose proxy rewrites Host).
 */
export function originCheck(config: Pick<Config, 'publicUrl' | 'trustProxy' | 'allowedOrigins'>): RequestHandler {
  const publicHost = hostOf(config.publicUrl);
  const extraHosts = (config.allowedOrigins ?? []).map(hostOf).filter((h): h is string => h !== null);
  return (req, _res, next) => {
    if (SAFE.has(req.method)) return next();
    const origin = req.headers.origin;
    const referer = req.headers.referer;
    const claimed = origin !== undefined ? origin : referer;
    if (claimed === undefined) return next();
    const host = hostOf(claimed);
    const allowed = new Set<string>();
    if (req.headers.host) allowed.add(req.headers.host.toLowerCase());
    const forwarded = req.headers['x-forwarded-host'];
    if (config.trustProxy !== false && typeof forwarded === 'string') allowed.add(forwarded.split(',')[0].trim().toLowerCase());
    if (publicHost) allowed.add(publicHost);
    for (const h of extraHosts) allowed.add(h);
    if (host && allowed.has(host)) return next();
    next(new HttpError(403, 'foreign_origin', 'This request came from another site and was refused.'));
  };
}
