/**
 * Demo customers, units, procedures and repair orders of Tamarack Valley Equipment Repair.
 * All invented: people, companies, serial numbers, complaints, readings of hours.
 * Customers and units come from seeds/library.ts; the orders are built around the demo
 * harnesses' walk-through faults (seeds/harnesses/README.md).
 */
import { eq } from 'drizzle-orm';
import type { AppDeps } from '../server/deps';
import { newId } from '../server/db/ids';
import {
  customers as customerTable,
  orderProcedures,
  orderProcedureSteps,
  orderSettings,
  procedures,
  repairOrders,
  repairOrderUnits,
  timeEntries,
  units as unitTable,
} from '../server/db/schema/orders';
import { ensureSettings } from '../server/orders/settings';
import type { OrderStatus, TimeKind } from '../shared/api/orders';
import { customers, models, units } from './library';
import type { SeededShop } from './shop';

export interface SeededOrders {
  customerIds: Record<string, string>;
  unitIds: Record<string, string>;
  procedureIds: Record<string, string>;
  /** By demo key: the order's id and number. */
  orders: Record<string, { id: string; number: number }>;
}

const MANUAL_NOTE = 'Follow the manufacturer’s procedure in the service manual for this model and software level: it governs over these steps, which are the shop’s own reminder list.';

export const demoProcedures = [
  {
    key: 'throttle',
    title: 'Hand and foot throttle recalibration after controller reprogramming',
    notes: MANUAL_NOTE,
    steps: [
      'Open the service manual’s throttle calibration for this model and controller software; keep it at hand.',
      'Park on level ground, lower the attachment to the ground, set the parking brake, stop the engine.',
      'Key on, engine off: check the display shows no active throttle or sensor faults; clear stored ones and note them on the order.',
      'Enter the display’s service menu and start the throttle calibration.',
      'Hand throttle against the idle stop: confirm. Then against the full stop: confirm.',
      'Foot throttle released: confirm. Then pressed to the floor stop: confirm.',
      'Key off for at least 30 s so the controller stores the values; key on again.',
      'Sweep each throttle slowly: the display reading rises smoothly from 0 to 100 % with no jumps.',
      'Start the engine: check low idle and high idle against the manual’s figures and write them on the order.',
    ],
  },
  {
    key: 'joystick',
    title: 'Joystick calibration',
    notes: MANUAL_NOTE,
    steps: [
      'Open the service manual’s joystick calibration for this model and controller software.',
      'Lower the lift arms and attachment to the ground, stop the engine, relieve hydraulic pressure, keep people clear.',
      'Key on, engine off, seat bar down: enter the service menu and start the joystick calibration.',
      'Left joystick centred and released: confirm; then each end of travel as the display asks.',
      'Right joystick the same, including the auxiliary roller at rest and at both ends.',
      'Key off for at least 30 s; key on and check each axis reads 0 % centred and 100 % at the ends.',
      'Start the engine and run each function slowly in a clear area: no creep with the sticks released.',
    ],
  },
  {
    key: 'attachment-bus',
    title: 'Attachment bus check after fitting or replacing an attachment',
    notes: 'Key off for the resistance check; readings are expectations from the documented harness.',
    steps: [
      'Key off, attachment plug connected: CAN_H to CAN_L at the diagnostic connector reads about 60 Ω.',
      'Key on: each bus line reads near 2.5 V to ground.',
      'Display lists the attachment control unit; no bus faults stored.',
      'Run the attachment functions once and record any stored codes.',
    ],
  },
] as const;

interface DemoOrder {
  key: string;
  customer: string;
  units: string[];
  status: OrderStatus;
  daysAgo: number;
  complaint: string;
  cause?: string;
  correction?: string;
  labourNotes?: string;
  internalNotes?: string;
  customerNotes?: string;
  tech: 'tech' | 'lead' | null;
  time: { kind: TimeKind; minutes: number; by: 'tech' | 'lead'; daysAgo: number; note: string }[];
  procedures?: { key: (typeof demoProcedures)[number]['key']; ticked: number }[];
  /** Already mailed as stalled (so the demo does not send at start-up). */
  stalledNotified?: boolean;
}

export const demoOrders: DemoOrder[] = [
  {
    key: 'fuse-blows',
    customer: 'birchline',
    units: ['u-krt78-10051'],
    status: 'diagnosing',
    daysAgo: 3,
    complaint: 'Front attachment fuse blows the moment a new one goes in, even with the key off. Aux hydraulics and attachment plug dead.',
    internalNotes: 'Rental return. Ask before replacing the whole lift-arm harness: replaced once already at 3900 h.',
    tech: 'tech',
    time: [
      { kind: 'diagnosis', minutes: 150, by: 'tech', daysAgo: 2, note: 'Power and ground at the fuse box; F2 blows on insert.' },
      { kind: 'diagnosis', minutes: 165, by: 'tech', daysAgo: 1, note: 'Checked attachment plug and dust cap; still blowing.' },
    ],
    stalledNotified: true,
  },
  {
    key: 'mulcher-not-found',
    customer: 'oxbow',
    units: ['u-krt78-10214', 'u-fwm60-2231'],
    status: 'open',
    daysAgo: 0,
    complaint: 'Mulcher will not start. Display says the attachment is not found; it worked at the end of last week.',
    customerNotes: 'We will call before any repair over two hours of labour.',
    tech: 'tech',
    time: [],
    procedures: [{ key: 'attachment-bus', ticked: 0 }],
  },
  {
    key: 'throttle-after-update',
    customer: 'birchline',
    units: ['u-krt78-10388'],
    status: 'closed',
    daysAgo: 12,
    complaint: 'After the dealer’s controller software update the foot throttle does nothing past half travel.',
    cause: 'The machine controller was reprogrammed without recalibrating the hand and foot throttles; it still held the old end points.',
    correction: 'Ran the hand and foot throttle recalibration; checked low and high idle; no faults stored.',
    labourNotes: 'Low idle 1050 rpm, high idle 2480 rpm after calibration.',
    tech: 'tech',
    time: [
      { kind: 'diagnosis', minutes: 30, by: 'tech', daysAgo: 11, note: 'Read stored codes; throttle sweep stops at 52 %.' },
      { kind: 'repair', minutes: 45, by: 'tech', daysAgo: 11, note: 'Calibration and test run.' },
    ],
    procedures: [{ key: 'throttle', ticked: 9 }],
  },
  {
    key: 'grapple-lamp',
    customer: 'halvorsen',
    units: ['u-krt78-10297', 'u-fwg72-1602'],
    status: 'ready',
    daysAgo: 5,
    complaint: 'Work lamp on the grapple stays dark; the grapple itself opens and closes.',
    cause: 'Lamp connector on the grapple full of water, terminal corroded through.',
    correction: 'Cut back and spliced in a new sealed lamp connector, dielectric grease, tested on the loader.',
    customerNotes: 'Keep the lamp plug capped when the grapple is off the machine.',
    tech: 'lead',
    time: [
      { kind: 'diagnosis', minutes: 40, by: 'lead', daysAgo: 4, note: 'Lamp supply present at the plug; none at the lamp.' },
      { kind: 'repair', minutes: 55, by: 'lead', daysAgo: 4, note: 'New connector and splices.' },
    ],
  },
  {
    key: 'joystick-drift',
    customer: 'halvorsen',
    units: ['u-krt78-10297'],
    status: 'waiting_on_parts',
    daysAgo: 6,
    complaint: 'Right joystick creeps the auxiliary a little with the stick let go.',
    cause: 'Auxiliary roller on the right joystick reads 4 % at rest; calibration brings it back but it drifts again within a day.',
    labourNotes: 'Roller sensor on order.',
    tech: 'tech',
    time: [{ kind: 'diagnosis', minutes: 75, by: 'tech', daysAgo: 5, note: 'Calibrated, then checked the next morning: drifted again.' }],
    procedures: [{ key: 'joystick', ticked: 7 }],
  },
  {
    key: 'backup-alarm',
    customer: 'oxbow',
    units: ['u-krt78-10214'],
    status: 'open',
    daysAgo: 1,
    complaint: 'Backup alarm is very quiet.',
    tech: null,
    time: [],
  },
];

const daysAgo = (n: number, hour = 9) => {
  const d = new Date();
  d.setUTCDate(d.getUTCDate() - n);
  d.setUTCHours(hour, 15, 0, 0);
  return d;
};

export async function seedOrders(
  deps: Pick<AppDeps, 'db'>,
  shop: SeededShop,
  library: { modelIds: Record<string, string> },
): Promise<SeededOrders> {
  const { db } = deps;
  const shopId = shop.shopId;
  const out: SeededOrders = { customerIds: {}, unitIds: {}, procedureIds: {}, orders: {} };
  await db.transaction(async (tx) => {
    await ensureSettings(tx, shopId);
    await tx.update(orderSettings).set({ stalledDiagnosisHours: 4, stalledDays: 10, linkDays: 14 }).where(eq(orderSettings.shopId, shopId));
    for (const c of customers) {
      const id = newId();
      out.customerIds[c.id] = id;
      await tx.insert(customerTable).values({
        id,
        shopId,
        name: c.name,
        company: null,
        email: c.email,
        phone: c.phone,
        contacts: [{ name: c.contactName, role: null, email: c.email, phone: c.phone }],
        notes: `${c.town}. ${c.notes}`,
      });
    }
    for (const u of units) {
      const id = newId();
      out.unitIds[u.id] = id;
      const model = models.find((m) => m.id === u.modelId);
      await tx.insert(unitTable).values({
        id,
        shopId,
        customerId: out.customerIds[u.customerId],
        kind: model?.kind ?? 'machine',
        modelId: library.modelIds[u.modelId] ?? null,
        description: model ? `${model.model} (${u.year})` : null,
        serialNumber: u.serialNumber,
        hourMeter: u.hours,
        notes: u.notes,
      });
    }
    const lead = shop.users.lead;
    for (const p of demoProcedures) {
      const id = newId();
      out.procedureIds[p.key] = id;
      await tx.insert(procedures).values({ id, shopId, title: p.title, notes: p.notes, steps: [...p.steps], createdBy: lead.id, createdAt: daysAgo(40), updatedAt: daysAgo(40) });
    }
    let number = 1040;
    for (const o of demoOrders) {
      number += 1;
      const id = newId();
      out.orders[o.key] = { id, number };
      const opened = daysAgo(o.daysAgo, 8);
      await tx.insert(repairOrders).values({
        id,
        shopId,
        number,
        customerId: out.customerIds[o.customer],
        status: o.status,
        complaint: o.complaint,
        cause: o.cause ?? null,
        correction: o.correction ?? null,
        labourNotes: o.labourNotes ?? null,
        internalNotes: o.internalNotes ?? null,
        customerNotes: o.customerNotes ?? null,
        assignedTechId: o.tech ? shop.users[o.tech].id : null,
        openedBy: shop.users.writer.id,
        openedAt: opened,
        closedAt: o.status === 'closed' ? daysAgo(o.daysAgo - 1, 16) : null,
        stalledNotifiedAt: o.stalledNotified ? daysAgo(0, 7) : null,
        updatedAt: opened,
      });
      await tx.insert(repairOrderUnits).values(o.units.map((u, position) => ({ orderId: id, unitId: out.unitIds[u], shopId, position })));
      for (const t of o.time) {
        await tx.insert(timeEntries).values({
          id: newId(),
          shopId,
          orderId: id,
          techId: shop.users[t.by].id,
          kind: t.kind,
          minutes: t.minutes,
          workDate: daysAgo(t.daysAgo).toISOString().slice(0, 10),
          note: t.note,
          createdBy: shop.users[t.by].id,
          createdAt: daysAgo(t.daysAgo, 17),
        });
      }
      for (const p of o.procedures ?? []) {
        const template = demoProcedures.find((d) => d.key === p.key)!;
        const opId = newId();
        await tx.insert(orderProcedures).values({ id: opId, shopId, orderId: id, procedureId: out.procedureIds[p.key], title: template.title, notes: template.notes, attachedBy: lead.id, attachedAt: opened });
        await tx.insert(orderProcedureSteps).values(
          template.steps.map((text, position) => ({
            id: newId(),
            shopId,
            orderProcedureId: opId,
            position,
            text,
            doneBy: position < p.ticked ? shop.users.tech.id : null,
            doneAt: position < p.ticked ? new Date(opened.getTime() + (position + 2) * 6 * 60_000) : null,
          })),
        );
      }
    }
    await tx.update(orderSettings).set({ lastOrderNumber: number }).where(eq(orderSettings.shopId, shopId));
  });
  return out;
}
