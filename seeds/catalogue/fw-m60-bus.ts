/**
 * Messages the FW-M60 mulcher's attachment control unit (module ACU,
 * source address 0x4A, ../harnesses/fw-m60-mulcher.ts) adds to the carrier
 * bus. Invented; proprietary B range (PDU format 0xFF, broadcast), split
 * per SAE J1939-21. Conventions as in ./kr-t78-bus.ts.
 */
import type { BusMessage } from '../../shared/harness/schema';

export const fwM60BusMessages: BusMessage[] = [
  {
    id: '18FF504A',
    extended: true,
    sender: 'ACU',
    name: 'Mulcher status',
    meaning: 'Attachment control unit broadcast, every 100 ms. Priority 6, PGN 65360 (proprietary B), source 0x4A.',
    signals: [
      { name: 'Rotor state', byte: 0, values: { '0': 'Off', '1': 'Enabled, spinning up', '2': 'Running', '3': 'Stopping', '14': 'Fault', '15': 'Not available' } },
      { name: 'Rotor supply pressure', byte: 1, scale: 2, offset: 0, unit: 'bar', notes: 'From the sensor at ACU.10 (0.5 V = 0 bar).' },
      { name: 'Rotor oil temperature', byte: 2, scale: 1, offset: -40, unit: '°C', notes: 'From the sensor at ACU.11.' },
      { name: 'Motor range', startBit: 24, length: 2, values: { '0': 'High speed', '1': 'High torque' } },
      { name: 'Attachment hours', startBit: 32, length: 24, scale: 0.1, offset: 0, unit: 'h' },
    ],
  },
  {
    id: '18FF514A',
    extended: true,
    sender: 'ACU',
    name: 'Mulcher identification',
    meaning: 'Every 1000 ms: attachment type and software level, so the carrier can recognise the mulcher. Priority 6, PGN 65361 (proprietary B), source 0x4A.',
    signals: [
      { name: 'Attachment type', byte: 0, values: { '77': 'Forestry mulcher (FW-M60)' } },
      { name: 'Software level', byte: 1 },
    ],
  },
  {
    id: '18FECA4A',
    extended: true,
    sender: 'ACU',
    name: 'Active trouble codes, attachment control unit',
    meaning: 'Every 1000 ms. Priority 6, PGN 65226, source 0x4A.',
    signals: [{ name: 'Lamp status', byte: 0 }],
  },
];

export const fwM60MessagePeriodsMs: Record<string, number> = {
  '18FF504A': 100,
  '18FF514A': 1000,
  '18FECA4A': 1000,
};
