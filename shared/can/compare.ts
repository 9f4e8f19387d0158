/**
 * Compare two capture summaries: a control at rest, and the same control
 * moved. Answers the identifiers seen in only one capture, and for those in
 * both, the data bytes whose values changed, ranked by how clearly.
 *
 * A byte counts as changed when its set of distinct values differs between
 * the captures (this covers a shifted range, and a byte constant in one and
 * varying in the other), or when it is present in only one (length changed).
 *
 * Score (0–1, higher is clearer):
 *   score = separation × confidence
 *   separation = total variation distance between the two value
 *     distributions of the byte, ½ Σ_v |p_rest(v) − p_moved(v)|: 1 when no
 *     value is shared (0x00 at rest, 0x40 moved), near 0 when the two mostly
 *     agree and only a rare value differs (sensor flicker), 0 for a counter
 *     that runs through the same values in both. A byte present in only one
 *     capture has separation 1.
 *   confidence = m / (m + 2), m the fewer frames of the two sides: one frame
 *     each gives 1/3, ten give 0.83, a hundred 0.98; it keeps a change seen
 *     in a handful of frames below the same change seen in many.
 * Ties go to the larger move of the range midpoint, then identifier and byte.
 */

import { j1939Label, type J1939Id } from '../standards/j1939';
import type { ByteSummary, CaptureSummary, IdentifierSummary } from './candump';

export type ByteChangeKind =
  | 'constant-changed'
  | 'varies-when-moved'
  | 'constant-when-moved'
  | 'range-shifted'
  | 'values-differ'
  | 'absent-at-rest'
  | 'absent-when-moved';

export interface ByteSide {
  count: number;
  min: number;
  max: number;
  /** Number of distinct values. */
  distinct: number;
}

export interface ByteChange {
  key: string;
  id: number;
  extended: boolean;
  j1939: J1939Id | null;
  /** 0-based offset in the data. */
  index: number;
  /** 1-based byte number, as message documents count them; used in the sentence. */
  position: number;
  kind: ByteChangeKind;
  /** 0–1, see the file comment. */
  score: number;
  rest: ByteSide | null;
  moved: ByteSide | null;
  /** e.g. "byte 3: 0x00 at rest, 0x00–0xFA moved". */
  sentence: string;
}

export interface IdentifierSide {
  count: number;
  rateHz: number | null;
  length: number;
}

export interface IdentifierBrief extends IdentifierSide {
  key: string;
  id: number;
  extended: boolean;
  j1939: J1939Id | null;
}

export interface IdentifierChange {
  key: string;
  id: number;
  extended: boolean;
  j1939: J1939Id | null;
  rest: IdentifierSide;
  moved: IdentifierSide;
  /** The best score of its bytes. */
  score: number;
  /** Its changed bytes, best first. */
  changes: ByteChange[];
}

export interface CaptureComparison {
  onlyAtRest: IdentifierBrief[];
  onlyMoved: IdentifierBrief[];
  /** Identifiers in both with at least one changed byte, best first. */
  changed: IdentifierChange[];
  /** Every changed byte of every identifier, best first. */
  changedBytes: ByteChange[];
  /** Identifiers in both with no changed byte. */
  unchanged: IdentifierBrief[];
}

function hex2(v: number): string {
  return '0x' + v.toString(16).toUpperCase().padStart(2, '0');
}

function side(b: ByteSummary): ByteSide {
  return { count: b.count, min: b.min, max: b.max, distinct: b.distinct.length };
}

function describe(s: ByteSide | null, withCount: boolean): string {
  if (!s) return 'absent';
  if (s.distinct === 1) return hex2(s.min);
  return `${hex2(s.min)}–${hex2(s.max)}` + (withCount ? ` (${s.distinct} values)` : '');
}

function brief(x: IdentifierSummary): IdentifierBrief {
  return { key: x.key, id: x.id, extended: x.extended, j1939: x.j1939, count: x.count, rateHz: x.rateHz, length: x.length };
}

function idSide(x: IdentifierSummary): IdentifierSide {
  return { count: x.count, rateHz: x.rateHz, length: x.length };
}

function sameValues(a: ByteSummary, b: ByteSummary): boolean {
  if (a.distinct.length !== b.distinct.length) return false;
  for (let i = 0; i < a.distinct.length; i++) if (a.distinct[i].value !== b.distinct[i].value) return false;
  return true;
}

function separation(a: ByteSummary, b: ByteSummary): number {
  const pa = new Float64Array(256);
  if (a.count > 0) for (const d of a.distinct) pa[d.value & 0xff] += d.count / a.count;
  if (b.count > 0) for (const d of b.distinct) pa[d.value & 0xff] -= d.count / b.count;
  let sum = 0;
  for (let v = 0; v < 256; v++) sum += Math.abs(pa[v]);
  return Math.min(1, sum / 2);
}

function kindOf(r: ByteSide | null, m: ByteSide | null): ByteChangeKind {
  if (!r) return 'absent-at-rest';
  if (!m) return 'absent-when-moved';
  if (r.distinct === 1 && m.distinct === 1) return 'constant-changed';
  if (r.distinct === 1) return 'varies-when-moved';
  if (m.distinct === 1) return 'constant-when-moved';
  if (r.min !== m.min || r.max !== m.max) return 'range-shifted';
  return 'values-differ';
}

function midMove(r: ByteSide | null, m: ByteSide | null): number {
  if (!r || !m) return 0;
  return Math.abs((r.min + r.max) / 2 - (m.min + m.max) / 2);
}

function compareBytes(r: IdentifierSummary, m: IdentifierSummary): { change: ByteChange; tie: number }[] {
  const out: { change: ByteChange; tie: number }[] = [];
  const byIndex = new Map<number, [ByteSummary | undefined, ByteSummary | undefined]>();
  for (const b of r.bytes ?? []) byIndex.set(b.index, [b, undefined]);
  for (const b of m.bytes ?? []) {
    const e = byIndex.get(b.index);
    if (e) e[1] = b;
    else byIndex.set(b.index, [undefined, b]);
  }
  for (const [index, [rb, mb]] of [...byIndex].sort((x, y) => x[0] - y[0])) {
    if (rb && mb && sameValues(rb, mb)) continue;
    if ((rb && !(rb.distinct?.length > 0)) || (mb && !(mb.distinct?.length > 0))) continue; // malformed input
    const rs = rb ? side(rb) : null;
    const ms = mb ? side(mb) : null;
    const sep = rb && mb ? separation(rb, mb) : 1;
    const n = Math.min(rb ? rb.count : mb!.count, mb ? mb.count : rb!.count);
    const confidence = n / (n + 2);
    const kind = kindOf(rs, ms);
    const withCount = kind === 'values-differ';
    out.push({
      tie: midMove(rs, ms),
      change: {
        key: r.key,
        id: r.id,
        extended: r.extended,
        j1939: r.j1939,
        index,
        position: index + 1,
        kind,
        score: Math.round(sep * confidence * 1000) / 1000,
        rest: rs,
        moved: ms,
        sentence: `byte ${index + 1}: ${describe(rs, withCount)} at rest, ${describe(ms, withCount)} moved`,
      },
    });
  }
  return out;
}

function idOrder(a: { extended: boolean; id: number }, b: { extended: boolean; id: number }): number {
  return a.extended === b.extended ? a.id - b.id : a.extended ? 1 : -1;
}

export function compareCaptures(rest: CaptureSummary, moved: CaptureSummary): CaptureComparison {
  const restIds = Array.isArray(rest?.identifiers) ? rest.identifiers : [];
  const movedIds = Array.isArray(moved?.identifiers) ? moved.identifiers : [];
  const movedByKey = new Map(movedIds.map((x) => [x.key, x]));
  const restKeys = new Set(restIds.map((x) => x.key));

  const onlyAtRest: IdentifierBrief[] = [];
  const unchanged: IdentifierBrief[] = [];
  const changed: IdentifierChange[] = [];
  const all: { change: ByteChange; tie: number }[] = [];
  const rank = (x: { change: ByteChange; tie: number }, y: { change: ByteChange; tie: number }) =>
    y.change.score - x.change.score || y.tie - x.tie || idOrder(x.change, y.change) || x.change.index - y.change.index;

  for (const r of restIds) {
    const m = movedByKey.get(r.key);
    if (!m) {
      onlyAtRest.push(brief(r));
      continue;
    }
    const bytes = compareBytes(r, m).sort(rank);
    if (bytes.length === 0) {
      unchanged.push(brief(r));
      continue;
    }
    all.push(...bytes);
    changed.push({
      key: r.key, id: r.id, extended: r.extended, j1939: r.j1939,
      rest: idSide(r), moved: idSide(m),
      score: bytes[0].change.score,
      changes: bytes.map((b) => b.change),
    });
  }
  const onlyMoved = movedIds.filter((x) => !restKeys.has(x.key)).map(brief);
  all.sort(rank);
  changed.sort((a, b) => b.score - a.score || idOrder(a, b));
  onlyAtRest.sort(idOrder);
  onlyMoved.sort(idOrder);
  unchanged.sort(idOrder);
  return { onlyAtRest, onlyMoved, changed, changedBytes: all.map((x) => x.change), unchanged };
}

/**
 * A heading for an identifier: "18FEF100 · priority 6, PGN 65265 (0xFEF1), source 0x00"
 * for 29-bit ones, "2A1 · 11-bit" for base ones.
 */
export function identifierLabel(x: { key: string; extended: boolean; j1939: J1939Id | null }): string {
  if (x.extended && x.j1939) return `${x.key} · ${j1939Label(x.j1939)}`;
  return `${x.key} · ${x.extended ? '29-bit' : '11-bit'}`;
}
