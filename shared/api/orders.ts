import { z } from 'zod';

/**
 * Customers, units, repair orders and everything attached to them: the request schemas the
 * server validates with and the forms use, and the shapes the API answers.
 */

// ---------------------------------------------------------------------------------------------
// Words

/** The order's status through the job, in the order a job usually goes. */
export const orderStatuses = ['open', 'diagnosing', 'waiting_on_parts', 'ready', 'closed'] as const;
export type OrderStatus = (typeof orderStatuses)[number];
export const orderStatusLabels: Record<OrderStatus, string> = {
  open: 'Open',
  diagnosing: 'Diagnosing',
  waiting_on_parts: 'Waiting on parts',
  ready: 'Ready',
  closed: 'Closed',
};

export const timeKinds = ['diagnosis', 'repair', 'other'] as const;
export type TimeKind = (typeof timeKinds)[number];
export const timeKindLabels: Record<TimeKind, string> = { diagnosis: 'Diagnosis', repair: 'Repair', other: 'Other' };

export const unitKinds = ['machine', 'attachment'] as const;
export type UnitKind = (typeof unitKinds)[number];

export const markerKinds = ['fault', 'note'] as const;
export type MarkerKind = (typeof markerKinds)[number];

// ---------------------------------------------------------------------------------------------
// Small pieces

const id = z.string().regex(/^[a-z2-7]{26}$/, 'Not a valid id');
const text = (max: number) => z.string().trim().max(max, `Use at most ${max} characters`);
const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `Use at most ${max} characters`)
    .nullish()
    .transform((v) => (v ? v : null));
const email = z.string().trim().toLowerCase().email('Enter an e-mail address like name@company.com').max(254);
const version = z.number({ error: 'Send the version you loaded' }).int().min(1);

export const idParam = z.object({ id });
export const contactSchema = z.object({
  name: text(100).min(1, 'Enter the contact’s name'),
  role: optionalText(60),
  email: email.nullish().transform((v) => v ?? null),
  phone: optionalText(40),
});
export type Contact = z.infer<typeof contactSchema>;

// ---------------------------------------------------------------------------------------------
// Customers

const customerFields = {
  name: text(120).min(1, 'Enter the customer’s name'),
  company: optionalText(120),
  /** Where the report goes unless the sender picks another address. */
  email: email.nullish().transform((v) => v ?? null),
  phone: optionalText(40),
  contacts: z.array(contactSchema).max(20, 'At most 20 contacts'),
  notes: optionalText(4000),
};
export const customerCreateSchema = z.object({ ...customerFields, contacts: customerFields.contacts.default([]) });
export type CustomerCreate = z.input<typeof customerCreateSchema>;
/** Only the fields sent change (no defaults here). */
export const customerUpdateSchema = z.object(customerFields).partial().extend({ version });
export type CustomerUpdate = z.input<typeof customerUpdateSchema>;

export const customerListQuery = z.object({
  q: z.string().trim().max(100).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});

export interface Customer {
  id: string;
  name: string;
  company: string | null;
  email: string | null;
  phone: string | null;
  contacts: Contact[];
  notes: string | null;
  version: number;
  createdAt: string;
  updatedAt: string;
}

// ---------------------------------------------------------------------------------------------
// Units

const unitFields = {
  kind: z.enum(unitKinds),
  /** A model of the shop's library (GET /api/models), when it is there. */
  modelId: id.nullish().transform((v) => v ?? null),
  /** Maker and model in words, when the model is not in the library. */
  description: optionalText(200),
  serialNumber: text(60).min(1, 'Enter the serial number'),
  hourMeter: z.number().min(0, 'Hours cannot be negative').max(1_000_000).nullish().transform((v) => v ?? null),
  notes: optionalText(4000),
};
export const unitCreateSchema = z.object({ ...unitFields, customerId: id, kind: unitFields.kind.default('machine') });
export type UnitCreate = z.input<typeof unitCreateSchema>;
export const unitUpdateSchema = z.object(unitFields).partial().extend({ version });
export type UnitUpdate = z.input<typeof unitUpdateSchema>;
export const unitListQuery = z.object({
  customerId: id.optional(),
  q: z.string().trim().max(100).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(50),
});

export interface Unit {
  id: string;
  customerId: string;
  customerName?: string;
  kind: UnitKind;
  modelId: string | null;
  /** "Maker Model" from the library, or the description. */
  modelName: string | null;
  description: string | null;
  serialNumber: string;
  hourMeter: number | null;
  notes: string | null;
  version: number;
  createdAt: string;
  updatedAt: string;
}

// ---------------------------------------------------------------------------------------------
// Repair orders

export const orderCreateSchema = z.object({
  customerId: id,
  unitIds: z.array(id).min(1, 'Pick at least one unit').max(10, 'At most 10 units on one order'),
  complaint: text(4000).min(1, 'Write down the complaint in the customer’s words'),
  assignedTechId: id.nullish().transform((v) => v ?? null),
  /** The unit's hour meter as the machine came in (updates the unit when higher). */
  hourMeter: z.number().min(0).max(1_000_000).nullish().transform((v) => v ?? null),
  customerNotes: optionalText(4000),
  internalNotes: optionalText(4000),
});
export type OrderCreate = z.input<typeof orderCreateSchema>;

/** Fields a technician on the order may change. */
export const techOrderFields = ['status', 'cause', 'correction', 'labourNotes', 'internalNotes'] as const;

export const orderUpdateSchema = z.object({
  version,
  status: z.enum(orderStatuses).optional(),
  customerId: id.optional(),
  unitIds: z.array(id).min(1, 'Pick at least one unit').max(10).optional(),
  complaint: text(4000).min(1, 'The complaint cannot be empty').optional(),
  cause: optionalText(4000).optional(),
  correction: optionalText(4000).optional(),
  labourNotes: optionalText(8000).optional(),
  internalNotes: optionalText(8000).optional(),
  customerNotes: optionalText(4000).optional(),
  assignedTechId: id.nullish(),
});
export type OrderUpdate = z.input<typeof orderUpdateSchema>;

export const orderSorts = ['number', 'openedAt', 'updatedAt', 'status', 'customer'] as const;
export const orderListQuery = z.object({
  status: z
    .union([z.enum(orderStatuses), z.array(z.enum(orderStatuses))])
    .optional()
    .transform((v) => (v === undefined ? undefined : Array.isArray(v) ? v : [v])),
  /** `techId=me` means the signed-in member; `techId=none` the unassigned. */
  techId: z.union([id, z.literal('me'), z.literal('none')]).optional(),
  customerId: id.optional(),
  /** Opened on or after / on or before (YYYY-MM-DD, UTC). */
  from: z.iso.date('Use a date like 2026-03-01').optional(),
  to: z.iso.date('Use a date like 2026-03-31').optional(),
  stalled: z.enum(['1', 'true']).optional(),
  q: z.string().trim().max(100).optional(),
  sort: z.enum(orderSorts).default('number'),
  dir: z.enum(['asc', 'desc']).default('desc'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});
export type OrderListQuery = z.input<typeof orderListQuery>;

export interface PersonRef {
  id: string;
  name: string;
}

export interface OrderListItem {
  id: string;
  number: number;
  status: OrderStatus;
  customer: { id: string; name: string; company: string | null };
  units: { id: string; serialNumber: string; modelName: string | null }[];
  complaint: string;
  assignedTech: PersonRef | null;
  openedAt: string;
  updatedAt: string;
  diagnosisMinutes: number;
  totalMinutes: number;
  /** Past the shop's diagnosis limit and not yet ready or closed. */
  stalled: boolean;
  version: number;
}

export interface OrderList {
  orders: OrderListItem[];
  total: number;
  page: number;
  pageSize: number;
  settings: OrderSettings;
}

export interface TimeEntry {
  id: string;
  tech: PersonRef;
  kind: TimeKind;
  minutes: number;
  workDate: string;
  note: string | null;
  createdAt: string;
}

export interface ProcedureStepState {
  id: string;
  position: number;
  text: string;
  doneBy: PersonRef | null;
  doneAt: string | null;
}

export interface OrderProcedure {
  id: string;
  procedureId: string | null;
  title: string;
  notes: string | null;
  attachedBy: PersonRef | null;
  attachedAt: string;
  steps: ProcedureStepState[];
}

export interface Attachment {
  id: string;
  kind: 'photo' | 'file';
  filename: string;
  contentType: string;
  size: number;
  width: number | null;
  height: number | null;
  caption: string | null;
  inReport: boolean;
  uploadedBy: PersonRef | null;
  createdAt: string;
  url: string;
  thumbUrl: string | null;
}

export interface ReportSend {
  id: string;
  sentBy: PersonRef | null;
  sentAt: string;
  to: string;
  subject: string;
  filename: string;
  bytes: number;
  linkId: string | null;
}

export interface CustomerLinkInfo {
  id: string;
  createdBy: PersonRef | null;
  createdAt: string;
  expiresAt: string;
  revokedAt: string | null;
  lastOpenedAt: string | null;
  /** Only in the answer that created it: the link itself is not stored. */
  url?: string;
}

export interface OrderDetail extends Omit<OrderListItem, 'units'> {
  customer: Customer;
  units: Unit[];
  cause: string | null;
  correction: string | null;
  labourNotes: string | null;
  internalNotes: string | null;
  customerNotes: string | null;
  openedBy: PersonRef | null;
  closedAt: string | null;
  stalledNotifiedAt: string | null;
  timeEntries: TimeEntry[];
  procedures: OrderProcedure[];
  drawings: MarkupSummary[];
  attachments: Attachment[];
  sends: ReportSend[];
  links: CustomerLinkInfo[];
  /** What the signed-in member may do on this order. */
  can: { edit: boolean; editFindings: boolean; send: boolean; assign: boolean };
}

// ---------------------------------------------------------------------------------------------
// Time entries and the stalled-order setting

export const timeEntryCreateSchema = z.object({
  /** Lead and owner may log time for another member; a tech logs their own. */
  techId: id.optional(),
  kind: z.enum(timeKinds),
  minutes: z.number().int('Whole minutes').min(1, 'At least one minute').max(24 * 60, 'At most 24 hours in one entry'),
  workDate: z.iso.date('Use a date like 2026-03-01').optional(),
  note: optionalText(1000),
});
export type TimeEntryCreate = z.input<typeof timeEntryCreateSchema>;

export const orderSettingsSchema = z.object({
  /** Diagnosis hours after which an order still open or diagnosing counts as stalled. */
  stalledDiagnosisHours: z.number().min(0.5, 'At least half an hour').max(200),
  /** Or days since it was opened, whichever comes first; null to leave days out. */
  stalledDays: z.number().int().min(1).max(365).nullable(),
  /** How long a customer link stays open. */
  linkDays: z.number().int().min(1).max(90),
});
export type OrderSettings = z.infer<typeof orderSettingsSchema>;
export const defaultOrderSettings: OrderSettings = { stalledDiagnosisHours: 4, stalledDays: null, linkDays: 14 };

// ---------------------------------------------------------------------------------------------
// Procedures

export const procedureSchema = z.object({
  title: text(200).min(1, 'Give the procedure a title'),
  notes: optionalText(4000),
  steps: z
    .array(text(1000).min(1, 'A step cannot be empty'))
    .min(1, 'Write at least one step')
    .max(60, 'At most 60 steps'),
});
export type ProcedureInput = z.input<typeof procedureSchema>;
export const procedureUpdateSchema = procedureSchema.extend({ version });

export interface Procedure {
  id: string;
  title: string;
  notes: string | null;
  steps: string[];
  version: number;
  createdBy: PersonRef | null;
  updatedAt: string;
}

export const attachProcedureSchema = z.object({ procedureId: id });
export const tickStepSchema = z.object({ done: z.boolean() });

// ---------------------------------------------------------------------------------------------
// Marked-up drawings

const finite = z.number().refine(Number.isFinite, 'Must be a number').refine((n) => Math.abs(n) < 1e7, 'Out of range');
export const viewportSchema = z.object({
  x: finite,
  y: finite,
  width: finite.refine((n) => n > 0, 'Width must be above 0'),
  height: finite.refine((n) => n > 0, 'Height must be above 0'),
});
export type Viewport = z.infer<typeof viewportSchema>;

export const highlightSchema = z.object({
  /** Component ids of the document (`X12`). */
  components: z.array(z.string().max(32)).max(500).default([]),
  /** Wire ids of the document (`W101`). */
  wires: z.array(z.string().max(32)).max(2000).default([]),
  /** Pin references (`X12.3`). */
  pins: z.array(z.string().max(50)).max(2000).default([]),
  /** The walk as the tech walked it: from and to pin references. */
  from: z.string().max(50).nullish(),
  to: z.string().max(50).nullish(),
});
export type Highlight = z.infer<typeof highlightSchema>;

export const markerInputSchema = z.object({
  kind: z.enum(markerKinds),
  /** Drawing coordinates; left out, the server puts the marker on its target. */
  x: finite.optional(),
  y: finite.optional(),
  text: text(200).min(1, 'A marker needs a short note'),
  /** What it points at: a component, wire or pin reference of the document. */
  target: z.string().max(50).nullish().transform((v) => v ?? null),
});
export type MarkerInput = z.input<typeof markerInputSchema>;
export interface Marker {
  kind: MarkerKind;
  x: number;
  y: number;
  text: string;
  target: string | null;
}
export const markerSchema = markerInputSchema;

const markupFields = {
  title: text(200).min(1, 'Give the drawing a title'),
  viewport: viewportSchema.nullish().transform((v) => v ?? null),
  highlight: highlightSchema,
  markers: z.array(markerSchema).max(50, 'At most 50 markers'),
  notes: optionalText(2000),
  inReport: z.boolean(),
};
export const markupCreateSchema = z.object({
  ...markupFields,
  revisionId: id,
  highlight: highlightSchema.default({ components: [], wires: [], pins: [] }),
  markers: markupFields.markers.default([]),
  inReport: z.boolean().default(true),
});
export type MarkupCreate = z.input<typeof markupCreateSchema>;
export const markupUpdateSchema = z.object(markupFields).partial().extend({ version });
export type MarkupUpdate = z.input<typeof markupUpdateSchema>;

export interface MarkupSummary {
  id: string;
  revisionId: string;
  harnessName: string;
  revisionNumber: number | null;
  title: string;
  notes: string | null;
  markers: Marker[];
  highlight: Highlight;
  viewport: Viewport | null;
  inReport: boolean;
  version: number;
  createdBy: PersonRef | null;
  createdAt: string;
  svgUrl: string;
  pngUrl: string;
}

// ---------------------------------------------------------------------------------------------
// Attachments, report, links

export const attachmentUpdateSchema = z.object({
  caption: optionalText(300).optional(),
  inReport: z.boolean().optional(),
});

export const reportSendSchema = z.object({
  /** Defaults to the customer's e-mail. */
  to: email.optional(),
  message: optionalText(4000),
  /** Put a customer link (read-only view) in the mail. */
  includeLink: z.boolean().default(true),
});
export type ReportSendInput = z.input<typeof reportSendSchema>;

export const linkCreateSchema = z.object({ days: z.number().int().min(1).max(90).optional() });

/** The read-only view a customer link opens: customer-visible fields only. */
export interface PublicReport {
  shopName: string;
  number: number;
  status: OrderStatus;
  customer: { name: string; company: string | null };
  units: { serialNumber: string; modelName: string | null; hourMeter: number | null }[];
  complaint: string;
  cause: string | null;
  correction: string | null;
  customerNotes: string | null;
  openedAt: string;
  drawings: { id: string; title: string; notes: string | null; markers: Marker[]; pngUrl: string }[];
  photos: { id: string; caption: string | null; url: string; width: number | null; height: number | null }[];
  readingSets: ReadingSetView[];
  cautions: { title: string; text: string }[];
  expiresAt: string;
  pdfUrl: string;
}

/** Reading sets as the readings API answers them, as much as the order needs. */
export interface ReadingSetView {
  id: string;
  revisionId: string;
  takenBy: string | PersonRef | null;
  takenAt: string;
  readings: ReadingView[];
  suspects: SuspectView[];
}
export interface ReadingView {
  pin?: string;
  at?: string;
  state?: string;
  quantity?: string;
  kind?: string;
  value?: number | null;
  unit?: string;
  expected?: unknown;
  inRange?: boolean | null;
  [key: string]: unknown;
}
export interface SuspectView {
  label?: string;
  description?: string;
  kind?: string;
  score?: number;
  [key: string]: unknown;
}

// ---------------------------------------------------------------------------------------------
// Readings in words (the PDF, the order page and the customer view say them the same way)

const n3 = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? String(Math.round(v * 1000) / 1000) : null);

/** Where the reading was taken: a pin, two pins, a fuse, a bus message. */
export function readingPointText(r: ReadingView): string {
  if (typeof r.pin === 'string') return r.pin;
  if (typeof r.a === 'string' && typeof r.b === 'string') return `${r.a} ↔ ${r.b}`;
  if (typeof r.fuse === 'string') return `Fuse ${r.fuse}`;
  if (typeof r.messageId === 'string') return `Message ${r.messageId}`;
  const other = [r.at, r.point, r.label].find((v) => typeof v === 'string' && v);
  return (other as string | undefined) ?? '—';
}

export function readingMeasuredText(r: ReadingView): string {
  if (typeof r.volts === 'number') return `${n3(r.volts)} V`;
  if (typeof r.ohms === 'number') return `${n3(r.ohms)} Ω`;
  if (typeof r.blowsOnInsert === 'boolean') return r.blowsOnInsert ? 'blows on insert' : 'holds';
  if (typeof r.seen === 'boolean') return r.seen ? 'seen' : 'not seen';
  const v = n3(r.value ?? r.measured);
  return v === null ? '—' : `${v} ${typeof r.unit === 'string' ? r.unit : ''}`.trim();
}

export function readingExpectedText(r: ReadingView): string {
  const e = r.expected;
  if (e === null || e === undefined) return '—';
  if (typeof e === 'string') return e;
  if (typeof e === 'number') return String(n3(e));
  const o = e as Record<string, unknown>;
  if (typeof o.text === 'string' && o.text) return o.text;
  const u = typeof o.unit === 'string' ? ` ${o.unit}` : '';
  if (typeof o.min === 'number' && typeof o.max === 'number') return `${n3(o.min)}–${n3(o.max)}${u}`;
  if (typeof o.value === 'number') return `${n3(o.value)}${typeof o.tolerance === 'number' ? ` ± ${n3(o.tolerance)}` : ''}${u}`;
  return '—';
}

export function readingStateText(r: ReadingView): string {
  return typeof r.state === 'string' ? r.state.replace(/_/g, ' ') : '—';
}

const faultWords: Record<string, string> = {
  open: 'Open circuit in',
  short: 'Short to ground at',
  blown: 'Blown fuse',
  high: 'High resistance at',
  missing: 'Missing',
};

/** A suspect (`{ fault: { kind, ref, at? }, score }`) in words. */
export function suspectText(s: SuspectView): string {
  const fault = (s.fault ?? null) as { kind?: string; ref?: string; at?: number } | null;
  if (fault && typeof fault.ref === 'string') {
    const words = faultWords[fault.kind ?? ''] ?? fault.kind ?? 'Fault at';
    const at = typeof fault.at === 'number' && fault.kind === 'short' ? ` (${Math.round(fault.at * 100)} % along)` : '';
    return `${words} ${fault.ref}${at}`;
  }
  const label = [s.label, s.description, s.title].find((v) => typeof v === 'string' && v) as string | undefined;
  return label ?? 'Suspect';
}
