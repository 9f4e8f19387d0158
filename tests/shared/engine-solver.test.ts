import { describe, expect, it } from 'vitest';
import { prepareHarness, readings, ohms } from '../../shared/engine';
import { NetworkBuilder, solveNetwork } from '../../shared/engine/solver';
import { baseDoc, bridge, divider, w } from '../support/fixtures/documents';

const volts = (doc: Parameters<typeof readings>[0], ref: string, state = 's') => readings(doc, state)!.pins.find((p) => p.ref === ref)!.volts;

describe('closed-form circuits', () => {
  it('voltage divider with internal resistance (divider rule, Ohm\'s law)', () => {
    const [v, ri, r1, r2] = [12.6, 0.02, 470, 1000];
    const doc = divider(v, r1, r2, ri);
    const i = v / (ri + r1 + r2); // Ohm's law
    expect(volts(doc, 'B.+')).toBeCloseTo(v - i * ri, 10);
    expect(volts(doc, 'R1.2')).toBeCloseTo(v * r2 / (ri + r1 + r2), 10);
    expect(volts(doc, 'R2.2')).toBeCloseTo(0, 12);
    expect(readings(doc, 's')!.status).toBe('settled');
  });

  it('an ideal source across 0.001 Ω and 100 kΩ stays exact (Ohm\'s law, divider rule)', () => {
    const doc = divider(12, 0.001, 100000, 0);
    expect(volts(doc, 'R1.2')).toBeCloseTo(12 * 100000 / 100000.001, 11);
    expect(volts(doc, 'B.+')).toBe(12);
  });

  it('series and parallel resistances with the power off (series sum, parallel reciprocal sum)', () => {
    const doc = divider(12, 470, 1000);
    // Battery removed: R1 + R2 in series from B.+ to ground.
    expect(ohms(doc, 'R1.1', 'G.G')).toBeCloseTo(1470, 8);
    const par = baseDoc({
      components: [
        { id: 'A', kind: 'splice' }, { id: 'C', kind: 'splice' },
        { id: 'R1', kind: 'resistor', ohms: 100 }, { id: 'R2', kind: 'resistor', ohms: 220 }, { id: 'R3', kind: 'resistor', ohms: 330 },
      ],
      wires: [w('A.S', 'R1.1', 0), w('R1.2', 'C.S', 0), w('A.S', 'R2.1', 0), w('R2.2', 'C.S', 0), w('A.S', 'R3.1', 0), w('R3.2', 'C.S', 0)],
    });
    expect(ohms(par, 'A.S', 'C.S')).toBeCloseTo(1 / (1 / 100 + 1 / 220 + 1 / 330), 9);
    // Nothing joins A to the unconnected resistor R3's ends once its wires are gone: open.
    par.wires = par.wires.slice(0, 4);
    expect(ohms(par, 'A.S', 'R3.1')).toBeNull();
  });

  it('Wheatstone bridge: balanced carries nothing through the middle, unbalanced per Thevenin (Kirchhoff\'s laws)', () => {
    const bal = bridge(12, [100, 200, 150, 300, 470]);
    expect(volts(bal, 'A.S')! - volts(bal, 'C.S')!).toBeCloseTo(0, 12);
    const r: [number, number, number, number, number] = [100, 220, 330, 470, 1000];
    const doc = bridge(12, r);
    const vth = 12 * (r[1] / (r[0] + r[1]) - r[3] / (r[2] + r[3]));
    const rth = (r[0] * r[1]) / (r[0] + r[1]) + (r[2] * r[3]) / (r[2] + r[3]);
    const i5 = vth / (rth + r[4]);
    expect(volts(doc, 'A.S')! - volts(doc, 'C.S')!).toBeCloseTo(i5 * r[4], 10);
    // Power off, between A and C: R5 ∥ (R1 + R3) ∥ (R2 + R4) (battery removed leaves TOP joining only R1 and R3).
    const expected = 1 / (1 / r[4] + 1 / (r[0] + r[2]) + 1 / (r[1] + r[3]));
    expect(ohms(doc, 'A.S', 'C.S')).toBeCloseTo(expected, 9);
  });

  it('wire resistance enters the circuit: 10 m of 1 mm² feeding 1 Ω (ρL/A per IEC 60028, Ohm\'s law)', () => {
    const doc = divider(12, 1, 1);
    doc.wires[0] = { id: 'FEED', from: 'B.+', to: 'R1.1', size: { mm2: 1 }, lengthM: 10 };
    const rw = 0.017241 * 10;
    expect(volts(doc, 'R1.1')).toBeCloseTo(12 * 2 / (2 + rw), 10);
  });

  it('a node with no path to the chassis reads null (floating); a floating battery island too', () => {
    const doc = divider(12, 470, 1000);
    doc.components.push({ id: 'LOOSE', kind: 'resistor', ohms: 10 }, { id: 'B2', kind: 'battery', volts: 9 }, { id: 'R9', kind: 'resistor', ohms: 5 });
    doc.wires.push(w('B2.+', 'R9.1', 0), w('R9.2', 'B2.-', 0));
    const r = readings(doc, 's')!;
    expect(r.pins.find((p) => p.ref === 'LOOSE.1')!.volts).toBeNull();
    expect(r.pins.find((p) => p.ref === 'B2.+')!.volts).toBeNull();
    expect(r.pins.find((p) => p.ref === 'R1.2')!.volts).not.toBeNull();
  });

  it('readings list every pin of every component in document order; unknown state or pin answers null', () => {
    const doc = divider(12, 470, 1000);
    expect(readings(doc, 's')!.pins.map((p) => p.ref)).toEqual(['B.+', 'B.-', 'G.G', 'R1.1', 'R1.2', 'R2.1', 'R2.2']);
    expect(readings(doc, 'nope')).toBeNull();
    expect(ohms(doc, 'R1.1', 'NOPE.1')).toBeNull();
    expect(ohms(doc, 'R1.1', 'R1.1')).toBe(0);
  });

  it('an ideal battery shorted by a zero-ohm wire does not throw', () => {
    const doc = divider(12, 470, 1000);
    doc.wires.push(w('B.+', 'B.-', 0));
    expect(() => prepareHarness(doc).readings('s')).not.toThrow();
  });

  it('solver: supernode offsets across two ideal sources in series (Kirchhoff\'s voltage law)', () => {
    // 0 = chassis; 1 –(5 V)→ 2 –(7 V)→ 3, 1 tied to chassis, 3 → 100 Ω → chassis.
    const net = new NetworkBuilder(4);
    net.join(0, 1, 0);
    net.source(1, 2, 5, 0);
    net.source(2, 3, 7, 0);
    net.conductance(3, 0, 1 / 100);
    const s = solveNetwork(net, 0);
    expect(s.volts[2]).toBeCloseTo(5, 12);
    expect(s.volts[3]).toBeCloseTo(12, 12);
  });
});

describe('relays and modules', () => {
  it('a relay pulls in at 0.6 × nominal by default and not below (the contract)', () => {
    const mk = (v: number) => baseDoc({
      components: [
        { id: 'B', kind: 'battery', volts: v }, { id: 'G', kind: 'ground' },
        { id: 'K', kind: 'relay', coilOhms: 80 }, { id: 'L', kind: 'load', ohms: 10 },
      ],
      wires: [w('B.-', 'G.G', 0), w('B.+', 'K.85', 0), w('K.86', 'G.G', 0), w('B.+', 'K.30', 0), w('K.87', 'L.1', 0), w('L.2', 'G.G', 0)],
    });
    expect(volts(mk(7.3), 'L.1')).toBeCloseTo(7.3, 10); // 7.3 ≥ 7.2: energised
    expect(volts(mk(7.1), 'L.1')).toBeCloseTo(0, 10); // released: L.1 grounded through the load
  });

  it('a module is powered when a supply pin stands ≥ half nominal above its ground; outputs only then (the contract)', () => {
    const mk = (v: number) => baseDoc({
      components: [
        { id: 'B', kind: 'battery', volts: v }, { id: 'G', kind: 'ground' }, { id: 'L', kind: 'load', ohms: 20 },
        { id: 'M', kind: 'module', pins: [{ id: 'P', role: 'supply', ohms: 100 }, { id: 'GN', role: 'ground' }, { id: 'O', role: 'output', from: 'P', onOhms: 0.5 }, { id: 'R', role: 'ref5' }] },
      ],
      wires: [w('B.-', 'G.G', 0), w('B.+', 'M.P', 0), w('M.GN', 'G.G', 0), w('M.O', 'L.1', 0), w('L.2', 'G.G', 0)],
      states: [{ id: 's', switches: {}, outputs: ['M.O'] }],
    });
    const on = mk(12);
    expect(volts(on, 'L.1')).toBeCloseTo(12 * 20 / 20.5, 10); // divider through onOhms
    expect(volts(on, 'M.R')).toBeCloseTo(5, 10); // open ref5: 5 V
    const off = mk(5.9);
    expect(volts(off, 'L.1')).toBeCloseTo(0, 10);
    expect(volts(off, 'M.R')).toBeNull();
  });

  it('a relay that feeds its own coil through its 87a contact never settles (buzzer): unsettled', () => {
    const doc = baseDoc({
      components: [{ id: 'B', kind: 'battery', volts: 12 }, { id: 'G', kind: 'ground' }, { id: 'K', kind: 'relay', coilOhms: 80, normallyClosed: true }],
      wires: [w('B.-', 'G.G', 0), w('B.+', 'K.30', 0), w('K.87a', 'K.85', 0), w('K.86', 'G.G', 0)],
    });
    expect(readings(doc, 's')!.status).toBe('unsettled');
  });
});

describe('low-rank changes', () => {
  it('Sherman–Morrison–Woodbury volts equal a fresh factorisation after grounding a wire mid-length (linear algebra identity)', async () => {
    const { prepareCircuit, baseConfig, buildNetwork, orderFor } = await import('../../shared/engine/circuit');
    const { analyse, numeric, injectionsOf, lowRankVolts } = await import('../../shared/engine/solver');
    const { loaderDoc } = await import('../support/fixtures/documents');
    const doc = loaderDoc();
    const prep = prepareCircuit(doc);
    const cfg = { ...baseConfig(prep, doc.states[1], false), fixed: true };
    cfg.relayOn.fill(1);
    cfg.modOn.fill(1);
    const built = buildNetwork(prep, cfg);
    const pt = analyse(built.net, 0, prep.cache, orderFor(prep));
    const inj = injectionsOf(built.net);
    const eg0 = built.net.eg.slice(0, built.net.edges);
    const base = numeric(pt, eg0, inj);
    for (const wire of [0, 6, 15, 20, 30]) {
      const eg = eg0.slice();
      const changes = [
        { e: 3 * wire, g: 1 / (prep.wireR[wire] * 0.3) },
        { e: 3 * wire + 1, g: 1 / (prep.wireR[wire] * 0.7) },
        { e: 3 * wire + 2, g: 20 },
      ].map(({ e, g }) => {
        const c = { a: built.net.ea[e], b: built.net.eb[e], dg: g - eg[e] };
        eg[e] = g;
        return c;
      });
      const fresh = numeric(pt, eg, inj).volts;
      const quick = lowRankVolts(pt, base.factor!, changes)!;
      expect(quick).not.toBeNull();
      for (let i = 0; i < fresh.length; i++) {
        if (Number.isNaN(fresh[i])) expect(quick[i]).toBeNaN();
        else expect(Math.abs(quick[i] - fresh[i])).toBeLessThan(1e-9);
      }
    }
  });
});
