import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  contrastRatio, formatWireColour, parseHexColour, parseWireColour, relativeLuminance, swatchInk,
  wireColourCodes, wireColourInfo, wireColourLabel, wireColours,
} from '../../shared/standards/iec60757';

describe('IEC 60757 letter codes', () => {
  // IEC 60757 codes and their colours, as listed in references.md.
  const names: Record<string, string> = {
    BK: 'black', BN: 'brown', RD: 'red', OG: 'orange', YE: 'yellow', GN: 'green', BU: 'blue',
    VT: 'violet', GY: 'grey', WH: 'white', PK: 'pink', GD: 'gold', TQ: 'turquoise', SR: 'silver',
    GNYE: 'green-yellow',
  };

  it('has exactly the IEC 60757 codes, each with its English name (IEC 60757)', () => {
    expect([...wireColourCodes].sort()).toEqual(Object.keys(names).sort());
    for (const c of wireColours) expect(c.name).toBe(names[c.code]);
  });

  it('gives every code a distinct #rrggbb display colour', () => {
    for (const c of wireColours) expect(c.hex).toMatch(/^#[0-9a-f]{6}$/);
    // GNYE is drawn as green with yellow; the rest are each distinct.
    const singles = wireColours.filter((c) => c.code !== 'GNYE').map((c) => c.hex);
    expect(new Set(singles).size).toBe(singles.length);
    expect(wireColourInfo('gnye')?.secondHex).toBe(wireColourInfo('YE')?.hex);
  });

  it('looks codes up case-insensitively and rejects others', () => {
    expect(wireColourInfo(' rd ')?.name).toBe('red');
    expect(wireColourInfo('XX')).toBeNull();
    expect(wireColourInfo('')).toBeNull();
  });
});

describe('parseWireColour and wireColourLabel', () => {
  it('reads base and stripe (IEC 60757 base/stripe notation, common practice)', () => {
    expect(parseWireColour('RD/WH')).toEqual({ base: 'RD', stripe: 'WH' });
    expect(wireColourLabel('RD/WH')).toBe('red with white stripe');
    expect(parseWireColour('RD')).toEqual({ base: 'RD' });
    expect(wireColourLabel('BU')).toBe('blue');
    expect(parseWireColour('GNYE')).toEqual({ base: 'GNYE' });
    expect(wireColourLabel('GNYE')).toBe('green-yellow');
  });

  it('accepts other separators, spaces, lower case and run-together pairs', () => {
    for (const t of ['rd/wh', ' RD / WH ', 'RD-WH', 'RD_WH', 'RD WH', 'RDWH']) {
      expect(parseWireColour(t)).toEqual({ base: 'RD', stripe: 'WH' });
    }
    expect(parseWireColour('BKGNYE')).toEqual({ base: 'BK', stripe: 'GNYE' });
    expect(parseWireColour('GNYE/BK')).toEqual({ base: 'GNYE', stripe: 'BK' });
    expect(parseWireColour('GN/YE')).toEqual({ base: 'GN', stripe: 'YE' });
  });

  it('rejects what is not a colour', () => {
    for (const t of ['', ' ', 'XX', 'RD/', '/WH', 'RD/WH/BK', 'RD//WH', 'RD/RD', 'RED', 'RDW', 'R D', 'RD/XX', 'A'.repeat(1000)]) {
      expect(parseWireColour(t)).toBeNull();
      expect(wireColourLabel(t)).toBeNull();
    }
    expect(parseWireColour(null as unknown as string)).toBeNull();
  });

  it('round-trips every base/stripe pair through its canonical text', () => {
    for (const base of wireColourCodes) {
      expect(parseWireColour(formatWireColour({ base }))).toEqual({ base });
      for (const stripe of wireColourCodes) {
        if (stripe === base) continue;
        expect(parseWireColour(formatWireColour({ base, stripe }))).toEqual({ base, stripe });
      }
    }
  });

  it('never throws on arbitrary text', () => {
    fc.assert(fc.property(fc.string(), (s) => {
      const c = parseWireColour(s);
      const l = wireColourLabel(s);
      return (c === null) === (l === null);
    }));
  });
});

describe('WCAG 2.x luminance and contrast', () => {
  it('black on white is 21:1 and a colour on itself is 1:1 (WCAG 2.x definition)', () => {
    expect(contrastRatio('#000000', '#ffffff')).toBeCloseTo(21, 10);
    expect(contrastRatio('#fff', '#000')).toBeCloseTo(21, 10);
    expect(contrastRatio('#d21f1f', '#d21f1f')).toBeCloseTo(1, 10);
  });

  it('matches well-known published ratios (WCAG 2.x, from memory)', () => {
    // #767676 is the lightest grey that passes 4.5:1 on white (4.54:1); #777777 fails (4.48:1).
    expect(contrastRatio('#767676', '#ffffff')).toBeCloseTo(4.54, 2);
    expect(contrastRatio('#777777', '#ffffff')).toBeCloseTo(4.48, 2);
    // Pure red on white is 4.0:1, pure blue on white 8.59:1.
    expect(contrastRatio('#ff0000', '#ffffff')).toBeCloseTo(4.0, 2);
    expect(contrastRatio('#0000ff', '#ffffff')).toBeCloseTo(8.59, 2);
  });

  it('has the WCAG luminance coefficients (sRGB / ITU-R BT.709 primaries)', () => {
    expect(relativeLuminance('#ff0000')).toBeCloseTo(0.2126, 10);
    expect(relativeLuminance('#00ff00')).toBeCloseTo(0.7152, 10);
    expect(relativeLuminance('#0000ff')).toBeCloseTo(0.0722, 10);
    expect(relativeLuminance('#808080')).toBeCloseTo(0.2159, 3); // from memory
  });

  it('parses #rgb and #rrggbb, rejects other text', () => {
    expect(parseHexColour('#AbC')).toEqual({ r: 0xaa, g: 0xbb, b: 0xcc });
    expect(parseHexColour('102030')).toEqual({ r: 0x10, g: 0x20, b: 0x30 });
    for (const t of ['', '#', '#12', '#12345', '#1234567', '#ggg', 'red']) expect(parseHexColour(t)).toBeNull();
    expect(swatchInk('nope')).toBeNull();
    expect(contrastRatio('#000', 'nope')).toBeNull();
  });

  it('picks white ink on dark swatches and black on light ones', () => {
    expect(swatchInk('#000000')).toEqual({ ink: '#ffffff', ratio: 21 });
    expect(swatchInk('#ffffff')).toEqual({ ink: '#000000', ratio: 21 });
    expect(swatchInk(wireColourInfo('BK')!.hex)!.ink).toBe('#ffffff');
    expect(swatchInk(wireColourInfo('YE')!.hex)!.ink).toBe('#000000');
  });

  it('always reaches 4.5:1 for any colour, and picks the better ink (WCAG 2.x text minimum)', () => {
    fc.assert(fc.property(fc.integer({ min: 0, max: 0xffffff }), (n) => {
      const hex = '#' + n.toString(16).padStart(6, '0');
      const s = swatchInk(hex)!;
      const other = s.ink === '#000000' ? '#ffffff' : '#000000';
      return s.ratio >= 4.5 && Math.abs(s.ratio - contrastRatio(s.ink, hex)!) < 1e-9 && s.ratio >= contrastRatio(other, hex)!;
    }));
  });
});
