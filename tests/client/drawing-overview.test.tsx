/**
 * The zoomed-out overview of a big drawing: its bitmap covers the drawing's box within its size limits,
 * and the marks over it pick out exactly the selected, walked and live items.
 */
import { describe, expect, it } from 'vitest';
import { boomLights, boomLightsPositions } from './boom-lights';
import { overviewMarks, renderDrawingSvg } from '@shared/drawing/svg';
import { OVERVIEW_MAX_PIXELS, OVERVIEW_MAX_SIDE, overviewBounds, overviewRaster } from '@/features/drawing/overview';

const doc = boomLights([{ id: 'CL1', label: 'Boom clip', wires: ['W2'] }]);
const positions = boomLightsPositions;

describe('the drawing overview', () => {
  it('covers the same box as the printed drawing', () => {
    const full = renderDrawingSvg(doc, positions);
    const b = overviewBounds(doc, positions);
    expect([b.x, b.y, b.w, b.h].map((v) => String(Math.round(v * 10) / 10)).join(' ')).toBe(/viewBox="([^"]+)"/.exec(full)![1]);
  });

  it('is painted sharp where it can be, and never past the side or pixel limit', () => {
    // A small drawing: the scale asked for.
    const small = overviewRaster({ x: 0, y: 0, w: 2000, h: 1000 }, 0.5);
    expect(small).toMatchObject({ scale: 0.5, width: 1000, height: 500 });
    // Tall and thin: the longest side sets the scale.
    const tall = overviewRaster({ x: -40, y: -40, w: 3000, h: 100_000 }, 0.5);
    expect(tall.height).toBeLessThanOrEqual(OVERVIEW_MAX_SIDE);
    expect(tall.scale).toBeCloseTo(OVERVIEW_MAX_SIDE / 100_000, 9);
    // Large both ways: the pixel count sets it.
    const wide = overviewRaster({ x: 0, y: 0, w: 40_000, h: 30_000 }, 0.5);
    expect(wide.width * wide.height).toBeLessThanOrEqual(OVERVIEW_MAX_PIXELS * 1.001);
    expect(Math.max(wide.width, wide.height)).toBeLessThanOrEqual(OVERVIEW_MAX_SIDE);
    // Never an empty bitmap.
    expect(overviewRaster({ x: 0, y: 0, w: 0, h: 0 }, 0.5)).toMatchObject({ width: 1, height: 1 });
  });

  it('marks the selected, the walked and the live items, and nothing else', () => {
    expect(overviewMarks(doc, positions, {})).toEqual({ wires: [], boxes: [] });
    const m = overviewMarks(doc, positions, {
      selectedComponents: ['G1'],
      selectedWires: ['W3'],
      walkPins: ['BATT.+', 'F1.1'],
      walkWires: ['W1'],
      volts: new Map([['F1.2', 12.4], ['X1A.1', 12.3], ['X1A.2', 0], ['G1.G', 0]]),
    });
    expect(m.wires.map((w) => [w.id, w.kind])).toEqual([['W1', 'walk'], ['W2', 'live'], ['W3', 'selected']]);
    expect(m.wires.every((w) => w.d.startsWith('M'))).toBe(true);
    expect(m.boxes.map((b) => [b.id, b.kind]).sort()).toEqual([['BATT', 'walk'], ['F1', 'walk'], ['G1', 'selected']]);
    const g1 = m.boxes.find((b) => b.id === 'G1')!;
    expect([g1.x, g1.y]).toEqual([520, 40]);
    expect(g1.w).toBeGreaterThan(0);
  });
});
