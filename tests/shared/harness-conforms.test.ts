/**
 * conformsToSchema is the quick path of validateDocument: it must never say yes where zod's
 * schema says no. Here it is compared with zod itself on valid documents and on thousands of
 * randomly broken ones (fast-check).
 */
import { isDeepStrictEqual } from 'node:util';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { validateDocument } from '../../shared/harness';
import { conformsToSchema } from '../../shared/harness/conforms';
import { harnessDocumentSchema, type HarnessDocument } from '../../shared/harness/schema';
import { loaderDoc } from '../support/fixtures/documents';
import { makeHarnessText } from '../support/make-harness';

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };

/** The fixture with a bus message catalogue, so every part of the schema is present. */
function withMessages(): HarnessDocument {
  const d = loaderDoc();
  d.messages = [
    { id: '18FEF100', extended: true, sender: 'ACU', name: 'Flow', signals: [{ name: 'flow', byte: 3, scale: 0.4, offset: -2, unit: '%', values: { '0': 'off' } }, { name: 'mode', startBit: 12, length: 4, notes: 'n' }] },
    { id: '1A0', extended: false, meaning: 'status', notes: 'x' },
  ];
  d.label = 'fixture';
  d.wires[0].ohms = 0.01;
  for (const c of d.components) {
    if (c.kind === 'relay') c.pullInVolts = 7;
    if (c.kind === 'module') c.poweredAboveVolts = 6;
  }
  return d;
}

const bases: HarnessDocument[] = [withMessages(), JSON.parse(makeHarnessText(3))];

/** Every place in a value: a path of keys and indexes. */
function places(v: Json, path: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
  out.push(path);
  if (Array.isArray(v)) v.forEach((x, i) => places(x, [...path, i], out));
  else if (v && typeof v === 'object') for (const k of Object.keys(v)) places(v[k], [...path, k], out);
  return out;
}
const at = (v: Json, path: (string | number)[]): Json => path.reduce<Json>((x, k) => (x as Record<string, Json>)[k as string], v);

/** One random change at a path: replace, remove, add a field or an element, or nudge a number or text. */
const change = fc.oneof(
  fc.record({ op: fc.constant('replace' as const), value: fc.jsonValue({ maxDepth: 2 }) as fc.Arbitrary<Json> }),
  fc.record({ op: fc.constant('remove' as const) }),
  fc.record({ op: fc.constant('add' as const), key: fc.oneof(fc.string({ maxLength: 8 }), fc.constantFrom('id', 'kind', 'ohms', 'mm2', 'awg', 'role', 'from', 'label')), value: fc.jsonValue({ maxDepth: 1 }) as fc.Arbitrary<Json> }),
  fc.record({ op: fc.constant('number' as const), value: fc.oneof(fc.constantFrom(0, -0, -1, 0.5, 1, 1.5, 7, 8, 56, 57, -3, -4, 1000, 1001, -273.15, -274, 511, 512, 64, 65, 1e300), fc.double({ noNaN: true, noDefaultInfinity: true })) }),
  fc.record({ op: fc.constant('text' as const), value: fc.oneof(fc.constantFrom('', 'x', 'a b', 'BATT.+', 'X1.', '.1', 'RD', 'RD/WH', 'GNYE', 'RD/WH/BK', '0x1FFFFFFF', 'G', '87a', 'supply', 'output', 'connector', 'x'.repeat(33), 'x'.repeat(65), 'x'.repeat(4001)), fc.string({ maxLength: 12 })) }),
  fc.record({ op: fc.constant('copy' as const) }),
  fc.record({ op: fc.constant('rename' as const), key: fc.oneof(fc.constantFrom('', '__proto__', 'BATT', 'bad id', 'x'.repeat(33), 'x'.repeat(65)), fc.string({ maxLength: 8 })) }),
);

/** Where a change applies: numbers and texts go to leaves of their own type, so the boundaries are tried. */
function placesFor(doc: Json, op: string, all: (string | number)[][]): (string | number)[][] {
  const kind = op === 'number' ? 'number' : op === 'text' ? 'string' : op === 'rename' ? 'object' : null;
  if (!kind) return all;
  const fit = all.filter((p) => {
    const v = at(doc, p);
    return kind === 'object' ? !!v && typeof v === 'object' && !Array.isArray(v) && Object.keys(v).length > 0 : typeof v === kind;
  });
  return fit.length ? fit : all;
}

function apply(doc: Json, path: (string | number)[], c: { op: string; value?: Json; key?: string }): void {
  if (path.length === 0) return;
  const parent = at(doc, path.slice(0, -1)) as Record<string, Json> | Json[];
  const key = path[path.length - 1];
  const here = at(doc, path);
  switch (c.op) {
    case 'replace': case 'number': case 'text':
      (parent as Record<string, Json>)[key as string] = c.value as Json;
      break;
    case 'remove':
      if (Array.isArray(parent)) parent.splice(key as number, 1);
      else delete parent[key as string];
      break;
    case 'add':
      if (Array.isArray(here)) here.push(c.value as Json);
      else if (here && typeof here === 'object') here[c.key as string] = c.value as Json;
      else (parent as Record<string, Json>)[key as string] = { [c.key as string]: c.value as Json };
      break;
    case 'rename': {
      if (!here || typeof here !== 'object' || Array.isArray(here)) break;
      const keys = Object.keys(here);
      const old = keys[(path.length * 31) % keys.length];
      const value = here[old];
      delete here[old];
      Object.defineProperty(here, c.key as string, { value, enumerable: true, writable: true, configurable: true });
      break;
    }
    case 'copy':
      if (Array.isArray(parent)) parent.push(structuredClone(here));
      else if (Array.isArray(here) && here.length) here.push(structuredClone(here[0]));
      break;
  }
}

const hasProtoKey = (v: unknown): boolean =>
  Array.isArray(v) ? v.some(hasProtoKey) : !!v && typeof v === 'object' && (Object.prototype.hasOwnProperty.call(v, '__proto__') || Object.values(v).some(hasProtoKey));

describe('conformsToSchema', () => {
  it('says yes to valid documents, and validateDocument then gives back what zod would', () => {
    for (const base of bases) {
      const input = structuredClone(base);
      expect(conformsToSchema(input)).toBe(true);
      const r = validateDocument(input);
      expect(r.ok).toBe(true);
      const z = harnessDocumentSchema.safeParse(structuredClone(base));
      expect(z.success && r.ok && isDeepStrictEqual(r.doc, z.data)).toBe(true);
    }
  });

  it('agrees with zod on randomly broken documents, and never says yes where zod says no (fast-check)', () => {
    const placesOf = bases.map((b) => places(b as unknown as Json));
    let agreedNo = 0;
    fc.assert(
      fc.property(fc.nat(bases.length - 1), fc.nat(), fc.array(change, { minLength: 1, maxLength: 3 }), (b, pick, changes) => {
        const doc = structuredClone(bases[b]) as unknown as Json;
        for (const [i, c] of changes.entries()) {
          const all = placesFor(doc, c.op, i === 0 ? placesOf[b] : places(doc));
          const path = all[(pick + i * 7919) % all.length];
          try {
            apply(doc, path, c);
          } catch {
            // the path went away with an earlier change
          }
        }
        const quick = conformsToSchema(doc);
        const zod = harnessDocumentSchema.safeParse(doc).success;
        if (quick) expect(zod).toBe(true);
        // zod strips a declared __proto__ key from records, which the quick path refuses to decide.
        if (!hasProtoKey(doc)) expect(quick).toBe(zod);
        if (!zod) agreedNo++;
      }),
      { numRuns: 4000, seed: 20261202 },
    );
    // The changes do break documents: most runs end in a "no" from both.
    expect(agreedNo).toBeGreaterThan(2000);
  }, 120_000);

  it('agrees with zod on every single change of every field of the fixture: boundary numbers, odd texts, fields removed or added', () => {
    const base = withMessages() as unknown as Json;
    const numbers = [0, -0, -1, 0.5, 1, 7, 8, 56, 57, -3, -4, 1000, 1001, -273.15, -274, 511, 512, 64, 65, 200, 201];
    const texts = ['', 'x', 'a b', 'BATT.+', 'X1.', 'RD', 'RD/WH', 'RD/WH/BK', '0x1FFFFFFF', '87a', 'supply', 'x'.repeat(33), 'x'.repeat(65), 'x'.repeat(201), 'x'.repeat(4001)];
    let tried = 0;
    const check = (doc: Json, what: string) => {
      tried++;
      const zod = harnessDocumentSchema.safeParse(doc).success;
      expect(conformsToSchema(doc), what).toBe(zod);
    };
    for (const path of places(base)) {
      const here = at(base, path);
      const variants: { op: string; value?: Json; key?: string }[] =
        typeof here === 'number' ? numbers.map((value) => ({ op: 'number', value }))
        : typeof here === 'string' ? texts.map((value) => ({ op: 'text', value }))
        : [{ op: 'remove' }, { op: 'add', key: 'extra', value: 1 }, { op: 'copy' }, { op: 'replace', value: null }, { op: 'replace', value: 'text' }];
      for (const c of variants) {
        const doc = structuredClone(base);
        apply(doc, path, c);
        check(doc, `${c.op} ${JSON.stringify(c.value ?? c.key ?? '')} at $.${path.join('.')}`);
      }
    }
    expect(tried).toBeGreaterThan(1000);
  });

  it('says no to what only plain JSON could not hold: undefined, class instances, inherited keys', () => {
    const d = withMessages() as unknown as Record<string, unknown>;
    expect(conformsToSchema({ ...d, label: undefined })).toBe(false);
    expect(conformsToSchema(Object.assign(Object.create({ inherited: 1 }), d))).toBe(false);
    class Box { constructor(public id: string) {} }
    const withInstance = structuredClone(d) as { wires: unknown[] };
    withInstance.wires[0] = Object.assign(new Box('W1'), withInstance.wires[0]);
    expect(conformsToSchema(withInstance)).toBe(false);
    // …and validateDocument still answers them on the full path (the guard refuses undefined).
    const r = validateDocument({ ...d, label: undefined });
    expect(!r.ok && r.problems[0].path).toBe('$.label');
  });
});
