/**
 * The carrier stand-in used by the attachment harness documents.
 *
 * An attachment harness is documented on its own, but its pin cards need the
 * supply the carrier presents at the attachment plug. Each attachment
 * document therefore starts with a small stand-in for the KR-T78 side of the
 * plug: the machine-side half X40 (same id and cavities as on the loader),
 * a battery, the two attachment fuses, the attachment power relay contacts as
 * a switch and the loader's rear bus terminator. Every stand-in component id
 * starts with `CAR-` (plus `X40` itself); `fitAttachment` (./fit.ts) drops
 * them when it joins an attachment to the loader's own harness.
 */
import type { Component, Wire } from '../../shared/harness/schema';
import { cavities, wires } from './build';

export const CARRIER_PREFIX = 'CAR-';
export const CARRIER_PLUG = 'X40';

export function isCarrierStandIn(id: string): boolean {
  return id === CARRIER_PLUG || id.startsWith(CARRIER_PREFIX);
}

const plug: Component = {
  id: CARRIER_PLUG,
  kind: 'connector',
  label: 'X40 Attachment plug, machine side (KR-T78 coupler plate)',
  notes: 'Carrier stand-in: the loader half of the attachment plug.',
  cavities: cavities([
    'Attachment constant power, +12 V battery (loader F2 15 A)',
    'Attachment switched power, +12 V through loader relay K3 (loader F4 20 A)',
    'Attachment ground (loader front frame ground)',
    'Bus CAN_H',
    'Bus CAN_L',
    'Attachment output A (loader control unit driver)',
    'Attachment output B (loader control unit driver)',
    'Spare, sealing plug fitted',
  ]),
};

export interface CarrierOptions {
  /** Include the loader's attachment output A driver (fuse F13 and a switch for the driver). */
  outputA?: boolean;
  /** Include the constant feed (fuse F2). */
  constant?: boolean;
}

/** The stand-in components and wires: the KR-T78 as its attachment plug presents it. */
export function carrierStandIn(opts: CarrierOptions = {}): { components: Component[]; wires: Wire[] } {
  const components: Component[] = [
    plug,
    { id: 'CAR-BATT', kind: 'battery', label: 'Carrier battery (stand-in for the KR-T78 battery)', volts: 12.6, internalOhms: 0.01 },
    { id: 'CAR-G', kind: 'ground', label: 'Carrier front frame ground (stand-in, KR-T78 G3)', bondOhms: 0.008 },
    { id: 'CAR-SP', kind: 'splice', label: 'Carrier fuse panel constant bus (stand-in)' },
    { id: 'CAR-F4', kind: 'fuse', label: 'Carrier F4 Attachment switched power (stand-in)', amps: 20, ohms: 0.003 },
    {
      id: 'CAR-K3',
      kind: 'switch',
      label: 'Carrier attachment power relay K3 contacts (stand-in: closed while the key is on)',
      pins: ['30', '87'],
      positions: { open: [], closed: [['30', '87']] },
      contactOhms: 0.003,
    },
    { id: 'CAR-TR1', kind: 'resistor', label: 'Carrier rear bus terminator (stand-in, KR-T78 TR1)', ohms: 120 },
    {
      id: 'CAR-NODE',
      kind: 'module',
      label: 'Carrier controllers on the bus (stand-in for the KR-T78 engine controller, control unit and display)',
      pins: [
        { id: '1', role: 'supply', ohms: 60, function: 'Supply, switched with the key' },
        { id: '2', role: 'ground', function: 'Ground' },
        { id: '3', role: 'can_h', biasOhms: 830, function: 'Bus CAN_H (three controllers in parallel)' },
        { id: '4', role: 'can_l', biasOhms: 830, function: 'Bus CAN_L (three controllers in parallel)' },
      ],
    },
  ];
  const rows: Parameters<typeof wires>[0] = [
    ['CW1', 'CAR-BATT.+', 'CAR-SP.S', 'RD', 6, 2.2, '102', 'Carrier battery cable and main fuse (stand-in)'],
    ['CW2', 'CAR-BATT.-', 'CAR-G.G', 'BK', 25, 0.5, '900', 'Carrier battery negative (stand-in)'],
    ['CW5', 'CAR-SP.S', 'CAR-F4.1', 'RD', 2.5, 0.05, '102', 'Carrier bus bar to F4 (stand-in)'],
    ['CW6', 'CAR-F4.2', 'CAR-K3.30', 'RD', 4, 0.2, '121', 'Carrier F4 to relay K3 (stand-in)'],
    ['CW7', 'CAR-K3.87', 'X40.2', 'RD/GN', 4, 7.2, '121', 'Carrier attachment switched power, cab to plug (stand-in)'],
    ['CW8', 'CAR-G.G', 'X40.3', 'BK', 2.5, 3.2, '903', 'Carrier attachment ground (stand-in)'],
    ['CW9', 'X40.4', 'CAR-TR1.1', 'YE', 0.5, 14.5, '601', 'Carrier bus CAN_H to the rear terminator (stand-in)'],
    ['CW10', 'X40.5', 'CAR-TR1.2', 'GN', 0.5, 14.5, '602', 'Carrier bus CAN_L to the rear terminator (stand-in)'],
    ['CW14', 'CAR-K3.87', 'CAR-NODE.1', 'RD/GY', 1.0, 1.0, '141', 'Carrier controllers supply (stand-in)'],
    ['CW15', 'CAR-NODE.2', 'CAR-G.G', 'BK', 1.5, 1.0, '901', 'Carrier controllers ground (stand-in)'],
    ['CW16', 'CAR-NODE.3', 'CAR-TR1.1', 'YE', 0.5, 0.4, '601', 'Carrier controllers CAN_H (stand-in)'],
    ['CW17', 'CAR-NODE.4', 'CAR-TR1.2', 'GN', 0.5, 0.4, '602', 'Carrier controllers CAN_L (stand-in)'],
  ];
  if (opts.constant !== false) {
    components.push({ id: 'CAR-F2', kind: 'fuse', label: 'Carrier F2 Attachment constant power (stand-in)', amps: 15 });
    rows.push(['CW3', 'CAR-SP.S', 'CAR-F2.1', 'RD', 2.5, 0.05, '102', 'Carrier bus bar to F2 (stand-in)']);
    rows.push(['CW4', 'CAR-F2.2', 'X40.1', 'RD/WH', 2.5, 7.2, '120', 'Carrier attachment constant power, cab to plug (stand-in)']);
  }
  if (opts.outputA) {
    components.push({ id: 'CAR-F13', kind: 'fuse', label: 'Carrier F13 Control unit valve output supply (stand-in)', amps: 10 });
    components.push({
      id: 'CAR-OUTA',
      kind: 'switch',
      label: 'Carrier control unit attachment output A driver (stand-in for KR-T78 MCU.21)',
      pins: ['1', '2'],
      positions: { off: [], on: [['1', '2']] },
      contactOhms: 0.02,
    });
    rows.push(['CW11', 'CAR-SP.S', 'CAR-F13.1', 'RD', 2.5, 0.05, '102', 'Carrier bus bar to F13 (stand-in)']);
    rows.push(['CW12', 'CAR-F13.2', 'CAR-OUTA.1', 'RD/BU', 1.5, 1.0, '142', 'Carrier control unit valve output supply (stand-in)']);
    rows.push(['CW13', 'CAR-OUTA.2', 'X40.6', 'BU/WH', 1.0, 7.2, '125', 'Carrier attachment output A, cab to plug (stand-in)']);
  }
  return { components, wires: wires(rows) };
}
