/**
 * Bus messages API: the catalogue of a harness revision (the document's
 * optional `messages` section, docs/harness-messages.md), uploaded candump
 * captures with their stored summaries, comparisons, and filing a finding.
 * Request schemas are shared by the server and the forms.
 */
import { z } from 'zod';
import { messageSchema, messageSignalSchema, type BusMessage } from '../harness/schema';
import { formatCanId, splitJ1939, j1939Label, type J1939Id } from '../standards/j1939';
import type { CaptureSummary } from '../can/candump';
import type { CaptureComparison } from '../can/compare';

const versionSchema = z.number().int().min(1);

/** Identifier key in a route or a catalogue: upper-case hex, no `0x`, 3 digits (11-bit) or 8 (29-bit). */
export function messageKey(m: Pick<BusMessage, 'id' | 'extended'>): string {
  const value = parseInt(m.id.replace(/^0x/i, ''), 16);
  return Number.isFinite(value) ? formatCanId(value, m.extended) : m.id.toUpperCase();
}

export const messageKeyPattern = /^([0-9A-Fa-f]{3}|[0-9A-Fa-f]{8})$/;

export const messageCreateSchema = z.strictObject({ version: versionSchema, message: messageSchema });
export const messagePutSchema = z.strictObject({ version: versionSchema, message: messageSchema });
export const signalCreateSchema = z.strictObject({ version: versionSchema, signal: messageSignalSchema });

/** File a finding from a comparison: the changed byte becomes a signal (on a new message when the identifier is not catalogued yet). */
export const findingSchema = z.strictObject({
  version: versionSchema,
  rest: z.string().min(1).max(26),
  moved: z.string().min(1).max(26),
  /** The identifier as the comparison writes it (`0CFF1021`, `123`). */
  key: z.string().regex(messageKeyPattern, 'Use the identifier as the capture writes it, e.g. 0CFF1021'),
  /** 0-based byte of the data. */
  index: z.number().int().min(0).max(63),
  name: z.string().trim().min(1).max(200).optional(),
  /** Sending module for a new message. */
  sender: z.string().regex(/^[A-Za-z0-9_-]{1,32}$/).optional(),
  notes: z.string().max(4000).optional(),
});
export type FindingInput = z.infer<typeof findingSchema>;

export const captureUploadFieldsSchema = z.strictObject({ name: z.string().trim().max(200).optional() });
export const compareQuerySchema = z.object({ revision: z.string().min(1).max(26).optional() });

/** A catalogue entry as the API answers it: the stored message plus its key and J1939 split. */
export interface MessageView {
  key: string;
  extended: boolean;
  /** SAE J1939-21 split of a 29-bit identifier; null for 11-bit. */
  j1939: J1939Id | null;
  /** "priority 6, PGN 65265 (0xFEF1), source 0x00"; null for 11-bit. */
  label: string | null;
  senderLabel: string | null;
  message: BusMessage;
}

export function messageView(m: BusMessage, senderLabel: string | null = null): MessageView {
  const key = messageKey(m);
  const j1939 = m.extended ? splitJ1939(parseInt(key, 16)) : null;
  return { key, extended: m.extended, j1939, label: j1939 ? j1939Label(j1939) : null, senderLabel, message: m };
}

export interface CatalogueResponse {
  revision: { id: string; status: 'draft' | 'published'; version: number; harnessId: string; number: number };
  messages: MessageView[];
  /** Modules of the document (possible senders). */
  modules: { id: string; label: string | null }[];
}

export interface CaptureRow {
  id: string;
  harnessId: string;
  revisionId: string | null;
  name: string;
  fileName: string;
  sizeBytes: number;
  lines: number;
  frames: number;
  badLineCount: number;
  identifierCount: number;
  durationS: number | null;
  uploadedBy: { id: string; name: string } | null;
  uploadedAt: string;
}

export interface CaptureDetail {
  capture: CaptureRow;
  summary: CaptureSummary;
}

export interface CompareResponse {
  rest: CaptureRow;
  moved: CaptureRow;
  comparison: CaptureComparison;
  /** With `?revision=`: keys of identifiers in that revision's catalogue, and `key:index` of bytes a signal already covers. */
  catalogued: { messages: string[]; bytes: string[] };
}

export interface FindingResponse {
  version: number;
  created: 'message' | 'signal';
  message: MessageView;
}

/** Bytes 0-based a signal covers (byte, or startBit/length rounded out to bytes). */
export function signalBytes(s: { byte?: number; startBit?: number; length?: number }): number[] {
  if (s.byte !== undefined) {
    const len = s.length ?? 8;
    const start = s.byte * 8 + (s.startBit !== undefined && s.startBit < 8 ? s.startBit : 0);
    const out: number[] = [];
    for (let b = Math.floor(start / 8); b <= Math.floor((start + len - 1) / 8); b++) out.push(b);
    return out;
  }
  if (s.startBit !== undefined && s.length !== undefined) {
    const out: number[] = [];
    for (let b = Math.floor(s.startBit / 8); b <= Math.floor((s.startBit + s.length - 1) / 8); b++) out.push(b);
    return out;
  }
  return [];
}
