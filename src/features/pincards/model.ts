/**
 * Pure derivations for pin cards and walks, from a harness document:
 * which pins a component has, the wires at a cavity and where each goes
 * next, the mated half, bus lines, and the probe placement in words.
 * No React and no zod here (types and the zod-free pins module only), so the pin-card route stays small.
 */
import { componentPinIds } from '@shared/harness/pins';
import type { Component, HarnessDocument, Wire } from '@shared/harness/schema';

export type Doc = HarnessDocument;


/** The function text a document gives a pin (connector cavity or module pin). */
export function pinFunction(c: Component, pinId: string): string | undefined {
  if (c.kind === 'connector') {
    const cav = c.cavities.find((x) => typeof x !== 'string' && x.id === pinId);
    return cav && typeof cav !== 'string' ? cav.function ?? cav.label : undefined;
  }
  if (c.kind === 'module') {
    const p = c.pins.find((x) => x.id === pinId);
    return p ? p.function ?? p.label : undefined;
  }
  return undefined;
}

export interface PinOption {
  ref: string;
  /** "X30B.1 · Attachment constant power (X30 Lift-arm connector, lift-arm side)" */
  text: string;
}

/** Every pin of the document, for the walk's and the ohms reading's typeahead. */
export function pinOptions(doc: Doc): PinOption[] {
  const out: PinOption[] = [];
  for (const c of doc.components) {
    for (const id of componentPinIds(c)) {
      const fn = pinFunction(c, id);
      const bits = [fn, c.label].filter(Boolean);
      out.push({ ref: `${c.id}.${id}`, text: bits.length ? `${c.id}.${id} · ${bits.join(' — ')}` : `${c.id}.${id}` });
    }
  }
  return out;
}

export function componentById(doc: Doc, id: string): Component | undefined {
  return doc.components.find((c) => c.id === id);
}

/** Ground pins (chassis ground studs), the usual second probe point. */
export function groundPins(doc: Doc): string[] {
  return doc.components.filter((c) => c.kind === 'ground').map((c) => `${c.id}.G`);
}

export function wiresAt(doc: Doc, ref: string): Wire[] {
  return doc.wires.filter((w) => w.from === ref || w.to === ref);
}

export function sizeText(w: Wire): string {
  return 'mm2' in w.size ? `${w.size.mm2} mm²` : `${w.size.awg} AWG`;
}

export interface WireEnd {
  wire: Wire;
  /** The pin at the other end. */
  to: string;
  /** What the other end is, in words ("MCU.3 · Attachment control unit"). */
  toText: string;
  /** Through a splice: the pins the splice joins onward. */
  onward: string[];
}

function refText(doc: Doc, ref: string): string {
  const [cid, pid] = splitRef(ref);
  const c = componentById(doc, cid);
  if (!c) return ref;
  const fn = pinFunction(c, pid);
  return [ref, c.label, fn].filter(Boolean).join(' · ');
}

export function splitRef(ref: string): [string, string] {
  const dot = ref.indexOf('.');
  return dot < 0 ? [ref, ''] : [ref.slice(0, dot), ref.slice(dot + 1)];
}

/** Where each wire on a pin goes next; through a splice, the splice's other wires too. */
export function wireEnds(doc: Doc, ref: string): WireEnd[] {
  return wiresAt(doc, ref).map((wire) => {
    const to = wire.from === ref ? wire.to : wire.from;
    const [toComp] = splitRef(to);
    const c = componentById(doc, toComp);
    const onward = c?.kind === 'splice' ? wiresAt(doc, to).filter((w) => w.id !== wire.id).map((w) => (w.from === to ? w.to : w.from)) : [];
    return { wire, to, toText: refText(doc, to), onward };
  });
}

export interface MatedPair {
  /** The half that was asked for first, then its mate (if any). */
  halves: Component[];
}

/** A connector and its mate (declared on either half), the asked-for half first. */
export function matedPair(doc: Doc, id: string): MatedPair | null {
  const c = componentById(doc, id);
  if (!c) return null;
  if (c.kind !== 'connector') return { halves: [c] };
  const mate = c.matesWith ? componentById(doc, c.matesWith) : doc.components.find((o) => o.kind === 'connector' && o.matesWith === c.id);
  return { halves: mate && mate.kind === 'connector' ? [c, mate] : [c] };
}

/** Components a pin card can show: connectors (one card per mated pair) and modules. */
export function cardComponents(doc: Doc): Component[] {
  const seen = new Set<string>();
  const out: Component[] = [];
  for (const c of doc.components) {
    if (c.kind === 'module') out.push(c);
    if (c.kind !== 'connector' || seen.has(c.id)) continue;
    const pair = matedPair(doc, c.id);
    pair?.halves.forEach((h) => seen.add(h.id));
    out.push(c);
  }
  return out;
}

/**
 * Groups of pins joined by wires, mates and splices (what a meter would see as one
 * conductor with every connector together), as a map pin → group id.
 */
export function conductorGroups(doc: Doc): Map<string, string> {
  const parent = new Map<string, string>();
  const find = (a: string): string => {
    let r = a;
    while (parent.has(r) && parent.get(r) !== r) r = parent.get(r)!;
    parent.set(a, r);
    return r;
  };
  const join = (a: string, b: string) => {
    const ra = find(a);
    const rb = find(b);
    if (ra !== rb) parent.set(ra, rb);
  };
  for (const c of doc.components) for (const p of componentPinIds(c)) parent.set(`${c.id}.${p}`, `${c.id}.${p}`);
  for (const w of doc.wires) join(w.from, w.to);
  for (const c of doc.components) {
    if (c.kind !== 'connector' || !c.matesWith) continue;
    const o = componentById(doc, c.matesWith);
    if (!o || o.kind !== 'connector') continue;
    const a = componentPinIds(c);
    const b = componentPinIds(o);
    for (let k = 0; k < Math.min(a.length, b.length); k++) join(`${c.id}.${a[k]}`, `${o.id}.${b[k]}`);
  }
  const out = new Map<string, string>();
  for (const ref of parent.keys()) out.set(ref, find(ref));
  return out;
}

/** Which pins are on a bus line: module pins of role can_h / can_l and every pin joined to them. */
export function busLines(doc: Doc): Map<string, 'can_h' | 'can_l'> {
  const groups = conductorGroups(doc);
  const byGroup = new Map<string, 'can_h' | 'can_l'>();
  for (const c of doc.components) {
    if (c.kind !== 'module') continue;
    for (const p of c.pins) {
      if (p.role === 'can_h' || p.role === 'can_l') {
        const g = groups.get(`${c.id}.${p.id}`);
        if (g) byGroup.set(g, p.role);
      }
    }
  }
  const out = new Map<string, 'can_h' | 'can_l'>();
  for (const [ref, g] of groups) {
    const line = byGroup.get(g);
    if (line) out.set(ref, line);
  }
  return out;
}

export function stateLabel(doc: Doc, id: string): string {
  const s = doc.states.find((x) => x.id === id);
  return s?.label ?? id.replace(/_/g, ' ');
}

/** A state's label inside a sentence: "key on, engine off"; "X20 apart" keeps its capitals. */
export function stateWords(doc: Doc, id: string): string {
  const label = stateLabel(doc, id);
  return label.length > 1 && label[1] === label[1].toLowerCase() ? label[0].toLowerCase() + label.slice(1) : label;
}

/** The state a meter check "with the power off" uses: the first key-off state with nothing apart, else the first. */
export function powerOffState(doc: Doc): string | undefined {
  const plain = doc.states.find((s) => /off/i.test(s.id) && !(s.unplugged?.length));
  return (plain ?? doc.states[0])?.id;
}

/** The state the card opens in: key on when there is one (most supply checks), else the first. */
export function defaultState(doc: Doc): string | undefined {
  return (doc.states.find((s) => s.id === 'key_on') ?? doc.states.find((s) => /on/i.test(s.id)) ?? doc.states[0])?.id;
}

/** "cavity 3" for a connector, "pin 3" for anything else. */
export function cavityWord(doc: Doc, ref: string): string {
  const [cid, pid] = splitRef(ref);
  const c = componentById(doc, cid);
  return `${c?.kind === 'connector' ? 'cavity' : 'pin'} ${pid} of ${cid}`;
}

/** Where to put the probes, in words: "Cavity 3 of X30B to chassis ground, DC volts, key on". */
export function probeText(doc: Doc, ref: string, state: string, ground?: string): string {
  const word = cavityWord(doc, ref);
  const to = ground ? `ground ${ground}` : 'chassis ground';
  return `${word[0].toUpperCase()}${word.slice(1)} (red probe) to ${to} (black probe), DC volts, ${stateWords(doc, state)}`;
}

/** The fuses of the document with their ratings, for the "fuse blows on insert" entry. */
export function fuses(doc: Doc): Array<{ id: string; amps: number; label?: string }> {
  return doc.components.flatMap((c) => (c.kind === 'fuse' ? [{ id: c.id, amps: c.amps, ...(c.label ? { label: c.label } : {}) }] : []));
}

/** Formats expected volts for a table cell: "12.6 V", "no steady reading". */
export function voltsText(v: number | null | undefined): string {
  if (v === undefined) return '…';
  if (v === null) return 'floating';
  return `${Math.abs(v) < 0.005 ? '0.00' : v.toFixed(2)} V`;
}
