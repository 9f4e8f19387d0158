import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runStalledCheck } from '../../server/orders/stalled';
import { createTestContext, type TestContext } from '../support/server-context';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext({ demo: 'full' });
});
afterAll(async () => {
  await ctx?.close();
});

describe('the demo orders', () => {
  it('has customers, units, procedures and orders through every status, one of them stalled', async () => {
    const writer = await ctx.agent('writer');
    const customers = await writer.get('/api/customers');
    expect(customers.body.total).toBeGreaterThanOrEqual(3);
    const units = await writer.get('/api/units');
    expect(units.body.units.some((u: { modelName: string | null; modelId: string | null }) => u.modelId && u.modelName)).toBe(true);
    const procedures = await writer.get('/api/procedures');
    expect(procedures.body.procedures.map((p: { title: string }) => p.title)).toEqual(expect.arrayContaining(['Joystick calibration']));
    expect(procedures.body.procedures.every((p: { notes: string | null }) => p.notes)).toBe(true);
    const orders = await (await ctx.agent('owner')).get('/api/repair-orders?pageSize=100');
    const statuses = new Set(orders.body.orders.map((o: { status: string }) => o.status));
    expect([...statuses].sort()).toEqual(['closed', 'diagnosing', 'open', 'ready', 'waiting_on_parts']);
    const stalled = orders.body.orders.filter((o: { stalled: boolean }) => o.stalled);
    expect(stalled).toHaveLength(1);
    // Already mailed in the demo: the check sends nothing at start-up.
    expect((await runStalledCheck(ctx.deps)).sent).toBe(0);
    // The next number follows the demo's.
    const c = customers.body.customers[0];
    const unit = units.body.units.find((u: { customerId: string }) => u.customerId === c.id);
    const next = await writer.post('/api/repair-orders').send({ customerId: c.id, unitIds: [unit.id], complaint: 'New job' });
    expect(next.body.order.number).toBe(Math.max(...orders.body.orders.map((o: { number: number }) => o.number)) + 1);
    // The tech's own list.
    const mine = await (await ctx.agent('tech')).get('/api/repair-orders?techId=me&status=open&status=diagnosing');
    expect(mine.body.total).toBeGreaterThanOrEqual(2);
  });
});
