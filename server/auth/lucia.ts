import { DrizzleMySQLAdapter } from '@lucia-auth/adapter-drizzle';
import { Lucia, TimeSpan } from 'lucia';
import type { Config } from '../config';
import type { Db } from '../db/client';
import { sessions, users } from '../db/schema';

export const SESSION_COOKIE = 'wirewalk_session';

/** lucia 3 over the `sessions` table; the cookie is HttpOnly, SameSite=Lax, Secure behind HTTPS. */
export function createLucia(db: Db, config: Pick<Config, 'secureCookies'>) {
  const adapter = new DrizzleMySQLAdapter(db, sessions, users);
  return new Lucia(adapter, {
    sessionExpiresIn: new TimeSpan(30, 'd'),
    sessionCookie: {
      name: SESSION_COOKIE,
      expires: true,
      attributes: { secure: config.secureCookies, sameSite: 'lax', path: '/' },
    },
    getUserAttributes: (attributes) => ({ email: attributes.email, name: attributes.name }),
    getSessionAttributes: (attributes) => ({ shopId: attributes.shopId }),
  });
}

export type AppLucia = ReturnType<typeof createLucia>;

declare module 'lucia' {
  interface Register {
    Lucia: AppLucia;
    DatabaseUserAttributes: { email: string; name: string };
    DatabaseSessionAttributes: { shopId: string };
  }
}
