import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { summariseCandump, type CaptureSummary } from '../../shared/can/candump';
import { compareCaptures, identifierLabel } from '../../shared/can/compare';

/** Small seeded generator so the synthetic captures are the same every run. */
function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const h = (v: number) => v.toString(16).toUpperCase().padStart(2, '0');

/**
 * An invented machine bus. 0CF00A21 (29-bit, 20 Hz) carries: byte 1 a rolling
 * counter, byte 2 a sensor jittering around 0x80, byte 3 constant 0x5A,
 * byte 4 the lever position (0x00 at rest; ramping 0x00..0xFA when moved),
 * byte 5 a switch bit (0x00 at rest, 0x04 moved). 18FF4433 (29-bit, 10 Hz)
 * never changes. 2A1 (11-bit) only at rest; 18FF5533 only when moved.
 */
function capture(moved: boolean, seed: number, frames = 400): string {
  const r = rng(seed);
  const out: string[] = [];
  for (let i = 0; i < frames; i++) {
    const t = (2000 + i * 0.05).toFixed(6);
    const lever = moved ? Math.round((250 * i) / (frames - 1)) : 0;
    const jitter = 0x80 + Math.floor(r() * 3) - 1;
    out.push(`(${t}) can0 0CF00A21#${h(i % 16)}${h(jitter)}5A${h(lever)}${moved ? '04' : '00'}FFFFFF`);
    if (i % 2 === 0) out.push(`(${t}) can0 18FF4433#0102030405060708`);
    if (!moved && i % 10 === 0) out.push(`(${t}) can0 2A1#00`);
    if (moved && i % 10 === 0) out.push(`(${t}) can0 18FF5533#C0`);
  }
  return out.join('\n') + '\n';
}

describe('compareCaptures on a synthetic capture with known changes', () => {
  const rest = summariseCandump(capture(false, 1));
  const moved = summariseCandump(capture(true, 2));
  const cmp = compareCaptures(rest, moved);

  it('lists identifiers seen in only one capture, with the J1939 split (SAE J1939-21)', () => {
    expect(cmp.onlyAtRest.map((x) => x.key)).toEqual(['2A1']);
    expect(cmp.onlyAtRest[0].j1939).toBeNull();
    expect(cmp.onlyMoved.map((x) => x.key)).toEqual(['18FF5533']);
    // 0x18FF5533: priority 6, PF 0xFF ≥ 240 so PGN 0xFF55 = 65365, source 0x33.
    expect(cmp.onlyMoved[0].j1939).toMatchObject({ priority: 6, pgn: 65365, source: 0x33, destination: null });
  });

  it('finds exactly the lever and switch bytes, not the counter, sensor jitter or constant', () => {
    expect(cmp.changed.map((x) => x.key)).toEqual(['0CF00A21']);
    expect(cmp.changedBytes.map((b) => b.position).sort()).toEqual([4, 5]);
    expect(cmp.unchanged.map((x) => x.key)).toEqual(['18FF4433']);
    const c = cmp.changed[0];
    expect(c.j1939).toMatchObject({ priority: 3, pgn: 61450, source: 0x21 });
    expect(c.rest.rateHz).toBeCloseTo(20, 6);
  });

  it('labels identifiers with their J1939 split (SAE J1939-21: 0x0CF00A21 is priority 3, PF 0xF0, PGN 0xF00A)', () => {
    expect(identifierLabel(cmp.changed[0])).toBe('0CF00A21 · priority 3, PGN 61450 (0xF00A), source 0x21');
    expect(identifierLabel(cmp.onlyAtRest[0])).toBe('2A1 · 11-bit');
  });

  it('describes each change in a sentence', () => {
    const byPos = new Map(cmp.changedBytes.map((b) => [b.position, b]));
    expect(byPos.get(4)).toMatchObject({ index: 3, kind: 'varies-when-moved', sentence: 'byte 4: 0x00 at rest, 0x00–0xFA moved' });
    expect(byPos.get(5)).toMatchObject({ index: 4, kind: 'constant-changed', sentence: 'byte 5: 0x00 at rest, 0x04 moved' });
    expect(byPos.get(4)!.rest).toEqual({ count: 400, min: 0, max: 0, distinct: 1 });
    expect(byPos.get(4)!.moved).toMatchObject({ min: 0, max: 0xfa });
  });

  it('scores by separation of the value distributions times confidence', () => {
    const byPos = new Map(cmp.changedBytes.map((b) => [b.position, b]));
    // No shared value: separation 1; 400 frames each: confidence 400/402.
    expect(byPos.get(5)!.score).toBeCloseTo(400 / 402, 3);
    // The ramp shares 0x00 with rest only on its first frame: separation 399/400.
    expect(byPos.get(4)!.score).toBeCloseTo((399 / 400) * (400 / 402), 3);
    expect(byPos.get(4)!.score).toBeLessThanOrEqual(byPos.get(5)!.score);
  });
});

function one(lines: string[]): CaptureSummary {
  return summariseCandump(lines.join('\n'));
}

function frames(id: string, bytes: (i: number) => number[], n: number, t0 = 0): string[] {
  return Array.from({ length: n }, (_, i) => `(${(t0 + i * 0.1).toFixed(6)}) can0 ${id}#${bytes(i).map(h).join('')}`);
}

describe('compareCaptures: kinds, ranking and edge cases', () => {
  it('ranks a clear change above a one-frame flicker', () => {
    const rest = one([...frames('123', (i) => [0x10, i === 7 ? 0x11 : 0x10], 100)]);
    const moved = one([...frames('123', () => [0x40, 0x10], 100)]);
    const c = compareCaptures(rest, moved).changedBytes;
    expect(c.map((b) => b.position)).toEqual([1, 2]);
    expect(c[0].score).toBeCloseTo(100 / 102, 3);
    expect(c[1]).toMatchObject({ kind: 'constant-when-moved', sentence: 'byte 2: 0x10–0x11 at rest, 0x10 moved' });
    expect(c[1].score).toBeCloseTo(0.01 * (100 / 102), 3);
  });

  it('ranks the same change seen in many frames above it seen in few', () => {
    const rest = one([...frames('100', () => [0], 2), ...frames('200', () => [0], 50)]);
    const moved = one([...frames('100', () => [1], 2), ...frames('200', () => [1], 50)]);
    const c = compareCaptures(rest, moved).changedBytes;
    expect(c.map((b) => b.key)).toEqual(['200', '100']);
    expect(c[1].score).toBeCloseTo(0.5, 3);
  });

  it('tells range shifts from same-range value changes', () => {
    const rest = one(frames('321', (i) => [i % 4, i % 2 ? 0 : 15], 40));
    const moved = one(frames('321', (i) => [4 + (i % 4), [0, 3, 15][i % 3]], 40));
    const c = compareCaptures(rest, moved).changedBytes;
    const b1 = c.find((b) => b.position === 1)!;
    const b2 = c.find((b) => b.position === 2)!;
    expect(b1).toMatchObject({ kind: 'range-shifted', sentence: 'byte 1: 0x00–0x03 at rest, 0x04–0x07 moved' });
    expect(b2).toMatchObject({ kind: 'values-differ', sentence: 'byte 2: 0x00–0x0F (2 values) at rest, 0x00–0x0F (3 values) moved' });
    expect(b1.score).toBeGreaterThan(b2.score);
  });

  it('reports bytes present in only one capture when the length changes', () => {
    const rest = one(frames('0CFE6CEE', () => [1, 2], 10));
    const moved = one(frames('0CFE6CEE', () => [1, 2, 3], 10));
    const c = compareCaptures(rest, moved).changedBytes;
    expect(c).toHaveLength(1);
    expect(c[0]).toMatchObject({ kind: 'absent-at-rest', position: 3, rest: null, sentence: 'byte 3: absent at rest, 0x03 moved' });
    const back = compareCaptures(moved, rest).changedBytes[0];
    expect(back).toMatchObject({ kind: 'absent-when-moved', sentence: 'byte 3: 0x03 at rest, absent moved' });
  });

  it('finds nothing between a capture and itself (property)', () => {
    fc.assert(fc.property(fc.array(fc.tuple(fc.constantFrom('123', '7FF', '18FEF100'), fc.uint8Array({ maxLength: 8 })), { maxLength: 40 }), (rows) => {
      const s = one(rows.map(([id, d], i) => `(${i}.5) can0 ${id}#${Array.from(d, h).join('')}`));
      const c = compareCaptures(s, s);
      return c.changedBytes.length === 0 && c.onlyAtRest.length === 0 && c.onlyMoved.length === 0 && c.unchanged.length === s.identifiers.length;
    }), { numRuns: 200 });
  });

  it('finds the same bytes with the same scores whichever capture is called rest (property)', () => {
    const row = fc.tuple(fc.constantFrom('123', '18FEF100'), fc.uint8Array({ minLength: 1, maxLength: 3 }));
    fc.assert(fc.property(fc.array(row, { maxLength: 30 }), fc.array(row, { maxLength: 30 }), (a, b) => {
      const sa = one(a.map(([id, d], i) => `(${i}.0) can0 ${id}#${Array.from(d, h).join('')}`));
      const sb = one(b.map(([id, d], i) => `(${i}.0) can0 ${id}#${Array.from(d, h).join('')}`));
      const key = (x: { key: string; index: number; score: number }) => `${x.key}:${x.index}:${x.score}`;
      const ab = compareCaptures(sa, sb).changedBytes.map(key).sort();
      const ba = compareCaptures(sb, sa).changedBytes.map(key).sort();
      return ab.join() === ba.join();
    }), { numRuns: 200 });
  });

  it('does not throw on empty or malformed summaries', () => {
    const empty = summariseCandump('');
    expect(compareCaptures(empty, empty)).toEqual({ onlyAtRest: [], onlyMoved: [], changed: [], changedBytes: [], unchanged: [] });
    expect(() => compareCaptures({} as CaptureSummary, null as unknown as CaptureSummary)).not.toThrow();
  });
});
