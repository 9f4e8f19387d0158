/** Facts of the trade (common practice, design/references.md) on the invented loader harness. */
import { describe, expect, it } from 'vitest';
import { prepareHarness } from '../../shared/engine';
import { loaderDoc } from '../support/fixtures/documents';

const h = prepareHarness(loaderDoc());
const v = (ref: string, state: string) => h.readings(state)!.pins.find((p) => p.ref === ref)!.volts!;

describe('trade facts on the loader harness', () => {
  it('key off: the constant feed reads battery volts, the ignition feed 0 V; key on: both battery volts (common practice)', () => {
    const batt = 12.6;
    expect(v('ACU.1', 'key_off')).toBeGreaterThan(batt - 0.2);
    expect(Math.abs(v('DSP.1', 'key_off'))).toBeLessThan(0.01);
    expect(v('ACU.1', 'key_on')).toBeGreaterThan(batt - 0.3);
    expect(v('DSP.1', 'key_on')).toBeGreaterThan(batt - 0.3);
    // Running and charging: 14.2 V at the battery (common practice: 13.8–14.4 V).
    expect(v('DSP.1', 'running')).toBeGreaterThan(13.8);
  });

  it('bus lines idle near 2.5 V each and add to about 5 V (ISO 11898-2; common practice)', () => {
    const hi = v('X1F.3', 'key_on');
    const lo = v('X1F.4', 'key_on');
    expect(Math.abs(hi - 2.5)).toBeLessThan(0.1);
    expect(Math.abs(lo - 2.5)).toBeLessThan(0.1);
    expect(Math.abs(hi + lo - 5)).toBeLessThan(0.15);
    expect(h.machineState('key_on')!.modules).toEqual({ ACU: true, DSP: true });
  });

  it('about 60 Ω between the bus lines with both terminators and the power off, about 120 Ω with one end unplugged (ISO 11898-2, SAE J1939-11)', () => {
    expect(Math.abs(h.ohms('X1.3', 'X1.4')! - 60)).toBeLessThan(1.5);
    expect(Math.abs(h.ohms('X1.3', 'X1.4', 'unplugged')! - 120)).toBeLessThan(1.5);
    // The display's bias is open with the power off: unplugged, the far half reads only its terminator.
    expect(Math.abs(h.ohms('X1F.3', 'X1F.4', 'unplugged')! - 120)).toBeLessThan(1.5);
  });

  it('key on: relay pulled in, work lamp fed and the 87a load off; key off the other way round', () => {
    expect(h.machineState('key_on')!.relays.K1).toBe(true);
    expect(v('LAMP.1', 'key_on')).toBeGreaterThan(12);
    expect(Math.abs(v('HORN.1', 'key_on'))).toBeLessThan(0.01);
    expect(h.machineState('key_off')!.relays.K1).toBe(false);
    expect(v('HORN.1', 'key_off')).toBeGreaterThan(12);
  });

  it('an output listed in the state drives its load from the module supply pin', () => {
    expect(v('SOL.1', 'aux_on')).toBeGreaterThan(11);
    // Off, it sits at its ground: a few mV above the frame with the lamp current in the boom ground's bond.
    expect(Math.abs(v('SOL.1', 'key_on') - v('GND2.G', 'key_on'))).toBeLessThan(1e-9);
    expect(Math.abs(v('SOL.1', 'key_on'))).toBeLessThan(0.05);
  });

  it('a hard short to ground downstream of a fuse blows it on insert; clamps and wires downstream of it lead the suspects (common practice)', () => {
    const fr = h.faultReadings({ kind: 'short', ref: 'W16' }, 'key_on')!;
    expect(fr.blowsOnInsert).toContain('F3');
    // 0.05 Ω to the frame draws far more than 5 × 20 A (Ohm's law).
    expect(Math.abs(fr.fuseCurrents.find((f) => f.id === 'F3')!.current!)).toBeGreaterThan(100);
    // With the fuse blown the lamp feed is dead.
    expect(Math.abs(fr.pins.find((p) => p.ref === 'LAMP.1')!.volts!)).toBeLessThan(0.01);

    const res = h.suspects([{ fuse: 'F3', blowsOnInsert: true }]);
    expect(res.suspects[0].fault).toMatchObject({ kind: 'short', ref: 'CL1' });
    const full = res.suspects.filter((s) => s.score === 1).map((s) => `${s.fault.kind}:${s.fault.ref}`);
    // Downstream of F3: W15 to the relay, W16 and W17 to the lamp (key on), W19 to the 87a load (key off).
    expect(new Set(full)).toEqual(new Set(['short:CL1', 'short:W15', 'short:W16', 'short:W17', 'short:W19']));
    expect(res.suspects[0].predicted).toEqual([{ fuse: 'F3', blowsOnInsert: true, match: 1 }]);
    // Unplugging X1 leaves W15, W16, W19 and the clamp on the feed side, clears W17.
    expect(res.nextUnplug).toEqual({ connector: 'X1', mate: 'X1F', splits: [4, 1] });
  }, 60_000);

  it('a blown fuse is found from the volts a tech reads', () => {
    const obs = [
      { pin: 'DSP.1', state: 'key_on', volts: 0 },
      { pin: 'ACU.1', state: 'key_on', volts: 12.5 },
      { pin: 'LAMP.1', state: 'key_on', volts: 0 },
    ];
    const top = (o: Parameters<typeof h.suspects>[0]) => h.suspects(o).suspects.filter((s) => s.score === 1).map((s) => `${s.fault.kind}:${s.fault.ref}`);
    // A short that blows F2 explains the same volts as F2 blown, and so does losing the key feed.
    expect(top(obs)).toEqual(expect.arrayContaining(['blown:F2', 'short:W9', 'open:W6']));
    expect(top(obs)).not.toContain('blown:F1');
    // A new fuse that holds rules the shorts out.
    const res = h.suspects([...obs, { fuse: 'F2', blowsOnInsert: false }]);
    expect(res.suspects[0].fault).toMatchObject({ kind: 'blown', ref: 'F2' });
    expect(res.suspects[0].score).toBe(1);
    expect(res.suspects.find((s) => s.fault.kind === 'short' && s.fault.ref === 'W9')!.score).toBeLessThan(1);
  }, 60_000);

  it('a missing terminator shows as 120 Ω across the bus with the power off', () => {
    const res = h.suspects([{ a: 'X1.3', b: 'X1.4', state: 'key_off', ohms: 120 }]);
    const top = res.suspects.filter((s) => s.score === 1).map((s) => `${s.fault.kind}:${s.fault.ref}`);
    expect(top).toContain('missing:RT1');
    expect(top).toContain('missing:RT2');
  }, 60_000);
});
