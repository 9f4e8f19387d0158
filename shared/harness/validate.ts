/**
 * validateDocument: the schema plus the rules a schema cannot express
 * (ids that must exist, must be unique, pins per component kind, mates,
 * states). Never throws, whatever the input: sizes and depth are checked
 * before parsing, and anything unexpected becomes a problem at `$`.
 */
import type { z } from 'zod';
import { conformsToSchema } from './conforms';
import { validationLimits } from './limits';
import { componentPinIds, harnessDocumentSchema, type Component, type HarnessDocument } from './schema';

export interface Problem {
  /** JSON path of the offending value, e.g. `$.wires[3].to`. */
  path: string;
  message: string;
}

export type ValidationResult = { ok: true; doc: HarnessDocument } | { ok: false; problems: Problem[] };

export { validationLimits } from './limits';

const identRe = /^[A-Za-z_$][A-Za-z0-9_$]*$/;

/** `$`, `.key`, `[n]` or `["odd key"]` per segment. */
export function formatPath(path: readonly PropertyKey[]): string {
  let out = '$';
  for (const seg of path) {
    if (typeof seg === 'number') out += `[${seg}]`;
    else if (typeof seg === 'string' && identRe.test(seg)) out += `.${seg}`;
    else out += `[${JSON.stringify(String(seg))}]`;
  }
  return out;
}

/** Walks the raw input without recursion; answers a problem if it is too deep, too big or not plain data. */
function guard(input: unknown): Problem | null {
  // Fast pass without paths; on a problem, a second pass finds where.
  const vals: unknown[] = [input];
  const depths: number[] = [0];
  let count = 0;
  let bad = false;
  while (vals.length) {
    const v = vals.pop();
    const d = depths.pop()!;
    if (++count > validationLimits.maxValues) return { path: '$', message: `The document has more than ${validationLimits.maxValues} values` };
    if (v === null || typeof v === 'boolean' || typeof v === 'number') continue;
    if (typeof v === 'string') {
      if (v.length > validationLimits.maxStringLength) { bad = true; break; }
      continue;
    }
    if (typeof v !== 'object' || d >= validationLimits.maxDepth) { bad = true; break; }
    if (Array.isArray(v)) {
      if (v.length > validationLimits.maxValues) return { path: '$', message: 'A list is too long' };
      for (let i = v.length - 1; i >= 0; i--) { vals.push(v[i]); depths.push(d + 1); }
    } else {
      const proto = Object.getPrototypeOf(v);
      if (proto !== Object.prototype && proto !== null) { bad = true; break; }
      const o = v as Record<string, unknown>;
      const keys = Object.keys(o);
      for (let i = keys.length - 1; i >= 0; i--) { vals.push(o[keys[i]]); depths.push(d + 1); }
    }
  }
  return bad ? locate(input) : null;
}

/** The slow pass of guard: the first offending value with its path. */
function locate(input: unknown): Problem | null {
  const stack: { v: unknown; path: PropertyKey[] }[] = [{ v: input, path: [] }];
  while (stack.length) {
    const { v, path } = stack.pop()!;
    if (v === null || typeof v === 'boolean' || typeof v === 'number') continue;
    if (typeof v === 'string') {
      if (v.length > validationLimits.maxStringLength) return { path: formatPath(path), message: 'Text is too long' };
      continue;
    }
    if (typeof v !== 'object') return { path: formatPath(path), message: `Unexpected ${typeof v} (a JSON document holds only objects, arrays, strings, numbers, booleans and null)` };
    if (path.length >= validationLimits.maxDepth) return { path: formatPath(path.slice(0, 8)) + '…', message: `Nested deeper than ${validationLimits.maxDepth} levels` };
    if (Array.isArray(v)) {
      for (let i = v.length - 1; i >= 0; i--) stack.push({ v: v[i], path: [...path, i] });
    } else {
      const proto = Object.getPrototypeOf(v);
      if (proto !== Object.prototype && proto !== null) return { path: formatPath(path), message: 'Expected a plain JSON object' };
      const o = v as Record<string, unknown>;
      const keys = Object.keys(o);
      for (let i = keys.length - 1; i >= 0; i--) stack.push({ v: o[keys[i]], path: [...path, keys[i]] });
    }
  }
  return { path: '$', message: 'The document could not be read' };
}

function issueMessage(issue: z.core.$ZodIssue): string {
  if (issue.code === 'invalid_union' && 'note' in issue && issue.note === 'No matching discriminator') {
    const opts = (issue as { options?: unknown[] }).options;
    return `Unknown value; expected one of ${Array.isArray(opts) ? opts.map((o) => JSON.stringify(o)).join(', ') : 'the listed kinds'}`;
  }
  return issue.message;
}

/**
 * Validate an imported document; on success the document keeps every field that came in.
 * A document that already conforms to the schema is used as it is (no copy); otherwise
 * the guard and zod find the problems.
 */
export function validateDocument(input: unknown): ValidationResult {
  try {
    if (conformsToSchema(input)) {
      const doc = input as HarnessDocument;
      const problems = semanticProblems(doc);
      if (problems.length) return { ok: false, problems: problems.slice(0, validationLimits.maxProblems) };
      return { ok: true, doc };
    }
    const g = guard(input);
    if (g) return { ok: false, problems: [g] };
    const parsed = harnessDocumentSchema.safeParse(input);
    if (!parsed.success) {
      const problems: Problem[] = [];
      for (const issue of parsed.error.issues) {
        if (problems.length >= validationLimits.maxProblems) break;
        if (issue.code === 'unrecognized_keys') {
          for (const k of issue.keys) problems.push({ path: formatPath([...issue.path, k]), message: `Unknown field "${k}"` });
        } else {
          problems.push({ path: formatPath(issue.path), message: issueMessage(issue) });
        }
      }
      return { ok: false, problems };
    }
    const problems = semanticProblems(parsed.data);
    if (problems.length) return { ok: false, problems: problems.slice(0, validationLimits.maxProblems) };
    return { ok: true, doc: parsed.data };
  } catch (err) {
    return { ok: false, problems: [{ path: '$', message: `The document could not be read (${err instanceof Error ? err.message : 'unexpected input'})` }] };
  }
}

/** The rules beyond the schema. Exported for the editor, which checks drafts as they change. */
export function semanticProblems(doc: HarnessDocument): Problem[] {
  const problems: Problem[] = [];
  const add = (path: PropertyKey[], message: string) => {
    if (problems.length < validationLimits.maxProblems) problems.push({ path: formatPath(path), message });
  };

  // Components, their pins.
  const byId = new Map<string, { c: Component; i: number; pins: Set<string> }>();
  doc.components.forEach((c, i) => {
    if (byId.has(c.id)) {
      add(['components', i, 'id'], `Duplicate component id "${c.id}" (first at $.components[${byId.get(c.id)!.i}])`);
      return;
    }
    const pins = new Set<string>();
    const ids = componentPinIds(c);
    ids.forEach((p, j) => {
      if (pins.has(p)) {
        const where: PropertyKey[] = c.kind === 'connector' ? ['cavities', j] : c.kind === 'module' ? ['pins', j, 'id'] : ['pins', j];
        add(['components', i, ...where], `Duplicate ${c.kind === 'connector' ? 'cavity' : 'pin'} "${p}" in ${c.id}`);
      }
      pins.add(p);
    });
    byId.set(c.id, { c, i, pins });
  });

  const pinExists = (ref: string): string | null => {
    const dot = ref.indexOf('.');
    const cid = ref.slice(0, dot);
    const pid = ref.slice(dot + 1);
    const entry = byId.get(cid);
    if (!entry) return `No component "${cid}"`;
    if (!entry.pins.has(pid)) {
      if (entry.c.kind === 'relay' && pid === '87a') return `Relay ${cid} has no 87a: it is not normallyClosed`;
      return `${entry.c.kind} ${cid} has no pin "${pid}" (pins: ${[...entry.pins].join(', ') || 'none'})`;
    }
    return null;
  };

  // Per-kind rules.
  const matedBy = new Map<string, string>();
  doc.components.forEach((c, i) => {
    if (c.kind === 'load' && c.ohms === undefined && c.watts === undefined) add(['components', i], `Load ${c.id} needs ohms or watts`);
    if (c.kind === 'switch') {
      const pins = new Set(c.pins);
      const names = Object.keys(c.positions);
      if (names.length === 0) add(['components', i, 'positions'], `Switch ${c.id} needs at least one position`);
      for (const name of names) {
        c.positions[name].forEach((pair, j) => {
          pair.forEach((p, k) => {
            if (!pins.has(p)) add(['components', i, 'positions', name, j, k], `Switch ${c.id} has no pin "${p}"`);
          });
        });
      }
    }
    if (c.kind === 'module') {
      c.pins.forEach((p, j) => {
        if (p.role === 'output') {
          const src = c.pins.find((q) => q.id === p.from);
          if (!src || src.role !== 'supply') add(['components', i, 'pins', j, 'from'], `Output ${c.id}.${p.id} must name a supply pin of ${c.id}`);
        }
      });
    }
    if (c.kind === 'connector' && c.matesWith !== undefined) {
      const other = byId.get(c.matesWith);
      const path = ['components', i, 'matesWith'];
      if (c.matesWith === c.id) add(path, `Connector ${c.id} cannot mate with itself`);
      else if (!other) add(path, `No component "${c.matesWith}" to mate with`);
      else if (other.c.kind !== 'connector') add(path, `${c.matesWith} is a ${other.c.kind}, not a connector half`);
      else {
        if (other.c.matesWith === c.id) add(path, `The pair ${c.id}–${c.matesWith} is declared on both halves; declare it on one half only`);
        if (other.c.cavities.length !== c.cavities.length) {
          add(path, `Mated halves must have the same number of cavities (${c.id} has ${c.cavities.length}, ${c.matesWith} has ${other.c.cavities.length})`);
        }
        const prev = matedBy.get(c.matesWith);
        if (prev !== undefined && prev !== c.id) add(path, `${c.matesWith} is already mated by ${prev}`);
        else matedBy.set(c.matesWith, c.id);
        if (other.c.matesWith !== undefined && other.c.matesWith !== c.id) add(path, `${c.matesWith} already mates with ${other.c.matesWith}`);
      }
    }
  });

  // Wires.
  const wireIds = new Map<string, number>();
  doc.wires.forEach((w, i) => {
    if (wireIds.has(w.id)) add(['wires', i, 'id'], `Duplicate wire id "${w.id}" (first at $.wires[${wireIds.get(w.id)}])`);
    else wireIds.set(w.id, i);
    const f = pinExists(w.from);
    if (f) add(['wires', i, 'from'], f);
    const t = pinExists(w.to);
    if (t) add(['wires', i, 'to'], t);
  });

  // Clamps.
  const clampIds = new Map<string, number>();
  doc.clamps.forEach((cl, i) => {
    if (clampIds.has(cl.id)) add(['clamps', i, 'id'], `Duplicate clamp id "${cl.id}"`);
    else clampIds.set(cl.id, i);
    cl.wires.forEach((w, j) => {
      if (!wireIds.has(w)) add(['clamps', i, 'wires', j], `No wire "${w}"`);
    });
  });

  // States.
  const stateIds = new Map<string, number>();
  doc.states.forEach((s, i) => {
    if (stateIds.has(s.id)) add(['states', i, 'id'], `Duplicate state id "${s.id}"`);
    else stateIds.set(s.id, i);
    for (const [sw, pos] of Object.entries(s.switches)) {
      const e = byId.get(sw);
      if (!e) add(['states', i, 'switches', sw], `No component "${sw}"`);
      else if (e.c.kind !== 'switch') add(['states', i, 'switches', sw], `${sw} is a ${e.c.kind}, not a switch`);
      else if (!Object.prototype.hasOwnProperty.call(e.c.positions, pos)) {
        add(['states', i, 'switches', sw], `Switch ${sw} has no position "${pos}" (positions: ${Object.keys(e.c.positions).join(', ')})`);
      }
    }
    for (const b of Object.keys(s.sources ?? {})) {
      const e = byId.get(b);
      if (!e) add(['states', i, 'sources', b], `No component "${b}"`);
      else if (e.c.kind !== 'battery') add(['states', i, 'sources', b], `${b} is a ${e.c.kind}, not a battery`);
    }
    (s.outputs ?? []).forEach((ref, j) => {
      const dot = ref.indexOf('.');
      const e = byId.get(ref.slice(0, dot));
      const pid = ref.slice(dot + 1);
      if (!e) add(['states', i, 'outputs', j], `No component "${ref.slice(0, dot)}"`);
      else if (e.c.kind !== 'module') add(['states', i, 'outputs', j], `${e.c.id} is a ${e.c.kind}, not a module`);
      else {
        const p = e.c.pins.find((q) => q.id === pid);
        if (!p) add(['states', i, 'outputs', j], `Module ${e.c.id} has no pin "${pid}"`);
        else if (p.role !== 'output') add(['states', i, 'outputs', j], `${ref} is a ${p.role} pin, not an output`);
      }
    });
    (s.unplugged ?? []).forEach((cid, j) => {
      const e = byId.get(cid);
      if (!e) add(['states', i, 'unplugged', j], `No component "${cid}"`);
      else if (e.c.kind !== 'connector') add(['states', i, 'unplugged', j], `${cid} is a ${e.c.kind}, not a connector half`);
    });
  });

  // Bus messages.
  (doc.messages ?? []).forEach((m, i) => {
    const value = parseInt(m.id.replace(/^0x/i, ''), 16);
    if (m.extended ? value > 0x1fffffff : value > 0x7ff) {
      add(['messages', i, 'id'], m.extended ? 'A 29-bit identifier is at most 1FFFFFFF' : 'An 11-bit identifier is at most 7FF');
    }
    if (m.sender !== undefined && !byId.has(m.sender)) add(['messages', i, 'sender'], `No component "${m.sender}"`);
    (m.signals ?? []).forEach((sig, j) => {
      const hasByte = sig.byte !== undefined;
      const hasBits = sig.startBit !== undefined && sig.length !== undefined;
      if (!hasByte && !hasBits) add(['messages', i, 'signals', j], 'A signal needs byte, or startBit and length');
    });
  });

  return problems;
}
