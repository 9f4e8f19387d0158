/**
 * Clamps on the drawing: each clamp is drawn on every wire it holds, at its
 * place along the wire (`at`, the middle by default), in the editor's view
 * and in the DOM-free SVG; a wire without a clamp has none.
 */
import { describe, expect, it } from 'vitest';
import { render } from '@testing-library/react';
import type { HarnessDocument } from '@shared/harness';
import { HarnessDrawing, renderDrawingSvg } from '@/features/drawing';
import { pointAlong, wirePath } from '@/features/drawing/wires';
import { stubResizeObserverEachTest } from './resize-observer';

stubResizeObserverEachTest();

const doc: HarnessDocument = {
  format: 'wirewalk-harness',
  version: 1,
  name: 'Boom lights',
  nominalVolts: 12,
  temperatureC: 20,
  components: [
    { id: 'BATT', kind: 'battery', volts: 12.6 },
    { id: 'F1', kind: 'fuse', amps: 10 },
    { id: 'X1A', kind: 'connector', cavities: ['1', '2'] },
    { id: 'G1', kind: 'ground' },
  ],
  wires: [
    { id: 'W1', from: 'BATT.+', to: 'F1.1', color: 'RD', size: { mm2: 2.5 }, lengthM: 0.5 },
    { id: 'W2', from: 'F1.2', to: 'X1A.1', color: 'RD/WH', size: { mm2: 1.5 }, lengthM: 2 },
    { id: 'W3', from: 'X1A.2', to: 'G1.G', color: 'BK', size: { mm2: 1.5 }, lengthM: 1 },
  ],
  clamps: [
    { id: 'CL1', label: 'Boom clip', wires: ['W2'] },
    { id: 'CL2', label: 'Frame rail', wires: ['W2', 'W3'], at: 0.25 },
  ],
  states: [],
};
// F1's pin 2 and X1A's cavity 1 on one level, so W2 runs straight: its middle is easy to know.
const positions = { BATT: { x: -200, y: -20 }, F1: { x: 0, y: 0 }, X1A: { x: 300, y: -18 }, G1: { x: 520, y: 40 } };

describe('clamps on the drawing', () => {
  it('draws each clamp on every wire it holds, at its place along the wire', () => {
    const { container } = render(
      <div style={{ width: 900, height: 500 }}>
        <HarnessDrawing document={doc} positions={positions} />
      </div>,
    );
    const on = (wire: string) => [...container.querySelectorAll(`[data-wire="${wire}"] [data-clamp]`)].map((g) => g.getAttribute('data-clamp'));
    expect(on('W1')).toEqual([]);
    expect(on('W2')).toEqual(['CL1', 'CL2']);
    expect(on('W3')).toEqual(['CL2']);
    // W2 runs from F1.2 (x 88 + the handle's half width) to X1A.1 (x 300 less it), at y 22: CL1 sits at its middle.
    const cl1 = container.querySelector('[data-wire="W2"] [data-clamp="CL1"]')!;
    expect(cl1.querySelector('g')!.getAttribute('transform')).toBe('translate(194 22) rotate(0)');
    expect(cl1.getAttribute('aria-label')).toBe('clamp CL1, Boom clip');
    // The id is printed beside it (a detail: hidden when zoomed far out).
    expect(cl1.querySelector('text')).toHaveTextContent('CL1');
    expect(cl1.querySelector('text')).toHaveClass('ww-detail');
    // A quarter of the way along W2, not its middle.
    const cl2 = container.querySelector('[data-wire="W2"] [data-clamp="CL2"] g')!.getAttribute('transform')!;
    const x = Number(/translate\(([-\d.]+)/.exec(cl2)![1]);
    expect(x).toBeCloseTo(93.5 + 0.25 * (294.5 - 93.5), 0);
  });

  it('places a clamp by length along a curved wire', () => {
    const path = wirePath(0, 0, 'right', 200, 120, 'left');
    const start = pointAlong(path, 0);
    const end = pointAlong(path, 1);
    expect([start.x, start.y]).toEqual([0, 0]);
    expect([Math.round(end.x), Math.round(end.y)]).toEqual([200, 120]);
    // The S-curve is symmetric about its middle: half its length lands on the centre, running down-right.
    const mid = pointAlong(path, 0.5);
    expect(mid.x).toBeCloseTo(100, 0);
    expect(mid.y).toBeCloseTo(60, 0);
    expect(mid.angle).toBeGreaterThan(10);
  });

  it('draws the clamps in the SVG too', () => {
    const svg = renderDrawingSvg(doc, positions);
    expect(svg.match(/data-clamp="CL1"/g)).toHaveLength(1);
    expect(svg.match(/data-clamp="CL2"/g)).toHaveLength(2);
    expect(svg).toContain('<title>CL1: Boom clip</title>');
    expect(renderDrawingSvg({ ...doc, clamps: [] }, positions)).not.toContain('data-clamp');
  });
});
