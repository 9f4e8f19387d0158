// @vitest-environment jsdom
/**
 * The one SVG renderer of the drawing (shared/drawing/svg.ts), as the report and the order page
 * use it: fault and note markers told apart by shape, numbered, placed beside what they are on,
 * a legend of their notes, a viewport crop, and well-formed XML whatever the text says
 * (checked with the DOM's strict XML parser, hence jsdom).
 */
import { describe, expect, it } from 'vitest';
import { documentGeometry, drawingBounds, fillPositions } from '../../shared/drawing/geometry';
import { escapeXml, highlightFrame, markerCentres, renderDrawingSvg, type Marker } from '../../shared/drawing/svg';
import { pinPoint } from '../../shared/drawing/wires';
import type { HarnessDocument } from '../../shared/harness';
import { boomLights, boomLightsPositions } from '../client/boom-lights';

const doc = boomLights([{ id: 'CL1', label: 'Boom clip', wires: ['W2'] }]);
const positions = boomLightsPositions;
const markers: Marker[] = [
  { kind: 'fault', ref: 'W2', label: 'Insulation worn through' },
  { kind: 'note', ref: 'X1A.1', label: 'Green corrosion in cavity 1' },
];

/** The SVG parsed as XML: throws on anything a strict XML parser refuses. */
function parse(svg: string): Document {
  const xml = new DOMParser().parseFromString(svg, 'image/svg+xml');
  const error = xml.getElementsByTagName('parsererror')[0];
  if (error) throw new Error(`not well-formed: ${error.textContent}`);
  return xml;
}
const viewBox = (xml: Document) => xml.documentElement.getAttribute('viewBox')!.split(' ').map(Number);

describe('markers on the drawing', () => {
  it('draws a fault as a disc and a note as a square, numbered in order', () => {
    const xml = parse(renderDrawingSvg(doc, positions, {}, markers));
    const drawn = [...xml.querySelectorAll('[data-marker]')];
    expect(drawn.map((g) => [g.getAttribute('data-marker'), g.getAttribute('data-kind')])).toEqual([['1', 'fault'], ['2', 'note']]);
    expect(drawn[0].querySelector('circle')).not.toBeNull();
    expect(drawn[0].querySelector('rect')).toBeNull();
    expect(drawn[1].querySelector('rect')).not.toBeNull();
    expect(drawn[1].querySelector('circle')).toBeNull();
    expect(drawn.map((g) => g.querySelector('text')!.textContent)).toEqual(['1', '2']);
  });

  it('puts a marker without coordinates beside what it is on, and keeps given coordinates', () => {
    const [onWire, onPin, given, nowhere] = markerCentres(doc, positions, [...markers, { kind: 'note', ref: 'W2', x: 7, y: -3, label: 'here' }, { label: 'no target' }]);
    // W2 runs level from F1.2 to X1A.1: its marker sits under its middle.
    const geom = documentGeometry(doc);
    const a = pinPoint('F1.2', geom, positions)!;
    const b = pinPoint('X1A.1', geom, positions)!;
    expect(onWire.x).toBeCloseTo((a.x + b.x) / 2, 0);
    expect(onWire.y - a.y).toBeGreaterThan(10);
    expect(onWire.y - a.y).toBeLessThan(30);
    // X1A.1 is on the connector's left face: the marker is just outside it, not on the cavity.
    expect(onPin.x).toBeLessThan(b.x);
    expect(Math.hypot(onPin.x - b.x, onPin.y - b.y)).toBeLessThan(30);
    expect(given).toEqual({ x: 7, y: -3 });
    const box = drawingBounds(doc, fillPositions(doc, positions), geom);
    expect(nowhere.x).toBeGreaterThanOrEqual(box.x);
    expect(nowhere.y).toBeGreaterThanOrEqual(box.y);
    expect(nowhere.x).toBeLessThanOrEqual(box.x + box.w);
  });

  it('lists the notes under the drawing with the legend, beside the markers without it', () => {
    const withLegend = renderDrawingSvg(doc, positions, {}, markers, { legend: true });
    const legend = parse(withLegend).querySelector('.legend')!;
    expect(legend.textContent).toContain('1. FAULT at W2: Insulation worn through');
    expect(legend.textContent).toContain('2. NOTE at X1A.1: Green corrosion in cavity 1');
    // The legend is under the drawing: the picture grows by its height.
    const [, y, , h] = viewBox(parse(withLegend));
    const plain = viewBox(parse(renderDrawingSvg(doc, positions, {}, markers)));
    expect(y).toBe(plain[1]);
    expect(h).toBeGreaterThan(plain[3] + 2 * 20);
    for (const text of legend.querySelectorAll(':scope > text')) expect(Number(text.getAttribute('y'))).toBeGreaterThan(plain[1] + plain[3]);

    const beside = parse(renderDrawingSvg(doc, positions, {}, markers));
    expect(beside.querySelector('.legend')).toBeNull();
    expect(beside.querySelector('.markers')!.textContent).toContain('Insulation worn through');
    expect(beside.documentElement.textContent).not.toContain('FAULT at');
  });

  it('wraps a long note over lines instead of running off the picture', () => {
    const long = 'Chafed through where the loom crosses the lift arm pivot, '.repeat(3).trim();
    const svg = renderDrawingSvg(doc, positions, {}, [{ kind: 'fault', ref: 'W2', label: long }], { legend: true, maxWidth: 500 });
    const lines = [...parse(svg).querySelectorAll('.legend > text')].map((t) => t.textContent!);
    expect(lines.length).toBeGreaterThan(1);
    expect(lines.join(' ').replace(/\s+/g, ' ')).toBe(`1. FAULT at W2: ${long}`);
  });
});

describe('the viewport crop', () => {
  it('shows only the viewport, clipped, at most maxWidth wide with the legend as legible', () => {
    const viewport = { x: -20, y: -40, width: 1800, height: 300 };
    const xml = parse(renderDrawingSvg(doc, positions, {}, markers, { viewport, legend: true, maxWidth: 900 }));
    const [x, y, w, h] = viewBox(xml);
    expect([x, y, w]).toEqual([-20, -40, 1800]);
    expect(h).toBeGreaterThan(300);
    expect(Number(xml.documentElement.getAttribute('width'))).toBe(900);
    // Two drawing units per shown px: the legend's text and the markers are drawn twice as large.
    expect(Number(xml.querySelector('.legend > text')!.getAttribute('font-size'))).toBe(28);
    expect(xml.querySelector('[data-marker="1"]')!.getAttribute('transform')).toMatch(/ scale\(2\)$/);
    const clip = xml.querySelector('clipPath rect')!;
    expect(['x', 'y', 'width', 'height'].map((a) => Number(clip.getAttribute(a)))).toEqual([-20, -40, 1800, 300]);
    expect(xml.querySelector('[clip-path]')!.querySelector('.components')).not.toBeNull();
  });

  it('without a viewport shows the whole drawing, markers included, unclipped', () => {
    const xml = parse(renderDrawingSvg(doc, positions, {}, [{ kind: 'note', x: 2000, y: 900, label: 'far off' }]));
    const [x, y, w, h] = viewBox(xml);
    const box = drawingBounds(doc, positions, documentGeometry(doc));
    expect(x).toBe(box.x);
    expect(y).toBe(box.y);
    expect(x + w).toBeGreaterThan(2000);
    expect(y + h).toBeGreaterThan(900);
    expect(xml.querySelector('clipPath')).toBeNull();
  });

  it('frames what a highlight touches, or nothing', () => {
    expect(highlightFrame(doc, positions, {})).toBeNull();
    expect(highlightFrame(doc, positions, { wires: ['W99'] })).toBeNull();
    const frame = highlightFrame(doc, positions, { wires: ['W3'] })!;
    const geom = documentGeometry(doc);
    for (const id of ['X1A', 'G1']) {
      const p = positions[id as keyof typeof positions];
      const g = geom.get(id)!;
      expect(frame.x).toBeLessThan(p.x);
      expect(frame.y).toBeLessThan(p.y);
      expect(frame.x + frame.width).toBeGreaterThan(p.x + g.width);
      expect(frame.y + frame.height).toBeGreaterThan(p.y + g.height);
    }
    // The battery is far left of X1A and G1: not in the frame of W3.
    expect(frame.x).toBeGreaterThan(positions.BATT.x + geom.get('BATT')!.width);
    // A far marker widens it.
    const wider = highlightFrame(doc, positions, { wires: ['W3'] }, [{ x: 2000, y: 0 }])!;
    expect(wider.x + wider.width).toBeGreaterThan(2000);
    // Shown at most 600 px wide, its markers are drawn larger: the frame leaves them more room.
    const shown = highlightFrame(doc, positions, { wires: ['W3'] }, [{ x: 2000, y: 0 }], 600)!;
    expect(shown.x + shown.width).toBeGreaterThan(wider.x + wider.width + 20);
  });

  it('draws the highlighted components in the accent colour', () => {
    const xml = parse(renderDrawingSvg(doc, positions, { components: ['G1'] }));
    const strokes = (id: string) => [...xml.querySelector(`[data-id="${id}"]`)!.querySelectorAll('path')].map((p) => p.getAttribute('stroke'));
    expect(strokes('G1')).toContain('#4536a6');
    expect(strokes('F1')).not.toContain('#4536a6');
  });
});

describe('hostile text', () => {
  it('escapes markup and drops characters XML does not allow', () => {
    expect(escapeXml(`a<b>&"c"'d'\u0000\u0007\u000b\u001f\ufffe`)).toBe('a&lt;b&gt;&amp;&quot;c&quot;&apos;d&apos;');
    expect(escapeXml('tab\tline\nreturn\r')).toBe('tab\tline\nreturn\r');
  });

  it('keeps the SVG well-formed with hostile ids, labels, notes and title', () => {
    const evil = '</text><script>alert(1)</script>\u0001&amp;';
    const hostile: HarnessDocument = { ...doc, name: evil, components: doc.components.map((c) => ({ ...c, label: evil })) };
    const svg = renderDrawingSvg(hostile, positions, {}, [{ kind: 'fault', ref: 'W2', label: evil }, { kind: 'note', ref: evil, label: evil }], { legend: true, title: evil });
    const xml = parse(svg);
    expect(xml.getElementsByTagName('script')).toHaveLength(0);
    expect(svg).not.toContain('\u0001');
    expect(xml.querySelector('title')!.textContent).toBe('</text><script>alert(1)</script>&amp;');
    expect(xml.querySelector('.legend')!.textContent).toContain('2. NOTE at </text><script>');
  });
});
