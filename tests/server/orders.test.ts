import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { repairOrders, timeEntries } from '../../server/db/schema/orders';
import { runStalledCheck } from '../../server/orders/stalled';
import { createTestContext, type TestContext } from '../support/server-context';
import { makeCustomerAndUnit, makeOrder } from './orders-fixtures';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
});
afterAll(async () => {
  await ctx?.close();
});

describe('customers and units', () => {
  it('writers create and edit customers; techs read but cannot write; another shop sees nothing', async () => {
    const writer = await ctx.agent('writer');
    const created = await writer.post('/api/customers').send({ name: 'Ridgeback Excavating', email: 'Office@Ridgeback.example', contacts: [{ name: 'Lu Ferris', phone: '555-0199' }] });
    expect(created.status).toBe(201);
    expect(created.body.customer.email).toBe('office@ridgeback.example');
    const id = created.body.customer.id;

    const tech = await ctx.agent('tech');
    expect((await tech.get(`/api/customers/${id}`)).status).toBe(200);
    const refused = await tech.post('/api/customers').send({ name: 'Nope' });
    expect(refused.status).toBe(403);

    const other = await ctx.otherShopAgent('owner');
    expect((await other.get(`/api/customers/${id}`)).status).toBe(404);
    const list = await other.get('/api/customers?q=Ridgeback');
    expect(list.body.customers).toHaveLength(0);

    const patched = await writer.patch(`/api/customers/${id}`).send({ version: 1, phone: '555-0100' });
    expect(patched.status).toBe(200);
    expect(patched.body.customer.version).toBe(2);
    expect(patched.body.customer.contacts).toHaveLength(1); // untouched fields stay
    const stale = await writer.patch(`/api/customers/${id}`).send({ version: 1, phone: '555-0101' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale_version');
    expect(stale.body.error.details.current.phone).toBe('555-0100');

    const search = await writer.get('/api/customers?q=ridge');
    expect(search.body.customers.map((c: { id: string }) => c.id)).toContain(id);
  });

  it('names what was wrong in a bad customer or unit', async () => {
    const writer = await ctx.agent('writer');
    const bad = await writer.post('/api/customers').send({ name: '', email: 'not-an-address' });
    expect(bad.status).toBe(400);
    const paths = bad.body.error.details.map((d: { path: string }) => d.path);
    expect(paths).toContain('$.name');
    expect(paths).toContain('$.email');

    const { customer } = await makeCustomerAndUnit(ctx, writer, 'Unit Rules Co');
    const noModel = await writer.post('/api/units').send({ customerId: customer.id, serialNumber: 'X-1' });
    expect(noModel.status).toBe(400);
    expect(noModel.body.error.message).toMatch(/model/i);
    const negative = await writer.post('/api/units').send({ customerId: customer.id, serialNumber: 'X-1', description: 'Loader', hourMeter: -4 });
    expect(negative.status).toBe(400);
    expect(negative.body.error.details[0].path).toBe('$.hourMeter');
    const otherShopCustomer = await (await ctx.otherShopAgent('writer')).post('/api/units').send({ customerId: customer.id, serialNumber: 'Z', description: 'Loader' });
    expect(otherShopCustomer.status).toBe(400);

    const units = await writer.get(`/api/units?customerId=${customer.id}`);
    expect(units.status).toBe(200);
    expect(units.body.units).toHaveLength(1);
    const unit = units.body.units[0];
    const patched = await writer.patch(`/api/units/${unit.id}`).send({ version: unit.version, hourMeter: 2200 });
    expect(patched.body.unit.hourMeter).toBe(2200);
    expect(patched.body.unit.kind).toBe('machine');
    expect((await (await ctx.agent('tech')).patch(`/api/units/${unit.id}`).send({ version: 2, hourMeter: 1 })).status).toBe(403);
  });
});

describe('repair orders', () => {
  it('numbers orders per shop, one after the other', async () => {
    const a = await makeOrder(ctx);
    const b = await makeOrder(ctx);
    expect(b.order.number).toBe(a.order.number + 1);
    expect(a.order.status).toBe('open');
    expect(a.order.units[0].hourMeter).toBe(2150); // the hour meter at intake raised the unit's
    // Another shop starts at 1.
    const otherWriter = await ctx.otherShopAgent('writer');
    const c = await otherWriter.post('/api/customers').send({ name: 'Other shop customer' });
    const u = await otherWriter.post('/api/units').send({ customerId: c.body.customer.id, serialNumber: 'O-1', description: 'Mini excavator' });
    const o = await otherWriter.post('/api/repair-orders').send({ customerId: c.body.customer.id, unitIds: [u.body.unit.id], complaint: 'Dead display' });
    expect(o.status).toBe(201);
    expect(o.body.order.number).toBe(1);
    // …and cannot see ours.
    expect((await otherWriter.get(`/api/repair-orders/${a.order.id}`)).status).toBe(404);
    expect((await otherWriter.patch(`/api/repair-orders/${a.order.id}`).send({ version: 1, complaint: 'x' })).status).toBe(404);
  });

  it('lets only the desk open orders, and checks the units belong to the customer', async () => {
    const writer = await ctx.agent('writer');
    const one = await makeCustomerAndUnit(ctx, writer, 'First Co');
    const two = await makeCustomerAndUnit(ctx, writer, 'Second Co');
    const wrongUnit = await writer.post('/api/repair-orders').send({ customerId: one.customer.id, unitIds: [two.unit.id], complaint: 'Hydraulics weak' });
    expect(wrongUnit.status).toBe(400);
    expect(wrongUnit.body.error.details[0]).toEqual({ path: '$.unitIds[0]', message: 'This unit belongs to another customer' });
    const noComplaint = await writer.post('/api/repair-orders').send({ customerId: one.customer.id, unitIds: [one.unit.id], complaint: '  ' });
    expect(noComplaint.status).toBe(400);
    expect(noComplaint.body.error.details[0].path).toBe('$.complaint');
    const tech = await ctx.agent('tech');
    expect((await tech.post('/api/repair-orders').send({ customerId: one.customer.id, unitIds: [one.unit.id], complaint: 'x' })).status).toBe(403);
    const notMember = await writer.post('/api/repair-orders').send({ customerId: one.customer.id, unitIds: [one.unit.id], complaint: 'x', assignedTechId: ctx.otherShop.users.tech.id });
    expect(notMember.status).toBe(400);
    expect(notMember.body.error.details[0].path).toBe('$.assignedTechId');
    expect((await ctx.request.get('/api/repair-orders')).status).toBe(401);
  });

  it('the assigned tech records findings, not desk fields; another tech cannot touch it; stale versions answer 409', async () => {
    const { order } = await makeOrder(ctx);
    const tech = await ctx.agent('tech');
    const findings = await tech.patch(`/api/repair-orders/${order.id}`).send({ version: order.version, status: 'diagnosing', cause: 'Chafed wire W2 at the boom clamp, shorting to the frame.' });
    expect(findings.status).toBe(200);
    expect(findings.body.order.status).toBe('diagnosing');
    expect(findings.body.order.can).toEqual({ edit: false, editFindings: true, send: false, assign: false });
    const v = findings.body.order.version;
    const desk = await tech.patch(`/api/repair-orders/${order.id}`).send({ version: v, complaint: 'rewritten', assignedTechId: null });
    expect(desk.status).toBe(403);
    expect(desk.body.error.message).toMatch(/complaint/);
    const close = await tech.patch(`/api/repair-orders/${order.id}`).send({ version: v, status: 'closed' });
    expect(close.status).toBe(403);
    const stale = await tech.patch(`/api/repair-orders/${order.id}`).send({ version: order.version, correction: 'late' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details.currentVersion).toBe(v);
    const after = await tech.get(`/api/repair-orders/${order.id}`);
    expect(after.body.order.correction).toBeNull(); // the stale save changed nothing

    // An order assigned to the lead: the tech may read it but not work on it.
    const { order: leadOrder } = await makeOrder(ctx, { assignTo: ctx.demo.users.lead.id });
    expect((await tech.get(`/api/repair-orders/${leadOrder.id}`)).status).toBe(200);
    const notMine = await tech.patch(`/api/repair-orders/${leadOrder.id}`).send({ version: 1, cause: 'x' });
    expect(notMine.status).toBe(403);
    expect(notMine.body.error.message).toMatch(/not assigned to you/);

    // The writer closes it; closedAt is set.
    const writer = await ctx.agent('writer');
    const closed = await writer.patch(`/api/repair-orders/${order.id}`).send({ version: v, status: 'closed', correction: 'Repaired W2, added sleeve.' });
    expect(closed.status).toBe(200);
    expect(closed.body.order.closedAt).not.toBeNull();
    // A writer does not log labour or tick steps.
    expect((await writer.post(`/api/repair-orders/${order.id}/time-entries`).send({ kind: 'repair', minutes: 30 })).status).toBe(403);
  });

  it('lists with filters, sorting and paging on the server', async () => {
    const writer = await ctx.agent('writer');
    const mine = await makeCustomerAndUnit(ctx, writer, 'Zephyr Paving');
    const made: { id: string; number: number }[] = [];
    for (let i = 0; i < 5; i++) {
      const r = await writer.post('/api/repair-orders').send({ customerId: mine.customer.id, unitIds: [mine.unit.id], complaint: `Paging complaint ${i}`, assignedTechId: i % 2 ? ctx.demo.users.lead.id : ctx.demo.users.tech.id });
      made.push(r.body.order);
    }
    const page1 = await writer.get(`/api/repair-orders?customerId=${mine.customer.id}&sort=number&dir=asc&pageSize=2&page=1`);
    expect(page1.status).toBe(200);
    expect(page1.body.total).toBe(5);
    expect(page1.body.orders.map((o: { number: number }) => o.number)).toEqual([made[0].number, made[1].number]);
    const page3 = await writer.get(`/api/repair-orders?customerId=${mine.customer.id}&sort=number&dir=asc&pageSize=2&page=3`);
    expect(page3.body.orders.map((o: { number: number }) => o.number)).toEqual([made[4].number]);
    const byLead = await writer.get(`/api/repair-orders?customerId=${mine.customer.id}&techId=${ctx.demo.users.lead.id}`);
    expect(byLead.body.total).toBe(2);
    const techMe = await (await ctx.agent('tech')).get(`/api/repair-orders?customerId=${mine.customer.id}&techId=me`);
    expect(techMe.body.total).toBe(3);
    const diagnosing = await writer.get(`/api/repair-orders?customerId=${mine.customer.id}&status=diagnosing`);
    expect(diagnosing.body.total).toBe(0);
    const two = await writer.get(`/api/repair-orders?customerId=${mine.customer.id}&status=open&status=diagnosing`);
    expect(two.body.total).toBe(5);
    const today = new Date().toISOString().slice(0, 10);
    expect((await writer.get(`/api/repair-orders?customerId=${mine.customer.id}&from=${today}&to=${today}`)).body.total).toBe(5);
    expect((await writer.get(`/api/repair-orders?customerId=${mine.customer.id}&to=2000-01-01`)).body.total).toBe(0);
    const byText = await writer.get(`/api/repair-orders?q=Zephyr`);
    expect(byText.body.total).toBe(5);
    const byNumber = await writer.get(`/api/repair-orders?q=${made[2].number}`);
    expect(byNumber.body.orders[0].id).toBe(made[2].id);
    const bySerial = await writer.get(`/api/repair-orders?q=${mine.unit.serialNumber}`);
    expect(bySerial.body.total).toBe(5);
    const bad = await writer.get('/api/repair-orders?status=lost&from=yesterday&pageSize=1000');
    expect(bad.status).toBe(400);
    const badPaths = bad.body.error.details.map((d: { path: string }) => d.path);
    expect(badPaths).toEqual(expect.arrayContaining(['$.from', '$.pageSize']));
    const sortedByCustomer = await writer.get('/api/repair-orders?sort=customer&dir=asc&pageSize=100');
    const names = sortedByCustomer.body.orders.map((o: { customer: { name: string } }) => o.customer.name);
    expect(names).toEqual([...names].sort((x: string, y: string) => x.localeCompare(y, 'en', { sensitivity: 'base' })));
  });

  it('changes units in one transaction and refuses units of another customer', async () => {
    const writer = await ctx.agent('writer');
    const { order, customer } = await makeOrder(ctx);
    const extra = await writer.post('/api/units').send({ customerId: customer.id, kind: 'attachment', description: 'Fenwick FW-M60 mulcher head', serialNumber: 'FWM60-0042' });
    const both = await writer.patch(`/api/repair-orders/${order.id}`).send({ version: order.version, unitIds: [order.units[0].id, extra.body.unit.id] });
    expect(both.status).toBe(200);
    expect(both.body.order.units.map((u: { serialNumber: string }) => u.serialNumber)).toEqual([order.units[0].serialNumber, 'FWM60-0042']);
    const stranger = await makeCustomerAndUnit(ctx, writer, 'Stranger Co');
    const refused = await writer.patch(`/api/repair-orders/${order.id}`).send({ version: both.body.order.version, unitIds: [stranger.unit.id] });
    expect(refused.status).toBe(400);
    const again = await writer.get(`/api/repair-orders/${order.id}`);
    expect(again.body.order.units).toHaveLength(2);
    expect(again.body.order.version).toBe(both.body.order.version);
  });
});

describe('time entries and stalled orders', () => {
  it('techs log their own time, leads for others; entries are validated', async () => {
    const { order } = await makeOrder(ctx);
    const tech = await ctx.agent('tech');
    const logged = await tech.post(`/api/repair-orders/${order.id}/time-entries`).send({ kind: 'diagnosis', minutes: 90, note: 'Power and ground at X12' });
    expect(logged.status).toBe(201);
    expect(logged.body.order.diagnosisMinutes).toBe(90);
    expect(logged.body.order.timeEntries[0].tech.id).toBe(ctx.demo.users.tech.id);
    const forOther = await tech.post(`/api/repair-orders/${order.id}/time-entries`).send({ kind: 'repair', minutes: 10, techId: ctx.demo.users.lead.id });
    expect(forOther.status).toBe(403);
    const lead = await ctx.agent('lead');
    const leadFor = await lead.post(`/api/repair-orders/${order.id}/time-entries`).send({ kind: 'repair', minutes: 45, techId: ctx.demo.users.tech.id });
    expect(leadFor.status).toBe(201);
    expect(leadFor.body.order.totalMinutes).toBe(135);
    const bad = await tech.post(`/api/repair-orders/${order.id}/time-entries`).send({ kind: 'coffee', minutes: 0 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((d: { path: string }) => d.path)).toEqual(expect.arrayContaining(['$.kind', '$.minutes']));
    const entry = leadFor.body.order.timeEntries.find((e: { minutes: number }) => e.minutes === 45);
    const removed = await tech.delete(`/api/repair-orders/${order.id}/time-entries/${entry.id}`);
    expect(removed.status).toBe(200);
    expect(removed.body.order.totalMinutes).toBe(90);
    const summary = await lead.get('/api/repair-orders/time-summary');
    expect(summary.body.rows.some((r: { techId: string; kind: string; minutes: number }) => r.techId === ctx.demo.users.tech.id && r.kind === 'diagnosis' && r.minutes >= 90)).toBe(true);
  });

  it('marks orders past the diagnosis limit stalled and mails the lead once, even with two instances checking', async () => {
    const owner = await ctx.agent('owner');
    const tech = await ctx.agent('tech');
    expect((await tech.put('/api/repair-orders/settings').send({ stalledDiagnosisHours: 1, stalledDays: null, linkDays: 14 })).status).toBe(403);
    const bad = await owner.put('/api/repair-orders/settings').send({ stalledDiagnosisHours: 0, stalledDays: null, linkDays: 14 });
    expect(bad.status).toBe(400);
    const set = await owner.put('/api/repair-orders/settings').send({ stalledDiagnosisHours: 2, stalledDays: null, linkDays: 14 });
    expect(set.status).toBe(200);

    // Clear out anything earlier tests left stalled-able, so this test counts only its own order.
    await runStalledCheck(ctx.deps, 500);
    const before = ctx.mail.messages.length;

    const { order } = await makeOrder(ctx, { complaint: 'Auxiliary hydraulics dead, intermittent' });
    await tech.patch(`/api/repair-orders/${order.id}`).send({ version: order.version, status: 'diagnosing' });
    await tech.post(`/api/repair-orders/${order.id}/time-entries`).send({ kind: 'diagnosis', minutes: 100 });
    let list = await owner.get(`/api/repair-orders?q=${order.number}`);
    expect(list.body.orders[0].stalled).toBe(false);
    await tech.post(`/api/repair-orders/${order.id}/time-entries`).send({ kind: 'diagnosis', minutes: 30 });
    // Repair time does not count towards the limit, diagnosis does: 130 min ≥ 120.
    list = await owner.get(`/api/repair-orders?q=${order.number}`);
    expect(list.body.orders[0].stalled).toBe(true);
    const stalledOnly = await owner.get('/api/repair-orders?stalled=1&pageSize=100');
    expect(stalledOnly.body.orders.map((o: { id: string }) => o.id)).toContain(order.id);

    // Two instances run the check at the same moment: one claims, one mail.
    const [a, b] = await Promise.all([runStalledCheck(ctx.deps), runStalledCheck(ctx.deps)]);
    expect(a.sent + b.sent).toBe(1);
    const again = await runStalledCheck(ctx.deps);
    expect(again.sent).toBe(0);
    await waitFor(() => ctx.mail.messages.length > before);
    const mails = ctx.mail.messages.slice(before).filter((m) => m.subject.includes(`Order ${order.number} is stalled`));
    expect(mails).toHaveLength(1);
    expect(JSON.stringify(mails[0].to)).toContain(ctx.demo.users.lead.email);
    const [row] = await ctx.db.select().from(repairOrders).where(eq(repairOrders.id, order.id));
    expect(row.stalledNotifiedAt).not.toBeNull();
  });

  it('a failed stalled e-mail clears its claim so a later round tries again', async () => {
    const owner = await ctx.agent('owner');
    await owner.put('/api/repair-orders/settings').send({ stalledDiagnosisHours: 0.5, stalledDays: null, linkDays: 14 });
    await runStalledCheck(ctx.deps, 500);
    const { order } = await makeOrder(ctx);
    await ctx.db.insert(timeEntries).values({ id: 'aaaaaaaaaaaaaaaaaaaaaaaaaa', shopId: ctx.demo.shopId, orderId: order.id, techId: ctx.demo.users.tech.id, kind: 'diagnosis', minutes: 45, workDate: '2026-01-05' });
    const failing = { ...ctx.deps, mailer: { send: async () => Promise.reject(new Error('connection refused')), close: async () => {} } };
    const round = await runStalledCheck(failing);
    expect(round.failed).toBe(1);
    const [row] = await ctx.db.select().from(repairOrders).where(eq(repairOrders.id, order.id));
    expect(row.stalledNotifiedAt).toBeNull();
    const retry = await runStalledCheck(ctx.deps);
    expect(retry.sent).toBe(1);
  });
});

describe('procedures', () => {
  it('leads write checklists; attached to an order, the tech ticks each step with who and when', async () => {
    const lead = await ctx.agent('lead');
    const tech = await ctx.agent('tech');
    expect((await tech.post('/api/procedures').send({ title: 'x', steps: ['a'] })).status).toBe(403);
    const empty = await lead.post('/api/procedures').send({ title: 'Joystick calibration', steps: [] });
    expect(empty.status).toBe(400);
    expect(empty.body.error.details[0].path).toBe('$.steps');
    const made = await lead.post('/api/procedures').send({ title: 'Joystick calibration', notes: 'Follow the manufacturer’s procedure.', steps: ['Key on, engine off', 'Centre both joysticks', 'Run the calibration from the display'] });
    expect(made.status).toBe(201);
    const proc = made.body.procedure;

    const { order } = await makeOrder(ctx);
    const writer = await ctx.agent('writer');
    const attached = await writer.post(`/api/repair-orders/${order.id}/procedures`).send({ procedureId: proc.id });
    expect(attached.status).toBe(201);
    const op = attached.body.order.procedures[0];
    expect(op.steps.map((s: { text: string }) => s.text)).toEqual(proc.steps);

    // Writers cannot tick; the assigned tech can.
    expect((await writer.put(`/api/repair-orders/${order.id}/procedures/${op.id}/steps/${op.steps[0].id}`).send({ done: true })).status).toBe(403);
    const ticked = await tech.put(`/api/repair-orders/${order.id}/procedures/${op.id}/steps/${op.steps[0].id}`).send({ done: true });
    expect(ticked.status).toBe(200);
    const step = ticked.body.order.procedures[0].steps[0];
    expect(step.doneBy.id).toBe(ctx.demo.users.tech.id);
    expect(step.doneAt).not.toBeNull();

    // Editing the template later leaves the order's copy and its ticks alone.
    const edited = await lead.put(`/api/procedures/${proc.id}`).send({ version: proc.version, title: 'Joystick calibration (v2)', steps: ['Only one step now'] });
    expect(edited.status).toBe(200);
    const stale = await lead.put(`/api/procedures/${proc.id}`).send({ version: proc.version, title: 'again', steps: ['x'] });
    expect(stale.status).toBe(409);
    const after = await tech.get(`/api/repair-orders/${order.id}`);
    expect(after.body.order.procedures[0].steps).toHaveLength(3);
    expect(after.body.order.procedures[0].steps[0].doneBy.name).toBe(ctx.demo.users.tech.name);

    const untick = await tech.put(`/api/repair-orders/${order.id}/procedures/${op.id}/steps/${op.steps[0].id}`).send({ done: false });
    expect(untick.body.order.procedures[0].steps[0].doneAt).toBeNull();
    const other = await ctx.otherShopAgent('lead');
    expect((await other.get(`/api/procedures/${proc.id}`)).status).toBe(404);
    expect((await other.post(`/api/repair-orders/${order.id}/procedures`).send({ procedureId: proc.id })).status).toBe(404);
  });
});

describe('small routes', () => {
  it('lists the people an order can go to, reads settings, and only leads remove procedures', async () => {
    const writer = await ctx.agent('writer');
    const people = await writer.get('/api/repair-orders/people');
    expect(people.status).toBe(200);
    const roles = people.body.people.map((p: { role: string }) => p.role);
    expect(roles).toEqual(expect.arrayContaining(['tech', 'lead']));
    expect(roles).not.toContain('writer');
    expect(people.body.people.map((p: { id: string }) => p.id)).not.toContain(ctx.otherShop.users.tech.id);
    const settings = await (await ctx.agent('tech')).get('/api/repair-orders/settings');
    expect(settings.body.settings).toMatchObject({ stalledDiagnosisHours: expect.any(Number), linkDays: expect.any(Number) });
    const lead = await ctx.agent('lead');
    const p = await lead.post('/api/procedures').send({ title: 'Temporary', steps: ['One'] });
    expect((await writer.delete(`/api/procedures/${p.body.procedure.id}`)).status).toBe(403);
    expect((await (await ctx.otherShopAgent('lead')).delete(`/api/procedures/${p.body.procedure.id}`)).status).toBe(404);
    expect((await lead.delete(`/api/procedures/${p.body.procedure.id}`)).status).toBe(204);
    expect((await lead.get(`/api/procedures/${p.body.procedure.id}`)).status).toBe(404);
    const badId = await writer.get('/api/repair-orders/not-an-id');
    expect(badId.status).toBe(400);
    expect(badId.body.error.details[0].path).toBe('$.id');
  });
});

async function waitFor(check: () => boolean, ms = 5000) {
  const start = Date.now();
  while (!check()) {
    if (Date.now() - start > ms) throw new Error('timed out waiting');
    await new Promise((r) => setTimeout(r, 50));
  }
}
