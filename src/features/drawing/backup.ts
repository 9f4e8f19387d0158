/**
 * The crash copy of a draft: written to this browser's storage while changes
 * wait for the server, removed once the server has them. An editor that
 * opens and finds one that differs from the draft offers it back.
 */
import type { HarnessDocument } from '@shared/harness';
import type { Positions } from '@shared/drawing/geometry';

export interface DraftBackup {
  doc: HarnessDocument;
  positions: Positions;
  /** When it was written (ms since the epoch). */
  at: number;
  /** The draft's version the copy was made on (absent in copies written before it was recorded). */
  version?: number;
}

export const backupKey = (revisionId: string) => `wirewalk.drawing.unsaved.${revisionId}`;

export function writeBackup(revisionId: string, backup: DraftBackup): void {
  try {
    localStorage.setItem(backupKey(revisionId), JSON.stringify(backup));
  } catch {
    /* storage full or blocked: the server copy still saves */
  }
}

export function removeBackup(revisionId: string): void {
  try {
    localStorage.removeItem(backupKey(revisionId));
  } catch {
    /* storage blocked */
  }
}

/**
 * The copy worth offering for this draft: null when there is none, when it
 * cannot be read, or when it holds nothing the draft does not (that copy is removed).
 * The copy may be a document with problems: it was never checked, that is why it was not saved.
 */
export function readBackup(revisionId: string, current: { doc: HarnessDocument; positions: Positions }): DraftBackup | null {
  let raw: string | null;
  try {
    raw = localStorage.getItem(backupKey(revisionId));
  } catch {
    return null;
  }
  if (!raw) return null;
  let parsed: unknown;
  try {
    parsed = JSON.parse(raw);
  } catch {
    return null;
  }
  const b = parsed as Partial<DraftBackup> | null;
  const doc = b?.doc as Partial<HarnessDocument> | undefined;
  if (!b || typeof b !== 'object' || !doc || !Array.isArray(doc.components) || !Array.isArray(doc.wires) || typeof b.at !== 'number') return null;
  const backup: DraftBackup = { doc: b.doc!, positions: b.positions && typeof b.positions === 'object' ? b.positions : {}, at: b.at, version: typeof b.version === 'number' ? b.version : undefined };
  if (JSON.stringify(backup.doc) === JSON.stringify(current.doc) && samePositions(backup.positions, current.positions)) {
    removeBackup(revisionId);
    return null;
  }
  return backup;
}

function samePositions(a: Positions, b: Positions): boolean {
  const ka = Object.keys(a);
  if (ka.length !== Object.keys(b).length) return false;
  return ka.every((k) => b[k] && a[k].x === b[k].x && a[k].y === b[k].y);
}

/** What the copy changes, in words: "3 components more, 2 wires fewer", "the same parts, placed differently" … */
export function backupDifference(backup: DraftBackup, current: HarnessDocument): string {
  const parts: string[] = [];
  const count = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
  const dc = backup.doc.components.length - current.components.length;
  const dw = backup.doc.wires.length - current.wires.length;
  if (dc) parts.push(`${count(Math.abs(dc), 'component', 'components')} ${dc > 0 ? 'more' : 'fewer'}`);
  if (dw) parts.push(`${count(Math.abs(dw), 'wire', 'wires')} ${dw > 0 ? 'more' : 'fewer'}`);
  if (parts.length) return parts.join(', ');
  return JSON.stringify(backup.doc) === JSON.stringify(current) ? 'the same parts, placed differently' : 'as many parts and wires, with changes';
}
