import { describe, expect, it } from 'vitest';
import { prepareHarness, type WalkStep } from '../../shared/engine';
import { bridge, loaderDoc } from '../support/fixtures/documents';
import { copperOhms } from '../../shared/engine/wire';

const names = (steps: WalkStep[]) => steps.map((s) => (s.type === 'pin' ? s.ref : s.type === 'mate' ? `mate:${s.cavity}` : 'id' in s ? `${s.type}:${s.id}` : s.type));

describe('walk', () => {
  const doc = loaderDoc();
  const h = prepareHarness(doc);

  it('battery to work lamp, key on: every pin and element in order, fuses with ISO 8820-3 colours, series ohms', () => {
    const res = h.walk('BATT.+', 'LAMP.1', 'key_on');
    const p = res.paths[0];
    expect(names(p.steps)).toEqual([
      'BATT.+', 'wire:W1', 'FMAIN.1', 'fuse:FMAIN', 'FMAIN.2', 'wire:W3', 'SP1.S', 'splice:SP1', 'wire:W14', 'F3.1', 'fuse:F3', 'F3.2',
      'wire:W15', 'K1.30', 'relay-contact:K1', 'K1.87', 'wire:W16', 'X1.2', 'mate:X1.2', 'X1F.2', 'wire:W17', 'LAMP.1',
    ]);
    const fuses = p.steps.filter((s) => s.type === 'fuse');
    // 40 A orange, 20 A yellow (ISO 8820-3, from memory).
    expect(fuses.map((f) => (f.type === 'fuse' ? [f.amps, f.colour?.name] : null))).toEqual([[40, 'orange'], [20, 'yellow']]);
    // Series resistance: wires by ρL/A (IEC 60028), fuses 0.005 Ω cold (contract default), relay contact 0, mate 0.003.
    const wires = [['W1', 16, 1.2], ['W3', 6, 0.5], ['W14', 2.5, 0.4], ['W15', 2.5, 0.3], ['W16', 2.5, 2.5], ['W17', 2.5, 3.0]] as const;
    const expected = wires.reduce((a, [, mm2, l]) => a + copperOhms({ mm2 }, l), 0) + 0.005 * 2 + 0.003;
    expect(p.ohms).toBeCloseTo(expected, 12);
    const last = p.steps[p.steps.length - 1];
    expect(last.type === 'pin' && last.ohmsFromStart).toBeCloseTo(expected, 12);
    const first = p.steps[0];
    expect(first.type === 'pin' && Object.keys(first.volts)).toEqual(doc.states.map((s) => s.id));
  });

  it('key off the relay is released: no path through 87; paths are simple and shortest first, at most 20', () => {
    const res = h.walk('BATT.+', 'LAMP.1', 'key_off');
    expect(res.paths.length).toBeGreaterThan(0);
    expect(res.paths.length).toBeLessThanOrEqual(20);
    for (const p of res.paths) {
      const pins = p.steps.filter((s) => s.type === 'pin').map((s) => (s.type === 'pin' ? s.ref : ''));
      expect(new Set(pins).size).toBe(pins.length);
      expect(p.steps.some((s) => s.type === 'relay-contact' && s.contact === '87')).toBe(false);
    }
    for (let i = 1; i < res.paths.length; i++) expect(res.paths[i].ohms).toBeGreaterThanOrEqual(res.paths[i - 1].ohms - 1e-12);
    // Key off, the way to the lamp crosses a load and the frame: a chassis step.
    expect(res.paths[0].steps.some((s) => s.type === 'chassis')).toBe(true);
  });

  it('with no state any switch position and both relay contacts conduct', () => {
    const p = h.walk('KEY.B', 'KEY.IGN').paths[0];
    expect(names(p.steps)).toEqual(['KEY.B', 'switch:KEY', 'KEY.IGN']);
    const sw = p.steps[1];
    expect(sw.type === 'switch' && sw.positions).toEqual(['on']);
    expect(h.walk('KEY.B', 'KEY.IGN', 'key_off').paths).toEqual([]);
  });

  it('unplugged halves break the walk; unknown pins answer no paths', () => {
    expect(h.walk('X1.3', 'X1F.3', 'unplugged').paths.every((p) => !p.steps.some((s) => s.type === 'mate' && s.cavity === 'X1.3'))).toBe(true);
    expect(h.walk('NOPE.1', 'X1.3').paths).toEqual([]);
  });

  it('k shortest simple paths agree with a brute-force enumeration on a bridge (every simple path, sorted)', () => {
    const b = bridge(12, [100, 220, 330, 470, 1000]);
    // Battery and ground as in the fixture: TOP–R1–A–R2–G, TOP–R3–C–R4–G, A–R5–C; zero-ohm wires.
    const edges: [string, string, number][] = [['TOP', 'A', 100], ['A', 'G', 220], ['TOP', 'C', 330], ['C', 'G', 470], ['A', 'C', 1000]];
    const all: number[] = [];
    const dfs = (at: string, seen: Set<string>, w: number) => {
      if (at === 'G') { all.push(w); return; }
      for (const [x, y, r] of edges) {
        const nx = x === at ? y : y === at ? x : null;
        if (nx && !seen.has(nx)) { seen.add(nx); dfs(nx, seen, w + r); seen.delete(nx); }
      }
    };
    dfs('TOP', new Set(['TOP']), 0);
    all.sort((x, y) => x - y);
    const got = prepareHarness(b).walk('TOP.S', 'G.G').paths.map((p) => p.ohms);
    expect(got.length).toBe(all.length);
    got.forEach((x, i) => expect(x).toBeCloseTo(all[i], 9));
  });
});
