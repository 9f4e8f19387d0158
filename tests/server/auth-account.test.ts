import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { roles } from '../../shared/api/auth';
import { createTestContext, type TestContext } from '../support/server-context';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
});
afterAll(async () => {
  await ctx?.close();
});

describe('/api/account', () => {
  it('answers 401 without a session on every route', async () => {
    expect((await ctx.request.get('/api/account')).status).toBe(401);
    expect((await ctx.request.patch('/api/account').send({ name: 'X' })).status).toBe(401);
    expect((await ctx.request.post('/api/account/password').send({ currentPassword: 'a', newPassword: 'bbbbbbbbbbbb' })).status).toBe(401);
  });

  it.each(roles)('shows the %s their own account', async (role) => {
    const agent = await ctx.agent(role);
    const res = await agent.get('/api/account');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ name: ctx.demo.users[role].name, email: ctx.demo.users[role].email, role, shopName: 'Tamarack Valley Equipment Repair' });
  });

  it('renames the member; bad names answer 400 with details', async () => {
    const agent = await ctx.agent('writer');
    const bad = await agent.patch('/api/account').send({ name: '   ' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('$.name');
    const res = await agent.patch('/api/account').send({ name: '  Sam L. Lindqvist ' });
    expect(res.status).toBe(200);
    expect(res.body.name).toBe('Sam L. Lindqvist');
    expect((await agent.get('/api/auth/me')).body.user.name).toBe('Sam L. Lindqvist');
  });

  it('changes the password: wrong current → 400, right → 204; other sessions end, this one stays', async () => {
    const here = await ctx.signIn('lead@example.com');
    const elsewhere = await ctx.signIn('lead@example.com');
    const wrong = await here.post('/api/account/password').send({ currentPassword: 'not-it', newPassword: 'lead-new-password' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.code).toBe('wrong_password');
    const weak = await here.post('/api/account/password').send({ currentPassword: 'wirewalk-demo', newPassword: 'short' });
    expect(weak.status).toBe(400);
    expect(weak.body.error.details[0].path).toBe('$.newPassword');

    const ok = await here.post('/api/account/password').send({ currentPassword: 'wirewalk-demo', newPassword: 'lead-new-password' });
    expect(ok.status).toBe(204);
    expect((await here.get('/api/auth/me')).status).toBe(200);
    expect((await elsewhere.get('/api/auth/me')).status).toBe(401);
    expect((await ctx.request.post('/api/auth/sign-in').send({ email: 'lead@example.com', password: 'lead-new-password' })).status).toBe(200);
    expect((await ctx.request.post('/api/auth/sign-in').send({ email: 'lead@example.com', password: 'wirewalk-demo' })).status).toBe(401);
  });
});
