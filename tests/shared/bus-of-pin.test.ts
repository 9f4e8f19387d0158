import { describe, expect, it } from 'vitest';
import { busOfPin, busOfPinOrConnector } from '../../shared/can/bus-of-pin';
import { harnessDocument } from '../../seeds/library';

const doc = harnessDocument('kr-t78-main');

describe('busOfPin on the demo loader harness', () => {
  it('follows wires, splices and mated halves to the modules on the bus', () => {
    const h = busOfPin(doc, 'X20B.3');
    expect(h.line).toBe('can_h');
    expect(h.modules.map((m) => m.id).sort()).toEqual(expect.arrayContaining(['ECU', 'MCU']));
    expect(h.messages.map((m) => m.id)).toContain('0CFF1021');
    expect(busOfPin(doc, 'X20A.4').line).toBe('can_l');
  });
  it('a connector answers the bus of its first bus cavity; a pin off the bus answers nothing', () => {
    expect(busOfPinOrConnector(doc, 'X20A').line).toBe('can_h');
    expect(busOfPin(doc, 'MCU.2')).toEqual({ line: null, modules: [], messages: [] });
    expect(busOfPin(null, 'X20A.3').line).toBeNull();
    expect(busOfPinOrConnector(doc, 'NOPE').line).toBeNull();
  });
});
