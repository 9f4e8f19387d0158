/**
 * Faults the demo data is built to show, each with the readings a tech
 * would take and the repair-order words (complaint, cause, correction).
 * Observation shapes follow the contract's `suspects(observations)`.
 */
import type { DemoHarnessKey } from './index';

export type DemoObservation =
  | { pin: string; state: string; volts: number | null }
  | { a: string; b: string; state: string; ohms: number | null }
  | { fuse: string; blowsOnInsert: true };

export interface DemoFault {
  id: string;
  harness: DemoHarnessKey;
  /** The fault as the engine names it. */
  fault: { kind: 'open' | 'short' | 'blown' | 'high' | 'missing'; ref: string; ohms?: number };
  complaint: string;
  observations: DemoObservation[];
  cause: string;
  correction: string;
}

/** The main walk-through: a chafe at clip CL7 on the lift arm. */
export const walkThroughFault: DemoFault = {
  id: 'cl7-chafe',
  harness: 'kr-t78-main',
  fault: { kind: 'short', ref: 'CL7' },
  complaint: 'Mulcher will not start. The attachment fuse F2 (15 A) blows the moment it is pushed in, with a snap, key off.',
  // In the order a tech takes them, halving the circuit as the suspects' next-unplug advice says:
  // the fuse alone points at X20; X20 apart the front side is still shorted, so X30 next; X30 apart the
  // lift-arm side of cavity 1 is shorted (CL7 or W27), and cavity 2 too: only the clip holds both.
  observations: [
    { fuse: 'F2', blowsOnInsert: true },
    { a: 'X20B.1', b: 'G3.G', state: 'key_off_x20_apart', ohms: 0.09 },
    { a: 'X30B.1', b: 'G3.G', state: 'key_off_x30_apart', ohms: 0.07 },
    { a: 'X30B.2', b: 'G3.G', state: 'key_off_x30_apart', ohms: 0.07 },
  ],
  cause: 'Attachment power pair W27/W28 chafed through to the lift arm at clip CL7, over the cross-tube edge.',
  correction: 'Repaired both wires with sealed splices, added a split loom and an edge guard at the cross-tube, re-clipped. F2 holds; mulcher powers up and reports on the bus.',
};

export const demoFaults: DemoFault[] = [
  walkThroughFault,
  {
    id: 'cap-lost',
    harness: 'kr-t78-main',
    fault: { kind: 'missing', ref: 'TR2' },
    complaint: 'Display shows bus warnings now and then with no attachment fitted.',
    observations: [
      { a: 'X10A.3', b: 'X10A.4', state: 'key_off', ohms: 120 },
      // X30 apart: the lift-arm side should read the cap's terminator; it reads open.
      { a: 'X30B.3', b: 'X30B.4', state: 'key_off_x30_apart', ohms: null },
    ],
    cause: 'Front end of the bus open: the suspects are the lift-arm bus wires and the dust cap terminator; the cap had been lost and a plain cap fitted.',
    correction: 'Fitted a new dust cap with terminator; CAN_H to CAN_L reads 60 ohms key off.',
  },
  {
    id: 'grapple-tine-chafe',
    harness: 'kr-t78-with-fw-g72',
    fault: { kind: 'short', ref: 'GCL1' },
    complaint: 'Grapple independent tine does not work; fuse F13 on the loader blows when the tine is selected, and the drive and lockout drop out.',
    observations: [
      { fuse: 'F13', blowsOnInsert: true },
      // Attachment plug apart: the grapple side of output A to the grapple frame, where the coil should read about 7.9 ohms.
      { a: 'XG1.6', b: 'GG1.G', state: 'key_off_unplugged', ohms: 0.08 },
    ],
    cause: 'Diverter solenoid lead chafed at the tine pivot hose guard clip GCL1.',
    correction: 'Replaced the lead section, rerouted it inside the hose guard.',
  },
  {
    id: 'mulcher-valve-open',
    harness: 'kr-t78-with-fw-m60',
    fault: { kind: 'open', ref: 'MW25' },
    complaint: 'Mulcher rotor will not engage; the display shows no rotor fault.',
    observations: [
      { pin: 'XM2A.1', state: 'running_rotor', volts: 0 },
      { pin: 'ACU.12', state: 'running_rotor', volts: 14.1 },
    ],
    cause: 'Rotor enable solenoid feed MW25 broken inside the loom at the valve block guard.',
    correction: 'Replaced the feed wire between the electrical box and XM2.',
  },
];
