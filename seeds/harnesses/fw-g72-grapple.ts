/**
 * Ferrowood Attachments FW-G72 root grapple: attachment harness.
 *
 * An invented attachment. The grapple's cylinders run on the carrier's
 * auxiliary flow; a diverter solenoid GY1, fed by the carrier's attachment
 * output A, switches the flow from the grapple cylinders to the independent
 * right-hand tine. An LED work lamp runs on switched power. There is no
 * controller on the grapple: its plug half carries a bus terminator (GTR)
 * across CAN_H and CAN_L so that the carrier's bus stays terminated at the
 * front with the dust cap off.
 *
 * The document starts with the carrier stand-in (./carrier.ts).
 */
import type { HarnessDocument } from '../../shared/harness/schema';
import { cavities, wires } from './build';
import { carrierStandIn } from './carrier';

const carrier = carrierStandIn({ outputA: true, constant: false });

export const fwG72GrappleHarness: HarnessDocument = {
  format: 'wirewalk-harness',
  version: 1,
  name: 'FW-G72 root grapple harness',
  label: 'Ferrowood FW-G72 root grapple, from serial FWG72-1580',
  notes:
    'Components whose id starts with CAR- (and X40) are a stand-in for the carrier side of the attachment plug (a KR-T78). The grapple plug carries the front bus terminator GTR.',
  nominalVolts: 12,
  temperatureC: 20,
  components: [
    ...carrier.components,
    {
      id: 'XG1',
      kind: 'connector',
      label: 'Attachment plug, grapple side (top link bracket)',
      matesWith: 'X40',
      contactOhms: 0.003,
      cavities: cavities([
        'Not used on this attachment (sealing plug)',
        'Switched power from carrier, work lamp (GF1 5 A)',
        'Ground from carrier',
        'Bus terminator GTR, CAN_H side (no controller on the grapple)',
        'Bus terminator GTR, CAN_L side (no controller on the grapple)',
        'Diverter solenoid GY1 feed (carrier attachment output A)',
        'Not used on this attachment (sealing plug)',
        'Spare, sealing plug fitted',
      ]),
    },
    { id: 'GTR', kind: 'resistor', label: 'Bus terminator moulded into the grapple plug', ohms: 120 },
    { id: 'GF1', kind: 'fuse', label: 'GF1 In-line fuse, work lamp', circuit: 'G120', amps: 5 },
    { id: 'GY1', kind: 'load', label: 'GY1 Independent-tine diverter solenoid', ohms: 7.8 },
    { id: 'GLP1', kind: 'load', label: 'Grapple LED work lamp, top frame', watts: 12 },
    { id: 'GSP1', kind: 'splice', label: 'Ground splice, behind the top link bracket' },
    { id: 'GG1', kind: 'ground', label: 'Grapple frame ground stud, top link bracket', bondOhms: 0.01 },
    { id: 'XG2A', kind: 'connector', label: 'XG2 Diverter solenoid connector, harness side', matesWith: 'XG2B', contactOhms: 0.003, cavities: cavities(['Solenoid feed', 'Solenoid return']) },
    { id: 'XG2B', kind: 'connector', label: 'XG2 Diverter solenoid connector, coil side', cavities: cavities(['Solenoid feed', 'Solenoid return']) },
  ],
  wires: [
    ...carrier.wires,
    ...wires([
      ['GW1', 'XG1.4', 'GTR.1', 'YE', 0.5, 0.03, 'G601', 'Inside the plug, CAN_H to terminator'],
      ['GW2', 'XG1.5', 'GTR.2', 'GN', 0.5, 0.03, 'G602', 'Inside the plug, CAN_L to terminator'],
      ['GW3', 'XG1.2', 'GF1.1', 'RD/GN', 1.0, 0.6, 'G121', 'Switched power to lamp fuse'],
      ['GW4', 'GF1.2', 'GLP1.1', 'RD/GN', 1.0, 1.9, 'G121', 'Work lamp feed'],
      ['GW5', 'GLP1.2', 'GSP1.S', 'BK', 1.0, 1.9, 'G900', 'Work lamp ground'],
      ['GW6', 'XG1.3', 'GSP1.S', 'BK', 1.5, 0.6, 'G900', 'Ground from carrier to ground splice'],
      ['GW7', 'GSP1.S', 'GG1.G', 'BK', 1.5, 0.2, 'G900', 'Ground splice to frame stud'],
      ['GW8', 'XG1.6', 'XG2A.1', 'BU/WH', 1.5, 2.1, 'G125', 'Diverter solenoid feed'],
      ['GW9', 'XG2A.2', 'GSP1.S', 'BK', 1.0, 2.1, 'G900', 'Diverter solenoid return'],
      ['GW10', 'XG2B.1', 'GY1.1', 'BU/WH', 1.5, 0.3, 'G125', 'Coil pigtail, feed'],
      ['GW11', 'GY1.2', 'XG2B.2', 'BK', 1.0, 0.3, 'G900', 'Coil pigtail, return'],
    ]),
  ],
  clamps: [
    { id: 'GCL1', label: 'Right-hand tine pivot, hose guard clip', wires: ['GW8', 'GW9'], at: 0.7, notes: 'The lead flexes here every time the tine opens; check for chafe.' },
    { id: 'GCL2', label: 'Top frame cross-member clip', wires: ['GW4', 'GW5'], at: 0.5 },
  ],
  states: [
    { id: 'key_off', label: 'Carrier key off', switches: { 'CAR-K3': 'open', 'CAR-OUTA': 'off' }, sources: {}, outputs: [], unplugged: [] },
    { id: 'key_on', label: 'Carrier key on, engine off (work lamp on)', switches: { 'CAR-K3': 'closed', 'CAR-OUTA': 'off' }, sources: {}, outputs: [], unplugged: [] },
    { id: 'running', label: 'Carrier engine running', switches: { 'CAR-K3': 'closed', 'CAR-OUTA': 'off' }, sources: { 'CAR-BATT': 14.2 }, outputs: [], unplugged: [] },
    {
      id: 'running_tine',
      label: 'Carrier running, independent tine selected (attachment output A on)',
      switches: { 'CAR-K3': 'closed', 'CAR-OUTA': 'on' },
      sources: { 'CAR-BATT': 14.2 },
      outputs: [],
      unplugged: [],
    },
    {
      id: 'key_off_unplugged',
      label: 'Key off, attachment plug apart',
      switches: { 'CAR-K3': 'open', 'CAR-OUTA': 'off' },
      sources: {},
      outputs: [],
      unplugged: ['XG1'],
      notes: 'Grapple side on its own: XG1.6 to the frame reads the diverter coil, about 7.9 ohms; XG1.4 to XG1.5 the plug terminator, 120 ohms.',
    },
  ],
};
