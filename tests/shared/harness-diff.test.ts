/* eslint-disable @typescript-eslint/no-explicit-any -- documents edited loosely in these tests */
import { describe, expect, it } from 'vitest';
import { diffDocuments, jsonEqual } from '../../shared/harness/diff';

type Doc = { [k: string]: any; components: any[]; wires: any[]; clamps: any[]; states: any[] };
const base = (): Doc => ({
  format: 'wirewalk-harness',
  version: 1,
  name: 'Diff test',
  nominalVolts: 12,
  temperatureC: 20,
  components: [
    { id: 'BATT', kind: 'battery', volts: 12.6 },
    { id: 'X1', kind: 'connector', cavities: ['1', { id: '2', function: 'Feed' }, '3'] },
    { id: 'F1', kind: 'fuse', amps: 10 },
  ],
  wires: [
    { id: 'W1', from: 'BATT.+', to: 'F1.1', color: 'RD', size: { mm2: 2.5 }, lengthM: 1 },
    { id: 'W2', from: 'F1.2', to: 'X1.2', size: { mm2: 1 }, lengthM: 2, circuit: 'A1' },
  ],
  clamps: [{ id: 'CL1', wires: ['W2'] }],
  states: [{ id: 'key_on', switches: {} }],
});

describe('diffDocuments', () => {
  it('finds nothing between equal documents, whatever the key order', () => {
    const a = base();
    const reversed = (o: Record<string, unknown>) => Object.fromEntries(Object.entries(o).reverse());
    const b = reversed({ ...base(), components: base().components.map(reversed), wires: base().wires.map(reversed) });
    expect(Object.keys(b)[0]).toBe('states');
    const d = diffDocuments(a, b);
    expect(d.same).toBe(true);
    expect(d.total).toBe(0);
    expect(jsonEqual({ x: 1, y: [1, 2] }, { y: [1, 2], x: 1 })).toBe(true);
    expect(jsonEqual([1, 2], [2, 1])).toBe(false);
    expect(jsonEqual({ x: 1 }, { x: 1, y: 2 })).toBe(false);
  });

  it('reports items added, removed and changed field by field', () => {
    const a = base();
    const b = base();
    b.name = 'Diff test, rev 2';
    b.components = b.components.filter((c) => c.id !== 'F1');
    b.components.push({ id: 'F2', kind: 'fuse', amps: 15 });
    b.wires[0] = { ...b.wires[0], color: 'RD/WH', to: 'F2.1' };
    delete (b.wires[1] as Record<string, unknown>).circuit;
    (b.wires[1] as Record<string, unknown>).label = 'Lamp feed';
    b.wires[1].from = 'F2.2';
    b.clamps[0] = { ...b.clamps[0], at: 0.3 } as (typeof b.clamps)[0];
    b.states.push({ id: 'key_off', switches: {} });

    const d = diffDocuments(a, b);
    expect(d.document).toEqual([{ field: 'name', before: 'Diff test', after: 'Diff test, rev 2' }]);
    expect(d.components.added).toEqual([{ id: 'F2', item: { id: 'F2', kind: 'fuse', amps: 15 } }]);
    expect(d.components.removed).toEqual([{ id: 'F1', item: { id: 'F1', kind: 'fuse', amps: 10 } }]);
    expect(d.components.changed).toEqual([]);
    expect(d.wires.changed).toEqual([
      { id: 'W1', changes: [{ field: 'to', before: 'F1.1', after: 'F2.1' }, { field: 'color', before: 'RD', after: 'RD/WH' }] },
      {
        id: 'W2',
        changes: [
          { field: 'from', before: 'F1.2', after: 'F2.2' },
          { field: 'circuit', before: 'A1' },
          { field: 'label', after: 'Lamp feed' },
        ],
      },
    ]);
    expect(d.clamps.changed).toEqual([{ id: 'CL1', changes: [{ field: 'at', after: 0.3 }] }]);
    expect(d.states.added.map((s) => s.id)).toEqual(['key_off']);
    expect(d.total).toBe(1 + 1 + 1 + 2 + 1 + 1);
    expect(d.same).toBe(false);
  });

  it('compares a connector cavity by cavity', () => {
    const a = base();
    const b = base();
    b.components[1] = { id: 'X1', kind: 'connector', cavities: [{ id: '1', function: 'Ground' }, { id: '2', function: 'Feed' }, '4'] };
    const d = diffDocuments(a, b);
    expect(d.components.changed).toEqual([
      {
        id: 'X1',
        changes: [
          { field: 'cavities.1', before: '1', after: { id: '1', function: 'Ground' } },
          { field: 'cavities.3', before: '3' },
          { field: 'cavities.4', after: '4' },
        ],
      },
    ]);
  });

  it('reports a reordered pin list and never throws on odd input', () => {
    const a = base();
    const b = base();
    b.components[1] = { id: 'X1', kind: 'connector', cavities: ['3', { id: '2', function: 'Feed' }, '1'] };
    expect(diffDocuments(a, b).components.changed[0].changes[0].field).toBe('cavities order');
    expect(diffDocuments(null, undefined).same).toBe(true);
    expect(diffDocuments({ components: 'x' }, { components: [{ id: 'A' }] }).components.added).toHaveLength(1);
  });
});
