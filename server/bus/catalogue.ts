/**
 * The bus message catalogue of a revision (the document's `messages` section) and findings
 * filed into it from a comparison of two captures. Every change goes through saveDraft, so
 * the version check, validation and the one transaction apply as for any draft edit.
 */
import { and, desc, eq } from 'drizzle-orm';
import type { BusMessage, BusSignal, HarnessDocument } from '../../shared/harness/schema';
import { messageKey, messageView, type CaptureRow, type FindingInput, type MessageView } from '../../shared/api/bus';
import type { CaptureSummary } from '../../shared/can/candump';
import { compareCaptures, type ByteChange } from '../../shared/can/compare';
import { splitJ1939, j1939Label } from '../../shared/standards/j1939';
import type { Db } from '../db/client';
import { users } from '../db/schema/auth';
import { captures } from '../db/schema/bus';
import { HttpError, notFound } from '../errors';
import { saveDraft, type Viewer } from '../harness/revisions';

type Obj = Record<string, unknown>;

export function messagesOf(doc: Obj): BusMessage[] {
  return Array.isArray(doc.messages) ? (doc.messages as BusMessage[]) : [];
}

export function modulesOf(doc: Obj): { id: string; label: string | null }[] {
  const comps = Array.isArray(doc.components) ? (doc.components as HarnessDocument['components']) : [];
  return comps.filter((c) => c.kind === 'module').map((c) => ({ id: c.id, label: c.label ?? null }));
}

export function views(doc: Obj): MessageView[] {
  const labels = new Map(modulesOf(doc).map((m) => [m.id, m.label]));
  return messagesOf(doc).map((m) => messageView(m, m.sender ? labels.get(m.sender) ?? m.sender : null));
}

/** Change the draft's messages under the version check; `change` may throw an HttpError (nothing is saved then). */
export async function editMessages(db: Db, viewer: Viewer, revisionId: string, version: number, change: (messages: BusMessage[], doc: Obj) => BusMessage[]) {
  let after: Obj = {};
  const revision = await saveDraft(db, viewer, revisionId, version, async (current) => {
    const { document } = await current();
    const next = change(structuredClone(messagesOf(document)), document);
    const doc: Obj = { ...document };
    if (next.length) doc.messages = next;
    else delete doc.messages;
    after = doc;
    return { document: doc };
  });
  return { revision, document: after };
}

export function indexOfKey(messages: BusMessage[], key: string): number {
  const k = key.toUpperCase();
  return messages.findIndex((m) => messageKey(m) === k);
}

// ---------------------------------------------------------------- captures

const captureColumns = {
  id: captures.id,
  harnessId: captures.harnessId,
  revisionId: captures.revisionId,
  name: captures.name,
  fileName: captures.fileName,
  sizeBytes: captures.sizeBytes,
  lines: captures.lines,
  frames: captures.frames,
  badLineCount: captures.badLineCount,
  identifierCount: captures.identifierCount,
  durationS: captures.durationS,
  uploadedById: captures.uploadedBy,
  uploadedByName: users.name,
  uploadedAt: captures.uploadedAt,
  storageKey: captures.storageKey,
};

type CaptureSelect = { [K in keyof typeof captureColumns]: unknown } & { uploadedAt: Date; uploadedById: string | null; uploadedByName: string | null };

export function toCaptureRow(r: CaptureSelect): CaptureRow {
  return {
    id: r.id as string,
    harnessId: r.harnessId as string,
    revisionId: (r.revisionId as string | null) ?? null,
    name: r.name as string,
    fileName: r.fileName as string,
    sizeBytes: Number(r.sizeBytes),
    lines: r.lines as number,
    frames: r.frames as number,
    badLineCount: r.badLineCount as number,
    identifierCount: r.identifierCount as number,
    durationS: (r.durationS as number | null) ?? null,
    uploadedBy: r.uploadedById ? { id: r.uploadedById, name: r.uploadedByName ?? '' } : null,
    uploadedAt: r.uploadedAt.toISOString(),
  };
}

export async function listCaptures(db: Db, shopId: string, harnessId: string): Promise<CaptureRow[]> {
  const rows = await db
    .select(captureColumns)
    .from(captures)
    .leftJoin(users, eq(users.id, captures.uploadedBy))
    .where(and(eq(captures.shopId, shopId), eq(captures.harnessId, harnessId)))
    .orderBy(desc(captures.uploadedAt))
    .limit(500);
  return rows.map(toCaptureRow);
}

export async function loadCapture(db: Db, shopId: string, id: string, withSummary = true): Promise<{ row: CaptureRow; storageKey: string; summary: CaptureSummary | null }> {
  const [r] = await db
    .select({ ...captureColumns, ...(withSummary ? { summary: captures.summary } : {}) })
    .from(captures)
    .leftJoin(users, eq(users.id, captures.uploadedBy))
    .where(and(eq(captures.id, id), eq(captures.shopId, shopId)))
    .limit(1);
  if (!r) throw notFound('The capture');
  return { row: toCaptureRow(r), storageKey: r.storageKey, summary: withSummary ? ((r as { summary?: unknown }).summary as CaptureSummary) : null };
}

// ---------------------------------------------------------------- findings

/** The signal a changed byte becomes: its byte, named values for what each capture showed, and how it was found. */
export function signalFromChange(change: ByteChange, rest: CaptureRow, moved: CaptureRow, input: Pick<FindingInput, 'name' | 'notes'>): BusSignal {
  const values: Record<string, string> = {};
  if (change.rest && change.rest.distinct === 1) values[String(change.rest.min)] = 'Rest';
  if (change.moved) {
    if (change.moved.distinct === 1) values[String(change.moved.min)] ??= 'Moved';
    else {
      values[String(change.moved.min)] ??= 'Moved, low end';
      values[String(change.moved.max)] ??= 'Moved, high end';
    }
  }
  const where = change.index <= 7 ? { byte: change.index } : { startBit: change.index * 8, length: 8 };
  const found = `Found comparing "${rest.name}" (rest) with "${moved.name}" (moved): ${change.sentence}.`;
  return {
    name: input.name ?? `Byte ${change.position} (found on the bus)`,
    ...where,
    ...(Object.keys(values).length ? { values } : {}),
    notes: input.notes ? `${input.notes}\n${found}` : found,
  };
}

export async function fileFinding(db: Db, viewer: Viewer, revisionId: string, input: FindingInput) {
  const [rest, moved] = await Promise.all([loadCapture(db, viewer.shopId, input.rest), loadCapture(db, viewer.shopId, input.moved)]);
  const comparison = compareCaptures(rest.summary!, moved.summary!);
  const key = input.key.toUpperCase();
  const change = comparison.changedBytes.find((c) => c.key === key && c.index === input.index);
  if (!change) throw new HttpError(404, 'change_not_found', `Byte ${input.index + 1} of ${key} did not change between these two captures.`);
  const signal = signalFromChange(change, rest.row, moved.row, input);
  let created: 'message' | 'signal' = 'signal';
  let filed: BusMessage | null = null;
  const { revision, document } = await editMessages(db, viewer, revisionId, input.version, (messages, doc) => {
    const at = indexOfKey(messages, key);
    if (at >= 0) {
      const m = messages[at];
      if ((m.signals ?? []).some((s) => s.name === signal.name)) {
        throw new HttpError(409, 'signal_exists', `${key} already has a signal named "${signal.name}". Give the finding another name.`);
      }
      m.signals = [...(m.signals ?? []), signal];
      filed = m;
      return messages;
    }
    created = 'message';
    const j = change.extended ? splitJ1939(change.id) : null;
    let sender = input.sender;
    if (!sender && j) {
      // Another catalogued message from the same source address names its sender.
      sender = messages.find((m) => m.extended && m.sender && (parseInt(messageKey(m), 16) & 0xff) === j.source)?.sender;
    }
    if (sender && !modulesOf(doc).some((x) => x.id === sender)) throw new HttpError(400, 'invalid_request', `No module "${sender}" in this harness.`);
    const m: BusMessage = {
      id: key,
      extended: change.extended,
      ...(sender ? { sender } : {}),
      name: `Found on the bus: ${key}`,
      ...(j ? { meaning: `SAE J1939-21 split: ${j1939Label(j)}.` } : {}),
      signals: [signal],
    };
    filed = m;
    return [...messages, m];
  });
  const view = views(document).find((v) => v.key === key) ?? messageView(filed!);
  return { version: revision.version, created, message: view };
}
