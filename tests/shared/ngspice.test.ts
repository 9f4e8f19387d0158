/**
 * The engine against ngspice (an independent circuit simulator, Debian
 * package `ngspice`): every pin's volts within 1 mV and chosen two-point
 * resistances within 0.1 % (design/references.md).
 */
import { makeHarnessScript } from '../support/make-harness';
import { execFileSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { validateDocument } from '../../shared/harness';
import { prepareHarness } from '../../shared/engine';
import type { HarnessDocument } from '../../shared/harness/schema';
import { hasNgspice, spiceOhms, spiceVolts } from '../support/ngspice';
import { bridge, divider, loaderDoc } from '../support/fixtures/documents';

const ngspice = hasNgspice();
if (!ngspice) console.warn('ngspice is not installed (/usr/bin/ngspice): the ngspice comparisons are skipped');

function checkVolts(doc: HarnessDocument) {
  const h = prepareHarness(doc);
  let compared = 0;
  for (const st of doc.states) {
    const ms = h.machineState(st.id)!;
    expect(ms.status).toBe('settled');
    const spice = spiceVolts(doc, { stateId: st.id, relays: ms.relays, modules: ms.modules });
    for (const p of h.readings(st.id)!.pins) {
      if (p.volts === null) continue;
      const v = spice.get(p.ref);
      expect(v, `${p.ref} in ${st.id}`).toBeDefined();
      expect(Math.abs(p.volts - v!), `${p.ref} in ${st.id}: engine ${p.volts}, ngspice ${v}`).toBeLessThanOrEqual(1e-3);
      compared++;
    }
  }
  return compared;
}

function checkOhms(doc: HarnessDocument, pairs: [string, string, string?][]) {
  const h = prepareHarness(doc);
  for (const [a, b, st] of pairs) {
    const mine = h.ohms(a, b, st);
    const theirs = spiceOhms(doc, a, b, st);
    expect(mine, `${a}–${b}`).not.toBeNull();
    expect(Math.abs(mine! - theirs) / Math.max(theirs, 1e-9), `${a}–${b} (${st ?? 'no state'}): engine ${mine}, ngspice ${theirs}`).toBeLessThanOrEqual(1e-3);
  }
}

describe.skipIf(!ngspice)('engine against ngspice', () => {
  it('a voltage divider and a bridge (every pin within 1 mV: ngspice)', () => {
    expect(checkVolts(divider(12.6, 470, 1000, 0.02))).toBeGreaterThan(0);
    expect(checkVolts(bridge(12, [100, 220, 330, 470, 1000]))).toBeGreaterThan(0);
  }, 60_000);

  it('the invented loader harness in every state: relays, modules with bus pins, outputs, ref5, unplugged halves (ngspice)', () => {
    const doc = loaderDoc();
    expect(validateDocument(doc).ok).toBe(true);
    expect(checkVolts(doc)).toBeGreaterThan(100);
  }, 60_000);

  it('two-point resistances with the power off within 0.1 % (ngspice, 1 A current source)', () => {
    const doc = loaderDoc();
    checkOhms(doc, [
      ['X1.3', 'X1.4'],
      ['X1.3', 'X1.4', 'unplugged'],
      ['BATT.+', 'LAMP.1', 'key_on'],
      ['ACU.1', 'GND2.G'],
      ['ACU.6', 'ACU.7'],
      ['SOL.1', 'GND1.G'],
    ]);
    checkOhms(bridge(12, [100, 220, 330, 470, 1000]), [['A.S', 'C.S'], ['TOP.S', 'G.G']]);
  }, 60_000);

  it('make_harness.py 100: every pin in all three states, and bus and feed resistances (ngspice)', () => {
    const text = execFileSync('python3', [makeHarnessScript, '100'], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
    const r = validateDocument(JSON.parse(text));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(checkVolts(r.doc)).toBeGreaterThan(1000);
    checkOhms(r.doc, [['CANH.S', 'CANL.S'], ['BATT.+', 'L10_0.1', 'key_on'], ['L3_0.1', 'L3_0.2'], ['F7.2', 'GND0.G', 'key_off']]);
  }, 300_000);
});
