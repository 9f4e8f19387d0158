/**
 * The demo library of Tamarack Valley Equipment Repair: invented makers,
 * machine and attachment models, the shop's customers and their units, and
 * which demo harness document belongs to which model.
 *
 * Everything here is invented: makers, models, serial numbers, customers,
 * addresses (example domains, 555 numbers).
 */
import type { HarnessDocument } from '../shared/harness/schema';
import { demoHarnesses, krT78MainHarnessDraft, type DemoHarnessKey } from './harnesses/index';
import { withMessages } from './catalogue/index';

export const DEMO_SHOP_NAME = 'Tamarack Valley Equipment Repair';

export interface Maker {
  id: string;
  name: string;
  notes: string;
}

export type ModelKind = 'machine' | 'attachment';

export interface EquipmentModel {
  id: string;
  kind: ModelKind;
  makerId: string;
  /** The maker's model designation. */
  model: string;
  series: string;
  /** What it is, in the trade's words. */
  category: string;
  notes: string;
  /** Carrier models an attachment is set up for (empty for machines). */
  fitsModels: string[];
}

export interface HarnessLink {
  /** Key into `demoHarnesses`. */
  key: DemoHarnessKey;
  modelId: string;
  /** Published in the demo, or also carrying a draft in progress. */
  status: 'published' | 'published_with_draft';
  /** Short title for lists. */
  title: string;
}

export interface Customer {
  id: string;
  name: string;
  contactName: string;
  email: string;
  phone: string;
  town: string;
  notes: string;
}

export interface Unit {
  id: string;
  customerId: string;
  modelId: string;
  serialNumber: string;
  /** Hour meter (machines) or the attachment control unit's hour counter; null where the unit has none. */
  hours: number | null;
  year: number;
  notes: string;
}

export const makers: Maker[] = [
  {
    id: 'kestrel-ridge',
    name: 'Kestrel Ridge Machinery',
    notes: 'Compact track loaders and skid-steer loaders. Electrical service: 12 V, one bus (two-wire, 250 kbit/s) between engine controller, machine control unit and display, extended to the attachment plug.',
  },
  {
    id: 'ferrowood',
    name: 'Ferrowood Attachments',
    notes: 'Hydraulic attachments for compact loaders: forestry mulchers, grapples, auger drives. Attachments with a controller join the carrier bus through the 8-cavity attachment plug.',
  },
];

export const models: EquipmentModel[] = [
  {
    id: 'kr-t78',
    kind: 'machine',
    makerId: 'kestrel-ridge',
    model: 'KR-T78',
    series: 'K',
    category: 'Compact track loader',
    notes: 'Radial lift, 55 kW diesel, electro-hydraulic joystick controls, high-flow auxiliary option. Series K from serial KRT78K10001: 8-cavity attachment plug on the coupler plate, front bus terminator in the plug dust cap.',
    fitsModels: [],
  },
  {
    id: 'fw-m60',
    kind: 'attachment',
    makerId: 'ferrowood',
    model: 'FW-M60',
    series: '22',
    category: 'Forestry mulcher (drum, fixed teeth)',
    notes: 'Needs high-flow auxiliary. Attachment control unit on the carrier bus (source address 0x4A) drives the rotor enable, two-speed and push-bar valves; rotor supply pressure/temperature sensor. Brings its own bus terminator.',
    fitsModels: ['kr-t78'],
  },
  {
    id: 'fw-g72',
    kind: 'attachment',
    makerId: 'ferrowood',
    model: 'FW-G72',
    series: '15',
    category: 'Root grapple with independent tine',
    notes: 'Grapple cylinders on the auxiliary flow; the diverter solenoid (carrier attachment output A) selects the independent right-hand tine. LED work lamp. No controller: bus terminator moulded into the plug.',
    fitsModels: ['kr-t78'],
  },
  {
    id: 'fw-a12',
    kind: 'attachment',
    makerId: 'ferrowood',
    model: 'FW-A12',
    series: '19',
    category: 'Auger drive (planetary, 12 kN·m)',
    notes: 'Hydraulic only: no harness, no plug. Keep the attachment plug dust cap on while it is fitted.',
    fitsModels: ['kr-t78'],
  },
];

export const harnessLinks: HarnessLink[] = [
  { key: 'kr-t78-main', modelId: 'kr-t78', status: 'published_with_draft', title: 'Main harness and front attachment circuit' },
  { key: 'kr-t78-with-fw-m60', modelId: 'kr-t78', status: 'published', title: 'With FW-M60 mulcher fitted' },
  { key: 'kr-t78-with-fw-g72', modelId: 'kr-t78', status: 'published', title: 'With FW-G72 grapple fitted' },
  { key: 'fw-m60-mulcher', modelId: 'fw-m60', status: 'published', title: 'Mulcher attachment harness' },
  { key: 'fw-g72-grapple', modelId: 'fw-g72', status: 'published', title: 'Grapple attachment harness' },
];

/** The published document of a link. */
export function harnessDocument(key: DemoHarnessKey): HarnessDocument {
  return withMessages(demoHarnesses[key], key);
}

/** The draft in progress for the links whose status says so, else null. */
export function harnessDraft(key: DemoHarnessKey): HarnessDocument | null {
  return key === 'kr-t78-main' ? withMessages(krT78MainHarnessDraft, key) : null;
}

export const customers: Customer[] = [
  {
    id: 'birchline',
    name: 'Birchline Excavating Ltd.',
    contactName: 'Dana Okafor',
    email: 'dana.okafor@birchline.example.com',
    phone: '+1 555 0142',
    town: 'Cedar Flats',
    notes: 'Two KR-T78 loaders on site work; brings machines in on Fridays.',
  },
  {
    id: 'oxbow',
    name: 'Oxbow Land Clearing',
    contactName: 'Marek Lindqvist',
    email: 'marek@oxbow-clearing.example.net',
    phone: '+1 555 0178',
    town: 'Pinecrest Hollow',
    notes: 'Right-of-way clearing. Runs the FW-M60 mulcher on a KR-T78 most days of the season.',
  },
  {
    id: 'halvorsen',
    name: 'Halvorsen Tree & Stump',
    contactName: 'Ruth Halvorsen',
    email: 'ruth@halvorsen-tree.example.org',
    phone: '+1 555 0119',
    town: 'Tamarack Valley',
    notes: 'Grapple and auger work; pays on pickup.',
  },
];

export const units: Unit[] = [
  {
    id: 'u-krt78-10214',
    customerId: 'oxbow',
    modelId: 'kr-t78',
    serialNumber: 'KRT78K10214',
    hours: 2347.6,
    year: 2023,
    notes: 'High-flow auxiliary. Forestry guarding, cab door polycarbonate.',
  },
  {
    id: 'u-fwm60-2231',
    customerId: 'oxbow',
    modelId: 'fw-m60',
    serialNumber: 'FWM60-2231',
    hours: 1138.4,
    year: 2023,
    notes: 'Hours from the attachment control unit. Runs on KRT78K10214.',
  },
  {
    id: 'u-krt78-10388',
    customerId: 'birchline',
    modelId: 'kr-t78',
    serialNumber: 'KRT78K10388',
    hours: 811.9,
    year: 2025,
    notes: 'Standard flow. Backup alarm fitted at the factory.',
  },
  {
    id: 'u-krt78-10051',
    customerId: 'birchline',
    modelId: 'kr-t78',
    serialNumber: 'KRT78K10051',
    hours: 5612.3,
    year: 2021,
    notes: 'Rental return; lift-arm harness replaced once at 3900 h.',
  },
  {
    id: 'u-krt78-10297',
    customerId: 'halvorsen',
    modelId: 'kr-t78',
    serialNumber: 'KRT78K10297',
    hours: 1960.0,
    year: 2024,
    notes: 'Tracks replaced at 1800 h.',
  },
  {
    id: 'u-fwg72-1602',
    customerId: 'halvorsen',
    modelId: 'fw-g72',
    serialNumber: 'FWG72-1602',
    hours: null,
    year: 2024,
    notes: 'No hour counter.',
  },
  {
    id: 'u-fwa12-0877',
    customerId: 'halvorsen',
    modelId: 'fw-a12',
    serialNumber: 'FWA12-0877',
    hours: null,
    year: 2022,
    notes: 'With 300 mm and 450 mm bits.',
  },
];
