/**
 * Request and response shapes of the harness API: library models, harnesses, revisions,
 * editing, engine queries and search. The server parses requests with these schemas; the
 * client's forms use the same ones. Harness documents themselves are checked by
 * `validateDocument` (shared/harness), not here.
 */
import { z } from 'zod';
import type { HarnessDiff } from '../harness/diff';

// ---------------------------------------------------------------- library

export const modelKinds = ['machine', 'attachment'] as const;
export const modelKindSchema = z.enum(modelKinds);
export type ModelKind = z.infer<typeof modelKindSchema>;

const shortText = (max: number) => z.string().trim().min(1, 'Enter a value').max(max);
const optionalText = (max: number) => z.string().trim().max(max).nullable().optional();

export const modelCreateSchema = z.strictObject({
  kind: modelKindSchema,
  maker: shortText(100),
  model: shortText(100),
  series: optionalText(100),
  notes: optionalText(4000),
});
export type ModelCreate = z.infer<typeof modelCreateSchema>;

export const modelUpdateSchema = modelCreateSchema.partial().refine((v) => Object.keys(v).length > 0, 'Change at least one field');
export type ModelUpdate = z.infer<typeof modelUpdateSchema>;

export const modelListQuerySchema = z.object({ kind: modelKindSchema.optional(), q: z.string().max(100).optional() });

export interface ModelSummary {
  id: string;
  kind: ModelKind;
  maker: string;
  model: string;
  series: string | null;
  notes: string | null;
  /** "Maker Model" (and series), as shown in lists. */
  displayName: string;
  harnessCount: number;
  createdAt: string;
  updatedAt: string;
}

// ---------------------------------------------------------------- harnesses and revisions

export const idParam = z.string().regex(/^[a-z2-7]{26}$/, 'Not a valid id');
export const idParamsSchema = z.object({ id: idParam });

export const importQuerySchema = z.object({ model: idParam.optional() });

export const harnessListQuerySchema = z.object({ model: idParam.optional(), q: z.string().max(200).optional() });

export const harnessUpdateSchema = z
  .strictObject({ name: shortText(200).optional(), modelId: idParam.nullable().optional() })
  .refine((v) => Object.keys(v).length > 0, 'Change at least one field');

export type RevisionStatus = 'draft' | 'published';

export interface PersonRef {
  id: string;
  name: string;
}

export interface RevisionSummary {
  id: string;
  harnessId: string;
  /** 1, 2, 3 … within the harness. */
  number: number;
  status: RevisionStatus;
  /** Optimistic-lock version: send it back with every save. */
  version: number;
  parentRevisionId: string | null;
  name: string;
  createdBy: PersonRef | null;
  createdAt: string;
  updatedBy: PersonRef | null;
  updatedAt: string;
  publishedBy: PersonRef | null;
  publishedAt: string | null;
  publishNote: string | null;
}

export interface HarnessSummary {
  id: string;
  name: string;
  modelId: string | null;
  modelName: string | null;
  modelKind: ModelKind | null;
  /** The latest published revision (what techs see), if any. */
  publishedRevisionId: string | null;
  publishedNumber: number | null;
  publishedAt: string | null;
  /** The draft in progress (leads and owners only; null for others). */
  draftRevisionId: string | null;
  createdAt: string;
  updatedAt: string;
}

export interface HarnessDetail {
  harness: HarnessSummary;
  /** Newest first; techs and writers get the published ones only. */
  revisions: RevisionSummary[];
}

export const positionSchema = z.strictObject({ x: z.number().finite(), y: z.number().finite() });
/** Drawing positions per component id. */
export const positionsSchema = z.record(z.string().regex(/^[A-Za-z0-9_-]{1,32}$/, 'Not a component id'), positionSchema);
export type Positions = z.infer<typeof positionsSchema>;

export const versionSchema = z.coerce.number().int().min(1);

export const documentPutSchema = z.object({ version: versionSchema, document: z.unknown(), positions: positionsSchema.optional() });
export const positionsPutSchema = z.strictObject({ version: versionSchema, positions: positionsSchema });
export const publishSchema = z.strictObject({ note: z.string().trim().max(4000).optional().default(''), version: versionSchema.optional() });
export const versionQuerySchema = z.object({ version: versionSchema });

/** An item of the document (component, wire, clamp, state, pin): checked by validateDocument. */
const item = z.record(z.string(), z.unknown());
export const componentCreateSchema = z.object({ version: versionSchema, component: item, position: positionSchema.optional() });
/** Fields to set; `null` removes an optional field. `id` and `kind` cannot change. */
export const itemPatchSchema = z.object({ version: versionSchema, changes: item });
export const pinCreateSchema = z.object({ version: versionSchema, pin: z.union([z.string(), item]) });
export const wireCreateSchema = z.object({ version: versionSchema, wire: item });
export const clampCreateSchema = z.object({ version: versionSchema, clamp: item });
export const stateCreateSchema = z.object({ version: versionSchema, state: item });

export interface RevisionView {
  revision: RevisionSummary;
  /** The harness document (harness-format.md). */
  document: Record<string, unknown>;
  positions: Positions;
}

/** What every save answers: the revision with its new version. */
export interface SaveResult {
  version: number;
  revision: RevisionSummary;
}

/** 409 `version_conflict` details. */
export interface VersionConflict {
  current: { version: number; updatedBy: PersonRef | null; updatedAt: string };
}

export interface DiffResult {
  from: RevisionSummary;
  to: RevisionSummary;
  diff: HarnessDiff;
}

// ---------------------------------------------------------------- engine

const pinRefText = z.string().min(3).max(49);
export const readingsQuerySchema = z.object({ state: z.string().min(1).max(64) });
export const ohmsQuerySchema = z.object({ a: pinRefText, b: pinRefText, state: z.string().min(1).max(64) });
export const walkQuerySchema = z.object({ from: pinRefText, to: pinRefText, state: z.string().min(1).max(64).optional() });

export const observationSchema = z.union([
  z.strictObject({ pin: pinRefText, state: z.string().min(1).max(64), volts: z.number().finite().nullable() }),
  z.strictObject({ a: pinRefText, b: pinRefText, state: z.string().min(1).max(64), ohms: z.number().finite().nonnegative().nullable() }),
  z.strictObject({ fuse: z.string().min(1).max(32), blowsOnInsert: z.boolean() }),
]);
export const suspectsBodySchema = z.object({ observations: z.array(observationSchema).min(1, 'Give at least one observation').max(500) });

export const faultKinds = ['open', 'short', 'blown', 'high', 'missing'] as const;
export const faultSchema = z.strictObject({
  kind: z.enum(faultKinds),
  ref: z.string().min(1).max(49),
  at: z.number().min(0).max(1).optional(),
  ohms: z.number().finite().nonnegative().optional(),
});
export const faultsBodySchema = z.object({ fault: faultSchema, state: z.string().min(1).max(64).optional() });

export interface PinReading {
  ref: string;
  volts: number | null;
}
export interface ReadingsResult {
  state: string;
  /** `unsettled` when the relay/module iteration did not settle in 20 rounds. */
  status: 'settled' | 'unsettled';
  pins: PinReading[];
}

// ---------------------------------------------------------------- search

export const searchQuerySchema = z.object({
  q: z.string().trim().min(1, 'Enter something to search for').max(100),
  limit: z.coerce.number().int().min(1).max(200).optional().default(50),
});

export interface SearchResult {
  kind: 'pin' | 'component' | 'wire';
  harnessId: string;
  harnessName: string;
  revisionId: string;
  revisionStatus: RevisionStatus;
  componentId: string;
  pinId?: string;
  label: string;
  circuit?: string;
  color?: string;
  function?: string;
  modelName?: string;
  /** Which field matched: `circuit`, `color`, `component`, `label`, `function`, `wire`. */
  matched: string;
}
