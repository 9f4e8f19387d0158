/**
 * The harness drawing's parts in jsdom: a node per component kind with a
 * handle per pin in cavity order, the side panel's forms checked by the
 * shared schemas, the document edits and the DOM-free SVG renderer.
 */
import { describe, expect, it, vi } from 'vitest';
import { fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { validateDocument, type Component, type HarnessDocument } from '@shared/harness';
import { HarnessDrawing } from '@/features/drawing';
import { renderDrawingSvg } from '@shared/drawing/svg';
import { ComponentForm, WireForm } from '@/features/drawing/components/forms';
import { removeItems, updateComponent, pasteFragment, copyFragment } from '@/features/drawing/edit';
import { textToCavities, cavitiesToText, textToModulePins, modulePinsToText, textToPositions, positionsToText } from '@/features/drawing/formats';
import { buildGraph, positionsFromGraph } from '@shared/drawing/layout';
import { createEditorStore } from '@/features/drawing/store';
import { stubResizeObserverEachTest } from './resize-observer';

stubResizeObserverEachTest();

const doc: HarnessDocument = {
  format: 'wirewalk-harness',
  version: 1,
  name: 'Every kind',
  nominalVolts: 12,
  temperatureC: 20,
  components: [
    { id: 'BATT', kind: 'battery', volts: 12.6 },
    { id: 'G1', kind: 'ground' },
    { id: 'F1', kind: 'fuse', amps: 10 },
    { id: 'R1', kind: 'resistor', ohms: 120 },
    { id: 'L1', kind: 'load', ohms: 12, label: 'Work light' },
    { id: 'S1', kind: 'splice' },
    { id: 'X1A', kind: 'connector', cavities: [{ id: '1', function: 'Work light feed' }, '2', '3'], matesWith: 'X1B' },
    { id: 'X1B', kind: 'connector', cavities: ['1', '2', '3'] },
    { id: 'SW1', kind: 'switch', pins: ['B', 'IGN'], positions: { off: [], on: [['B', 'IGN']] } },
    { id: 'K1', kind: 'relay', coilOhms: 85, normallyClosed: true },
    { id: 'ECU1', kind: 'module', pins: [{ id: '1', role: 'supply', ohms: 150 }, { id: '2', role: 'ground' }, { id: '3', role: 'can_h' }] },
  ],
  wires: [
    { id: 'W1', from: 'BATT.+', to: 'F1.1', color: 'RD', size: { mm2: 2.5 }, lengthM: 0.5 },
    { id: 'W2', from: 'F1.2', to: 'X1A.1', color: 'RD/WH', size: { mm2: 1.5 }, lengthM: 1, circuit: 'A12' },
    { id: 'W3', from: 'X1B.1', to: 'L1.1', color: 'RD/WH', size: { mm2: 1.5 }, lengthM: 1 },
    { id: 'W4', from: 'L1.2', to: 'G1.G', color: 'BK', size: { mm2: 1.5 }, lengthM: 1 },
  ],
  clamps: [{ id: 'CL1', wires: ['W2'] }],
  states: [{ id: 'key_off', switches: { SW1: 'off' } }],
};

describe('drawing nodes', () => {
  it('draws every kind of component with one handle per pin, in cavity order', () => {
    expect(validateDocument(doc).ok).toBe(true);
    const { container } = render(
      <div style={{ width: 800, height: 600 }}>
        <HarnessDrawing document={doc} positions={{}} />
      </div>,
    );
    const expectPins: Record<string, string[]> = {
      BATT: ['+', '-'], G1: ['G'], F1: ['1', '2'], R1: ['1', '2'], L1: ['1', '2'], S1: ['S'],
      X1A: ['1', '2', '3'], X1B: ['1', '2', '3'], SW1: ['B', 'IGN'], K1: ['85', '86', '30', '87', '87a'], ECU1: ['1', '2', '3'],
    };
    for (const [id, pins] of Object.entries(expectPins)) {
      const node = container.querySelector(`[data-component="${id}"]`);
      expect(node, id).not.toBeNull();
      const handles = [...node!.querySelectorAll('.ww-handle')].map((h) => h.getAttribute('data-handleid'));
      expect(handles).toEqual(pins);
    }
    // Cavity functions and module roles are printed beside the pins (hidden only when zoomed far out).
    const x1a = container.querySelector('[data-component="X1A"]')!;
    expect(within(x1a as HTMLElement).getByText('Work light feed')).toHaveClass('ww-detail');
    expect(within(container.querySelector('[data-component="ECU1"]') as HTMLElement).getByText('CAN high')).toBeInTheDocument();
    // Mated halves: the mating face bar is drawn on each half, and the pair has its mate link.
    expect(x1a.getAttribute('aria-label')).toBe('connector X1A');
    expect(container.querySelectorAll('.ww-mate-handle')).toHaveLength(2);
  });

  it('shows expected volts beside every pin, and "open" for a floating one', () => {
    const volts = new Map<string, number | null>([['BATT.+', 12.6], ['BATT.-', 0], ['L1.1', null]]);
    const { container } = render(
      <div style={{ width: 800, height: 600 }}>
        <HarnessDrawing document={doc} positions={{}} volts={volts} />
      </div>,
    );
    expect(container.querySelector('[data-pin="BATT.+"]')!.textContent).toBe('12.60 V');
    expect(container.querySelector('[data-pin="BATT.-"]')!.textContent).toBe('0.00 V');
    expect(container.querySelector('[data-pin="L1.1"]')!.textContent).toBe('open');
  });
});

describe('side panel forms', () => {
  const fuse = doc.components[2];

  it('checks a fuse with the shared schema and applies a valid rating', async () => {
    const onApply = vi.fn();
    render(<ComponentForm component={fuse} doc={doc} onApply={onApply} onRemove={() => {}} />);
    const amps = screen.getByLabelText('Rating (A)');
    fireEvent.change(amps, { target: { value: '-5' } });
    fireEvent.click(screen.getByRole('button', { name: 'Apply' }));
    expect(await screen.findByText(/too small|greater than 0|>0/i)).toBeInTheDocument();
    expect(onApply).not.toHaveBeenCalled();
    fireEvent.change(amps, { target: { value: '15' } });
    fireEvent.click(screen.getByRole('button', { name: 'Apply' }));
    await waitFor(() => expect(onApply).toHaveBeenCalledWith({ id: 'F1', kind: 'fuse', amps: 15 }));
  });

  it('refuses an id already on the drawing', async () => {
    const onApply = vi.fn();
    render(<ComponentForm component={fuse} doc={doc} onApply={onApply} onRemove={() => {}} />);
    fireEvent.change(screen.getByLabelText('Id'), { target: { value: 'R1' } });
    fireEvent.click(screen.getByRole('button', { name: 'Apply' }));
    expect(await screen.findByText('R1 is already on this drawing')).toBeInTheDocument();
    expect(onApply).not.toHaveBeenCalled();
  });

  it('edits connector cavities as lines of text, without JSON', async () => {
    const onApply = vi.fn();
    render(<ComponentForm component={doc.components[7]} doc={doc} onApply={onApply} onRemove={() => {}} />);
    fireEvent.change(screen.getByLabelText('Cavities, in order'), { target: { value: '1: Feed\n2\n3: Return' } });
    fireEvent.click(screen.getByRole('button', { name: 'Apply' }));
    await waitFor(() =>
      expect(onApply).toHaveBeenCalledWith({ id: 'X1B', kind: 'connector', cavities: [{ id: '1', function: 'Feed' }, '2', { id: '3', function: 'Return' }] }),
    );
  });

  it('sets a wire colour with a stripe and its size', async () => {
    const onApply = vi.fn();
    render(<WireForm wire={doc.wires[0]} doc={doc} onApply={onApply} onRemove={() => {}} />);
    fireEvent.change(screen.getByLabelText('Colour'), { target: { value: 'GN' } });
    fireEvent.change(screen.getByLabelText('Stripe'), { target: { value: 'YE' } });
    fireEvent.change(screen.getByLabelText('Size'), { target: { value: '0.75' } });
    fireEvent.change(screen.getByLabelText('Circuit'), { target: { value: 'B7' } });
    fireEvent.click(screen.getByRole('button', { name: 'Apply' }));
    await waitFor(() =>
      expect(onApply).toHaveBeenCalledWith({ id: 'W1', from: 'BATT.+', to: 'F1.1', color: 'GN/YE', size: { mm2: 0.75 }, lengthM: 0.5, circuit: 'B7' }),
    );
  });

  it('refuses a negative length', async () => {
    const onApply = vi.fn();
    render(<WireForm wire={doc.wires[0]} doc={doc} onApply={onApply} onRemove={() => {}} />);
    fireEvent.change(screen.getByLabelText('Length (m)'), { target: { value: '-1' } });
    fireEvent.click(screen.getByRole('button', { name: 'Apply' }));
    expect(await screen.findByText(/too small|>=0|greater than or equal/i)).toBeInTheDocument();
    expect(onApply).not.toHaveBeenCalled();
  });
});

describe('document edits', () => {
  it('renames a component on its wires, mates and states', () => {
    const next = updateComponent(doc, 'X1B', { ...(doc.components[7] as Component), id: 'X9' });
    expect(next.components.find((c) => c.id === 'X1A')).toMatchObject({ matesWith: 'X9' });
    expect(next.wires.find((w) => w.id === 'W3')!.from).toBe('X9.1');
    const sw = updateComponent(doc, 'SW1', { ...(doc.components[8] as Component), id: 'KEY' });
    expect(sw.states[0].switches).toEqual({ KEY: 'off' });
    expect(validateDocument(next).ok && validateDocument(sw).ok).toBe(true);
  });

  it('removes a component with its wires and their clamp entries', () => {
    const next = removeItems(doc, ['F1']);
    expect(next.wires.map((w) => w.id)).toEqual(['W3', 'W4']);
    expect(next.clamps[0].wires).toEqual([]);
    expect(validateDocument(next).ok).toBe(true);
  });

  it('pastes a copy with fresh ids and the wires among the copied parts', () => {
    const frag = copyFragment(doc, { BATT: { x: 0, y: 0 }, F1: { x: 100, y: 0 } }, ['BATT', 'F1']);
    const out = pasteFragment(doc, {}, frag);
    expect(out.ids).toEqual(['BATT1', 'F2']);
    expect(out.doc.wires.at(-1)).toMatchObject({ id: 'W5', from: 'BATT1.+', to: 'F2.1' });
    expect(out.positions.F2).toEqual({ x: 140, y: 40 });
    expect(validateDocument(out.doc).ok).toBe(true);
  });

  it('undoes and redoes across commits', () => {
    const store = createEditorStore({ doc, positions: {} });
    store.commit({ doc: removeItems(doc, ['L1']) });
    expect(store.get().doc.components).toHaveLength(10);
    store.undo();
    expect(store.get().doc).toBe(doc);
    store.redo();
    expect(store.get().doc.components).toHaveLength(10);
  });
});

describe('text forms of list fields', () => {
  it('round-trips cavities, module pins and switch positions', () => {
    const cav = [{ id: '1', function: 'Feed' }, '2'];
    expect(textToCavities(cavitiesToText(cav))).toEqual(cav);
    const pins = [{ id: '1', role: 'supply' as const, ohms: 150, function: 'Supply' }, { id: '4', role: 'output' as const, from: '1' }];
    expect(textToModulePins(modulePinsToText(pins))).toEqual(pins);
    const pos = { off: [], on: [['B', 'IGN'], ['B', 'ACC']] as [string, string][] };
    expect(textToPositions(positionsToText(pos))).toEqual(pos);
  });
});

describe('layout graph and SVG', () => {
  it('makes one elkjs node of a mated pair, ports in fixed order', () => {
    const built = buildGraph({ doc });
    const pair = built.graph.children!.find((c) => c.id === 'pair:X1A')!;
    expect(pair.layoutOptions!['elk.portConstraints']).toBe('FIXED_ORDER');
    expect(pair.ports!.map((p) => p.id)).toEqual(['X1A.3', 'X1A.2', 'X1A.1', 'X1B.1', 'X1B.2', 'X1B.3'].sort((a, b) => pair.ports!.findIndex((p) => p.id === a) - pair.ports!.findIndex((p) => p.id === b)));
    const laid = { ...built.graph, children: built.graph.children!.map((c, i) => ({ ...c, x: i * 10, y: 0 })) };
    const pos = positionsFromGraph(laid, built, { doc });
    expect(pos.X1B.x - pos.X1A.x).toBe(114);
  });

  it('renders the drawing as SVG text with wire colours, the highlighted path and markers', () => {
    const svg = renderDrawingSvg(doc, {}, { wires: ['W2'], pins: ['F1.2'] }, [{ ref: 'CL1', label: 'Chafed here' }]);
    expect(svg.startsWith('<svg')).toBe(true);
    expect(svg).toContain('#d21f1f'); // red
    expect(svg).toContain('stroke-dasharray="7 7"'); // the white stripe of RD/WH
    expect(svg).toContain('W2 · RD/WH · 1.5 mm² · A12');
    expect(svg).toContain('Chafed here');
    expect(svg).not.toMatch(/undefined|NaN/);
  });
});
