import { makeHarnessScript } from '../support/make-harness';
import { execFileSync } from 'node:child_process';
import { isDeepStrictEqual } from 'node:util';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { validateDocument } from '../../shared/harness';
import type { HarnessDocument } from '../../shared/harness/schema';
import { loaderDoc } from '../support/fixtures/documents';

function problemsOf(doc: unknown) {
  const r = validateDocument(doc);
  expect(r.ok).toBe(false);
  return r.ok ? [] : r.problems;
}
function expectProblem(mutate: (d: HarnessDocument & Record<string, unknown>) => void, path: string, message?: RegExp) {
  const d = loaderDoc() as HarnessDocument & Record<string, unknown>;
  mutate(d);
  const ps = problemsOf(d);
  const hit = ps.find((p) => p.path === path);
  expect(hit, `expected a problem at ${path}, got ${JSON.stringify(ps)}`).toBeDefined();
  if (message) expect(hit!.message).toMatch(message);
}
const comp = (d: HarnessDocument, id: string) => d.components.find((c) => c.id === id)! as unknown as Record<string, unknown>;
const D = loaderDoc();
const idx = (d: HarnessDocument, id: string) => d.components.findIndex((c) => c.id === id);

describe('validateDocument', () => {
  it('accepts the fixture and gives back every field as it came (round trip)', () => {
    const d = loaderDoc();
    const r = validateDocument(JSON.parse(JSON.stringify(d)));
    expect(r.ok).toBe(true);
    expect(r.ok && isDeepStrictEqual(r.doc, d)).toBe(true);
    // No defaults injected: the state without sources stays without.
    expect(r.ok && 'sources' in r.doc.states[0]).toBe(false);
  });

  it('accepts make_harness.py output and round-trips it', () => {
    const text = execFileSync('python3', [makeHarnessScript, '20'], { encoding: 'utf8' });
    const r = validateDocument(JSON.parse(text));
    expect(r.ok).toBe(true);
    expect(r.ok && isDeepStrictEqual(r.doc, JSON.parse(text))).toBe(true);
  }, 60_000);

  it('schema rules, each with its JSON path', () => {
    expectProblem((d) => { d.extra = 1; }, '$.extra', /Unknown field/);
    expectProblem((d) => { (d.wires[3] as Record<string, unknown>).colour = 'RD'; }, '$.wires[3].colour', /Unknown field/);
    expectProblem((d) => { d.format = 'other' as 'wirewalk-harness'; }, '$.format');
    expectProblem((d) => { d.version = 2 as 1; }, '$.version');
    expectProblem((d) => { d.components[0].id = 'bad id!'; }, '$.components[0].id');
    expectProblem((d) => { d.wires[2].from = 'NO_DOT'; }, '$.wires[2].from');
    expectProblem((d) => { d.wires[2].color = 'RED'; }, '$.wires[2].color');
    expectProblem((d) => { d.wires[2].color = 'RD/WH/BK'; }, '$.wires[2].color');
    expectProblem((d) => { d.wires[2].lengthM = -1; }, '$.wires[2].lengthM');
    expectProblem((d) => { d.wires[2].size = { mm2: 1, awg: 18 } as unknown as { mm2: number }; }, '$.wires[2].size');
    expectProblem((d) => { comp(d, 'F1').amps = -5; }, `$.components[${idx(D, 'F1')}].amps`);
    expectProblem((d) => { comp(d, 'RT1').ohms = -120; }, `$.components[${idx(D, 'RT1')}].ohms`);
    expectProblem((d) => { comp(d, 'BATT').volts = -12; }, `$.components[${idx(D, 'BATT')}].volts`);
    expectProblem((d) => { comp(d, 'BATT').kind = 'capacitor'; }, `$.components[${idx(D, 'BATT')}].kind`);
    expectProblem((d) => { comp(d, 'F1').coilOhms = 3; }, `$.components[${idx(D, 'F1')}].coilOhms`, /Unknown field/);
    expectProblem((d) => { (comp(d, 'ACU').pins as Record<string, unknown>[])[0].role = 'power'; }, `$.components[${idx(D, 'ACU')}].pins[0].role`);
    expectProblem((d) => { d.clamps[0].at = 1.5; }, '$.clamps[0].at');
    expectProblem((d) => { delete (d as Record<string, unknown>).wires; }, '$.wires');
    expectProblem((d) => { d.nominalVolts = Infinity; }, '$.nominalVolts');
  });

  it('semantic rules, each with its JSON path', () => {
    expectProblem((d) => { d.components.push({ id: 'F1', kind: 'fuse', amps: 5 }); }, `$.components[${loaderDoc().components.length}].id`, /Duplicate component/);
    expectProblem((d) => { d.wires.push({ ...d.wires[0] }); }, `$.wires[${loaderDoc().wires.length}].id`, /Duplicate wire/);
    expectProblem((d) => { d.clamps.push({ ...d.clamps[0] }); }, '$.clamps[2].id', /Duplicate clamp/);
    expectProblem((d) => { d.states.push({ ...d.states[0] }); }, `$.states[${loaderDoc().states.length}].id`, /Duplicate state/);
    expectProblem((d) => { (comp(d, 'X1F').cavities as string[])[1] = '1'; }, `$.components[${idx(D, 'X1F')}].cavities[1]`, /Duplicate cavity/);
    expectProblem((d) => { (comp(d, 'ACU').pins as { id: string }[])[1].id = '1'; }, `$.components[${idx(D, 'ACU')}].pins[1].id`, /Duplicate pin/);
    expectProblem((d) => { d.wires[3].to = 'NOPE.1'; }, '$.wires[3].to', /No component/);
    expectProblem((d) => { d.wires[3].to = 'F1.3'; }, '$.wires[3].to', /no pin "3"/);
    expectProblem((d) => { d.wires[3].to = 'BATT.1'; }, '$.wires[3].to', /no pin "1"/);
    expectProblem((d) => { comp(d, 'K1').normallyClosed = false; }, '$.wires[18].from', /not normallyClosed/);
    expectProblem((d) => { comp(d, 'X1').matesWith = 'X9'; }, `$.components[${idx(D, 'X1')}].matesWith`, /No component/);
    expectProblem((d) => { comp(d, 'X1').matesWith = 'F1'; }, `$.components[${idx(D, 'X1')}].matesWith`, /not a connector/);
    expectProblem((d) => { comp(d, 'X1F').matesWith = 'X1'; }, `$.components[${idx(D, 'X1')}].matesWith`, /both halves/);
    expectProblem((d) => { d.components.push({ id: 'X2', kind: 'connector', cavities: ['1', '2', '3', '4', '5', '6'], matesWith: 'X1F' }); }, `$.components[${loaderDoc().components.length}].matesWith`, /already mated/);
    expectProblem((d) => { (comp(d, 'X1F').cavities as string[]).pop(); }, `$.components[${idx(D, 'X1')}].matesWith`, /same number of cavities/);
    expectProblem((d) => { (comp(d, 'KEY').positions as Record<string, string[][]>).on[0][1] = 'START'; }, `$.components[${idx(D, 'KEY')}].positions.on[0][1]`, /no pin "START"/);
    expectProblem((d) => { (comp(d, 'ACU').pins as { from?: string }[])[4].from = '2'; }, `$.components[${idx(D, 'ACU')}].pins[4].from`, /supply pin/);
    expectProblem((d) => { delete comp(d, 'LAMP').watts; }, `$.components[${idx(D, 'LAMP')}]`, /ohms or watts/);
    expectProblem((d) => { d.states[0].switches = { NOPE: 'on' }; }, '$.states[0].switches.NOPE', /No component/);
    expectProblem((d) => { d.states[0].switches = { KEY: 'start' }; }, '$.states[0].switches.KEY', /no position/);
    expectProblem((d) => { d.states[0].switches = { F1: 'on' }; }, '$.states[0].switches.F1', /not a switch/);
    expectProblem((d) => { d.states[0].sources = { F1: 12 }; }, '$.states[0].sources.F1', /not a battery/);
    expectProblem((d) => { d.states[0].outputs = ['ACU.1']; }, '$.states[0].outputs[0]', /not an output/);
    expectProblem((d) => { d.states[0].outputs = ['F1.1']; }, '$.states[0].outputs[0]', /not a module/);
    expectProblem((d) => { d.states[0].unplugged = ['F1']; }, '$.states[0].unplugged[0]', /not a connector/);
    expectProblem((d) => { d.clamps[0].wires.push('W999'); }, '$.clamps[0].wires[2]', /No wire/);
    expectProblem((d) => { d.messages = [{ id: '800', extended: false }]; }, '$.messages[0].id', /7FF/);
    expectProblem((d) => { d.messages = [{ id: '18FEF100', extended: true, sender: 'NOPE' }]; }, '$.messages[0].sender', /No component/);
  });

  it('restricts component and pin ids only, as the contract does: other ids are free text', () => {
    const d = loaderDoc();
    d.wires[0].id = 'W-1.2';
    d.states[0].id = 'key off (rest)';
    d.clamps[0].wires = ['W-1.2'];
    expect(validateDocument(d).ok).toBe(true);
  });

  it('accepts a bus message catalogue', () => {
    const d = loaderDoc();
    d.messages = [{ id: '18FEF100', extended: true, sender: 'ACU', name: 'Flow', signals: [{ name: 'flow', byte: 3, scale: 0.4, unit: '%', values: { '0': 'off' } }, { name: 'mode', startBit: 12, length: 4 }] }];
    expect(validateDocument(d).ok).toBe(true);
  });

  it('never throws: hostile, deep, huge and odd inputs give problems at $', () => {
    const deep: Record<string, unknown> = {};
    let cur = deep;
    for (let i = 0; i < 100000; i++) { cur.a = {}; cur = cur.a as Record<string, unknown>; }
    const cyclic: Record<string, unknown> = { format: 'wirewalk-harness' };
    cyclic.self = cyclic;
    const hostile = new Proxy({}, { ownKeys() { throw new Error('no'); }, get() { throw new Error('no'); } });
    const getter = Object.defineProperty({}, 'format', { enumerable: true, get() { throw new Error('boom'); } });
    for (const input of [undefined, null, 0, 'x', [], deep, cyclic, hostile, getter, new Date(), () => 1, Symbol('s'), BigInt(1), { components: new Array(300_000).fill(0) }]) {
      let r: ReturnType<typeof validateDocument> | undefined;
      expect(() => { r = validateDocument(input); }).not.toThrow();
      expect(r!.ok).toBe(false);
      expect(r!.ok ? [] : r!.problems.length).toBeGreaterThan(0);
    }
  }, 60_000);

  it('property: any JSON value is answered without throwing (fast-check)', () => {
    fc.assert(fc.property(fc.jsonValue({ maxDepth: 6 }), (v) => {
      const r = validateDocument(v);
      return r.ok === false && r.problems.every((p) => p.path.startsWith('$'));
    }), { numRuns: 300 });
  }, 60_000);

  it('property: a valid document with one random breaking change is rejected with the path of the change (fast-check)', () => {
    type Mut = { apply: (d: HarnessDocument & Record<string, unknown>, i: number) => string };
    const muts: Mut[] = [
      { apply: (d, i) => { const k = i % d.wires.length; (d.wires[k] as Record<string, unknown>).gauge = 1; return `$.wires[${k}].gauge`; } },
      { apply: (d, i) => { const k = i % d.wires.length; d.wires[k].to = 'ZZ.9'; return `$.wires[${k}].to`; } },
      { apply: (d, i) => { const k = i % d.wires.length; d.wires[k].lengthM = -0.5; return `$.wires[${k}].lengthM`; } },
      { apply: (d, i) => { const k = i % d.wires.length; d.wires[k].color = 'XX'; return `$.wires[${k}].color`; } },
      { apply: (d, i) => { const k = i % d.components.length; d.components[k].id = 'bad.id'; return `$.components[${k}].id`; } },
      { apply: (d, i) => { const k = i % d.components.length; (d.components[k] as Record<string, unknown>).zap = true; return `$.components[${k}].zap`; } },
      { apply: (d, i) => { const k = i % d.states.length; d.states[k].unplugged = ['NOPE']; return `$.states[${k}].unplugged[0]`; } },
      { apply: (d, i) => { const k = i % d.clamps.length; d.clamps[k].wires = ['NOPE']; return `$.clamps[${k}].wires[0]`; } },
    ];
    fc.assert(fc.property(fc.integer({ min: 0, max: muts.length - 1 }), fc.nat(1000), (m, i) => {
      const d = loaderDoc() as HarnessDocument & Record<string, unknown>;
      const path = muts[m].apply(d, i);
      const r = validateDocument(d);
      return !r.ok && r.problems.some((p) => p.path === path);
    }), { numRuns: 200 });
  }, 60_000);
});
