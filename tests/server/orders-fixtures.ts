import type { TestAgent, TestContext } from '../support/server-context';

/** A small harness document: battery → fuse → connector half → lamp, and ground. */
export const smallHarness = {
  format: 'wirewalk-harness',
  version: 1,
  name: 'Work light circuit, test loader',
  nominalVolts: 12,
  temperatureC: 20,
  components: [
    { id: 'BATT', kind: 'battery', label: 'Battery', volts: 12.6 },
    { id: 'F3', kind: 'fuse', label: 'Work light fuse', amps: 10 },
    { id: 'X12', kind: 'connector', label: 'Cab to boom', cavities: ['1', '2'] },
    { id: 'L1', kind: 'load', label: 'Work light', watts: 55 },
    { id: 'GND', kind: 'ground', label: 'Frame ground' },
  ],
  wires: [
    { id: 'W1', from: 'BATT.+', to: 'F3.1', color: 'RD', size: { mm2: 2.5 }, lengthM: 0.5, circuit: 'B+' },
    { id: 'W2', from: 'F3.2', to: 'X12.1', color: 'RD/WH', size: { mm2: 1.0 }, lengthM: 2.4, circuit: 'A12' },
    { id: 'W3', from: 'X12.1', to: 'L1.1', color: 'RD/WH', size: { mm2: 1.0 }, lengthM: 1.2, circuit: 'A12' },
    { id: 'W4', from: 'L1.2', to: 'GND.G', color: 'BK', size: { mm2: 1.0 }, lengthM: 0.4 },
    { id: 'W5', from: 'BATT.-', to: 'GND.G', color: 'BK', size: { mm2: 6 }, lengthM: 0.6 },
  ],
  clamps: [],
  states: [{ id: 'key_on', label: 'Key on', switches: {}, sources: {}, outputs: [], unplugged: [] }],
};

export async function importHarness(ctx: TestContext, agent?: TestAgent): Promise<{ harnessId: string; revisionId: string }> {
  const a = agent ?? (await ctx.agent('lead'));
  const res = await a.post('/api/harnesses/import').set('Origin', ctx.origin).send(smallHarness);
  if (res.status !== 201) throw new Error(`harness import answered ${res.status}: ${JSON.stringify(res.body)}`);
  return res.body;
}

export async function makeCustomerAndUnit(ctx: TestContext, agent?: TestAgent, name = 'Halvorsen Grading') {
  const a = agent ?? (await ctx.agent('writer'));
  const c = await a.post('/api/customers').send({ name, company: `${name} LLC`, email: 'ops@halvorsen-grading.example', contacts: [{ name: 'Jo Halvorsen', role: 'Fleet manager', phone: '555-0142' }] });
  if (c.status !== 201) throw new Error(`customer: ${c.status} ${JSON.stringify(c.body)}`);
  const u = await a.post('/api/units').send({ customerId: c.body.customer.id, kind: 'machine', description: 'Kestrel KR-T78 track loader', serialNumber: `KRT78-${Math.floor(Math.random() * 1e6)}`, hourMeter: 2140 });
  if (u.status !== 201) throw new Error(`unit: ${u.status} ${JSON.stringify(u.body)}`);
  return { customer: c.body.customer, unit: u.body.unit };
}

export async function makeOrder(ctx: TestContext, options: { assignTo?: string; complaint?: string } = {}) {
  const writer = await ctx.agent('writer');
  const { customer, unit } = await makeCustomerAndUnit(ctx, writer);
  const res = await writer.post('/api/repair-orders').send({
    customerId: customer.id,
    unitIds: [unit.id],
    complaint: options.complaint ?? 'Work lights flicker, then go out after an hour of running.',
    assignedTechId: options.assignTo ?? ctx.demo.users.tech.id,
    hourMeter: 2150,
  });
  if (res.status !== 201) throw new Error(`order: ${res.status} ${JSON.stringify(res.body)}`);
  return { customer, unit, order: res.body.order };
}

/** A real 64×48 JPEG made with sharp. */
export async function jpeg(width = 64, height = 48): Promise<Buffer> {
  const sharp = (await import('sharp')).default;
  return sharp({ create: { width, height, channels: 3, background: { r: 180, g: 90, b: 40 } } }).jpeg().toBuffer();
}
export async function png(width = 40, height = 30): Promise<Buffer> {
  const sharp = (await import('sharp')).default;
  return sharp({ create: { width, height, channels: 3, background: { r: 20, g: 120, b: 200 } } }).png().toBuffer();
}
