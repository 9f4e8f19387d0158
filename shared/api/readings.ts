import { z } from 'zod';
import { componentIdPattern, pinRefPattern } from '../harness/schema';
import type { MarkedReading } from '../readings/mark';

const pinRef = z.string().trim().regex(pinRefPattern, 'Write a pin as COMPONENT.PIN, e.g. X12.3');
const componentId = z.string().trim().regex(componentIdPattern, 'Not a component id');
const stateId = z.string().trim().min(1).max(64);
const note = z.string().trim().max(500).optional();
/** A meter shows at most a few hundred volts here; anything else is a typing slip. */
const volts = z.number().finite().min(-100).max(100).nullable();
const ohms = z.number().finite().min(0).max(1e9).nullable();

export const observationSchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('volts'), pin: pinRef, state: stateId, volts, note }),
  z.strictObject({ kind: z.literal('ohms'), a: pinRef, b: pinRef, state: stateId, ohms, note }),
  z.strictObject({ kind: z.literal('fuse'), fuse: componentId, blowsOnInsert: z.boolean(), note }),
  // A catalogued bus message seen or not seen (identifier as candump writes it): marked with the checks it implies.
  z.strictObject({ kind: z.literal('message'), messageId: z.string().trim().regex(/^(0x)?([0-9A-Fa-f]{3}|[0-9A-Fa-f]{8})$/, 'Write the identifier as the capture does, e.g. 0CFF1021'), seen: z.boolean(), note }),
]);
export type ObservationInput = z.infer<typeof observationSchema>;

const observations = z.array(observationSchema).max(500, 'At most 500 readings in one set');

export const evaluateBodySchema = z.strictObject({ observations });

const id = z.string().trim().min(1).max(26);
const title = z.string().trim().max(200).optional();

export const readingSetCreateSchema = z.strictObject({
  revisionId: id,
  repairOrderId: id.optional(),
  unitId: id.optional(),
  title,
  observations,
});

export const readingSetUpdateSchema = z.strictObject({
  version: z.number().int().positive(),
  title,
  observations,
});

export const readingSetListQuerySchema = z.object({
  repairOrderId: id.optional(),
  revisionId: id.optional(),
  harnessId: id.optional(),
  mine: z.enum(['1', 'true']).optional(),
});

export const toleranceSchema = z
  .strictObject({
    below: z.number().finite().min(0).max(50),
    above: z.number().finite().min(0).max(50),
  })
  .refine((t) => t.below + t.above > 0, 'A band of zero width can never be met');

export const bookmarkOpenedSchema = z.strictObject({ harnessId: id, connectorId: componentId });
export const bookmarkPinnedSchema = z.strictObject({ harnessId: id, connectorId: componentId, pinned: z.boolean() });

export interface ConnectorBookmark {
  harnessId: string;
  harnessName: string;
  connectorId: string;
  label: string | null;
  openedAt: string | null;
  pinned: boolean;
}

/** A saved reading set as the reading-set routes answer it. */
export interface ReadingSet {
  id: string;
  revisionId: string;
  harnessId: string;
  harnessName: string;
  repairOrderId: string | null;
  unitId: string | null;
  title: string | null;
  version: number;
  takenBy: { id: string; name: string } | null;
  takenAt: string;
  updatedAt: string;
  readings: MarkedReading[];
  suspects: unknown[];
  nextUnplug: unknown;
}
