import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import supertest from 'supertest';
import { createApp } from '../../server/app';
import type { AuthContext } from '../../server/auth/middleware';
import { SessionCache } from '../../server/auth/session-cache';
import { sessions } from '../../server/db/schema';
import { createTestContext, type TestContext } from '../support/server-context';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
});
afterAll(async () => {
  await ctx?.close();
});

const auth = (sessionId: string, userId = 'u1'): AuthContext => ({ sessionId, userId, shopId: 's1', shopName: 'Shop', role: 'tech', email: 'a@example.com', name: 'A' });
const far = new Date(Date.UTC(2100, 0, 1));

describe('SessionCache (a hand-driven clock)', () => {
  it('keeps an entry for ttlMs, never past the session’s own expiry', () => {
    let now = 1_000_000;
    const cache = new SessionCache(5000, 100, () => now);
    cache.set(auth('a'), far, cache.mark());
    cache.set(auth('b'), new Date(now + 1000), cache.mark());
    expect(cache.get('a')?.sessionId).toBe('a');
    expect(cache.get('b')?.sessionId).toBe('b');
    now += 1000;
    expect(cache.get('b')).toBeUndefined();
    expect(cache.get('a')).toBeDefined();
    now += 4000;
    expect(cache.get('a')).toBeUndefined();
  });

  it('forgets one session, or every session of a person', () => {
    const cache = new SessionCache(5000, 100, () => 0);
    cache.set(auth('a', 'u1'), far, cache.mark());
    cache.set(auth('b', 'u1'), far, cache.mark());
    cache.set(auth('c', 'u2'), far, cache.mark());
    cache.forgetSession('c');
    expect(cache.get('c')).toBeUndefined();
    cache.forgetUser('u1');
    expect(cache.get('a')).toBeUndefined();
    expect(cache.get('b')).toBeUndefined();
  });

  it('does not store a lookup that began before a forget (it may have read the revoked session)', () => {
    const cache = new SessionCache(5000, 100, () => 0);
    const mark = cache.mark();
    cache.forgetUser('someone else');
    cache.set(auth('a'), far, mark);
    expect(cache.get('a')).toBeUndefined();
    cache.set(auth('a'), far, cache.mark());
    expect(cache.get('a')).toBeDefined();
  });

  it('holds at most `capacity` entries (the oldest go first), and nothing with ttl 0', () => {
    const cache = new SessionCache(5000, 2, () => 0);
    for (const id of ['a', 'b', 'c']) cache.set(auth(id), far, cache.mark());
    expect(cache.size).toBe(2);
    expect(cache.get('a')).toBeUndefined();
    expect(cache.get('c')).toBeDefined();
    const off = new SessionCache(0, 2, () => 0);
    off.set(auth('a'), far, off.mark());
    expect(off.get('a')).toBeUndefined();
  });
});

describe('revocation on this instance takes effect at once (the session was just cached)', () => {
  it('sign-out (the same cookie sent again, as a copy of it would be)', async () => {
    const res = await ctx.request.post('/api/auth/sign-in').send({ email: 'writer@example.com', password: 'wirewalk-demo' });
    const cookie = String(res.headers['set-cookie']).split(';')[0];
    expect((await ctx.request.get('/api/auth/me').set('Cookie', cookie)).status).toBe(200);
    expect((await ctx.request.post('/api/auth/sign-out').set('Cookie', cookie)).status).toBe(204);
    expect((await ctx.request.get('/api/auth/me').set('Cookie', cookie)).status).toBe(401);
  });

  it('a password change ends the person’s other, cached sessions', async () => {
    const here = await ctx.signIn('tech@example.com');
    const elsewhere = await ctx.signIn('tech@example.com');
    expect((await elsewhere.get('/api/auth/me')).status).toBe(200);
    expect((await here.post('/api/account/password').send({ currentPassword: 'wirewalk-demo', newPassword: 'tech-new-password' })).status).toBe(204);
    expect((await elsewhere.get('/api/auth/me')).status).toBe(401);
    expect((await here.get('/api/auth/me')).status).toBe(200);
    expect((await here.post('/api/account/password').send({ currentPassword: 'tech-new-password', newPassword: 'wirewalk-demo' })).status).toBe(204);
  });

  it('a role change counts from the next request, and the old role’s rights go with it', async () => {
    const owner = await ctx.agent('owner');
    const lead = await ctx.signIn('lead@example.com');
    expect((await lead.get('/api/auth/me')).body.role).toBe('lead');
    const leadId = ctx.demo.users.lead.id;
    expect((await owner.patch(`/api/people/${leadId}`).send({ role: 'tech' })).status).toBe(200);
    try {
      expect((await lead.get('/api/auth/me')).body.role).toBe('tech');
      // Importing is a lead's or owner's work.
      expect((await lead.post('/api/harnesses/import').send({})).status).toBe(403);
    } finally {
      expect((await owner.patch(`/api/people/${leadId}`).send({ role: 'lead' })).status).toBe(200);
    }
    expect((await lead.get('/api/auth/me')).body.role).toBe('lead');
  });

  it('a name change shows in the next answer', async () => {
    const writer = await ctx.signIn('writer@example.com');
    const before = (await writer.get('/api/auth/me')).body.user.name;
    expect((await writer.patch('/api/account').send({ name: 'Renamed Writer' })).status).toBe(200);
    expect((await writer.get('/api/auth/me')).body.user.name).toBe('Renamed Writer');
    expect((await writer.patch('/api/account').send({ name: before })).status).toBe(200);
  });
});

describe('two app instances over one database', () => {
  it('another instance trusts its cached session for at most SESSION_CACHE_MS; with 0 it checks every request', async () => {
    const cached = createApp({ ...ctx.deps, config: { ...ctx.deps.config, sessionCacheMs: 30_000 } });
    const uncached = createApp({ ...ctx.deps, config: { ...ctx.deps.config, sessionCacheMs: 0 } });
    const res = await ctx.request.post('/api/auth/sign-in').send({ email: 'writer@example.com', password: 'wirewalk-demo' });
    const cookie = String(res.headers['set-cookie']).split(';')[0];
    expect((await supertest(cached).get('/api/auth/me').set('Cookie', cookie)).status).toBe(200);
    expect((await supertest(uncached).get('/api/auth/me').set('Cookie', cookie)).status).toBe(200);

    // Signed out through the first instance (ctx.app).
    expect((await ctx.request.post('/api/auth/sign-out').set('Cookie', cookie)).status).toBe(204);
    const sessionId = cookie.split('=')[1];
    expect(await ctx.db.select().from(sessions).where(eq(sessions.id, sessionId))).toHaveLength(0);
    expect((await ctx.request.get('/api/auth/me').set('Cookie', cookie)).status).toBe(401);
    expect((await supertest(uncached).get('/api/auth/me').set('Cookie', cookie)).status).toBe(401);
    // The documented bound: the other instance has not heard of it yet (the SessionCache tests show the entry ends).
    expect((await supertest(cached).get('/api/auth/me').set('Cookie', cookie)).status).toBe(200);
  });
});
