/**
 * The demo harnesses read as a tech expects, through the engine's public
 * functions (shared/engine): voltages per state against the trade's facts,
 * the bus resistance with the power off, feed and ground drops under load,
 * and the walk-through fault (a chafe at lift-arm clip CL7) blowing its fuse
 * and leading the suspects.
 *
 * Sources named beside each check (references.md): ISO 11898-2, SAE J1939-11,
 * ISO 8820-3, Ohm's law, "common practice" for facts of the trade.
 */
import { describe, expect, it } from 'vitest';
import * as engine from '../../shared/engine';
import type { HarnessDocument } from '../../shared/harness/schema';
import { demoHarnesses, krT78MainHarness, krT78WithMulcher, walkThroughFault } from '../../seeds/harnesses';
import { demoFaults } from '../../seeds/harnesses/walk-through';

type Doc = HarnessDocument;
type Key = keyof typeof demoHarnesses;
const docs = Object.entries(demoHarnesses) as [Key, Doc][];

// ---- helpers over the engine's public functions

const prepared = new Map<Doc, ReturnType<typeof engine.prepareHarness>>();
function prep(doc: Doc) {
  let p = prepared.get(doc);
  if (!p) {
    p = engine.prepareHarness(doc);
    prepared.set(doc, p);
  }
  return p;
}

function pinVolts(r: { pins: { ref: string; volts: number | null }[] }): Map<string, number | null> {
  return new Map(r.pins.map((p) => [p.ref, p.volts]));
}

const cache = new Map<string, Map<string, number | null>>();
function volts(doc: Doc, state: string): Map<string, number | null> {
  const k = `${doc.name}|${state}`;
  let m = cache.get(k);
  if (!m) {
    const r = prep(doc).readings(state);
    expect(r?.status, `${doc.name} ${state}`).toBe('settled');
    m = pinVolts(r!);
    cache.set(k, m);
  }
  return m;
}

function v(doc: Doc, state: string, ref: string): number | null {
  const m = volts(doc, state);
  expect(m.has(ref), `${ref} in readings`).toBe(true);
  return m.get(ref) ?? null;
}

function ohmsOf(doc: Doc, a: string, b: string, state?: string): number | null {
  return prep(doc).ohms(a, b, state);
}

function batteryId(doc: Doc): string {
  return doc.components.find((c) => c.kind === 'battery')!.id;
}

const near = (x: number | null, target: number, tol: number) => x !== null && Math.abs(x - target) <= tol;

// ---- the loader on its own

describe('KR-T78 main harness readings', () => {
  const doc = krT78MainHarness;
  const constantFeeds = ['F2.2', 'X40.1', 'F3.2', 'MCU.1', 'F1.2', 'S1.B'];
  const ignitionFeeds = ['SP2.S', 'F7.2', 'MCU.2', 'F6.2', 'DSP.1', 'F8.2', 'ECU.1', 'F13.2', 'MCU.3'];

  it('battery at rest reads 12.4-12.7 V with the key off and on (common practice)', () => {
    for (const s of ['key_off', 'key_on']) {
      const b = v(doc, s, 'BATT.+')!;
      expect(b).toBeGreaterThanOrEqual(12.4);
      expect(b).toBeLessThanOrEqual(12.7);
    }
  });

  it('battery running and charging reads 13.8-14.4 V (common practice)', () => {
    for (const s of ['running', 'running_aux', 'running_lamps']) {
      const b = v(doc, s, 'BATT.+')!;
      expect(b).toBeGreaterThanOrEqual(13.8);
      expect(b).toBeLessThanOrEqual(14.4);
    }
  });

  it('key off: constant feeds read battery, ignition feeds 0 V (common practice)', () => {
    const b = v(doc, 'key_off', 'BATT.+')!;
    for (const p of constantFeeds) expect(near(v(doc, 'key_off', p), b, 0.05), p).toBe(true);
    for (const p of ignitionFeeds) expect(v(doc, 'key_off', p) ?? 0, p).toBeLessThan(0.1);
    // switched attachment power behind the open relay K3: no voltage (a meter reads 0 or wanders)
    expect(v(doc, 'key_off', 'X40.2') ?? 0).toBeLessThan(0.1);
  });

  it('key on: constant and ignition feeds both read battery (common practice)', () => {
    for (const s of ['key_on', 'running']) {
      const b = v(doc, s, 'BATT.+')!;
      for (const p of [...constantFeeds, ...ignitionFeeds, 'X40.2']) expect(near(v(doc, s, p), b, 0.3), `${s} ${p}`).toBe(true);
    }
  });

  it('cranking: the start circuit is live and the starter relay pulls in', () => {
    const b = v(doc, 'cranking', 'BATT.+')!;
    expect(near(v(doc, 'cranking', 'M1.1'), b, 0.5)).toBe(true);
    expect(v(doc, 'key_on', 'M1.1') ?? 0).toBeLessThan(0.1);
  });

  it('bus lines idle near 2.5 V each, adding to about 5 V, with the key on (ISO 11898-2; common practice)', () => {
    for (const s of ['key_on', 'running', 'running_aux']) {
      for (const [h, l] of [['X40.4', 'X40.5'], ['MCU.6', 'MCU.7'], ['ECU.4', 'ECU.5'], ['DSP.3', 'DSP.4']]) {
        const vh = v(doc, s, h)!;
        const vl = v(doc, s, l)!;
        expect(near(vh, 2.5, 0.2), `${s} ${h}`).toBe(true);
        expect(near(vl, 2.5, 0.2), `${s} ${l}`).toBe(true);
        expect(near(vh + vl, 5, 0.3)).toBe(true);
        expect(Math.abs(vh - vl)).toBeLessThan(0.05); // recessive: differential about 0 V (ISO 11898-2)
      }
    }
  });

  it('handle sensors get 5 V and sit at mid-scale at rest (common practice for ratiometric sensors)', () => {
    expect(near(v(doc, 'key_on', 'HL.1'), 5, 0.1)).toBe(true);
    expect(near(v(doc, 'key_on', 'MCU.10'), 2.5, 0.1)).toBe(true);
    expect(v(doc, 'key_off', 'MCU.10') ?? 0).toBeLessThan(0.1);
  });

  it('an attachment function commanded drives its solenoid; released it reads 0 V', () => {
    expect(near(v(doc, 'running_aux', 'Y3.1'), v(doc, 'running_aux', 'BATT.+')!, 0.5)).toBe(true);
    expect(v(doc, 'running', 'Y3.1') ?? 0).toBeLessThan(0.1);
  });

  it('about 60 ohms CAN_H to CAN_L with the power off and both terminators; 120 with the dust cap off (ISO 11898-2; SAE J1939-11)', () => {
    for (const [a, b] of [['X40.4', 'X40.5'], ['X10A.3', 'X10A.4'], ['MCU.6', 'MCU.7']]) {
      expect(near(ohmsOf(doc, a, b, 'key_off'), 60, 3), `${a}-${b}`).toBe(true);
    }
    expect(near(ohmsOf(doc, 'X40.4', 'X40.5', 'key_off_cap_off'), 120, 3)).toBe(true);
  });

  it('the walk from the battery to the attachment constant cavity passes F2, 15 A, blue (ISO 8820-3)', () => {
    const { paths } = prep(doc).walk('BATT.+', 'X40.1', 'key_off');
    expect(paths.length).toBeGreaterThan(0);
    const fuses = paths[0].steps.filter((s) => s.type === 'fuse');
    expect(fuses.map((f) => f.type === 'fuse' && [f.id, f.amps, f.colour?.name])).toEqual([
      ['FM1', 100, undefined],
      ['F2', 15, 'blue'],
    ]);
    expect(paths[0].steps.some((s) => s.type === 'wire' && s.id === 'W27')).toBe(true);
  });
});

// ---- every document, every state

describe.each(docs)('%s', (_key, doc) => {
  const batt = batteryId(doc);

  it('every state settles', () => {
    for (const s of doc.states) expect(prep(doc).readings(s.id)?.status, s.id).toBe('settled');
  });

  it('loses under 0.5 V along each power feed and under 0.2 V along each ground under load (references.md, from memory)', () => {
    for (const s of doc.states) {
      const b = v(doc, s.id, `${batt}.+`);
      if (b === null) continue;
      for (const c of doc.components) {
        if (c.kind !== 'load') continue;
        const v1 = v(doc, s.id, `${c.id}.1`);
        const v2 = v(doc, s.id, `${c.id}.2`);
        if (v1 === null || v2 === null || v1 - v2 < 1) continue; // not energised
        expect(b - v1, `${s.id} ${c.id} feed`).toBeLessThan(0.5);
        expect(v2, `${s.id} ${c.id} ground`).toBeLessThan(0.2);
      }
    }
  });

  it('reads about 60 ohms between the bus lines at the attachment plug with the power off (ISO 11898-2; SAE J1939-11)', () => {
    const [h, l] = doc.components.some((c) => c.id === 'X40') ? ['X40.4', 'X40.5'] : ['X10A.3', 'X10A.4'];
    expect(near(ohmsOf(doc, h, l, 'key_off'), 60, 3)).toBe(true);
  });
});

describe('attachments', () => {
  it('with the mulcher fitted, its control unit is fed, talks and drives the rotor valve', () => {
    const doc = krT78WithMulcher;
    const b = v(doc, 'running_rotor', 'BATT.+')!;
    expect(v(doc, 'key_off', 'ACU.1') ?? 0).toBeLessThan(0.1); // switched feed, key off (common practice)
    expect(near(v(doc, 'key_off', 'ACU.3'), v(doc, 'key_off', 'BATT.+')!, 0.05)).toBe(true); // constant feed
    expect(near(v(doc, 'key_on', 'XM1.4'), 2.5, 0.2)).toBe(true); // ISO 11898-2
    expect(near(v(doc, 'running_rotor', 'MY1.1'), b, 0.5)).toBe(true);
    expect(near(v(doc, 'key_on', 'ACU.10'), 0.5, 0.05)).toBe(true); // pressure sensor at 0 bar
  });

  it('the mulcher plug on its own reads its own terminator, about 120 ohms', () => {
    expect(near(ohmsOf(demoHarnesses['fw-m60-mulcher'], 'XM1.4', 'XM1.5', 'key_off_unplugged'), 120, 3)).toBe(true);
    expect(near(ohmsOf(krT78WithMulcher, 'XM1.4', 'XM1.5', 'key_off_unplugged'), 120, 3)).toBe(true);
  });
});

// ---- the walk-through fault

describe('walk-through: short to ground at lift-arm clip CL7', () => {
  const doc = krT78MainHarness;
  const fault = walkThroughFault.fault;

  it('draws more than 5 x the 15 A rating through F2 with the key off: blows on insert (contract rule; common practice)', () => {
    const r = engine.faultReadings(doc, fault, 'key_off')!;
    expect(r.blowsOnInsert).toEqual(['F2']);
    const f2 = r.fuseCurrents.find((f) => f.id === 'F2')!;
    expect(f2.current!).toBeGreaterThan(5 * 15);
    // Ohm's law over the loop: battery, its cable, main fuse, F2, the feed up to the chafe, 0.05 ohm to chassis
    // (contract), back through the battery negative. Copper at 20 °C: 0.017241 ohm·mm²/m (IEC 60028).
    const w = (id: string) => {
      const wire = doc.wires.find((x) => x.id === id)!;
      return (0.017241 * wire.lengthM) / (wire.size as { mm2: number }).mm2;
    };
    const loop = 0.01 + w('W1') + 0.0006 + w('W3') + w('W5') + 0.005 + w('W25') + 0.002 + w('W26') + 0.002 + 0.55 * w('W27') + 0.05 + 0.002 + w('W2');
    expect(f2.current!).toBeCloseTo(12.6 / loop, 0);
  });

  it('fault-free, the front side of X20 and X30 reads open to chassis on the power cavity, and the bus still 120 ohms on the arm', () => {
    expect(ohmsOf(doc, 'X20B.1', 'G3.G', 'key_off_x20_apart')).toBeNull();
    expect(ohmsOf(doc, 'X30B.1', 'G3.G', 'key_off_x30_apart')).toBeNull();
    expect(near(ohmsOf(doc, 'X30B.3', 'X30B.4', 'key_off_x30_apart'), 120, 3)).toBe(true); // the cap's terminator (ISO 11898-2)
  });

  it('ranks CL7 first among the suspects for the walk-through readings', () => {
    const list = engine.suspects(doc, walkThroughFault.observations).suspects;
    const top = list.slice(0, 3).map((s) => `${s.fault.kind}:${s.fault.ref}`);
    expect(top).toContain('short:CL7');
    expect(`${list[0].fault.kind}:${list[0].fault.ref}`).toBe('short:CL7');
  }, 60_000);

  it('following the next-unplug advice step by step leads from the fuse to CL7 (halving the circuit: common practice)', () => {
    const obs = walkThroughFault.observations;
    const leaders = (n: number) => {
      const r = engine.suspects(doc, obs.slice(0, n));
      const best = r.suspects[0].score;
      return { r, ids: r.suspects.filter((s) => s.score >= best - 1e-9).map((s) => s.fault.ref) };
    };
    const s1 = leaders(1);
    expect(s1.r.nextUnplug?.connector).toMatch(/^X20/);
    expect(s1.ids).toContain('CL7');
    const s2 = leaders(2);
    expect(s2.r.nextUnplug?.connector).toMatch(/^X30/);
    expect(s2.ids).not.toContain('CL2');
    const s3 = leaders(3);
    expect(s3.ids.sort()).toEqual(['CL7', 'W27']);
    const s4 = leaders(4);
    expect(s4.ids).toEqual(['CL7']);
    // the engine's predicted meter readings under the fault agree with the ones written in the demo (within 0.03 ohm)
    for (const p of s4.r.suspects[0].predicted) if ('ohms' in p) expect(Math.abs(p.ohms! - (obs.find((o) => 'a' in o && o.a === p.a) as { ohms: number }).ohms)).toBeLessThan(0.03);
  }, 120_000);

  it('with only the blown fuse, CL7 is among the shorts the fuse points to', () => {
    const list = engine.suspects(doc, [{ fuse: 'F2', blowsOnInsert: true }]).suspects;
    const best = list[0].score;
    const leaders = list.filter((s) => s.score >= best - 1e-9).map((s) => `${s.fault.kind}:${s.fault.ref}`);
    expect(leaders).toContain('short:CL7');
  }, 60_000);
});

describe.each(demoFaults.map((f) => [f.id, f] as const))('demo fault %s', (_id, f) => {
  it('its fault is among the leading suspects for its readings', () => {
    const list = engine.suspects(demoHarnesses[f.harness], f.observations).suspects;
    const best = list[0].score;
    const leaders = list.filter((s) => s.score >= best - 1e-9).map((s) => `${s.fault.kind}:${s.fault.ref}`);
    expect(best).toBeGreaterThan(0.99);
    expect(leaders).toContain(`${f.fault.kind}:${f.fault.ref}`);
  }, 60_000);
});
