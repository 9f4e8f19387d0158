import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { passwordResetTokens, sessions } from '../../server/db/schema';
import { hashToken } from '../../server/auth/passwords';
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

/** The reset mail is sent after the 202 answer: wait for it. */
async function requestReset(email: string) {
  const from = ctx.mail.messages.length;
  const res = await ctx.request.post('/api/auth/password-reset').send({ email });
  const message = await ctx.mail.waitFor((m) => m.envelopeTo.includes(email), { from });
  return { res, mail: [message], from };
}

describe('password reset', () => {
  it('answers 202 for an unknown e-mail and sends nothing', async () => {
    const from = ctx.mail.messages.length;
    const res = await ctx.request.post('/api/auth/password-reset').send({ email: 'nobody@example.com' });
    expect(res.status).toBe(202);
    expect(res.body).toEqual({ ok: true });
    // A known address asked right after gets its mail; by then nothing went to the unknown one.
    const known = await ctx.request.post('/api/auth/password-reset').send({ email: 'writer@example.com' });
    expect(known.body).toEqual(res.body);
    await ctx.mail.waitFor((m) => m.envelopeTo.includes('writer@example.com'), { from });
    expect(ctx.mail.messages.slice(from).map((m) => m.envelopeTo)).toEqual([['writer@example.com']]);
  });

  it('answers 400 with details for a bad e-mail', async () => {
    const res = await ctx.request.post('/api/auth/password-reset').send({ email: 'nope' });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('$.email');
  });

  it('mails a link; the link sets a new password once, ends every session, and cannot be reused', async () => {
    const signedIn = await ctx.signIn('tech@example.com');
    expect((await signedIn.get('/api/auth/me')).status).toBe(200);

    const { res, mail, from } = await requestReset('tech@example.com');
    expect(res.status).toBe(202);
    expect(ctx.mail.messages.slice(from)).toHaveLength(1);
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
    await ctx.db.update(passwordResetTokens).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(passwordResetTokens.tokenHash, hashToken(token)));
    const res = await ctx.request.post('/api/auth/password-reset/confirm').send({ token, password: 'a-brand-new-password' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_token');
  });

  it('expires links after one hour', async () => {
    await requestReset('lead@example.com');
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
