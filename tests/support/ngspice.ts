/**
 * An outside check for the engine: writes the circuit a harness document
 * makes as a SPICE netlist, straight from the document and the contract's
 * rules (not from the engine's network), and runs ngspice on it. The only
 * thing taken from the engine is which relays are energised and which
 * modules are powered once the state has settled (that is an iteration
 * ngspice does not do); the tests check those separately.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { HarnessDocument } from '../../shared/harness/schema';

export const NGSPICE = '/usr/bin/ngspice';

export function hasNgspice(): boolean {
  try {
    const r = spawnSync(NGSPICE, ['-v'], { encoding: 'utf8', timeout: 20_000 });
    return r.status === 0 || /ngspice/i.test(`${r.stdout}${r.stderr}`);
  } catch {
    return false;
  }
}

/** Copper wire resistance written out again here: ρ = 0.017241 Ω·mm²/m (IEC 60028), AWG per ASTM B258, α = 0.00393. */
function wireR(w: HarnessDocument['wires'][number], t: number): number {
  if (w.ohms !== undefined) return w.ohms;
  let a: number;
  if ('mm2' in w.size) a = w.size.mm2;
  else {
    const d = 0.127 * 92 ** ((36 - w.size.awg) / 39);
    a = (Math.PI * d * d) / 4;
  }
  return ((0.017241 * w.lengthM) / a) * (1 + 0.00393 * (t - 20));
}

export interface SpiceOptions {
  stateId?: string;
  /** Relays energised and modules powered (from the engine's settling). */
  relays?: Record<string, boolean>;
  modules?: Record<string, boolean>;
  /** Power off: batteries removed, modules unpowered, relays released; 1 A driven from b into a. */
  ohmsBetween?: [string, string];
}

export interface Netlist {
  text: string;
  /** SPICE node name (lower case) of each pin ref. */
  nodeOf: Map<string, string>;
}

export function writeNetlist(doc: HarnessDocument, opt: SpiceOptions): Netlist {
  const state = opt.stateId ? doc.states.find((s) => s.id === opt.stateId) : undefined;
  const powerOff = !!opt.ohmsBetween;
  const lines: string[] = [`* ${doc.name}`];
  const nodeOf = new Map<string, string>();
  let k = 0;
  for (const c of doc.components) {
    const pins =
      c.kind === 'battery' ? ['+', '-'] : c.kind === 'ground' ? ['G'] : c.kind === 'splice' ? ['S']
      : c.kind === 'connector' ? c.cavities.map((x) => (typeof x === 'string' ? x : x.id))
      : c.kind === 'switch' ? c.pins : c.kind === 'relay' ? ['85', '86', '30', '87', '87a']
      : c.kind === 'module' ? c.pins.map((p) => p.id) : ['1', '2'];
    for (const p of pins) nodeOf.set(`${c.id}.${p}`, `n${++k}`);
  }
  const N = (ref: string) => nodeOf.get(ref)!;
  let e = 0;
  const r = (a: string, b: string, ohms: number) => {
    // Zero ohms as a 0 V source: SPICE's own way to join two nodes.
    if (ohms > 0) lines.push(`R${++e} ${a} ${b} ${ohms}`);
    else lines.push(`V${++e} ${a} ${b} DC 0`);
  };
  const unplugged = new Set(state?.unplugged ?? []);
  const outputs = new Set(powerOff ? [] : state?.outputs ?? []);
  for (const w of doc.wires) r(N(w.from), N(w.to), wireR(w, doc.temperatureC));
  for (const c of doc.components) {
    const p = (pin: string) => N(`${c.id}.${pin}`);
    switch (c.kind) {
      case 'battery': {
        if (powerOff) break;
        const v = state?.sources?.[c.id] ?? c.volts;
        const ri = c.internalOhms ?? 0;
        if (ri > 0) {
          lines.push(`V${++e} bi_${c.id.toLowerCase()} ${p('-')} DC ${v}`);
          r(p('+'), `bi_${c.id.toLowerCase()}`, ri);
        } else lines.push(`V${++e} ${p('+')} ${p('-')} DC ${v}`);
        break;
      }
      case 'ground': r(p('G'), '0', c.bondOhms ?? 0); break;
      case 'fuse': r(p('1'), p('2'), c.ohms ?? 0.005); break;
      case 'resistor': r(p('1'), p('2'), c.ohms); break;
      case 'load': r(p('1'), p('2'), c.ohms ?? (doc.nominalVolts ** 2) / c.watts!); break;
      case 'connector': {
        if (!c.matesWith || unplugged.has(c.id) || unplugged.has(c.matesWith)) break;
        const other = doc.components.find((x) => x.id === c.matesWith);
        if (!other || other.kind !== 'connector') break;
        c.cavities.forEach((cv, i) => {
          const a = typeof cv === 'string' ? cv : cv.id;
          const bcv = other.cavities[i];
          const b = typeof bcv === 'string' ? bcv : bcv.id;
          r(p(a), N(`${other.id}.${b}`), c.contactOhms ?? 0);
        });
        break;
      }
      case 'switch': {
        const names = Object.keys(c.positions);
        const pos = state?.switches[c.id] ?? names[0];
        for (const [a, b] of c.positions[pos] ?? []) r(p(a), p(b), c.contactOhms ?? 0);
        break;
      }
      case 'relay': {
        r(p('85'), p('86'), c.coilOhms);
        const on = !powerOff && opt.relays?.[c.id] === true;
        if (on) r(p('30'), p('87'), c.contactOhms ?? 0);
        else if (c.normallyClosed) r(p('30'), p('87a'), c.contactOhms ?? 0);
        break;
      }
      case 'module': {
        const ig = c.pins.some((q) => q.role === 'ground') ? `ig_${c.id.toLowerCase()}` : '0';
        const powered = !powerOff && opt.modules?.[c.id] === true;
        for (const q of c.pins) {
          const n = p(q.id);
          const src = (volts: number, ohms: number) => {
            const mid = `m${++e}`;
            lines.push(`V${++e} ${mid} ${ig} DC ${volts}`);
            r(mid, n, ohms);
          };
          switch (q.role) {
            case 'supply': r(n, ig, q.ohms); break;
            case 'ground': r(n, ig, 0); break;
            case 'can_h': case 'can_l': if (powered) src(2.5, q.biasOhms ?? 2500); break;
            case 'ref5': if (powered) src(q.volts ?? 5, q.ohms ?? 1); break;
            case 'input': r(n, ig, q.ohms ?? 100000); break;
            case 'output': if (powered && outputs.has(`${c.id}.${q.id}`)) r(n, p(q.from), q.onOhms ?? 0.05); break;
          }
        }
        break;
      }
      default: break;
    }
  }
  if (opt.ohmsBetween) lines.push(`I${++e} ${N(opt.ohmsBetween[1])} ${N(opt.ohmsBetween[0])} DC 1`);
  lines.push('.option rshunt=1e12', '.op', '.end');
  return { text: lines.join('\n') + '\n', nodeOf };
}

/** Run `ngspice -b` on a netlist; node volts by (lower-case) node name. */
export function runNgspice(text: string): Map<string, number> {
  const dir = mkdtempSync(join(tmpdir(), 'ww-spice-'));
  try {
    const file = join(dir, 'c.cir');
    writeFileSync(file, text);
    const out = execFileSync(NGSPICE, ['-b', file], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'], maxBuffer: 256 * 1024 * 1024, timeout: 120_000 });
    const volts = new Map<string, number>();
    let inNodes = false;
    for (const line of out.split('\n')) {
      if (/^\s*Node\s+Voltage/.test(line)) { inNodes = true; continue; }
      if (/^\s*Source\s+Current/.test(line)) { inNodes = false; continue; }
      if (!inNodes) continue;
      const m = /^\s*(\S+)\s+([-+0-9.eE]+)\s*$/.exec(line);
      if (m && !m[1].startsWith('-')) volts.set(m[1].toLowerCase(), Number(m[2]));
    }
    return volts;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** Pin volts from ngspice for a state (relays/modules as given). */
export function spiceVolts(doc: HarnessDocument, opt: SpiceOptions): Map<string, number> {
  const net = writeNetlist(doc, opt);
  const v = runNgspice(net.text);
  const out = new Map<string, number>();
  for (const [ref, n] of net.nodeOf) {
    const x = v.get(n);
    if (x !== undefined) out.set(ref, x);
  }
  return out;
}

/** Two-point resistance from ngspice: 1 A from b into a with the power off, R = V(a) − V(b). */
export function spiceOhms(doc: HarnessDocument, a: string, b: string, stateId?: string): number {
  const net = writeNetlist(doc, { stateId, ohmsBetween: [a, b] });
  const v = runNgspice(net.text);
  return (v.get(net.nodeOf.get(a)!) ?? NaN) - (v.get(net.nodeOf.get(b)!) ?? NaN);
}
