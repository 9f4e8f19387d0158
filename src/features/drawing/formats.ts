/**
 * Text forms of the list fields a lead types in the side panel, so nobody
 * edits JSON: cavities one per line (`3: Work light feed`), switch positions
 * (`on: B-IGN, B-ACC`), module pins (`1 supply 150: Supply`). Pure.
 */
import type { Cavity, ModulePin, SwitchComponent } from '@shared/harness';

export function cavitiesToText(cavities: Cavity[]): string {
  return cavities.map((c) => (typeof c === 'string' ? c : c.function ? `${c.id}: ${c.function}` : c.id)).join('\n');
}

/** Keeps other fields of an existing cavity object (label, circuit, notes) when its id stays. */
export function textToCavities(text: string, previous: Cavity[] = []): Cavity[] {
  const prev = new Map(previous.map((c) => (typeof c === 'string' ? [c, { id: c }] : [c.id, c])));
  return lines(text).map((line) => {
    const [id, ...rest] = line.split(':');
    const fn = rest.join(':').trim();
    const key = id.trim();
    const old = prev.get(key) as Exclude<Cavity, string> | undefined;
    const { function: _f, ...others } = old ?? { id: key };
    void _f;
    const hasOthers = Object.keys(others).some((k) => k !== 'id');
    if (!fn && !hasOthers) return key;
    return fn ? { ...others, id: key, function: fn } : { ...others, id: key };
  });
}

export function pinsToText(pins: string[]): string {
  return pins.join(', ');
}

export function textToPins(text: string): string[] {
  return text.split(/[,\s]+/).map((s) => s.trim()).filter(Boolean);
}

export function positionsToText(positions: SwitchComponent['positions']): string {
  return Object.entries(positions)
    .map(([name, pairs]) => `${name}: ${pairs.map(([a, b]) => `${a}-${b}`).join(', ')}`.trimEnd())
    .join('\n');
}

export function textToPositions(text: string): SwitchComponent['positions'] {
  const out: SwitchComponent['positions'] = {};
  for (const line of lines(text)) {
    const [name, ...rest] = line.split(':');
    const pairs = rest.join(':').split(',').map((s) => s.trim()).filter(Boolean).map((p) => {
      const [a, b] = p.split(/\s*-\s*/);
      return [a ?? '', b ?? ''] as [string, string];
    });
    out[name.trim()] = pairs;
  }
  return out;
}

const roles = ['supply', 'ground', 'can_h', 'can_l', 'output', 'ref5', 'input'] as const;

export function modulePinsToText(pins: ModulePin[]): string {
  return pins
    .map((p) => {
      const parts: string[] = [p.id, p.role];
      if ('ohms' in p && p.ohms !== undefined) parts.push(String(p.ohms));
      if (p.role === 'output') parts.push(`from=${p.from}`);
      if ('volts' in p && p.volts !== undefined) parts.push(`volts=${p.volts}`);
      if ('biasOhms' in p && p.biasOhms !== undefined) parts.push(`bias=${p.biasOhms}`);
      if ('onOhms' in p && p.onOhms !== undefined) parts.push(`on=${p.onOhms}`);
      return p.function ? `${parts.join(' ')}: ${p.function}` : parts.join(' ');
    })
    .join('\n');
}

/** `1 supply 150: Supply`, `4 output from=1`, `5 ref5 volts=5`; unknown roles are kept as written for the validator to name. */
export function textToModulePins(text: string): ModulePin[] {
  return lines(text).map((line) => {
    const [head, ...rest] = line.split(':');
    const fn = rest.join(':').trim();
    const [id = '', role = '', ...args] = head.trim().split(/\s+/);
    const pin: Record<string, unknown> = { id, role: roles.includes(role as (typeof roles)[number]) ? role : role || 'input' };
    for (const a of args) {
      const [k, v] = a.includes('=') ? a.split('=') : ['ohms', a];
      const key = k === 'bias' ? 'biasOhms' : k === 'on' ? 'onOhms' : k;
      pin[key] = key === 'from' ? v : Number(v);
    }
    if (fn) pin.function = fn;
    return pin as ModulePin;
  });
}

function lines(text: string): string[] {
  return text.split('\n').map((l) => l.trim()).filter(Boolean);
}

/** A number field's text: empty → undefined, otherwise the number (NaN stays NaN for the schema to refuse). */
export function numberOrUndefined(text: string | number | undefined | null): number | undefined {
  if (text === undefined || text === null) return undefined;
  if (typeof text === 'number') return text;
  const t = text.trim().replace(',', '.');
  return t === '' ? undefined : Number(t);
}

export function textOrUndefined(text: string | undefined | null): string | undefined {
  const t = (text ?? '').trim();
  return t === '' ? undefined : t;
}
