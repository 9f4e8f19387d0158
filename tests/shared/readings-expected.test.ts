import { describe, expect, it } from 'vitest';
import { expectedOhms, expectedVolts, inRange, verdict } from '../../shared/readings';

describe('reading bands', () => {
  // "More than about 0.5 V lost along a power feed … points to a poor connection"
  // (references.md, from memory): a feed expected at 12.6 V passes at 12.2 V, fails at 11.9 V.
  it('a power feed may read up to 0.5 V below the expected value (feed-drop rule, from memory)', () => {
    const band = expectedVolts(12.6);
    expect(band.min).toBeCloseTo(12.1, 9);
    expect(inRange(band, 12.2)).toBe(true);
    expect(inRange(band, 11.9)).toBe(false);
    expect(inRange(band, 0)).toBe(false);
  });

  // "… or 0.2 V along a ground path" (references.md, from memory).
  it('a ground pin may read up to 0.2 V (ground-drop rule, from memory)', () => {
    const band = expectedVolts(0.01);
    expect(inRange(band, 0.15)).toBe(true);
    expect(inRange(band, 0.4)).toBe(false);
  });

  // Each CAN line idles near 2.5 V (ISO 11898-2); a line at 0 V or at 5 V is out.
  it('a bus line idling at 2.5 V accepts 2.4 V and refuses 0 V and 5 V (ISO 11898-2)', () => {
    const band = expectedVolts(2.5);
    expect(inRange(band, 2.4)).toBe(true);
    expect(inRange(band, 0)).toBe(false);
    expect(inRange(band, 5)).toBe(false);
  });

  it("a lead's own band replaces the default", () => {
    const band = expectedVolts(12.6, { below: 0.1, above: 0.1 });
    expect(inRange(band, 12.4)).toBe(false);
    expect(inRange(band, 12.55)).toBe(true);
  });

  it('a floating pin is in range only when the meter shows no steady reading', () => {
    const band = expectedVolts(null);
    expect(inRange(band, null)).toBe(true);
    expect(inRange(band, 12)).toBe(false);
  });

  // About 60 Ω between CAN_H and CAN_L with both 120 Ω terminators (ISO 11898-2; SAE J1939-11):
  // one terminator missing reads about 120 Ω, which is out.
  it('bus resistance: 60 Ω expected passes 62 Ω and fails 120 Ω (ISO 11898-2, SAE J1939-11)', () => {
    const band = expectedOhms(60);
    expect(inRange(band, 62)).toBe(true);
    expect(inRange(band, 120)).toBe(false);
  });

  it('a resistance expected open passes OL and fails a few ohms; low values allow meter-lead resistance (common practice)', () => {
    expect(inRange(expectedOhms(null), null)).toBe(true);
    expect(inRange(expectedOhms(null), 3)).toBe(false);
    expect(inRange(expectedOhms(0.05), 0.3)).toBe(true);
    expect(inRange(expectedOhms(0.05), 1)).toBe(false);
  });

  it('verdicts say what the meter showed and what was expected, in words', () => {
    const band = expectedVolts(12.6);
    expect(verdict(band, 0, inRange(band, 0))).toBe('OUT: 0.0 V, expected 12.1–12.9 V');
    expect(verdict(expectedOhms(null), null, true)).toBe('OK: open (OL), expected open (OL)');
  });
});
