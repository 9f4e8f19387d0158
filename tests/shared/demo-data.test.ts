/**
 * The demo library, harness documents, message catalogue and captures hold
 * together: every document is valid, the parts the issues ask for are there,
 * ids line up across files, and the two captures differ where the catalogue
 * says they should. No engine needed here (see demo-harnesses.test.ts).
 */
import { readFileSync, statSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { validateDocument } from '../../shared/harness';
import type { Component, HarnessDocument, ModuleComponent } from '../../shared/harness/schema';
import { splitJ1939 } from '../../shared/standards/j1939';
import { isStandardBladeFuseRating } from '../../shared/standards/iso8820';
import { summariseCandump } from '../../shared/can/candump';
import { compareCaptures } from '../../shared/can/compare';
import {
  demoHarnesses,
  fwG72GrappleHarness,
  fwM60MulcherHarness,
  isCarrierStandIn,
  krT78MainHarness,
  krT78MainHarnessDraft,
  walkThroughFault,
} from '../../seeds/harnesses';
import { demoFaults } from '../../seeds/harnesses/walk-through';
import { customers, DEMO_SHOP_NAME, harnessLinks, makers, models, units } from '../../seeds/library';
import { auxiliaryControlSignal, demoCatalogues, krT78BusMessages, withMessages } from '../../seeds/catalogue';
import { movedCapture, restCapture } from '../../seeds/captures/make-captures';

const docs = Object.entries(demoHarnesses) as [keyof typeof demoHarnesses, HarnessDocument][];
const byKind = (doc: HarnessDocument, kind: Component['kind']) => doc.components.filter((c) => c.kind === kind);
const modules = (doc: HarnessDocument) => byKind(doc, 'module') as ModuleComponent[];

/** Resistors of 120 Ω whose two pins are wired to bus nets (CAN_H, CAN_L): the terminators. */
function terminators(doc: HarnessDocument): string[] {
  return doc.components.filter((c) => c.kind === 'resistor' && c.ohms === 120).map((c) => c.id);
}

describe('demo harness documents', () => {
  it.each(docs)('%s validates against the document contract', (_key, doc) => {
    const r = validateDocument(doc);
    expect(r.ok ? [] : r.problems).toEqual([]);
  });

  it.each(docs)('%s validates with its message catalogue as the messages section', (key, doc) => {
    const r = validateDocument(withMessages(doc, key));
    expect(r.ok ? [] : r.problems).toEqual([]);
  });

  it.each(docs)('%s survives a JSON round trip unchanged (plain data, as the import route receives it)', (_key, doc) => {
    const back = JSON.parse(JSON.stringify(doc));
    expect(back).toEqual(doc);
    const r = validateDocument(back);
    expect(r.ok && r.doc).toEqual(doc);
  });

  it('the draft in progress validates too', () => {
    const r = validateDocument(krT78MainHarnessDraft);
    expect(r.ok ? [] : r.problems).toEqual([]);
  });

  it('the loader harness has what issue 4 asks for', () => {
    const doc = krT78MainHarness;
    expect(doc.components.length).toBeGreaterThanOrEqual(60);
    expect(byKind(doc, 'battery')).toHaveLength(1);
    const grounds = byKind(doc, 'ground');
    expect(grounds.length).toBeGreaterThanOrEqual(3);
    for (const g of grounds) expect(g.kind === 'ground' && g.bondOhms).toBeGreaterThan(0);
    const fuses = byKind(doc, 'fuse').filter((f) => f.kind === 'fuse');
    const bladeRatings = new Set(fuses.map((f) => (f.kind === 'fuse' ? f.amps : 0)).filter((a) => isStandardBladeFuseRating(a)));
    expect(bladeRatings.size).toBeGreaterThanOrEqual(5); // several blade ratings (ISO 8820-3 series)
    const key = doc.components.find((c) => c.id === 'S1');
    expect(key?.kind === 'switch' && Object.keys(key.positions)).toEqual(['off', 'on', 'start']);
    expect(byKind(doc, 'relay').map((r) => r.id)).toEqual(expect.arrayContaining(['K2', 'K3']));
    const bus = modules(doc).filter((m) => m.pins.some((p) => p.role === 'can_h') && m.pins.some((p) => p.role === 'can_l'));
    expect(bus.map((m) => m.id).sort()).toEqual(['DSP', 'ECU', 'MCU']);
    expect(modules(doc).some((m) => m.pins.some((p) => p.role === 'ref5')) && modules(doc).some((m) => m.pins.some((p) => p.role === 'input'))).toBe(true);
    expect(byKind(doc, 'load').length).toBeGreaterThanOrEqual(8);
    expect(byKind(doc, 'splice').length).toBeGreaterThanOrEqual(5);
    expect(doc.clamps.length).toBeGreaterThanOrEqual(5);
    expect(terminators(doc)).toEqual(['TR1', 'TR2']);
    const states = doc.states.map((s) => s.id);
    expect(states).toEqual(expect.arrayContaining(['key_off', 'key_on', 'running']));
    expect(doc.states.find((s) => s.id === 'running')?.sources).toEqual({ BATT: 14.2 });
    expect(doc.states.some((s) => (s.outputs ?? []).includes('MCU.18'))).toBe(true); // an attachment function commanded
  });

  it('the attachment plug carries constant, switched, ground and both bus lines', () => {
    const x40 = krT78MainHarness.components.find((c) => c.id === 'X40');
    expect(x40?.kind).toBe('connector');
    const fns = x40?.kind === 'connector' ? x40.cavities.map((c) => (typeof c === 'string' ? '' : c.function ?? '')) : [];
    expect(fns[0]).toMatch(/constant/i);
    expect(fns[1]).toMatch(/switched.*relay K3/i);
    expect(fns[2]).toMatch(/ground/i);
    expect(fns[3]).toMatch(/CAN_H/);
    expect(fns[4]).toMatch(/CAN_L/);
  });

  it.each(docs)('%s: every connector cavity has a function, every wire a colour, size, length and circuit', (_key, doc) => {
    for (const c of doc.components) {
      if (c.kind !== 'connector') continue;
      for (const cv of c.cavities) expect(typeof cv === 'object' && (cv.function ?? '').length > 0, `${c.id}`).toBe(true);
    }
    for (const w of doc.wires) {
      expect(w.color, w.id).toBeTruthy();
      expect(w.circuit, w.id).toBeTruthy();
      expect(w.lengthM, w.id).toBeGreaterThan(0);
    }
  });

  it.each(docs)('%s has exactly two bus terminators (ISO 11898-2: 120 ohms at each end)', (_key, doc) => {
    expect(terminators(doc)).toHaveLength(2);
  });

  it('attachment ids never collide with the loader, apart from the carrier stand-in', () => {
    const loaderIds = new Set([...krT78MainHarness.components, ...krT78MainHarness.wires, ...krT78MainHarness.clamps].map((x) => x.id));
    for (const doc of [fwM60MulcherHarness, fwG72GrappleHarness]) {
      for (const x of [...doc.components, ...doc.wires, ...doc.clamps]) {
        if (isCarrierStandIn(x.id) || x.id.startsWith('CW')) continue;
        expect(loaderIds.has(x.id), x.id).toBe(false);
      }
    }
  });

  it('the fitted documents keep the attachment plug mated and drop the dust cap', () => {
    for (const key of ['kr-t78-with-fw-m60', 'kr-t78-with-fw-g72'] as const) {
      const doc = demoHarnesses[key];
      const ids = doc.components.map((c) => c.id);
      expect(ids).not.toContain('XCAP');
      expect(ids.some((id) => id.startsWith('CAR-'))).toBe(false);
      const half = doc.components.find((c) => c.kind === 'connector' && c.matesWith === 'X40');
      expect(half, key).toBeTruthy();
    }
  });

  it('the walk-through clamp holds the attachment power pair', () => {
    const cl = krT78MainHarness.clamps.find((c) => c.id === walkThroughFault.fault.ref);
    expect(cl?.wires).toEqual(['W27', 'W28']);
    const w27 = krT78MainHarness.wires.find((w) => w.id === 'W27');
    expect(w27).toMatchObject({ from: 'X30B.1', to: 'X40.1' });
  });

  it('every demo fault names parts and states that exist in its document', () => {
    for (const f of demoFaults) {
      const doc = demoHarnesses[f.harness];
      const refs = new Set([...doc.components, ...doc.wires, ...doc.clamps].map((x) => x.id));
      expect(refs.has(f.fault.ref), f.id).toBe(true);
      const states = new Set(doc.states.map((s) => s.id));
      for (const o of f.observations) {
        if ('state' in o) expect(states.has(o.state), `${f.id} ${o.state}`).toBe(true);
        if ('fuse' in o) expect(refs.has(o.fuse)).toBe(true);
      }
    }
  });
});

describe('demo library', () => {
  it('names the demo shop', () => {
    expect(DEMO_SHOP_NAME).toBe('Tamarack Valley Equipment Repair');
  });

  it('links makers, models, harnesses, customers and units consistently', () => {
    const makerIds = new Set(makers.map((m) => m.id));
    const modelIds = new Set(models.map((m) => m.id));
    for (const m of models) {
      expect(makerIds.has(m.makerId)).toBe(true);
      for (const f of m.fitsModels) expect(modelIds.has(f)).toBe(true);
    }
    for (const l of harnessLinks) {
      expect(modelIds.has(l.modelId)).toBe(true);
      expect(demoHarnesses[l.key]).toBeTruthy();
    }
    expect(new Set(harnessLinks.map((l) => l.key)).size).toBe(Object.keys(demoHarnesses).length);
    const customerIds = new Set(customers.map((c) => c.id));
    for (const u of units) {
      expect(customerIds.has(u.customerId)).toBe(true);
      expect(modelIds.has(u.modelId)).toBe(true);
    }
    expect(new Set(units.map((u) => u.serialNumber)).size).toBe(units.length);
    expect(models.filter((m) => m.kind === 'attachment').length).toBeGreaterThanOrEqual(2);
  });
});

describe('demo bus catalogue', () => {
  // Source addresses as the module labels of the harnesses give them.
  const addressOf: Record<string, number> = { ECU: 0x00, MCU: 0x21, DSP: 0x28, ACU: 0x4a };

  it('SAE J1939-21 worked examples split as references.md says (from memory)', () => {
    expect(splitJ1939(0x0cf00400)).toMatchObject({ priority: 3, pgn: 61444, source: 0x00 });
    expect(splitJ1939(0x18fef100)).toMatchObject({ priority: 6, pgn: 65265, source: 0x00 });
  });

  it.each(Object.entries(demoCatalogues))('%s: every sender is a bus module of the document and sends from its own address', (key, messages) => {
    const doc = demoHarnesses[key as keyof typeof demoHarnesses];
    for (const m of messages) {
      const sender = doc.components.find((c) => c.id === m.sender);
      expect(sender?.kind, m.id).toBe('module');
      expect(sender?.kind === 'module' && sender.pins.some((p) => p.role === 'can_h')).toBe(true);
      const split = splitJ1939(parseInt(m.id, 16));
      expect(split?.source, m.id).toBe(addressOf[m.sender!]);
      expect(sender?.label).toContain(`0x${addressOf[m.sender!].toString(16).toUpperCase().padStart(2, '0')}`);
    }
  });

  it('invented identifiers sit in the proprietary B range (PDU format 0xFF, SAE J1939-21)', () => {
    const published = new Set([61444, 65262, 65226]);
    for (const m of krT78BusMessages) {
      const split = splitJ1939(parseInt(m.id, 16))!;
      if (!published.has(split.pgn)) expect(split.pf, m.id).toBe(0xff);
    }
  });
});

describe('demo captures', () => {
  const dir = fileURLToPath(new URL('../../seeds/captures/', import.meta.url));
  const rest = readFileSync(dir + 'aux-rest.log', 'utf8');
  const moved = readFileSync(dir + 'aux-moved.log', 'utf8');

  it('the committed files are what the deterministic script writes', () => {
    expect(rest).toBe(restCapture());
    expect(moved).toBe(movedCapture());
  });

  it('are a few thousand candump -l lines each, under 500 KB, with no bad line', () => {
    for (const name of ['aux-rest.log', 'aux-moved.log']) expect(statSync(dir + name).size).toBeLessThan(500_000);
    for (const text of [rest, moved]) {
      expect(text.split('\n')[0]).toMatch(/^\(\d{10}\.\d{6}\) can0 [0-9A-F]{8}#[0-9A-F]{16}$/); // SocketCAN candump -l format
      const s = summariseCandump(text);
      expect(s.badLineCount).toBe(0);
      expect(s.frames).toBeGreaterThan(2000);
      expect(s.frames).toBeLessThan(10000);
      const aux = s.identifiers.find((i) => i.key === auxiliaryControlSignal.id);
      expect(aux?.rateHz).toBeCloseTo(50, 0);
    }
  });

  it('only the catalogued auxiliary byte changes between rest and moved', () => {
    const cmp = compareCaptures(summariseCandump(rest), summariseCandump(moved));
    expect(cmp.onlyAtRest).toEqual([]);
    expect(cmp.onlyMoved).toEqual([]);
    expect(cmp.changedBytes.map((b) => [b.key, b.index])).toEqual([[auxiliaryControlSignal.id, auxiliaryControlSignal.byte]]);
    const b = cmp.changedBytes[0];
    expect(b.rest).toMatchObject({ min: auxiliaryControlSignal.rest, max: auxiliaryControlSignal.rest });
    expect(b.moved).toMatchObject({ min: auxiliaryControlSignal.reverseEnd, max: auxiliaryControlSignal.forwardEnd });
    const signal = krT78BusMessages.find((m) => m.id === b.key)?.signals?.[0];
    expect(signal?.byte).toBe(b.index);
    expect(signal?.values?.[String(auxiliaryControlSignal.rest)]).toMatch(/rest/i);
  });
});
