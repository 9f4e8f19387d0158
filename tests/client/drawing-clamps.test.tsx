/**
 * Clamps on the drawing: each clamp is drawn on every wire it holds, at its
 * place along the wire (`at`, the middle by default), in the editor's view
 * and in the DOM-free SVG; a wire without a clamp has none.
 */
import { describe, expect, it } from 'vitest';
import { boomLights, boomLightsPositions } from './boom-lights';
import { render } from '@testing-library/react';
import { HarnessDrawing } from '@/features/drawing';
import { renderDrawingSvg } from '@shared/drawing/svg';
import { pointAlong, wirePath } from '@shared/drawing/wires';
import { stubResizeObserverEachTest } from './resize-observer';

stubResizeObserverEachTest();

const doc = boomLights([
  { id: 'CL1', label: 'Boom clip', wires: ['W2'] },
  { id: 'CL2', label: 'Frame rail', wires: ['W2', 'W3'], at: 0.25 },
]);
const positions = boomLightsPositions;

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
