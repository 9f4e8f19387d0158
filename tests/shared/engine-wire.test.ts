import { describe, expect, it } from 'vitest';
import { awgDiameterMm, copperOhms, wireOhms } from '../../shared/engine/wire';

describe('wire resistance', () => {
  it('1 mm² × 1 m of annealed copper at 20 °C is 0.017241 Ω (IEC 60028 resistivity)', () => {
    expect(copperOhms({ mm2: 1 }, 1)).toBeCloseTo(0.017241, 9);
    // 2.5 mm², 10 m: ρL/A = 0.017241 × 10 / 2.5 (IEC 60028)
    expect(copperOhms({ mm2: 2.5 }, 10)).toBeCloseTo(0.068964, 9);
  });

  it('AWG diameters: AWG 0000 is 0.46 in, AWG 36 is 0.005 in (ASTM B258 definition)', () => {
    expect(awgDiameterMm(36)).toBeCloseTo(0.127, 9);
    expect(awgDiameterMm(-3)).toBeCloseTo(11.684, 3);
  });

  // Ω per 1000 ft at 20 °C, NIST Handbook 100 copper wire tables (from memory, design/references.md).
  const nist: [number, number][] = [[10, 0.9989], [12, 1.588], [14, 2.525], [16, 4.016], [18, 6.385], [20, 10.15], [22, 16.14]];
  for (const [awg, ohmsPer1000ft] of nist) {
    it(`AWG ${awg}: ${ohmsPer1000ft} Ω per 1000 ft within 0.1 % (NIST Handbook 100, from memory)`, () => {
      const r = copperOhms({ awg }, 304.8);
      expect(Math.abs(r - ohmsPer1000ft) / ohmsPer1000ft).toBeLessThan(1e-3);
    });
  }

  it('temperature: R(60 °C) = R(20 °C) × (1 + 0.00393 × 40) (IEC 60028 coefficient)', () => {
    expect(copperOhms({ mm2: 1 }, 1, 60)).toBeCloseTo(0.017241 * (1 + 0.00393 * 40), 9);
    expect(copperOhms({ mm2: 1 }, 1, -20)).toBeCloseTo(0.017241 * (1 - 0.00393 * 40), 9);
  });

  it('an ohms override wins over size and length; zero length is zero ohms', () => {
    expect(wireOhms({ size: { mm2: 1 }, lengthM: 5, ohms: 0.5 }, 80)).toBe(0.5);
    expect(wireOhms({ size: { awg: 18 }, lengthM: 0 })).toBe(0);
  });
});
