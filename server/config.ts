import path from 'node:path';

/**
 * Environment variables, parsed once.
 *
 * DEMO rule (resolved in server/start.ts):
 * - DEMO unset or DEMO=1: an empty database (no shop yet) gets the demo shop; demo mode is
 *   on while the demo owner account (owner@example.com) exists in the database.
 * - DEMO=0: nothing is seeded and demo mode is off (a warning is printed if the demo
 *   accounts exist anyway, since their password is public).
 * `config.demo` holds the explicit choice: true / false / undefined (unset).
 */
export interface Config {
  port: number;
  host: string;
  dbPort: number;
  dataDir: string;
  databaseUrl?: string;
  smtpUrl?: string;
  mailFrom: string;
  publicUrl: string;
  nodeEnv: 'production' | 'development' | 'test';
  /** true/false when DEMO is set, undefined for "demo only if the database was empty". */
  demo?: boolean;
  trustProxy: boolean | number | string;
  /** ALLOWED_ORIGINS (comma-separated origins) also count as our own, e.g. the Vite dev server. */
  allowedOrigins: string[];
  /** Session cookie `Secure`: PUBLIC_URL is https, or TRUST_PROXY is set. */
  secureCookies: boolean;
  /** argon2id cost; lowered in tests only. */
  argon2: { memoryCost: number; timeCost: number };
  version: string;
  /** Serve the built client from `clientDir` (npm start sets it; dev and tests do not). */
  serveClient: boolean;
  clientDir: string;
  /**
   * SESSION_CACHE_MS: how long one app instance may trust a session it checked (0 = check
   * every request). Revocation on another instance takes effect within this bound.
   */
  sessionCacheMs: number;
}

function int(name: string, value: string | undefined, fallback: number): number {
  if (value === undefined || value === '') return fallback;
  const n = Number(value);
  if (!Number.isInteger(n) || n < 0 || n > 65535) throw new Error(`${name} must be a port number (0-65535), got "${value}".`);
  return n;
}

function millis(name: string, value: string | undefined, fallback: number, max: number): number {
  if (value === undefined || value === '') return fallback;
  const n = Number(value);
  if (!Number.isInteger(n) || n < 0 || n > max) throw new Error(`${name} must be a whole number of milliseconds from 0 to ${max}, got "${value}".`);
  return n;
}

function flag(value: string | undefined): boolean | undefined {
  if (value === undefined || value === '') return undefined;
  return !['0', 'false', 'no', 'off'].includes(value.toLowerCase());
}

function trustProxyValue(value: string | undefined): boolean | number | string {
  if (value === undefined || value === '' || value === '0' || value === 'false') return false;
  if (value === '1' || value === 'true') return 1;
  const n = Number(value);
  return Number.isInteger(n) ? n : value;
}

export function loadConfig(env: NodeJS.ProcessEnv = process.env, overrides: Partial<Config> = {}): Config {
  const port = int('PORT', env.PORT, 3000);
  const publicUrl = (env.PUBLIC_URL || `http://127.0.0.1:${port}`).replace(/\/+$/, '');
  const trustProxy = trustProxyValue(env.TRUST_PROXY);
  const nodeEnv = env.NODE_ENV === 'production' ? 'production' : env.NODE_ENV === 'test' ? 'test' : 'development';
  const config: Config = {
    port,
    host: env.HOST || '127.0.0.1',
    dbPort: int('DB_PORT', env.DB_PORT, 3307),
    dataDir: path.resolve(env.DATA_DIR || '.data'),
    databaseUrl: env.DATABASE_URL || undefined,
    smtpUrl: env.SMTP_URL || undefined,
    mailFrom: env.MAIL_FROM || 'Wirewalk <no-reply@wirewalk.invalid>',
    publicUrl,
    nodeEnv,
    demo: flag(env.DEMO),
    trustProxy,
    allowedOrigins: (env.ALLOWED_ORIGINS ?? '').split(',').map((o) => o.trim()).filter(Boolean),
    secureCookies: publicUrl.startsWith('https:') || trustProxy !== false,
    argon2: { memoryCost: 19456, timeCost: 2 },
    version: env.npm_package_version || '0.1.0',
    serveClient: nodeEnv === 'production',
    clientDir: path.resolve('dist'),
    // A few seconds at most: it is how long a revocation can take on the other instances.
    sessionCacheMs: millis('SESSION_CACHE_MS', env.SESSION_CACHE_MS, 5000, 30_000),
  };
  return { ...config, ...overrides };
}
