import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import supertest from 'supertest';
import { createApp } from '../../server/app';
import { rateLimits, sessions } from '../../server/db/schema';
import { createTestContext, type TestContext } from '../support/server-context';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
});
afterAll(async () => {
  await ctx?.close();
});

const cookieOf = (res: { headers: Record<string, unknown> }) => {
  const set = res.headers['set-cookie'];
  return (Array.isArray(set) ? set : [set]).filter(Boolean).join('\n') as string;
};

describe('POST /api/auth/sign-in', () => {
  it('signs a demo owner in: Me and an HttpOnly SameSite=Lax session cookie (not Secure over http)', async () => {
    const res = await ctx.request.post('/api/auth/sign-in').send({ email: 'Owner@Example.com ', password: 'wirewalk-demo' });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      user: { id: ctx.demo.users.owner.id, email: 'owner@example.com', name: 'Dana Whitfield' },
      shop: { id: ctx.demo.shopId, name: 'Tamarack Valley Equipment Repair' },
      role: 'owner',
      demo: true,
    });
    const cookie = cookieOf(res);
    expect(cookie).toMatch(/^wirewalk_session=[^;]+;/);
    expect(cookie).toContain('HttpOnly');
    expect(cookie).toContain('SameSite=Lax');
    expect(cookie).not.toContain('Secure');
  });

  it.each(['lead', 'tech', 'writer'] as const)('signs the demo %s in with their role', async (role) => {
    const agent = await ctx.agent(role);
    const me = await agent.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.role).toBe(role);
    expect(me.body.shop.id).toBe(ctx.demo.shopId);
  });

  it('answers the same 401 for an unknown e-mail and a wrong password', async () => {
    const unknown = await ctx.request.post('/api/auth/sign-in').send({ email: 'nobody@example.com', password: 'wirewalk-demo' });
    const wrong = await ctx.request.post('/api/auth/sign-in').send({ email: 'tech@example.com', password: 'not-the-password' });
    expect(unknown.status).toBe(401);
    expect(wrong.status).toBe(401);
    expect(unknown.body).toEqual(wrong.body);
    expect(unknown.body.error.code).toBe('invalid_credentials');
    expect(cookieOf(unknown)).toBe('');
  });

  it('answers 400 with details for a bad body', async () => {
    const res = await ctx.request.post('/api/auth/sign-in').send({ email: 'not-an-email', password: '' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_request');
    const paths = res.body.error.details.map((d: { path: string }) => d.path);
    expect(paths).toEqual(expect.arrayContaining(['$.email', '$.password']));
  });
});

describe('GET /api/auth/me and POST /api/auth/sign-out', () => {
  it('answers 401 unauthenticated without a session, or with a made-up cookie', async () => {
    const none = await ctx.request.get('/api/auth/me');
    expect(none.status).toBe(401);
    expect(none.body.error.code).toBe('unauthenticated');
    const madeUp = await ctx.request.get('/api/auth/me').set('Cookie', 'wirewalk_session=abcdefghijklmnopqrstuvwxyz0123456789abcd');
    expect(madeUp.status).toBe(401);
  });

  it('ends the session on sign-out (the row is gone and the cookie no longer works)', async () => {
    const agent = await ctx.signIn('writer@example.com');
    expect((await agent.get('/api/auth/me')).status).toBe(200);
    const before = await ctx.db.select().from(sessions).where(eq(sessions.userId, ctx.demo.users.writer.id));
    const out = await agent.post('/api/auth/sign-out');
    expect(out.status).toBe(204);
    expect(cookieOf(out)).toMatch(/wirewalk_session=;/);
    const after = await ctx.db.select().from(sessions).where(eq(sessions.userId, ctx.demo.users.writer.id));
    expect(after.length).toBe(before.length - 1);
    expect((await agent.get('/api/auth/me')).status).toBe(401);
  });

  it('signing in again ends the session the request came with', async () => {
    const agent = await ctx.signIn('writer@example.com');
    const count = async () => (await ctx.db.select().from(sessions).where(eq(sessions.userId, ctx.demo.users.writer.id))).length;
    const before = await count();
    expect((await agent.post('/api/auth/sign-in').send({ email: 'writer@example.com', password: 'wirewalk-demo' })).status).toBe(200);
    expect(await count()).toBe(before);
    expect((await agent.get('/api/auth/me')).status).toBe(200);
  });

  it('answers sign-out without a session with 204 too', async () => {
    expect((await ctx.request.post('/api/auth/sign-out')).status).toBe(204);
  });
});

describe('Origin check on state-changing requests', () => {
  const body = { email: 'lead@example.com', password: 'wirewalk-demo' };

  it('refuses a foreign Origin with 403 foreign_origin', async () => {
    const res = await ctx.request.post('/api/auth/sign-in').set('Origin', 'http://evil.example').send(body);
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('foreign_origin');
  });

  it('refuses Origin: null', async () => {
    const res = await ctx.request.post('/api/auth/sign-in').set('Origin', 'null').send(body);
    expect(res.status).toBe(403);
  });

  it('refuses a foreign Referer when there is no Origin', async () => {
    const res = await ctx.request.post('/api/auth/sign-in').set('Referer', 'https://evil.example/page').send(body);
    expect(res.status).toBe(403);
  });

  it('accepts PUBLIC_URL as Origin, our own Host as Origin, and neither header', async () => {
    expect((await ctx.request.post('/api/auth/sign-in').set('Origin', ctx.origin).send(body)).status).toBe(200);
    expect((await ctx.request.post('/api/auth/sign-in').set('Host', 'shop.local:8080').set('Origin', 'http://shop.local:8080').send(body)).status).toBe(200);
    expect((await ctx.request.post('/api/auth/sign-in').send(body)).status).toBe(200);
  });

  it('refuses a foreign Origin on a signed-in write (cookie present)', async () => {
    const agent = await ctx.agent('owner');
    const res = await agent.patch('/api/account').set('Origin', 'https://evil.example').send({ name: 'Hijacked' });
    expect(res.status).toBe(403);
    expect((await agent.get('/api/account')).body.name).toBe('Dana Whitfield');
  });

  it('accepts an origin named in ALLOWED_ORIGINS (the Vite dev server), and only that one', async () => {
    const dev = await createTestContext({ config: { allowedOrigins: ['http://localhost:5173'] } });
    try {
      expect((await dev.request.post('/api/auth/sign-in').set('Origin', 'http://localhost:5173').send(body)).status).toBe(200);
      expect((await dev.request.post('/api/auth/sign-in').set('Origin', 'http://localhost:5174').send(body)).status).toBe(403);
    } finally {
      await dev.close();
    }
  });

  it('lets reads through whatever their Origin', async () => {
    const res = await ctx.request.get('/api/health').set('Origin', 'http://evil.example');
    expect(res.status).toBe(200);
  });
});

describe('sign-in rate limits', () => {
  it('blocks an account after 10 failed attempts from one address with 429 rate_limited, even with the right password', async () => {
    const email = ctx.otherShop.users.tech.email; // no failed attempts on it so far
    for (let i = 0; i < 10; i++) {
      const res = await ctx.request.post('/api/auth/sign-in').send({ email, password: `wrong-${i}` });
      expect(res.status).toBe(401);
    }
    const blocked = await ctx.request.post('/api/auth/sign-in').send({ email: email.toUpperCase(), password: 'wirewalk-demo' });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe('rate_limited');
    // Another account from the same address is not blocked yet.
    expect((await ctx.request.post('/api/auth/sign-in').send({ email: 'lead@example.com', password: 'wirewalk-demo' })).status).toBe(200);
  });

  it('counts in the database: a second app instance sees the same attempts; a finished window starts afresh', async () => {
    const email = ctx.otherShop.users.writer.email;
    const second = supertest(createApp(ctx.deps));
    for (let i = 0; i < 10; i++) {
      const app = i % 2 ? ctx.request : second;
      expect((await app.post('/api/auth/sign-in').send({ email, password: `wrong-${i}` })).status).toBe(401);
    }
    expect((await ctx.request.post('/api/auth/sign-in').send({ email, password: 'wirewalk-demo' })).status).toBe(429);
    expect((await second.post('/api/auth/sign-in').send({ email, password: 'wirewalk-demo' })).status).toBe(429);
    // Windows end: move every counter's end into the past.
    await ctx.db.update(rateLimits).set({ resetAt: new Date(Date.now() - 1000) });
    expect((await second.post('/api/auth/sign-in').send({ email, password: 'wirewalk-demo' })).status).toBe(200);
  });

  it('blocks an address after 50 failed attempts across accounts', async () => {
    const own = await createTestContext();
    try {
      for (let i = 0; i < 50; i++) {
        const res = await own.request.post('/api/auth/sign-in').send({ email: `guess-${i}@example.com`, password: 'whatever' });
        expect(res.status).toBe(401);
      }
      const res = await own.request.post('/api/auth/sign-in').send({ email: 'owner@example.com', password: 'wirewalk-demo' });
      expect(res.status).toBe(429);
      expect(res.body.error.code).toBe('rate_limited');
    } finally {
      await own.close();
    }
  });
});

describe('Secure cookie behind HTTPS', () => {
  it('marks the session cookie Secure when PUBLIC_URL is https', async () => {
    const https = await createTestContext({ config: { publicUrl: 'https://wirewalk.shop.example', secureCookies: true } });
    try {
      const res = await supertest(https.app).post('/api/auth/sign-in').send({ email: 'owner@example.com', password: 'wirewalk-demo' });
      expect(res.status).toBe(200);
      expect(cookieOf(res)).toContain('Secure');
      expect(res.headers['strict-transport-security']).toBeDefined();
    } finally {
      await https.close();
    }
  });
});
