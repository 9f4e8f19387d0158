/**
 * Small helpers for writing the demo harness documents by hand: they only
 * shorten the source; what they return is plain contract data
 * (../../../shared/design/harness-format.md).
 */
import type { Cavity, Wire } from '../../shared/harness/schema';

/** One wire row: id, from, to, IEC 60757 colour, size in mm², length in m, circuit, label, notes. */
export type WireRow = [id: string, from: string, to: string, color: string, mm2: number, lengthM: number, circuit: string, label: string, notes?: string];

export function wires(rows: WireRow[]): Wire[] {
  return rows.map(([id, from, to, color, mm2, lengthM, circuit, label, notes]) => {
    const w: Wire = { id, from, to, color, size: { mm2 }, lengthM, circuit, label };
    if (notes) w.notes = notes;
    return w;
  });
}

/** Cavities from a list of functions: cavity n (1-based) gets the n-th function. */
export function cavities(functions: string[]): Cavity[] {
  return functions.map((fn, i) => ({ id: String(i + 1), function: fn }));
}
