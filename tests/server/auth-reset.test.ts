import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { passwordResetTokens, sessions } from '../../server/db/schema';
import { createTestContext, type TestContext } from '../support/server-context';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
});
afterAll(async () => {
  await ctx?.close();
});

function tokenFrom(text: string): string {
  const m = /\/reset-password\/([A-Za-z0-9_-]+)/.exec(text);
  if (!m) throw new Error(`no reset link in:\n${text}`);
  return m[1];
}

async function requestReset(email: string) {
  const before = ctx.mail.messages.length;
  const res = await ctx.request.post('/api/auth/password-reset').send({ email });
  return { res, mail: ctx.mail.messages.slice(before) };
}

describe('password reset', () => {
  it('answers 202 for an unknown e-mail and sends nothing', async () => {
    const { res, mail } = await requestReset('nobody@example.com');
    expect(res.status).toBe(202);
    expect(mail).toHaveLength(0);
  });

  it('answers 400 with details for a bad e-mail', async () => {
    const res = await ctx.request.post('/api/auth/password-reset').send({ email: 'nope' });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('$.email');
  });

  it('mails a link; the link sets a new password once, ends every session, and cannot be reused', async () => {
    const signedIn = await ctx.signIn('tech@example.com');
    expect((await signedIn.get('/api/auth/me')).status).toBe(200);

    const { res, mail } = await requestReset('tech@example.com');
    expect(res.status).toBe(202);
    expect(mail).toHaveLength(1);
    expect(mail[0].envelopeTo).toEqual(['tech@example.com']);
    expect(mail[0].subject).toBe('Reset your Wirewalk password');
    expect(mail[0].shopId).toBe(ctx.demo.shopId);
    const token = tokenFrom(mail[0].text);
    expect(mail[0].text).toContain(`${ctx.origin}/reset-password/${token}`);
    expect(mail[0].html).toContain(`/reset-password/${token}`);
    // Only the hash is stored.
    const rows = await ctx.db.select().from(passwordResetTokens).where(eq(passwordResetTokens.userId, ctx.demo.users.tech.id));
    expect(rows.some((r) => r.tokenHash === token)).toBe(false);

    const weak = await ctx.request.post('/api/auth/password-reset/confirm').send({ token, password: 'short' });
    expect(weak.status).toBe(400);
    expect(weak.body.error.details[0].path).toBe('$.password');

    const ok = await ctx.request.post('/api/auth/password-reset/confirm').send({ token, password: 'a-brand-new-password' });
    expect(ok.status).toBe(204);
    expect(await ctx.db.select().from(sessions).where(eq(sessions.userId, ctx.demo.users.tech.id))).toHaveLength(0);
    expect((await signedIn.get('/api/auth/me')).status).toBe(401);

    expect((await ctx.request.post('/api/auth/sign-in').send({ email: 'tech@example.com', password: 'wirewalk-demo' })).status).toBe(401);
    expect((await ctx.request.post('/api/auth/sign-in').send({ email: 'tech@example.com', password: 'a-brand-new-password' })).status).toBe(200);

    const again = await ctx.request.post('/api/auth/password-reset/confirm').send({ token, password: 'yet-another-password' });
    expect(again.status).toBe(400);
    expect(again.body.error.code).toBe('invalid_token');
    expect((await ctx.request.post('/api/auth/sign-in').send({ email: 'tech@example.com', password: 'yet-another-password' })).status).toBe(401);
  });

  it('refuses an expired token with 400 invalid_token', async () => {
    const { mail } = await requestReset('writer@example.com');
    const token = tokenFrom(mail[0].text);
    await ctx.db.update(passwordResetTokens).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(passwordResetTokens.userId, ctx.demo.users.writer.id));
    const res = await ctx.request.post('/api/auth/password-reset/confirm').send({ token, password: 'a-brand-new-password' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_token');
  });

  it('expires links after one hour', async () => {
    const { mail } = await requestReset('lead@example.com');
    expect(mail).toHaveLength(1);
    const [row] = await ctx.db.select().from(passwordResetTokens).where(eq(passwordResetTokens.userId, ctx.demo.users.lead.id));
    const ttl = row.expiresAt.getTime() - row.createdAt.getTime();
    expect(ttl).toBeGreaterThan(59 * 60 * 1000);
    expect(ttl).toBeLessThanOrEqual(60 * 60 * 1000 + 1000);
  });

  it('using one link voids the older open links of the same person', async () => {
    const first = tokenFrom((await requestReset('owner@example.com')).mail[0].text);
    const second = tokenFrom((await requestReset('owner@example.com')).mail[0].text);
    expect((await ctx.request.post('/api/auth/password-reset/confirm').send({ token: second, password: 'owner-new-password' })).status).toBe(204);
    const res = await ctx.request.post('/api/auth/password-reset/confirm').send({ token: first, password: 'owner-other-password' });
    expect(res.status).toBe(400);
  });

  it('refuses a made-up token', async () => {
    const res = await ctx.request.post('/api/auth/password-reset/confirm').send({ token: 'x'.repeat(43), password: 'a-brand-new-password' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_token');
  });
});
