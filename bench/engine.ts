/**
 * Engine bench on generated harnesses (make_harness.py):
 * - engine.volts: validate + prepare + volts of every pin in all three states, 1000 circuits,
 *   cold (a fresh document each round); ngspiceMs = `ngspice -b` on the same three states' netlists, summed
 * - engine.walk: one walk (fuse to load, and battery to load with the key on), 1000 circuits, prepared,
 *   median after 30 warm-up walks; firstWalkMs is the very first (it builds the walk graph)
 * - engine.ohms: one two-point resistance with the power off, 1000 circuits, prepared
 * - engine.suspects: suspects for one blown-on-insert fuse (and one reading), 100 circuits, fresh each round
 * Each also reports cpuMedianMs, the process's CPU time, steadier than the wall clock on a shared machine.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { validateDocument } from '../shared/harness';
import type { HarnessDocument } from '../shared/harness/schema';
import { prepareHarness } from '../shared/engine';
import { makeHarnessText } from '../tests/support/make-harness';
import { writeNetlist } from '../tests/support/ngspice';
import type { BenchResult } from './run';


function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}
const round = (x: number) => Math.round(x * 100) / 100;
const log = (s: string) => process.stderr.write(`  ${s}\n`);

/** CPU time of this process (all its threads), ms: on a busy shared machine it tells more than the wall clock. */
const cpuNow = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};
let lastCpu = 0;
function time<T>(f: () => T): [number, T] {
  const c = cpuNow();
  const t = performance.now();
  const r = f();
  const ms = performance.now() - t;
  lastCpu = cpuNow() - c;
  return [ms, r];
}

function ngspiceMs(doc: HarnessDocument): number | null {
  const probe = spawnSync('/usr/bin/ngspice', ['-v'], { encoding: 'utf8' });
  if (probe.error) return null;
  const h = prepareHarness(doc);
  const dir = mkdtempSync(join(tmpdir(), 'ww-bench-'));
  try {
    let total = 0;
    for (const st of doc.states) {
      const ms = h.machineState(st.id)!;
      const file = join(dir, `${st.id}.cir`);
      writeFileSync(file, writeNetlist(doc, { stateId: st.id, relays: ms.relays, modules: ms.modules }).text);
      const t = performance.now();
      execFileSync('/usr/bin/ngspice', ['-b', file], { stdio: ['ignore', 'ignore', 'ignore'], maxBuffer: 512 * 1024 * 1024 });
      total += performance.now() - t;
    }
    return total;
  } catch {
    return null;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

export async function run(): Promise<BenchResult[]> {
  const out: BenchResult[] = [];
  const big = makeHarnessText(1000);
  const rounds = Number(process.env.BENCH_ROUNDS ?? 9);

  // Volts, cold.
  const times: number[] = [];
  const cpuTimes: number[] = [];
  let doc: HarnessDocument | null = null;
  let pins = 0;
  for (let i = 0; i < rounds + 2; i++) {
    const input = JSON.parse(big);
    const [ms, n] = time(() => {
      const r = validateDocument(input);
      if (!r.ok) throw new Error('generated harness did not validate');
      doc = r.doc;
      const h = prepareHarness(r.doc);
      let count = 0;
      for (const s of r.doc.states) count += h.readings(s.id)!.pins.length;
      return count;
    });
    pins = n;
    if (i >= 2) {
      times.push(ms); // two warm-up rounds for the JIT
      cpuTimes.push(lastCpu);
    }
    log(`volts round ${i}: ${ms.toFixed(1)} ms`);
  }
  const d = doc as unknown as HarnessDocument;
  const spice = ngspiceMs(d);
  out.push({ bench: 'engine.volts', circuits: 1000, components: d.components.length, wires: d.wires.length, pinReadings: pins, medianMs: round(median(times)), cpuMedianMs: round(median(cpuTimes)), ngspiceMs: spice === null ? null : round(spice), targetMs: 100 });

  // Walk and ohms on a prepared harness.
  const h = prepareHarness(d);
  for (const s of d.states) h.readings(s.id);
  const walks: number[] = [];
  const walksCpu: number[] = [];
  let paths = 0;
  // The first walk of each kind builds the state's walk graph (and the JIT is cold); a server
  // answers many, so the median is taken once 30 warm-up walks on other circuits have run.
  let firstMs = 0;
  for (let i = -30; i < 30; i++) {
    const c = i < 0 ? 500 + i * 13 : 10 + ((i * 37) % 980);
    const [ms, w] = time(() => (i % 2 ? h.walk('BATT.+', `L${c}_0.1`, 'key_on') : h.walk(`F${c}.1`, `L${c}_0.2`)));
    paths = Math.max(paths, w.paths.length);
    if (i === -30) firstMs = ms;
    if (i >= 0) {
      walks.push(ms);
      walksCpu.push(lastCpu);
    }
  }
  out.push({ bench: 'engine.walk', circuits: 1000, paths, medianMs: round(median(walks)), cpuMedianMs: round(median(walksCpu)), firstWalkMs: round(firstMs), targetMs: 5 });
  log(`walk median ${median(walks).toFixed(2)} ms`);

  const ohmsT: number[] = [];
  const ohmsCpu: number[] = [];
  for (let i = 0; i < 30; i++) {
    const c = (i * 53) % 1000;
    const [ms] = time(() => (i % 3 === 0 ? h.ohms('CANH.S', 'CANL.S') : i % 3 === 1 ? h.ohms(`F${c}.2`, `G${c % 20}.G`, 'key_off') : h.ohms('BATT.+', `L${c}_0.1`, 'key_on')));
    if (i >= 4) {
      ohmsT.push(ms);
      ohmsCpu.push(lastCpu);
    }
  }
  out.push({ bench: 'engine.ohms', circuits: 1000, medianMs: round(median(ohmsT)), cpuMedianMs: round(median(ohmsCpu)), targetMs: 30 });
  log(`ohms median ${median(ohmsT).toFixed(2)} ms`);

  // Suspects on 100 circuits.
  const small = makeHarnessText(100);
  const sus: number[] = [];
  const susCpu: number[] = [];
  let top = '';
  for (let i = 0; i < 5; i++) {
    const r = validateDocument(JSON.parse(small));
    if (!r.ok) throw new Error('generated harness did not validate');
    const [ms, res] = time(() => prepareHarness(r.doc).suspects([{ fuse: 'F10', blowsOnInsert: true }]));
    top = `${res.suspects[0]?.fault.kind}:${res.suspects[0]?.fault.ref}`;
    if (i >= 1) {
      sus.push(ms);
      susCpu.push(lastCpu);
    }
    log(`suspects round ${i}: ${ms.toFixed(0)} ms (top ${top})`);
  }
  const sus2: number[] = [];
  for (let i = 0; i < 3; i++) {
    const r = validateDocument(JSON.parse(small));
    if (!r.ok) throw new Error('generated harness did not validate');
    const [ms] = time(() => prepareHarness(r.doc).suspects([{ fuse: 'F10', blowsOnInsert: true }, { pin: 'YB10.1', state: 'key_on', volts: 0 }]));
    sus2.push(ms);
  }
  out.push({ bench: 'engine.suspects', circuits: 100, observations: 'fuse F10 blows on insert', top, medianMs: round(median(sus)), cpuMedianMs: round(median(susCpu)), withReadingMedianMs: round(median(sus2)), targetMs: 1000 });
  return out;
}
