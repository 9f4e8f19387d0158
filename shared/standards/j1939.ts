/**
 * CAN identifiers: 29-bit identifiers split per SAE J1939-21, 11-bit base
 * identifiers (ISO 11898) passed through unsplit.
 *
 * 29-bit layout, most significant bit first:
 *   priority (3) | extended data page / reserved (1) | data page (1) |
 *   PDU format (8) | PDU specific (8) | source address (8)
 * PGN = DP·65536 + PF·256 + (PF ≥ 240 ? PS : 0). With PF < 240 (PDU1) the
 * PDU specific byte is the destination address; with PF ≥ 240 (PDU2) the
 * message is broadcast and PS is part of the PGN (group extension).
 *
 * Nothing here throws: values out of range answer null.
 */

export const MAX_EXTENDED_ID = 0x1fffffff;
export const MAX_BASE_ID = 0x7ff;
/** The global (broadcast) destination address. */
export const GLOBAL_ADDRESS = 0xff;

export interface J1939Id {
  /** The 29-bit identifier. */
  id: number;
  /** 0 (highest) to 7 (lowest). */
  priority: number;
  /** Extended data page (formerly reserved) bit, 0 or 1. */
  edp: number;
  /** Data page bit, 0 or 1. */
  dp: number;
  /** PDU format, 0–255. */
  pf: number;
  /** PDU specific, 0–255: destination address (PDU1) or group extension (PDU2). */
  ps: number;
  /** Parameter group number, 0–131071 (the EDP bit is reported apart, not folded in). */
  pgn: number;
  /** 1 when PF < 240 (addressed), 2 when PF ≥ 240 (broadcast). */
  pduFormat: 1 | 2;
  /** Destination address for PDU1 messages (0xFF = global); null for PDU2 (broadcast). */
  destination: number | null;
  /** Source address, 0–255. */
  source: number;
}

function isInt(n: unknown, lo: number, hi: number): n is number {
  return typeof n === 'number' && Number.isInteger(n) && n >= lo && n <= hi;
}

/** Split a 29-bit identifier per SAE J1939-21; null when not an integer in 0..0x1FFFFFFF. */
export function splitJ1939(id: number): J1939Id | null {
  if (!isInt(id, 0, MAX_EXTENDED_ID)) return null;
  const priority = (id >>> 26) & 0x7;
  const edp = (id >>> 25) & 0x1;
  const dp = (id >>> 24) & 0x1;
  const pf = (id >>> 16) & 0xff;
  const ps = (id >>> 8) & 0xff;
  const source = id & 0xff;
  const pdu2 = pf >= 240;
  return {
    id,
    priority,
    edp,
    dp,
    pf,
    ps,
    pgn: dp * 65536 + pf * 256 + (pdu2 ? ps : 0),
    pduFormat: pdu2 ? 2 : 1,
    destination: pdu2 ? null : ps,
    source,
  };
}

export interface J1939Compose {
  priority: number;
  /** 0–131071 (DP, PF, PS); for PDU1 PGNs the low byte must be 0. */
  pgn: number;
  source: number;
  /** PDU1 only: the destination address; defaults to 0xFF (global). Must be absent or null for PDU2. */
  destination?: number | null;
  /** Extended data page bit; default 0. */
  edp?: number;
}

/**
 * Build a 29-bit identifier from its J1939 parts; null when a part is out
 * of range, a PDU1 PGN has a non-zero low byte, or a destination is given
 * for a PDU2 (broadcast) PGN.
 */
export function composeJ1939(parts: J1939Compose): number | null {
  if (parts === null || typeof parts !== 'object') return null;
  const { priority, pgn, source } = parts;
  const edp = parts.edp ?? 0;
  if (!isInt(priority, 0, 7) || !isInt(pgn, 0, 0x1ffff) || !isInt(source, 0, 255) || !isInt(edp, 0, 1)) return null;
  const dp = (pgn >>> 16) & 1;
  const pf = (pgn >>> 8) & 0xff;
  let ps = pgn & 0xff;
  if (pf < 240) {
    if (ps !== 0) return null;
    const dest = parts.destination ?? GLOBAL_ADDRESS;
    if (!isInt(dest, 0, 255)) return null;
    ps = dest;
  } else if (parts.destination !== undefined && parts.destination !== null) {
    return null;
  }
  // Multiplication instead of << keeps the result a non-negative number.
  return priority * 0x4000000 + edp * 0x2000000 + dp * 0x1000000 + pf * 0x10000 + ps * 0x100 + source;
}

export type CanIdentifier =
  | { extended: false; id: number; hex: string }
  | { extended: true; id: number; hex: string; j1939: J1939Id };

/** Identifier text as candump writes it: 3 hex digits (11-bit) or 8 (29-bit), upper case. */
export function formatCanId(id: number, extended: boolean): string {
  return id.toString(16).toUpperCase().padStart(extended ? 8 : 3, '0');
}

/**
 * Describe a CAN identifier: an 11-bit base identifier passes through
 * unsplit; a 29-bit one carries its J1939 split. Null when out of range.
 */
export function describeCanId(id: number, extended: boolean): CanIdentifier | null {
  if (extended) {
    const j1939 = splitJ1939(id);
    return j1939 ? { extended: true, id, hex: formatCanId(id, true), j1939 } : null;
  }
  if (!isInt(id, 0, MAX_BASE_ID)) return null;
  return { extended: false, id, hex: formatCanId(id, false) };
}

function hex2(n: number): string {
  return '0x' + n.toString(16).toUpperCase().padStart(2, '0');
}

/** A short line for a J1939 identifier: "priority 6, PGN 65265 (0xFEF1), source 0x00". */
export function j1939Label(parts: J1939Id): string {
  const pgnHex = '0x' + parts.pgn.toString(16).toUpperCase().padStart(4, '0');
  const dest = parts.destination === null ? '' : `, destination ${parts.destination === GLOBAL_ADDRESS ? 'global (0xFF)' : hex2(parts.destination)}`;
  return `priority ${parts.priority}, PGN ${parts.pgn} (${pgnHex})${dest}, source ${hex2(parts.source)}`;
}
