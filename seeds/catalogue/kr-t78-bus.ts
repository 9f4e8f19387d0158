/**
 * Message catalogue of the KR-T78 bus (invented), for the bus-messages
 * feature and the document's optional `messages` section.
 *
 * Senders are module ids of the loader harness (../harnesses/kr-t78-main.ts):
 * ECU (source address 0x00), MCU (0x21), DSP (0x28). Identifiers are 29-bit,
 * split per SAE J1939-21: the two engine messages use published parameter
 * groups, the rest are in the proprietary B range (PDU format 0xFF,
 * broadcast) with invented group extensions and contents.
 *
 * Signal `byte` is the zero-based byte of the data field; multi-byte signals
 * give `startBit` and `length`, least significant byte first. Named values
 * are keyed by the raw value in decimal.
 */
import type { BusMessage } from '../../shared/harness/schema';

export const krT78BusMessages: BusMessage[] = [
  {
    id: '0CF00400',
    extended: true,
    sender: 'ECU',
    name: 'Engine speed and torque',
    meaning: 'Engine controller broadcast, every 10 ms. Priority 3, PGN 61444, source 0x00.',
    signals: [
      { name: 'Actual engine torque', byte: 2, scale: 1, offset: -125, unit: '%' },
      { name: 'Engine speed', startBit: 24, length: 16, scale: 0.125, offset: 0, unit: 'rpm', notes: 'About 2450 rpm at full throttle with no load on the demo machine.' },
    ],
  },
  {
    id: '18FEEE00',
    extended: true,
    sender: 'ECU',
    name: 'Engine temperature',
    meaning: 'Engine controller broadcast, every 1000 ms. Priority 6, PGN 65262, source 0x00.',
    signals: [{ name: 'Coolant temperature', byte: 0, scale: 1, offset: -40, unit: '°C' }],
  },
  {
    id: '0CFF1021',
    extended: true,
    sender: 'MCU',
    name: 'Auxiliary hydraulics command',
    meaning:
      'Machine control unit broadcast, every 20 ms: the left handle auxiliary roller as the control unit reads it (MCU.10) and the auxiliary mode. The attachment control unit of a fitted attachment follows byte 0. Priority 3, PGN 65296 (proprietary B), source 0x21.',
    signals: [
      {
        name: 'Auxiliary roller position',
        byte: 0,
        scale: 0.8,
        offset: -100,
        unit: '%',
        values: { '0': 'End, reverse (flow to the male coupler)', '125': 'Rest (centred)', '250': 'End, forward (flow to the female coupler)' },
        notes: 'Follows the roller: 125 (0x7D) at rest, 250 (0xFA) at the forward end, 0 at the reverse end.',
      },
      { name: 'Continuous flow latched', startBit: 8, length: 2, values: { '0': 'Off', '1': 'On, forward', '2': 'On, reverse', '3': 'Not available' } },
      { name: 'Attachment output A', startBit: 16, length: 2, values: { '0': 'Off', '1': 'On', '3': 'Not available' } },
      { name: 'Attachment output B', startBit: 18, length: 2, values: { '0': 'Off', '1': 'On', '3': 'Not available' } },
    ],
  },
  {
    id: '18FF1121',
    extended: true,
    sender: 'MCU',
    name: 'Machine status',
    meaning: 'Machine control unit broadcast, every 100 ms: interlocks and drive. Priority 6, PGN 65297 (proprietary B), source 0x21.',
    signals: [
      { name: 'Seat bar', startBit: 0, length: 2, values: { '0': 'Raised', '1': 'Lowered' } },
      { name: 'Hydraulic lockout', startBit: 2, length: 2, values: { '0': 'Locked', '1': 'Unlocked' } },
      { name: 'Park brake', startBit: 4, length: 2, values: { '0': 'Applied', '1': 'Released' } },
      { name: 'Two-speed', startBit: 6, length: 2, values: { '0': 'Low range', '1': 'High range' } },
      { name: 'System voltage', byte: 1, scale: 0.1, offset: 0, unit: 'V' },
      { name: 'Message counter', startBit: 56, length: 4, notes: 'Counts 0 to 15 and wraps; changes in every capture.' },
    ],
  },
  {
    id: '18FF1221',
    extended: true,
    sender: 'MCU',
    name: 'Right joystick position',
    meaning: 'Machine control unit broadcast, every 50 ms: the right joystick axes as read at MCU.11 and MCU.12. Priority 6, PGN 65298 (proprietary B), source 0x21.',
    signals: [
      { name: 'Joystick X (steer)', byte: 0, scale: 0.8, offset: -100, unit: '%', values: { '0': 'End, left', '125': 'Centred', '250': 'End, right' } },
      { name: 'Joystick Y (travel)', byte: 1, scale: 0.8, offset: -100, unit: '%', values: { '0': 'End, reverse', '125': 'Centred', '250': 'End, forward' } },
    ],
  },
  {
    id: '18FECA21',
    extended: true,
    sender: 'MCU',
    name: 'Active trouble codes, machine control unit',
    meaning: 'Every 1000 ms. Priority 6, PGN 65226, source 0x21. All zero lamps and no code when nothing is active.',
    signals: [{ name: 'Lamp status', byte: 0 }],
  },
  {
    id: '18FF3028',
    extended: true,
    sender: 'DSP',
    name: 'Display settings',
    meaning: 'Display broadcast, every 200 ms: operator settings. Priority 6, PGN 65328 (proprietary B), source 0x28.',
    signals: [
      { name: 'Auxiliary flow limit', byte: 0, scale: 1, offset: 0, unit: '%' },
      { name: 'Drive response', byte: 1, values: { '0': 'Gentle', '1': 'Normal', '2': 'Brisk' } },
      { name: 'Screen brightness', byte: 2, scale: 1, offset: 0, unit: '%' },
    ],
  },
  {
    id: '18FECA28',
    extended: true,
    sender: 'DSP',
    name: 'Active trouble codes, display',
    meaning: 'Every 1000 ms. Priority 6, PGN 65226, source 0x28.',
    signals: [{ name: 'Lamp status', byte: 0 }],
  },
];

/** Broadcast period of each message, in milliseconds (used by the capture generator). */
export const krT78MessagePeriodsMs: Record<string, number> = {
  '0CF00400': 10,
  '18FEEE00': 1000,
  '0CFF1021': 20,
  '18FF1121': 100,
  '18FF1221': 50,
  '18FECA21': 1000,
  '18FF3028': 200,
  '18FECA28': 1000,
};

/** The identifier and byte that follow the auxiliary roller (what comparing the two demo captures should find). */
export const auxiliaryControlSignal = { id: '0CFF1021', byte: 0, rest: 0x7d, forwardEnd: 0xfa, reverseEnd: 0x00 } as const;
