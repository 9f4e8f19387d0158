/**
 * SocketCAN `candump -l` log lines and an incremental capture summary.
 *
 * A log line is `(seconds.micros) interface frame`, for example
 * `(1700000000.123456) can0 18FEF100#FFFFFF3C00FFFFFF`. The frame is
 *   - `III#data`       11-bit identifier (3 hex digits), classic data frame
 *   - `IIIIIIII#data`  29-bit identifier (8 hex digits)
 *   - data: 0–8 bytes as hex pairs, optionally separated by `.`; an optional
 *     `_D` suffix (raw DLC 9–F on an 8-byte frame) is accepted and ignored
 *   - `I#R` or `I#R5`: remote frame, optionally with its requested length
 *   - `I##Fdata`: CAN FD frame, `F` one hex digit of FD flags, then 0–64 data
 *     bytes (a valid FD length). CAN FD frames are parsed, not refused.
 * An optional trailing direction token (`R` or `T`) after the frame is allowed.
 * Blank lines and lines starting with `#` (notes added by people) are skipped;
 * everything else that does not fit is a bad line with a reason. Nothing
 * here throws.
 */

import { formatCanId, splitJ1939, type J1939Id } from '../standards/j1939';

export interface CanFrame {
  /** Seconds since the epoch, as logged. */
  time: number;
  iface: string;
  id: number;
  extended: boolean;
  remote: boolean;
  fd: boolean;
  /** CAN FD flags nibble (0 for classic frames). */
  fdFlags: number;
  /** Data length in bytes; for a remote frame, the requested length. */
  length: number;
  /** Data bytes; empty for a remote frame. */
  data: number[];
}

export type CandumpLine =
  | { kind: 'frame'; lineNo: number; frame: CanFrame }
  | { kind: 'blank'; lineNo: number }
  | { kind: 'comment'; lineNo: number }
  | { kind: 'bad'; lineNo: number; reason: string; text: string };

export interface BadLine {
  lineNo: number;
  reason: string;
  /** The start of the line as read (at most 80 characters). */
  text: string;
}

/** Longest line accepted; the longest CAN FD line with separators is about 260 characters. */
export const MAX_LINE_LENGTH = 512;
const MAX_IFACE_LENGTH = 64;
const BAD_TEXT_LENGTH = 80;
const FD_LENGTHS = new Set([0, 1, 2, 3, 4, 5, 6, 7, 8, 12, 16, 20, 24, 32, 48, 64]);

// ---------------------------------------------------------------------------
// Line parser (writes into a reusable scratch frame so the summariser does
// not allocate per line)

interface Scratch {
  time: number;
  ifaceStart: number;
  ifaceEnd: number;
  id: number;
  extended: boolean;
  remote: boolean;
  fd: boolean;
  fdFlags: number;
  length: number;
  data: Uint8Array;
}

function newScratch(): Scratch {
  return { time: 0, ifaceStart: 0, ifaceEnd: 0, id: 0, extended: false, remote: false, fd: false, fdFlags: 0, length: 0, data: new Uint8Array(64) };
}

const enum Kind { Frame, Blank, Comment, Bad }

function hexVal(c: number): number {
  if (c >= 48 && c <= 57) return c - 48; // 0-9
  if (c >= 65 && c <= 70) return c - 55; // A-F
  if (c >= 97 && c <= 102) return c - 87; // a-f
  return -1;
}

function isSpace(c: number): boolean {
  return c === 32 || c === 9 || c === 13 || c === 11 || c === 12;
}

let lastReason = '';

function bad(reason: string): Kind {
  lastReason = reason;
  return Kind.Bad;
}

/** Parse one line (without its `\n`) into `f`; answers the kind, with `lastReason` set for bad lines. */
function parseInto(s: string, f: Scratch): Kind {
  let end = s.length;
  if (end > MAX_LINE_LENGTH) return bad(`line longer than ${MAX_LINE_LENGTH} characters`);
  while (end > 0 && isSpace(s.charCodeAt(end - 1))) end--;
  let i = 0;
  while (i < end && isSpace(s.charCodeAt(i))) i++;
  if (i === end) return Kind.Blank;
  if (s.charCodeAt(i) === 35 /* # */) return Kind.Comment;

  // (timestamp)
  if (s.charCodeAt(i) !== 40 /* ( */) return bad('expected a timestamp in parentheses at the start');
  i++;
  const tStart = i;
  let digitsBefore = 0;
  while (i < end && s.charCodeAt(i) >= 48 && s.charCodeAt(i) <= 57) { i++; digitsBefore++; }
  if (i < end && s.charCodeAt(i) === 46 /* . */) {
    i++;
    while (i < end && s.charCodeAt(i) >= 48 && s.charCodeAt(i) <= 57) i++;
  }
  if (i >= end || s.charCodeAt(i) !== 41 /* ) */) {
    return s.indexOf(')', tStart) < 0 ? bad('timestamp has no closing parenthesis') : bad('timestamp is not a number of seconds');
  }
  if (digitsBefore === 0) return bad('timestamp is not a number of seconds');
  f.time = Number(s.slice(tStart, i));
  i++;

  // interface
  if (i >= end || !isSpace(s.charCodeAt(i))) return bad(i >= end ? 'missing interface and frame after the timestamp' : 'expected a space after the timestamp');
  while (i < end && isSpace(s.charCodeAt(i))) i++;
  const ifStart = i;
  while (i < end && !isSpace(s.charCodeAt(i))) i++;
  if (i >= end) return bad(s.indexOf('#', ifStart) >= 0 ? 'missing interface name' : 'missing frame after the interface');
  if (i - ifStart > MAX_IFACE_LENGTH) return bad('interface name too long');
  f.ifaceStart = ifStart;
  f.ifaceEnd = i;
  while (i < end && isSpace(s.charCodeAt(i))) i++;

  // frame token
  const frStart = i;
  while (i < end && !isSpace(s.charCodeAt(i))) i++;
  const frEnd = i;
  while (i < end && isSpace(s.charCodeAt(i))) i++;
  if (i < end) {
    // One trailing direction letter is allowed (R received, T transmitted).
    const c = s.charCodeAt(i);
    if (!(i + 1 === end && (c === 82 || c === 84))) return bad('unexpected text after the frame');
  }

  // identifier
  let j = frStart;
  let id = 0;
  while (j < frEnd && s.charCodeAt(j) !== 35 /* # */) {
    const v = hexVal(s.charCodeAt(j));
    if (v < 0) return bad('identifier is not hexadecimal');
    id = id * 16 + v;
    j++;
  }
  if (j >= frEnd) return bad("frame has no '#' between identifier and data");
  const idLen = j - frStart;
  if (idLen === 3) {
    if (id > 0x7ff) return bad('11-bit identifier above 7FF');
    f.extended = false;
  } else if (idLen === 8) {
    if (id > 0x1fffffff) {
      return bad(id >= 0x20000000 && id < 0x40000000 ? 'error frame (error flag set in the identifier), not a data frame' : 'identifier beyond 29 bits');
    }
    f.extended = true;
  } else {
    return bad('identifier must be 3 hex digits (11-bit) or 8 (29-bit)');
  }
  f.id = id;
  j++; // past '#'
  f.remote = false;
  f.fd = false;
  f.fdFlags = 0;

  let maxBytes = 8;
  if (j < frEnd && s.charCodeAt(j) === 35) {
    // CAN FD: '##' then a flags nibble
    j++;
    if (j < frEnd && s.charCodeAt(j) === 35) return bad('CAN XL frames are not supported');
    if (j >= frEnd) return bad('CAN FD frame has no flags digit');
    const fl = hexVal(s.charCodeAt(j));
    if (fl < 0) return bad('CAN FD flags digit is not hexadecimal');
    f.fd = true;
    f.fdFlags = fl;
    maxBytes = 64;
    j++;
  } else if (j < frEnd && (s.charCodeAt(j) === 82 || s.charCodeAt(j) === 114) /* R r */) {
    j++;
    let len = 0;
    if (j < frEnd) {
      const c = s.charCodeAt(j);
      if (c < 48 || c > 56 || j + 1 !== frEnd) return bad('remote frame length must be one digit 0–8');
      len = c - 48;
      j++;
    }
    f.remote = true;
    f.length = len;
    return Kind.Frame;
  }

  // data bytes, optionally separated by '.'
  let n = 0;
  const data = f.data;
  while (j < frEnd) {
    const c = s.charCodeAt(j);
    if (c === 46 /* . */) {
      if (n === 0 || s.charCodeAt(j - 1) === 46) return bad("misplaced '.' in the data");
      j++;
      continue;
    }
    if (c === 95 /* _ */) break;
    const hi = hexVal(c);
    if (hi < 0) return bad('data is not hexadecimal');
    if (j + 1 >= frEnd) return bad('data has an odd number of hex digits');
    const lo = hexVal(s.charCodeAt(j + 1));
    if (lo < 0) return bad(s.charCodeAt(j + 1) === 46 || s.charCodeAt(j + 1) === 95 ? 'data has an odd number of hex digits' : 'data is not hexadecimal');
    if (n >= maxBytes) return bad(f.fd ? 'more than 64 data bytes (CAN FD)' : 'more than 8 data bytes (classic CAN)');
    data[n++] = hi * 16 + lo;
    j += 2;
  }
  if (j < frEnd) {
    // '_D': raw DLC 9..F on an 8-byte classic frame
    const d = j + 1 < frEnd ? hexVal(s.charCodeAt(j + 1)) : -1;
    if (f.fd || n !== 8 || j + 2 !== frEnd || d < 9) return bad("'_' suffix must be a raw DLC 9–F after 8 data bytes");
  }
  if (n > 0 && s.charCodeAt(frEnd - 1) === 46) return bad("misplaced '.' in the data");
  if (f.fd && !FD_LENGTHS.has(n)) return bad(`${n} bytes is not a CAN FD length`);
  f.length = n;
  return Kind.Frame;
}

function clip(line: string): string {
  const t = line.length > BAD_TEXT_LENGTH ? line.slice(0, BAD_TEXT_LENGTH) : line;
  return t.replace(/\r$/, '');
}

/** Parse one candump log line (without its newline). `lineNo` is carried through for reports. */
export function parseCandumpLine(line: string, lineNo: number): CandumpLine {
  if (typeof line !== 'string') return { kind: 'bad', lineNo, reason: 'not text', text: '' };
  const f = newScratch();
  const k = parseInto(line, f);
  if (k === Kind.Blank) return { kind: 'blank', lineNo };
  if (k === Kind.Comment) return { kind: 'comment', lineNo };
  if (k === Kind.Bad) return { kind: 'bad', lineNo, reason: lastReason, text: clip(line) };
  return {
    kind: 'frame',
    lineNo,
    frame: {
      time: f.time,
      iface: line.slice(f.ifaceStart, f.ifaceEnd),
      id: f.id,
      extended: f.extended,
      remote: f.remote,
      fd: f.fd,
      fdFlags: f.fdFlags,
      length: f.length,
      data: f.remote ? [] : Array.from(f.data.subarray(0, f.length)),
    },
  };
}

// ---------------------------------------------------------------------------
// Capture summary

export interface ByteValueCount {
  value: number;
  count: number;
}

export interface ByteSummary {
  /** 0-based offset in the data. */
  index: number;
  /** Frames that carried this byte. */
  count: number;
  min: number;
  max: number;
  /** Every distinct value seen (at most 256), ascending, with how often. */
  distinct: ByteValueCount[];
}

export interface IdentifierSummary {
  /** The identifier as candump writes it: `123` or `18FEF100`; unique in a summary. */
  key: string;
  id: number;
  extended: boolean;
  /** SAE J1939-21 split of a 29-bit identifier; null for 11-bit ones. */
  j1939: J1939Id | null;
  /** All frames with this identifier (data and remote). */
  count: number;
  remoteCount: number;
  fdCount: number;
  firstTime: number;
  lastTime: number;
  /** (count − 1) / (lastTime − firstTime); null with fewer than two frames or no time span. */
  rateHz: number | null;
  /** Most common data length of its data frames (0 when it only had remote frames). */
  length: number;
  /** Every data length seen, ascending, with counts. */
  lengths: { length: number; count: number }[];
  bytes: ByteSummary[];
}

export interface CaptureSummary {
  /** Lines read, blank and bad included. */
  lines: number;
  frames: number;
  blankLines: number;
  commentLines: number;
  badLineCount: number;
  /** The first bad lines (at most `maxBadLines`), with line numbers. */
  badLines: BadLine[];
  firstTime: number | null;
  lastTime: number | null;
  interfaces: { name: string; frames: number }[];
  /** Sorted: 11-bit identifiers first, then 29-bit, each ascending. */
  identifiers: IdentifierSummary[];
  /** Frames not summarised because `maxIdentifiers` distinct identifiers were already held. */
  droppedFrames: number;
}

export interface SummariserOptions {
  /** Distinct identifiers held at most (memory bound); later new ones are counted in droppedFrames. Default 20000. */
  maxIdentifiers?: number;
  /** Bad lines kept with their numbers. Default 100. */
  maxBadLines?: number;
}

interface IdAcc {
  id: number;
  extended: boolean;
  count: number;
  remote: number;
  fd: number;
  first: number;
  last: number;
  lengthCounts: Uint32Array; // index 0..64
  bytes: (Uint32Array | undefined)[]; // per position, 256 counters
}

const MAX_INTERFACES = 32;

/**
 * Summarises a capture fed as chunks of text (which may split a line
 * anywhere) or as whole lines. Memory is bounded by the number of distinct
 * identifiers (each holds at most 64 × 256 counters), not by the lines.
 * Call `end()` (or `result()`, which ends) when the input is done; the last
 * line may lack its newline.
 */
export class CaptureSummariser {
  private readonly maxIds: number;
  private readonly maxBad: number;
  private readonly ids = new Map<number, IdAcc>();
  private readonly ifaces = new Map<string, number>();
  private readonly scratch = newScratch();
  private pending = '';
  private pendingTooLong = false;
  private lineNo = 0;
  private frames = 0;
  private blank = 0;
  private comments = 0;
  private badCount = 0;
  private readonly badLines: BadLine[] = [];
  private first = Infinity;
  private last = -Infinity;
  private dropped = 0;

  constructor(options: SummariserOptions = {}) {
    const mi = options.maxIdentifiers;
    const mb = options.maxBadLines;
    this.maxIds = typeof mi === 'number' && mi >= 0 ? Math.floor(mi) : 20000;
    this.maxBad = typeof mb === 'number' && mb >= 0 ? Math.floor(mb) : 100;
  }

  /** Feed a piece of the log; lines are numbered from 1 across all input. */
  addChunk(text: string): void {
    if (typeof text !== 'string' || text.length === 0) return;
    let start = 0;
    for (;;) {
      const nl = text.indexOf('\n', start);
      if (nl < 0) break;
      if (this.pending.length > 0 || this.pendingTooLong) {
        this.appendPending(text, start, nl);
        this.flushPending();
      } else {
        this.line(nl - start > MAX_LINE_LENGTH + 1 ? text.slice(start, start + MAX_LINE_LENGTH + 1) : text.slice(start, nl), nl - start);
      }
      start = nl + 1;
    }
    if (start < text.length) this.appendPending(text, start, text.length);
  }

  /** Feed one whole line (no newline). */
  addLine(line: string): void {
    if (this.pending.length > 0 || this.pendingTooLong) this.flushPending();
    if (typeof line !== 'string') line = '';
    this.line(line.length > MAX_LINE_LENGTH + 1 ? line.slice(0, MAX_LINE_LENGTH + 1) : line, line.length);
  }

  /** The input is complete: a last line without a newline is read now. */
  end(): void {
    if (this.pending.length > 0 || this.pendingTooLong) this.flushPending();
  }

  result(): CaptureSummary {
    this.end();
    const identifiers: IdentifierSummary[] = [];
    for (const a of this.ids.values()) identifiers.push(summariseId(a));
    identifiers.sort((x, y) => (x.extended === y.extended ? x.id - y.id : x.extended ? 1 : -1));
    return {
      lines: this.lineNo,
      frames: this.frames,
      blankLines: this.blank,
      commentLines: this.comments,
      badLineCount: this.badCount,
      badLines: this.badLines.map((b) => ({ ...b })),
      firstTime: this.frames > 0 ? this.first : null,
      lastTime: this.frames > 0 ? this.last : null,
      interfaces: [...this.ifaces].map(([name, frames]) => ({ name, frames })),
      identifiers,
      droppedFrames: this.dropped,
    };
  }

  private appendPending(text: string, from: number, to: number): void {
    if (this.pendingTooLong) return;
    const room = MAX_LINE_LENGTH + 1 - this.pending.length;
    if (to - from > room) {
      this.pending += text.slice(from, from + room);
      this.pendingTooLong = true;
    } else {
      this.pending += text.slice(from, to);
    }
  }

  private flushPending(): void {
    const p = this.pending;
    const long = this.pendingTooLong;
    this.pending = '';
    this.pendingTooLong = false;
    this.line(p, long ? MAX_LINE_LENGTH + 2 : p.length);
  }

  /** `s` is the line (possibly cut just past the limit); `fullLength` its real length. */
  private line(s: string, fullLength: number): void {
    const lineNo = ++this.lineNo;
    const f = this.scratch;
    const k = fullLength > MAX_LINE_LENGTH ? bad(`line longer than ${MAX_LINE_LENGTH} characters`) : parseInto(s, f);
    if (k === Kind.Frame) this.frame(s, f);
    else if (k === Kind.Blank) this.blank++;
    else if (k === Kind.Comment) this.comments++;
    else {
      this.badCount++;
      if (this.badLines.length < this.maxBad) this.badLines.push({ lineNo, reason: lastReason, text: clip(s) });
    }
  }

  private frame(s: string, f: Scratch): void {
    const key = f.extended ? f.id : f.id + 0x20000000;
    let a = this.ids.get(key);
    if (!a) {
      if (this.ids.size >= this.maxIds) {
        this.dropped++;
        this.frames++;
        this.times(f.time);
        return;
      }
      a = { id: f.id, extended: f.extended, count: 0, remote: 0, fd: 0, first: Infinity, last: -Infinity, lengthCounts: new Uint32Array(65), bytes: [] };
      this.ids.set(key, a);
    }
    this.frames++;
    this.times(f.time);
    a.count++;
    if (f.time < a.first) a.first = f.time;
    if (f.time > a.last) a.last = f.time;
    if (f.fd) a.fd++;
    const iface = s.slice(f.ifaceStart, f.ifaceEnd);
    const ic = this.ifaces.get(iface);
    if (ic !== undefined) this.ifaces.set(iface, ic + 1);
    else if (this.ifaces.size < MAX_INTERFACES) this.ifaces.set(iface, 1);
    if (f.remote) {
      a.remote++;
      return;
    }
    const n = f.length;
    a.lengthCounts[n]++;
    const data = f.data;
    const bytes = a.bytes;
    for (let b = 0; b < n; b++) {
      let c = bytes[b];
      if (c === undefined) {
        c = new Uint32Array(256);
        bytes[b] = c;
      }
      c[data[b]]++;
    }
  }

  private times(t: number): void {
    if (t < this.first) this.first = t;
    if (t > this.last) this.last = t;
  }
}

function summariseId(a: IdAcc): IdentifierSummary {
  const lengths: { length: number; count: number }[] = [];
  let length = 0;
  let best = 0;
  for (let n = 0; n < a.lengthCounts.length; n++) {
    const c = a.lengthCounts[n];
    if (c > 0) {
      lengths.push({ length: n, count: c });
      if (c > best) { best = c; length = n; }
    }
  }
  const bytes: ByteSummary[] = [];
  for (let i = 0; i < a.bytes.length; i++) {
    const c = a.bytes[i];
    if (!c) continue;
    const distinct: ByteValueCount[] = [];
    let count = 0;
    for (let v = 0; v < 256; v++) {
      if (c[v] > 0) {
        distinct.push({ value: v, count: c[v] });
        count += c[v];
      }
    }
    bytes.push({ index: i, count, min: distinct[0].value, max: distinct[distinct.length - 1].value, distinct });
  }
  const span = a.last - a.first;
  return {
    key: formatCanId(a.id, a.extended),
    id: a.id,
    extended: a.extended,
    j1939: a.extended ? splitJ1939(a.id) : null,
    count: a.count,
    remoteCount: a.remote,
    fdCount: a.fd,
    firstTime: a.first,
    lastTime: a.last,
    rateHz: a.count >= 2 && span > 0 ? (a.count - 1) / span : null,
    length,
    lengths,
    bytes,
  };
}

/** Summarise a whole log held in memory. */
export function summariseCandump(text: string, options?: SummariserOptions): CaptureSummary {
  const s = new CaptureSummariser(options);
  s.addChunk(typeof text === 'string' ? text : '');
  return s.result();
}

