/** Property tests on random valid documents (fast-check). */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { validateDocument } from '../../shared/harness';
import type { Component, HarnessDocument } from '../../shared/harness/schema';
import { componentPinIds } from '../../shared/harness/schema';
import { prepareHarness } from '../../shared/engine';
import { baseConfig, prepareCircuit, settle } from '../../shared/engine/circuit';

const ohmsArb = fc.constantFrom(0, 0.001, 0.05, 1, 47, 120, 2200, 100000);

const componentArb = (i: number): fc.Arbitrary<Component[]> =>
  fc.oneof(
    fc.record({ v: fc.double({ min: 0, max: 15, noNaN: true }), r: fc.constantFrom(0, 0, 0.005, 0.5) }).map(({ v, r }) => [{ id: `B${i}`, kind: 'battery', volts: v, internalOhms: r }] as Component[]),
    fc.constantFrom(0, 0.002).map((b) => [{ id: `G${i}`, kind: 'ground', bondOhms: b }] as Component[]),
    fc.constantFrom(5, 10, 15).map((a) => [{ id: `F${i}`, kind: 'fuse', amps: a }] as Component[]),
    ohmsArb.map((o) => [{ id: `R${i}`, kind: 'resistor', ohms: o }] as Component[]),
    fc.oneof(ohmsArb.map((o) => ({ ohms: o })), fc.constantFrom(5, 55).map((w) => ({ watts: w }))).map((x) => [{ id: `L${i}`, kind: 'load', ...x }] as Component[]),
    fc.constant([{ id: `S${i}`, kind: 'splice' }] as Component[]),
    fc.record({ n: fc.integer({ min: 1, max: 3 }), c: fc.constantFrom(0, 0.002) }).map(({ n, c }) => {
      const cav = Array.from({ length: n }, (_, k) => `${k + 1}`);
      return [{ id: `X${i}`, kind: 'connector', cavities: cav, matesWith: `Y${i}`, contactOhms: c }, { id: `Y${i}`, kind: 'connector', cavities: [...cav] }] as Component[];
    }),
    fc.constantFrom(0, 0.01).map((c) => [{ id: `K${i}`, kind: 'switch', pins: ['A', 'B', 'C'], positions: { off: [], on: [['A', 'B']], both: [['A', 'B'], ['A', 'C']] }, contactOhms: c }] as Component[]),
    fc.record({ nc: fc.boolean(), coil: fc.constantFrom(60, 90, 200) }).map(({ nc, coil }) => [{ id: `RL${i}`, kind: 'relay', coilOhms: coil, normallyClosed: nc }] as Component[]),
    fc.record({ gnd: fc.boolean(), bias: fc.constantFrom(0, 2500) }).map(({ gnd, bias }) => [{
      id: `M${i}`, kind: 'module', pins: [
        { id: '1', role: 'supply', ohms: 150 }, ...(gnd ? [{ id: '2', role: 'ground' }] : []), { id: '3', role: 'can_h', biasOhms: bias }, { id: '4', role: 'can_l' },
        { id: '5', role: 'output', from: '1' }, { id: '6', role: 'ref5' }, { id: '7', role: 'input' },
      ],
    }] as Component[]),
  );

const docArb: fc.Arbitrary<HarnessDocument> = fc
  .integer({ min: 2, max: 10 })
  .chain((n) => fc.tuple(...Array.from({ length: n }, (_, i) => componentArb(i))))
  .chain((groups) => {
    const components = [{ id: 'BATT', kind: 'battery', volts: 12.6 }, { id: 'GND', kind: 'ground' }, ...groups.flat()] as Component[];
    const pins = components.flatMap((c) => componentPinIds(c).map((p) => `${c.id}.${p}`));
    const wireArb = fc.record({ a: fc.nat(pins.length - 1), b: fc.nat(pins.length - 1), r: fc.oneof(ohmsArb, fc.constant(undefined)), len: fc.double({ min: 0, max: 5, noNaN: true }) });
    const switches = components.filter((c) => c.kind === 'switch').map((c) => c.id);
    const connectors = components.filter((c) => c.kind === 'connector').map((c) => c.id);
    const outputs = components.filter((c) => c.kind === 'module').map((c) => `${c.id}.5`);
    const stateArb = fc.record({
      pos: fc.array(fc.constantFrom('off', 'on', 'both'), { minLength: switches.length, maxLength: switches.length }),
      unplugged: fc.subarray(connectors),
      outputs: fc.subarray(outputs),
      src: fc.option(fc.double({ min: 0, max: 15, noNaN: true }), { nil: undefined }),
    });
    return fc.record({ wires: fc.array(wireArb, { minLength: 1, maxLength: 25 }), states: fc.array(stateArb, { minLength: 1, maxLength: 2 }) }).map(({ wires, states }) => ({
      format: 'wirewalk-harness' as const,
      version: 1 as const,
      name: 'random',
      nominalVolts: 12,
      temperatureC: 20,
      components,
      wires: [
        { id: 'WB1', from: 'BATT.-', to: 'GND.G', size: { mm2: 10 }, lengthM: 0.5 },
        ...wires.map((w, k) => ({ id: `W${k}`, from: pins[w.a], to: pins[w.b], size: { mm2: 1 }, lengthM: w.len, ...(w.r === undefined ? {} : { ohms: w.r }) })),
      ],
      clamps: [],
      states: states.map((s, k) => ({
        id: `st${k}`,
        switches: Object.fromEntries(switches.map((id, j) => [id, s.pos[j]])),
        unplugged: s.unplugged,
        outputs: s.outputs,
        ...(s.src === undefined ? {} : { sources: { BATT: s.src } }),
      })),
    }));
  });

/**
 * Kirchhoff's current law per supernode (nodes tied by zero-ohm joins or ideal sources are one node):
 * the worst imbalance beyond 1e-7 of the currents meeting there and the rounding of the
 * node volts (1e-12 × 15 V × the stiffest conductance there), in amps.
 */
function kclResidual(doc: HarnessDocument, stateId: string): number {
  const prep = prepareCircuit(doc);
  const sol = settle(prep, baseConfig(prep, doc.states.find((s) => s.id === stateId)!, false));
  const net = sol.built.net;
  const v = sol.volts;
  const parent = Array.from({ length: net.nodeCount }, (_, i) => i);
  const find = (x: number): number => (parent[x] === x ? x : (parent[x] = find(parent[x])));
  for (let j = 0; j < net.joins; j++) parent[find(net.ja[j])] = find(net.jb[j]);
  const sum = new Float64Array(net.nodeCount);
  const mag = new Float64Array(net.nodeCount);
  const stiff = new Float64Array(net.nodeCount);
  for (let e = 0; e < net.edges; e++) {
    const g = net.eg[e];
    if (g === 0) continue;
    const a = net.ea[e];
    const b = net.eb[e];
    if (Number.isNaN(v[a]) || Number.isNaN(v[b])) continue;
    const i = g * (v[a] - v[b]);
    sum[find(a)] -= i;
    sum[find(b)] += i;
    mag[find(a)] += Math.abs(i);
    mag[find(b)] += Math.abs(i);
    stiff[find(a)] = Math.max(stiff[find(a)], g);
    stiff[find(b)] = Math.max(stiff[find(b)], g);
  }
  for (let k = 0; k < net.injections; k++) {
    const a = net.ia[k];
    if (Number.isNaN(v[a])) continue;
    sum[find(a)] += net.iv[k];
    mag[find(a)] += Math.abs(net.iv[k]);
  }
  let worst = 0;
  for (let i = 0; i < net.nodeCount; i++) {
    if (find(i) !== i || i === find(0)) continue; // the chassis reference takes the return current
    if (Number.isNaN(v[i])) continue;
    worst = Math.max(worst, Math.abs(sum[i]) - 1e-7 * mag[i] - 1.5e-11 * stiff[i]);
  }
  return worst;
}

describe('random valid documents', () => {
  it('validate, never throw, and satisfy Kirchhoff\'s current law at every node (fast-check)', () => {
    fc.assert(fc.property(docArb, (doc) => {
      const r = validateDocument(doc);
      expect(r.ok, r.ok ? '' : JSON.stringify(r.problems)).toBe(true);
      const h = prepareHarness(doc);
      for (const s of doc.states) {
        const rd = h.readings(s.id)!;
        expect(rd.pins.length).toBe(h.pins.length);
        for (const p of rd.pins) expect(p.volts === null || Number.isFinite(p.volts)).toBe(true);
        expect(kclResidual(doc, s.id)).toBeLessThan(1e-9);
      }
    }), { numRuns: 150 });
  }, 120_000);

  it('two-point ohms are reciprocal and non-negative; walks and faults never throw (reciprocity theorem, fast-check)', () => {
    fc.assert(fc.property(docArb, fc.nat(), fc.nat(), (doc, i, j) => {
      const h = prepareHarness(doc);
      const a = h.pins[i % h.pins.length];
      const b = h.pins[j % h.pins.length];
      const ab = h.ohms(a, b, 'st0');
      const ba = h.ohms(b, a, 'st0');
      expect(ab === null).toBe(ba === null);
      if (ab !== null && ba !== null) {
        expect(ab).toBeGreaterThanOrEqual(0);
        expect(Math.abs(ab - ba)).toBeLessThanOrEqual(1e-6 * Math.max(1, ab));
      }
      const w = h.walk(a, b);
      for (let k = 1; k < w.paths.length; k++) expect(w.paths[k].ohms).toBeGreaterThanOrEqual(w.paths[k - 1].ohms - 1e-9);
      const faults = h.listFaults();
      if (faults.length) h.faultReadings(faults[i % faults.length], 'st0');
      h.suspects([{ pin: a, state: 'st0', volts: 1 }, { a, b, state: 'st0', ohms: null }, { fuse: 'F0', blowsOnInsert: true }]);
    }), { numRuns: 100 });
  }, 120_000);
});
