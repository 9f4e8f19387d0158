import { describe, expect, it } from 'vitest';
import { bladeFuseColour, bladeFuseRatings, isStandardBladeFuseRating, standardBladeFuseAmps } from '../../shared/standards/iso8820';
import { contrastRatio, swatchInk } from '../../shared/standards/iec60757';

describe('bladeFuseColour', () => {
  // ISO 8820-3 blade fuse colours (from memory), as listed in references.md.
  const published: [number, string][] = [
    [1, 'black'], [2, 'grey'], [3, 'violet'], [4, 'pink'], [5, 'tan'], [7.5, 'brown'],
    [10, 'red'], [15, 'blue'], [20, 'yellow'], [25, 'natural (white)'], [30, 'green'], [40, 'orange'],
  ];

  it.each(published)('%s A is %s (ISO 8820-3, from memory)', (amps, name) => {
    expect(bladeFuseColour(amps)?.name).toBe(name);
  });

  it('lists exactly the published ratings in ascending order (ISO 8820-3, from memory)', () => {
    expect(standardBladeFuseAmps).toEqual(published.map(([a]) => a));
    expect(bladeFuseRatings.map((r) => r.name)).toEqual(published.map(([, n]) => n));
  });

  it('answers null for ratings that are not standard, and for non-numbers', () => {
    for (const a of [0, 6, 7, 8, 12, 35.5, -10, Number.NaN, Number.POSITIVE_INFINITY]) {
      expect(bladeFuseColour(a)).toBeNull();
      expect(isStandardBladeFuseRating(a)).toBe(false);
    }
    expect(bladeFuseColour('10' as unknown as number)).toBeNull();
  });

  it('gives each rating a distinct #rrggbb swatch that a label can sit on at 4.5:1 (WCAG 2.x text minimum)', () => {
    const hexes = bladeFuseRatings.map((r) => r.hex);
    expect(new Set(hexes).size).toBe(hexes.length);
    for (const r of bladeFuseRatings) {
      expect(r.hex).toMatch(/^#[0-9a-f]{6}$/);
      const ink = swatchInk(r.hex)!;
      expect(contrastRatio(ink.ink, r.hex)).toBeGreaterThanOrEqual(4.5);
    }
  });

  it('returns a fresh object the caller may change without touching the table', () => {
    const c = bladeFuseColour(10)!;
    c.name = 'changed';
    expect(bladeFuseColour(10)!.name).toBe('red');
  });
});
