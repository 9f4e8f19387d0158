import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, type TestContext } from '../support/server-context';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
});
afterAll(async () => {
  await ctx?.close();
});

describe('GET /api/health', () => {
  it('answers ok with the database reachable', async () => {
    const res = await ctx.request.get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ ok: true, db: true });
  });

  it('answers 503 with db false when the database is gone', async () => {
    const broken = await createTestContext();
    await broken.deps.pool.end();
    const res = await broken.request.get('/api/health');
    expect(res.status).toBe(503);
    expect(res.body).toEqual({ ok: false, db: false });
    // close() ends the pool again; drop the database through a fresh connection.
    await broken.close().catch(() => {});
  });
});

describe('GET /api/meta', () => {
  it('tells the client whether the outbox and demo mode are on, without a session', async () => {
    const res = await ctx.request.get('/api/meta');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ outbox: true, demo: true });
    expect(typeof res.body.version).toBe('string');
  });
});

describe('unknown API routes and security headers', () => {
  it('answers JSON 404 for an unknown /api route', async () => {
    const res = await ctx.request.get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });

  it('sends a content security policy and no x-powered-by', async () => {
    const res = await ctx.request.get('/api/health');
    expect(res.headers['content-security-policy']).toContain("script-src 'self'");
    expect(res.headers['content-security-policy']).toContain("worker-src 'self' blob:");
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('answers invalid JSON with 400 invalid_json, no stack trace', async () => {
    const res = await ctx.request.post('/api/auth/sign-in').set('Content-Type', 'application/json').send('{"email":');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_json');
    expect(JSON.stringify(res.body)).not.toContain('at ');
  });
});
