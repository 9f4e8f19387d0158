import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import supertest from 'supertest';
import { invitations, memberships, users } from '../../server/db/schema';
import { newId } from '../../server/db/ids';
import type { Mailer } from '../../server/mail/mailer';
import { createTestContext, type TestContext } from '../support/server-context';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
});
afterAll(async () => {
  await ctx?.close();
});

function inviteToken(text: string): string {
  const m = /\/invite\/([A-Za-z0-9_-]+)/.exec(text);
  if (!m) throw new Error(`no invitation link in:\n${text}`);
  return m[1];
}

async function invite(email: string, role: string) {
  const owner = await ctx.agent('owner');
  const before = ctx.mail.messages.length;
  const res = await owner.post('/api/people/invitations').send({ email, role });
  const mail = ctx.mail.messages.slice(before);
  return { res, mail, token: mail.length ? inviteToken(mail[0].text) : '' };
}

describe('authorisation of /api/people', () => {
  const routes = [
    ['get', '/api/people', undefined],
    ['post', '/api/people/invitations', { email: 'a@example.com', role: 'tech' }],
    ['delete', '/api/people/invitations/abc', undefined],
    ['patch', '/api/people/abc', { role: 'lead' }],
    ['delete', '/api/people/abc', undefined],
  ] as const;

  it.each(routes)('%s %s answers 401 without a session', async (method, url, body) => {
    const res = await ctx.request[method](url).send(body);
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it.each(['lead', 'tech', 'writer'] as const)('answers 403 to the %s on every route', async (role) => {
    const agent = await ctx.agent(role);
    for (const [method, url, body] of routes) {
      const res = await agent[method](url).send(body);
      expect(res.status, `${method} ${url}`).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    }
  });
});

describe('GET /api/people', () => {
  it("lists the owner's shop only", async () => {
    const owner = await ctx.agent('owner');
    const res = await owner.get('/api/people');
    expect(res.status).toBe(200);
    const emails = res.body.people.map((p: { email: string }) => p.email).sort();
    expect(emails).toEqual(['lead@example.com', 'owner@example.com', 'tech@example.com', 'writer@example.com']);
    const dana = res.body.people.find((p: { email: string }) => p.email === 'owner@example.com');
    expect(dana).toEqual({ userId: ctx.demo.users.owner.id, name: 'Dana Whitfield', email: 'owner@example.com', role: 'owner', joinedAt: expect.any(String) });
    expect(Array.isArray(res.body.invitations)).toBe(true);
  });
});

describe('invitations end to end', () => {
  it('invites a new tech by e-mail; the link shows the invitation, accepting creates the account and signs in', async () => {
    const { res, mail, token } = await invite('New.Tech@Example.com', 'tech');
    expect(res.status).toBe(201);
    expect(res.body).toEqual({ id: expect.any(String), email: 'new.tech@example.com', role: 'tech', invitedAt: expect.any(String), expiresAt: expect.any(String) });
    const days = (Date.parse(res.body.expiresAt) - Date.parse(res.body.invitedAt)) / 86_400_000;
    expect(days).toBeCloseTo(7, 3);

    expect(mail).toHaveLength(1);
    expect(mail[0].envelopeTo).toEqual(['new.tech@example.com']);
    expect(mail[0].subject).toBe('Dana Whitfield invited you to Tamarack Valley Equipment Repair on Wirewalk');
    expect(mail[0].text).toContain(`${ctx.origin}/invite/${token}`);
    expect(mail[0].shopId).toBe(ctx.demo.shopId);

    const owner = await ctx.agent('owner');
    const listed = await owner.get('/api/people');
    expect(listed.body.invitations).toEqual([res.body]);

    const shown = await ctx.request.get(`/api/invitations/${token}`);
    expect(shown.status).toBe(200);
    expect(shown.body).toEqual({ email: 'new.tech@example.com', role: 'tech', shopName: 'Tamarack Valley Equipment Repair', invitedBy: 'Dana Whitfield' });

    const bad = await ctx.request.post(`/api/invitations/${token}/accept`).send({ name: '', password: 'short' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['$.name', '$.password']);

    const newcomer = supertest.agent(ctx.app);
    const accepted = await newcomer.post(`/api/invitations/${token}/accept`).send({ name: 'Jo Newcomb', password: 'jo-first-password' });
    expect(accepted.status).toBe(200);
    expect(accepted.body).toMatchObject({ user: { email: 'new.tech@example.com', name: 'Jo Newcomb' }, shop: { id: ctx.demo.shopId }, role: 'tech' });
    const me = await newcomer.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.role).toBe('tech');

    const after = await owner.get('/api/people');
    expect(after.body.invitations).toEqual([]);
    expect(after.body.people.map((p: { email: string }) => p.email)).toContain('new.tech@example.com');

    expect((await ctx.request.get(`/api/invitations/${token}`)).status).toBe(410);
    const reuse = await ctx.request.post(`/api/invitations/${token}/accept`).send({ name: 'Someone Else', password: 'another-password' });
    expect(reuse.status).toBe(410);
    expect(reuse.body.error.code).toBe('invitation_used');

    expect((await ctx.request.post('/api/auth/sign-in').send({ email: 'new.tech@example.com', password: 'jo-first-password' })).status).toBe(200);
  });

  it('answers 404 for an unknown token and 410 invitation_expired for an old one', async () => {
    expect((await ctx.request.get(`/api/invitations/${'z'.repeat(43)}`)).status).toBe(404);
    const { res, token } = await invite('late@example.com', 'writer');
    await ctx.db.update(invitations).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(invitations.id, res.body.id));
    const shown = await ctx.request.get(`/api/invitations/${token}`);
    expect(shown.status).toBe(410);
    expect(shown.body.error.code).toBe('invitation_expired');
    const accept = await ctx.request.post(`/api/invitations/${token}/accept`).send({ name: 'Late Person', password: 'late-password-1' });
    expect(accept.status).toBe(410);
  });

  it('refuses to invite a member (409 already_member) or someone of another shop (409 account_exists)', async () => {
    const member = await invite('lead@example.com', 'tech');
    expect(member.res.status).toBe(409);
    expect(member.res.body.error.code).toBe('already_member');
    expect(member.mail).toHaveLength(0);
    const other = await invite(ctx.otherShop.users.tech.email, 'tech');
    expect(other.res.status).toBe(409);
    expect(other.res.body.error.code).toBe('account_exists');
  });

  it('answers 409 on accept when the e-mail got an account with a shop meanwhile', async () => {
    const { token } = await invite('race@example.com', 'lead');
    const userId = newId();
    await ctx.db.insert(users).values({ id: userId, email: 'race@example.com', name: 'Race', passwordHash: 'x' });
    await ctx.db.insert(memberships).values({ id: newId(), shopId: ctx.otherShop.shopId, userId, role: 'tech' });
    const res = await ctx.request.post(`/api/invitations/${token}/accept`).send({ name: 'Race Again', password: 'race-password-1' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('account_exists');
    // Nothing changed: the invitation can still be seen (not consumed) and no membership was added here.
    expect((await ctx.request.get(`/api/invitations/${token}`)).status).toBe(200);
  });

  it('answers 400 with details for a bad invitation body', async () => {
    const owner = await ctx.agent('owner');
    const res = await owner.post('/api/people/invitations').send({ email: 'nope', role: 'boss' });
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['$.email', '$.role']);
  });

  it('makes no invitation when the mail cannot be sent (502 mail_failed)', async () => {
    const real = ctx.deps.mailer;
    const failing: Mailer = { send: async () => Promise.reject(new Error('connection refused')), close: async () => {} };
    ctx.deps.mailer = failing;
    try {
      const owner = await ctx.agent('owner');
      const res = await owner.post('/api/people/invitations').send({ email: 'nomail@example.com', role: 'tech' });
      expect(res.status).toBe(502);
      expect(res.body.error.code).toBe('mail_failed');
    } finally {
      ctx.deps.mailer = real;
    }
    expect(await ctx.db.select().from(invitations).where(eq(invitations.email, 'nomail@example.com'))).toHaveLength(0);
  });

  it('withdraws an invitation; the link stops working; another shop cannot withdraw it (404)', async () => {
    const { res, token } = await invite('withdrawn@example.com', 'tech');
    const otherOwner = await ctx.otherShopAgent('owner');
    expect((await otherOwner.delete(`/api/people/invitations/${res.body.id}`)).status).toBe(404);
    const owner = await ctx.agent('owner');
    expect((await owner.delete(`/api/people/invitations/${res.body.id}`)).status).toBe(204);
    expect((await owner.delete(`/api/people/invitations/${res.body.id}`)).status).toBe(404);
    expect((await ctx.request.get(`/api/invitations/${token}`)).status).toBe(404);
  });

  it('re-inviting the same address replaces the open invitation', async () => {
    const first = await invite('twice@example.com', 'tech');
    const second = await invite('twice@example.com', 'lead');
    expect((await ctx.request.get(`/api/invitations/${first.token}`)).status).toBe(404);
    expect((await ctx.request.get(`/api/invitations/${second.token}`)).body.role).toBe('lead');
  });
});

describe('roles and removal', () => {
  it('changes a role; the person has it on their next request', async () => {
    const owner = await ctx.agent('owner');
    const tech = await ctx.signIn('tech@example.com');
    const res = await owner.patch(`/api/people/${ctx.demo.users.tech.id}`).send({ role: 'lead' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ userId: ctx.demo.users.tech.id, role: 'lead', email: 'tech@example.com' });
    expect((await tech.get('/api/auth/me')).body.role).toBe('lead');
    expect((await owner.patch(`/api/people/${ctx.demo.users.tech.id}`).send({ role: 'tech' })).status).toBe(200);
  });

  it('answers 400 for a bad role and 404 for a person of another shop', async () => {
    const owner = await ctx.agent('owner');
    const bad = await owner.patch(`/api/people/${ctx.demo.users.tech.id}`).send({ role: 'boss' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('$.role');
    expect((await owner.patch(`/api/people/${ctx.otherShop.users.tech.id}`).send({ role: 'lead' })).status).toBe(404);
    expect((await owner.delete(`/api/people/${ctx.otherShop.users.tech.id}`)).status).toBe(404);
    expect((await ctx.request.get('/api/health')).status).toBe(200);
    // The other shop's tech is untouched.
    const otherTech = await ctx.otherShopAgent('tech');
    expect((await otherTech.get('/api/auth/me')).body.role).toBe('tech');
  });

  it('keeps the last owner: demoting or removing them answers 409 last_owner', async () => {
    const owner = await ctx.agent('owner');
    const demote = await owner.patch(`/api/people/${ctx.demo.users.owner.id}`).send({ role: 'lead' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.code).toBe('last_owner');
    const remove = await owner.delete(`/api/people/${ctx.demo.users.owner.id}`);
    expect(remove.status).toBe(409);
    // With a second owner, the first may step down.
    expect((await owner.patch(`/api/people/${ctx.demo.users.lead.id}`).send({ role: 'owner' })).status).toBe(200);
    expect((await owner.patch(`/api/people/${ctx.demo.users.owner.id}`).send({ role: 'lead' })).status).toBe(200);
    expect((await owner.get('/api/people')).status).toBe(403);
    const marco = await ctx.signIn('lead@example.com');
    expect((await marco.patch(`/api/people/${ctx.demo.users.owner.id}`).send({ role: 'owner' })).status).toBe(200);
    expect((await marco.patch(`/api/people/${ctx.demo.users.lead.id}`).send({ role: 'lead' })).status).toBe(200);
    expect((await owner.get('/api/people')).status).toBe(200);
  });

  it('removes a person: their sessions end at once and they can no longer sign in', async () => {
    const { token } = await invite('leaving@example.com', 'writer');
    const leaving = supertest.agent(ctx.app);
    const accepted = await leaving.post(`/api/invitations/${token}/accept`).send({ name: 'Lee Ving', password: 'leaving-password' });
    const userId = accepted.body.user.id;
    const owner = await ctx.agent('owner');
    expect((await owner.delete(`/api/people/${userId}`)).status).toBe(204);
    expect((await leaving.get('/api/auth/me')).status).toBe(401);
    const signIn = await ctx.request.post('/api/auth/sign-in').send({ email: 'leaving@example.com', password: 'leaving-password' });
    expect(signIn.status).toBe(403);
    expect(signIn.body.error.code).toBe('no_shop');
    expect((await owner.delete(`/api/people/${userId}`)).status).toBe(404);

    // Invited again later, they join afresh with the link.
    const again = await invite('leaving@example.com', 'tech');
    expect(again.res.status).toBe(201);
    const back = await ctx.request.post(`/api/invitations/${again.token}/accept`).send({ name: 'Lee Ving', password: 'back-again-password' });
    expect(back.status).toBe(200);
    expect(back.body.role).toBe('tech');
    expect(back.body.user.id).toBe(userId);
  });
});
