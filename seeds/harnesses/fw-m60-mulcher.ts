/**
 * Ferrowood Attachments FW-M60 forestry mulcher: attachment harness.
 *
 * An invented attachment. The attachment control unit (ACU, source address
 * 0x4A) sits in the electrical box on the top frame, talks on the carrier's
 * bus through the attachment plug and drives the rotor valve solenoids. A
 * combined pressure/temperature sensor on the rotor motor supply line feeds
 * it. The mulcher terminates the bus at its end (MTR, in the ACU branch):
 * fitted to a KR-T78 it replaces the terminator in the plug's dust cap, so
 * the joined bus has exactly two.
 *
 * The document starts with the carrier stand-in (./carrier.ts) so its pin
 * cards read as on the machine.
 */
import type { HarnessDocument } from '../../shared/harness/schema';
import { cavities, wires } from './build';
import { carrierStandIn } from './carrier';

const carrier = carrierStandIn();

const plugCavities = cavities([
  'Constant power from carrier, ACU keep-alive (MF2 3 A)',
  'Switched power from carrier, ACU and valves (MF1 15 A)',
  'Ground from carrier',
  'Bus CAN_H',
  'Bus CAN_L',
  'Not used on this attachment (sealing plug)',
  'Not used on this attachment (sealing plug)',
  'Spare, sealing plug fitted',
]);

const valveCavities = [
  'Rotor enable solenoid MY1 feed',
  'Rotor enable solenoid MY1 return',
  'Rotor motor two-speed solenoid MY2 feed',
  'Rotor motor two-speed solenoid MY2 return',
  'Push-bar tilt solenoid MY3 feed',
  'Push-bar tilt solenoid MY3 return',
];

const sensorCavities = ['Sensor supply 5 V', 'Sensor return', 'Pressure signal', 'Temperature signal'];

export const fwM60MulcherHarness: HarnessDocument = {
  format: 'wirewalk-harness',
  version: 1,
  name: 'FW-M60 mulcher attachment harness',
  label: 'Ferrowood FW-M60 forestry mulcher, from serial FWM60-2207',
  notes:
    'Components whose id starts with CAR- (and X40) are a stand-in for the carrier side of the attachment plug (a KR-T78), so the pin cards read as on the machine. The mulcher brings its own bus terminator MTR: keep the loader dust cap off while it is fitted.',
  nominalVolts: 12,
  temperatureC: 20,
  components: [
    ...carrier.components,
    { id: 'XM1', kind: 'connector', label: 'Attachment plug, mulcher side (hose bracket, left)', matesWith: 'X40', contactOhms: 0.003, cavities: plugCavities },
    { id: 'MF1', kind: 'fuse', label: 'MF1 In-line fuse, ACU and valve supply (electrical box)', circuit: 'M102', amps: 15 },
    { id: 'MF2', kind: 'fuse', label: 'MF2 In-line fuse, ACU keep-alive (electrical box)', circuit: 'M101', amps: 3 },
    {
      id: 'ACU',
      kind: 'module',
      label: 'Attachment control unit (source address 0x4A), electrical box',
      pins: [
        { id: '1', role: 'supply', ohms: 55, function: 'Logic supply, switched (MF1)' },
        { id: '2', role: 'supply', ohms: 3300, function: 'Valve output supply, switched (MF1)' },
        { id: '3', role: 'input', ohms: 22000, function: 'Keep-alive feed, constant (MF2), hour counter memory' },
        { id: '4', role: 'ground', function: 'Power ground' },
        { id: '5', role: 'ground', function: 'Power ground' },
        { id: '6', role: 'can_h', function: 'Bus CAN_H' },
        { id: '7', role: 'can_l', function: 'Bus CAN_L' },
        { id: '8', role: 'ref5', function: 'Sensor supply 5 V' },
        { id: '9', role: 'ground', function: 'Sensor return' },
        { id: '10', role: 'input', function: 'Rotor supply pressure signal (0.5 V at 0 bar, 4.5 V at 400 bar)' },
        { id: '11', role: 'input', function: 'Rotor oil temperature signal (about 1.9 V at 20 °C)' },
        { id: '12', role: 'output', from: '2', onOhms: 0.02, function: 'Rotor enable solenoid MY1' },
        { id: '13', role: 'output', from: '2', onOhms: 0.02, function: 'Rotor motor two-speed solenoid MY2' },
        { id: '14', role: 'output', from: '2', onOhms: 0.02, function: 'Push-bar tilt solenoid MY3' },
      ],
    },
    {
      id: 'MS1',
      kind: 'module',
      label: 'Rotor supply pressure/temperature sensor, motor inlet block',
      poweredAboveVolts: 4,
      pins: [
        { id: '1', role: 'supply', ohms: 400, function: 'Sensor supply 5 V' },
        { id: '2', role: 'ground', function: 'Sensor return' },
        { id: '3', role: 'ref5', volts: 0.5, ohms: 100, function: 'Pressure signal, 0.5 V at 0 bar' },
        { id: '4', role: 'ref5', volts: 1.9, ohms: 100, function: 'Temperature signal, about 1.9 V at 20 °C' },
      ],
    },
    { id: 'MY1', kind: 'load', label: 'MY1 Rotor enable valve solenoid', ohms: 6.8 },
    { id: 'MY2', kind: 'load', label: 'MY2 Rotor motor two-speed solenoid', ohms: 8.2 },
    { id: 'MY3', kind: 'load', label: 'MY3 Push-bar tilt solenoid', ohms: 8.2 },
    { id: 'MTR', kind: 'resistor', label: 'Bus terminator, mulcher end (ACU branch, electrical box)', ohms: 120 },
    { id: 'MSP1', kind: 'splice', label: 'Switched supply splice, electrical box' },
    { id: 'MSP2', kind: 'splice', label: 'Ground splice, electrical box' },
    { id: 'MSPH', kind: 'splice', label: 'Bus CAN_H splice, electrical box' },
    { id: 'MSPL', kind: 'splice', label: 'Bus CAN_L splice, electrical box' },
    { id: 'MG1', kind: 'ground', label: 'Mulcher frame ground stud, electrical box', bondOhms: 0.01 },
    { id: 'XM2A', kind: 'connector', label: 'XM2 Valve block connector, harness side', matesWith: 'XM2B', contactOhms: 0.003, cavities: cavities(valveCavities) },
    { id: 'XM2B', kind: 'connector', label: 'XM2 Valve block connector, valve side', cavities: cavities(valveCavities) },
    { id: 'XM3A', kind: 'connector', label: 'XM3 Sensor connector, harness side', matesWith: 'XM3B', contactOhms: 0.003, cavities: cavities(sensorCavities) },
    { id: 'XM3B', kind: 'connector', label: 'XM3 Sensor connector, sensor pigtail', cavities: cavities(sensorCavities) },
  ],
  wires: [
    ...carrier.wires,
    ...wires([
      ['MW1', 'XM1.1', 'MF2.1', 'RD/WH', 1.0, 3.2, 'M101', 'Constant power to keep-alive fuse'],
      ['MW2', 'MF2.2', 'ACU.3', 'RD/WH', 0.5, 0.3, 'M101', 'ACU keep-alive'],
      ['MW3', 'XM1.2', 'MF1.1', 'RD/GN', 4, 3.2, 'M102', 'Switched power to ACU fuse'],
      ['MW4', 'MF1.2', 'MSP1.S', 'RD/GN', 4, 0.2, 'M102', 'ACU fuse to supply splice'],
      ['MW5', 'MSP1.S', 'ACU.1', 'RD/GN', 1.0, 0.3, 'M102', 'ACU logic supply'],
      ['MW6', 'MSP1.S', 'ACU.2', 'RD/GN', 2.5, 0.3, 'M102', 'ACU valve output supply'],
      ['MW7', 'XM1.3', 'MSP2.S', 'BK', 2.5, 3.2, 'M900', 'Ground from carrier to ground splice'],
      ['MW8', 'MSP2.S', 'MG1.G', 'BK', 2.5, 0.3, 'M900', 'Ground splice to frame stud'],
      ['MW9', 'ACU.4', 'MSP2.S', 'BK', 1.5, 0.3, 'M900', 'ACU power ground'],
      ['MW10', 'ACU.5', 'MSP2.S', 'BK', 1.5, 0.3, 'M900', 'ACU power ground'],
      ['MW11', 'XM1.4', 'MSPH.S', 'YE', 0.5, 3.4, 'M601', 'Bus CAN_H, plug to electrical box'],
      ['MW12', 'MSPH.S', 'ACU.6', 'YE', 0.5, 0.3, 'M601', 'Bus CAN_H, ACU'],
      ['MW13', 'MSPH.S', 'MTR.1', 'YE', 0.5, 0.15, 'M601', 'Bus CAN_H, terminator'],
      ['MW14', 'XM1.5', 'MSPL.S', 'GN', 0.5, 3.4, 'M602', 'Bus CAN_L, plug to electrical box'],
      ['MW15', 'MSPL.S', 'ACU.7', 'GN', 0.5, 0.3, 'M602', 'Bus CAN_L, ACU'],
      ['MW16', 'MSPL.S', 'MTR.2', 'GN', 0.5, 0.15, 'M602', 'Bus CAN_L, terminator'],
      ['MW17', 'ACU.8', 'XM3A.1', 'OG', 0.5, 1.8, 'M160', 'Sensor supply 5 V'],
      ['MW18', 'ACU.9', 'XM3A.2', 'BK/WH', 0.5, 1.8, 'M161', 'Sensor return'],
      ['MW19', 'XM3A.3', 'ACU.10', 'VT', 0.5, 1.8, 'M162', 'Pressure signal'],
      ['MW20', 'XM3A.4', 'ACU.11', 'VT/WH', 0.5, 1.8, 'M163', 'Temperature signal'],
      ['MW21', 'XM3B.1', 'MS1.1', 'OG', 0.5, 0.2, 'M160', 'Sensor pigtail, supply'],
      ['MW22', 'XM3B.2', 'MS1.2', 'BK/WH', 0.5, 0.2, 'M161', 'Sensor pigtail, return'],
      ['MW23', 'MS1.3', 'XM3B.3', 'VT', 0.5, 0.2, 'M162', 'Sensor pigtail, pressure'],
      ['MW24', 'MS1.4', 'XM3B.4', 'VT/WH', 0.5, 0.2, 'M163', 'Sensor pigtail, temperature'],
      ['MW25', 'ACU.12', 'XM2A.1', 'BU', 1.5, 2.2, 'M201', 'Rotor enable solenoid feed'],
      ['MW26', 'XM2A.2', 'MSP2.S', 'BK', 1.0, 2.2, 'M900', 'Rotor enable solenoid return'],
      ['MW27', 'ACU.13', 'XM2A.3', 'BU/WH', 1.5, 2.2, 'M202', 'Two-speed solenoid feed'],
      ['MW28', 'XM2A.4', 'MSP2.S', 'BK', 1.0, 2.2, 'M900', 'Two-speed solenoid return'],
      ['MW29', 'ACU.14', 'XM2A.5', 'BU/YE', 1.5, 2.2, 'M203', 'Push-bar tilt solenoid feed'],
      ['MW30', 'XM2A.6', 'MSP2.S', 'BK', 1.0, 2.2, 'M900', 'Push-bar tilt solenoid return'],
      ['MW31', 'XM2B.1', 'MY1.1', 'BU', 1.5, 0.4, 'M201', 'Valve pigtail, MY1 feed'],
      ['MW32', 'MY1.2', 'XM2B.2', 'BK', 1.0, 0.4, 'M900', 'Valve pigtail, MY1 return'],
      ['MW33', 'XM2B.3', 'MY2.1', 'BU/WH', 1.5, 0.4, 'M202', 'Valve pigtail, MY2 feed'],
      ['MW34', 'MY2.2', 'XM2B.4', 'BK', 1.0, 0.4, 'M900', 'Valve pigtail, MY2 return'],
      ['MW35', 'XM2B.5', 'MY3.1', 'BU/YE', 1.5, 0.4, 'M203', 'Valve pigtail, MY3 feed'],
      ['MW36', 'MY3.2', 'XM2B.6', 'BK', 1.0, 0.4, 'M900', 'Valve pigtail, MY3 return'],
    ]),
  ],
  clamps: [
    { id: 'MCL1', label: 'Push frame, hose bracket clip', wires: ['MW1', 'MW3', 'MW7', 'MW11', 'MW14'], at: 0.4 },
    { id: 'MCL2', label: 'Valve block guard, lower edge', wires: ['MW25', 'MW26', 'MW27', 'MW28', 'MW29', 'MW30'], at: 0.85 },
    { id: 'MCL3', label: 'Electrical box entry gland, sensor lead', wires: ['MW17', 'MW18', 'MW19', 'MW20'], at: 0.1 },
  ],
  states: [
    { id: 'key_off', label: 'Carrier key off', switches: { 'CAR-K3': 'open' }, sources: {}, outputs: [], unplugged: [] },
    { id: 'key_on', label: 'Carrier key on, engine off', switches: { 'CAR-K3': 'closed' }, sources: {}, outputs: [], unplugged: [] },
    { id: 'running', label: 'Carrier engine running, rotor off', switches: { 'CAR-K3': 'closed' }, sources: { 'CAR-BATT': 14.2 }, outputs: [], unplugged: [] },
    {
      id: 'running_rotor',
      label: 'Carrier running, rotor on (auxiliary flow forward)',
      switches: { 'CAR-K3': 'closed' },
      sources: { 'CAR-BATT': 14.2 },
      outputs: ['ACU.12'],
      unplugged: [],
    },
    {
      id: 'running_rotor_high',
      label: 'Carrier running, rotor on, motor in high-torque range',
      switches: { 'CAR-K3': 'closed' },
      sources: { 'CAR-BATT': 14.2 },
      outputs: ['ACU.12', 'ACU.13'],
      unplugged: [],
    },
    {
      id: 'key_off_unplugged',
      label: 'Key off, attachment plug apart',
      switches: { 'CAR-K3': 'open' },
      sources: {},
      outputs: [],
      unplugged: ['XM1'],
      notes: 'Mulcher side on its own: CAN_H to CAN_L at XM1 reads the mulcher terminator, about 120 ohms.',
    },
  ],
};
