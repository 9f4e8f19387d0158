/**
 * The zoomed-out overview of a big drawing: its picture has shapes and wire colours but no text, and
 * the marks over it pick out exactly the selected, walked and live items.
 */
import { describe, expect, it } from 'vitest';
import { boomLights, boomLightsPositions } from './boom-lights';
import { renderDrawingSvg } from '@/features/drawing';
import { overviewMarks } from '@/features/drawing/svg';

const doc = boomLights([{ id: 'CL1', label: 'Boom clip', wires: ['W2'] }]);
const positions = boomLightsPositions;

describe('the drawing overview', () => {
  it('is a picture of every component and wire without any text', () => {
    const bare = renderDrawingSvg(doc, positions, {}, [], { bare: true });
    const full = renderDrawingSvg(doc, positions);
    expect(bare).not.toMatch(/<text|<title/);
    expect(full).toMatch(/<text/);
    // The same components, wires and clamps as the full drawing, on no sheet of its own.
    const count = (s: string, re: RegExp) => s.match(re)?.length ?? 0;
    expect(count(bare, /data-id="/g)).toBe(4);
    expect(count(bare, /data-clamp="/g)).toBe(1);
    expect(count(bare, /<path /g)).toBe(count(full, /<path /g));
    expect(/viewBox="([^"]+)"/.exec(bare)![1]).toBe(/viewBox="([^"]+)"/.exec(full)![1]);
    expect(bare).not.toContain('fill="#ffffff"/><g class="mates"');
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
