import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { composeJ1939, describeCanId, formatCanId, j1939Label, splitJ1939 } from '../../shared/standards/j1939';

describe('splitJ1939', () => {
  it('splits 0x0CF00400: priority 3, PGN 61444, source 0x00 (SAE J1939-21 and J1939-71, from memory)', () => {
    const p = splitJ1939(0x0cf00400)!;
    expect(p).toMatchObject({ priority: 3, pgn: 61444, source: 0x00, pduFormat: 2, destination: null, pf: 0xf0, ps: 0x04 });
  });

  it('splits 0x18FEF100: priority 6, PGN 65265, source 0x00 (SAE J1939-21 and J1939-71, from memory)', () => {
    expect(splitJ1939(0x18fef100)).toMatchObject({ priority: 6, pgn: 65265, source: 0x00, destination: null });
  });

  it('splits 0x18EA00FE: priority 6, PGN 59904, destination 0x00, source 0xFE (SAE J1939-21, from memory)', () => {
    expect(splitJ1939(0x18ea00fe)).toMatchObject({ priority: 6, pgn: 59904, destination: 0x00, source: 0xfe, pduFormat: 1 });
  });

  it('takes the data page and EDP bits from bits 24 and 25 (SAE J1939-21 layout)', () => {
    // Invented identifier: priority 7, EDP 1, DP 1, PF 0x12 (PDU1), destination 0x34, source 0x56.
    const p = splitJ1939(0x1f123456)!;
    expect(p).toMatchObject({ priority: 7, edp: 1, dp: 1, pf: 0x12, ps: 0x34, destination: 0x34, source: 0x56 });
    expect(p.pgn).toBe(65536 + 0x12 * 256);
  });

  it('treats PF 239 as PDU1 and PF 240 as PDU2 (SAE J1939-21)', () => {
    expect(splitJ1939(0x00efaa01)).toMatchObject({ pduFormat: 1, destination: 0xaa, pgn: 0xef00 });
    expect(splitJ1939(0x00f0aa01)).toMatchObject({ pduFormat: 2, destination: null, pgn: 0xf0aa });
  });

  it('answers null outside 0..0x1FFFFFFF and for non-integers', () => {
    for (const v of [-1, 0x20000000, 1.5, Number.NaN, Infinity]) expect(splitJ1939(v)).toBeNull();
  });
});

describe('composeJ1939', () => {
  it('builds the worked identifiers back (SAE J1939-21, from memory)', () => {
    expect(composeJ1939({ priority: 3, pgn: 61444, source: 0x00 })).toBe(0x0cf00400);
    expect(composeJ1939({ priority: 6, pgn: 65265, source: 0x00 })).toBe(0x18fef100);
    expect(composeJ1939({ priority: 6, pgn: 59904, destination: 0x00, source: 0xfe })).toBe(0x18ea00fe);
  });

  it('sends a PDU1 PGN to the global address when no destination is given (SAE J1939-21)', () => {
    expect(composeJ1939({ priority: 6, pgn: 59904, source: 0xfe })).toBe(0x18eafffe);
  });

  it('refuses bad parts rather than throwing', () => {
    expect(composeJ1939({ priority: 8, pgn: 0, source: 0 })).toBeNull();
    expect(composeJ1939({ priority: 0, pgn: 0x20000, source: 0 })).toBeNull();
    expect(composeJ1939({ priority: 0, pgn: 0, source: 256 })).toBeNull();
    expect(composeJ1939({ priority: 0, pgn: 0xea01, source: 0 })).toBeNull(); // PDU1 PGN with a low byte
    expect(composeJ1939({ priority: 0, pgn: 0xfef1, source: 0, destination: 3 })).toBeNull(); // PDU2 has no destination
    expect(composeJ1939({ priority: 0, pgn: 0xea00, source: 0, destination: -1 })).toBeNull();
    expect(composeJ1939({ priority: 0, pgn: 0, source: 0, edp: 2 })).toBeNull();
    expect(composeJ1939(null as never)).toBeNull();
  });

  it('round-trips every 29-bit identifier through split and compose (property)', () => {
    fc.assert(fc.property(fc.integer({ min: 0, max: 0x1fffffff }), (id) => {
      const p = splitJ1939(id)!;
      return composeJ1939({ priority: p.priority, pgn: p.pgn, source: p.source, destination: p.destination, edp: p.edp }) === id;
    }), { numRuns: 5000 });
  });

  it('round-trips the corners of the identifier space', () => {
    for (const id of [0, 0x1fffffff, 0x00ef0000, 0x00f00000, 0x1c000000, 0x02000000, 0x01000000]) {
      const p = splitJ1939(id)!;
      expect(composeJ1939({ priority: p.priority, pgn: p.pgn, source: p.source, destination: p.destination, edp: p.edp })).toBe(id);
    }
  });
});

describe('describeCanId', () => {
  it('passes 11-bit base identifiers through unsplit (ISO 11898 base frame)', () => {
    expect(describeCanId(0x123, false)).toEqual({ extended: false, id: 0x123, hex: '123' });
    expect(describeCanId(0x7ff, false)?.hex).toBe('7FF');
    expect(describeCanId(0x800, false)).toBeNull();
  });

  it('splits 29-bit identifiers and writes them as candump does (8 hex digits)', () => {
    const d = describeCanId(0x18fef100, true)!;
    expect(d.hex).toBe('18FEF100');
    expect(d.extended && d.j1939.pgn).toBe(65265);
    expect(formatCanId(0x5, true)).toBe('00000005');
    expect(formatCanId(0x5, false)).toBe('005');
  });

  it('labels a split for people', () => {
    expect(j1939Label(splitJ1939(0x18fef100)!)).toBe('priority 6, PGN 65265 (0xFEF1), source 0x00');
    expect(j1939Label(splitJ1939(0x18ea00fe)!)).toBe('priority 6, PGN 59904 (0xEA00), destination 0x00, source 0xFE');
    expect(j1939Label(splitJ1939(0x18eafffe)!)).toContain('destination global (0xFF)');
  });
});
