/**
 * Which bus a pin is on, from the harness document alone: pins joined by
 * wires, by mated connector halves (cavity n to cavity n) and by splices
 * form one net; a net that reaches a module's `can_h` or `can_l` pin is a
 * bus line, and the modules on it are the ones that talk on that bus.
 * Resistors (terminators) are not followed, so CAN_H and CAN_L stay apart.
 * Takes any input; never throws.
 */
import type { BusMessage, HarnessDocument } from '../harness/schema';
import { componentPinIds } from '../harness/schema';

export interface ModuleOnBus {
  id: string;
  label: string | null;
  supply: string[];
  ground: string[];
  canH: string[];
  canL: string[];
}

export interface BusOfPin {
  /** The line the pin carries: 'can_h', 'can_l', or null when it reaches no module's bus pin. */
  line: 'can_h' | 'can_l' | null;
  /** Modules with a bus pin on the pin's net (for CAN_H), or on the partner net. */
  modules: ModuleOnBus[];
  /** Messages of the catalogue sent by those modules. */
  messages: BusMessage[];
}

type Comp = HarnessDocument['components'][number];

function find(parent: Map<string, string>, a: string): string {
  let r = a;
  while (parent.has(r) && parent.get(r) !== r) r = parent.get(r)!;
  let x = a;
  while (parent.get(x) !== undefined && parent.get(x) !== r) {
    const next = parent.get(x)!;
    parent.set(x, r);
    x = next;
  }
  return r;
}

function union(parent: Map<string, string>, a: string, b: string): void {
  if (!parent.has(a)) parent.set(a, a);
  if (!parent.has(b)) parent.set(b, b);
  const ra = find(parent, a);
  const rb = find(parent, b);
  if (ra !== rb) parent.set(ra, rb);
}

/** The module's pins by role, as `MODULE.PIN` refs. */
export function modulePins(c: Comp): ModuleOnBus | null {
  if (c.kind !== 'module') return null;
  const m: ModuleOnBus = { id: c.id, label: c.label ?? null, supply: [], ground: [], canH: [], canL: [] };
  for (const p of c.pins) {
    const ref = `${c.id}.${p.id}`;
    if (p.role === 'supply') m.supply.push(ref);
    else if (p.role === 'ground') m.ground.push(ref);
    else if (p.role === 'can_h') m.canH.push(ref);
    else if (p.role === 'can_l') m.canL.push(ref);
  }
  return m;
}

export function busOfPin(doc: HarnessDocument | null | undefined, pinRef: string): BusOfPin {
  const none: BusOfPin = { line: null, modules: [], messages: [] };
  try {
    if (!doc || !Array.isArray(doc.components) || typeof pinRef !== 'string') return none;
    const parent = new Map<string, string>();
    const comps = new Map<string, Comp>();
    for (const c of doc.components) comps.set(c.id, c);
    for (const w of doc.wires ?? []) union(parent, w.from, w.to);
    for (const c of doc.components) {
      if (c.kind === 'connector' && c.matesWith && comps.get(c.matesWith)?.kind === 'connector') {
        const other = comps.get(c.matesWith)!;
        const a = componentPinIds(c);
        const b = componentPinIds(other);
        for (let i = 0; i < Math.min(a.length, b.length); i++) union(parent, `${c.id}.${a[i]}`, `${other.id}.${b[i]}`);
      }
    }
    if (!parent.has(pinRef)) parent.set(pinRef, pinRef);
    const net = find(parent, pinRef);
    const netOf = (ref: string) => (parent.has(ref) ? find(parent, ref) : ref);
    let line: BusOfPin['line'] = null;
    const mods: ModuleOnBus[] = [];
    for (const c of doc.components) {
      const m = modulePins(c);
      if (!m) continue;
      if (m.canH.some((r) => netOf(r) === net)) line = 'can_h';
      else if (m.canL.some((r) => netOf(r) === net)) line = line ?? 'can_l';
    }
    if (!line) return none;
    // Modules on the bus: a bus pin of the same line on the pin's net.
    for (const c of doc.components) {
      const m = modulePins(c);
      if (!m) continue;
      const pins = line === 'can_h' ? m.canH : m.canL;
      if (pins.some((r) => netOf(r) === net)) mods.push(m);
    }
    const ids = new Set(mods.map((m) => m.id));
    const messages = (doc.messages ?? []).filter((msg) => msg.sender !== undefined && ids.has(msg.sender));
    return { line, modules: mods, messages };
  } catch {
    return none;
  }
}

/**
 * The bus a pin or a whole connector is on: a `COMPONENT.PIN` ref as busOfPin; a component id
 * answers the bus of its first cavity on a bus (CAN_H before CAN_L), for a pin card of a
 * connector.
 */
export function busOfPinOrConnector(doc: HarnessDocument | null | undefined, ref: string): BusOfPin {
  if (typeof ref !== 'string') return { line: null, modules: [], messages: [] };
  if (ref.includes('.')) return busOfPin(doc, ref);
  const c = doc?.components?.find((x) => x.id === ref);
  if (!c) return { line: null, modules: [], messages: [] };
  let found: BusOfPin | null = null;
  for (const pin of componentPinIds(c)) {
    const b = busOfPin(doc, `${ref}.${pin}`);
    if (b.line === 'can_h') return b;
    if (b.line && !found) found = b;
  }
  return found ?? { line: null, modules: [], messages: [] };
}
