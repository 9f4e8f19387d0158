import { useState } from 'react';
import type { HarnessDocument } from '@shared/harness';
import { Button } from '@/components';
import { errorMessage } from '@/lib/api';
import type { WalkPath, WalkStep } from '../engineClient';
import { voltsText } from './ComponentNode';

/** The pins and wires of a walked path. */
export function walkHighlight(path: WalkPath | null): { pins: Set<string>; wires: Set<string> } {
  const pins = new Set<string>();
  const wires = new Set<string>();
  for (const step of path?.steps ?? []) {
    if (step.type === 'pin') pins.add(step.ref);
    else if (step.type === 'wire') wires.add(step.id);
  }
  return { pins, wires };
}

const stepWords: Record<WalkStep['type'], string> = { pin: 'Pin', wire: 'Wire', mate: 'Mated cavity', splice: 'Splice', fuse: 'Fuse', switch: 'Switch contact', 'relay-contact': 'Relay contact', resistor: 'Resistor', load: 'Load', chassis: 'Chassis' };

function stepText(step: WalkStep): { title: string; detail: string } {
  const parts: string[] = [];
  let ref: string;
  switch (step.type) {
    case 'pin':
      ref = step.ref;
      if (step.cavityFunction) parts.push(step.cavityFunction);
      parts.push(`${step.ohmsFromStart.toFixed(3)} Ω from the start`);
      break;
    case 'wire':
      ref = step.id;
      parts.push([step.color, 'mm2' in step.size ? `${step.size.mm2} mm²` : `${step.size.awg} AWG`, step.circuit].filter(Boolean).join(' · '));
      break;
    case 'mate':
      ref = `${step.connector}.${step.cavity} ↔ ${step.mate}.${step.mateCavity}`;
      break;
    case 'chassis':
      ref = `${step.from} → ${step.to}`;
      break;
    case 'relay-contact':
      ref = `${step.id} 30–${step.contact}`;
      break;
    case 'fuse':
      ref = step.id;
      if (step.colour) parts.push(`${step.colour.name} blade`);
      parts.push(`${step.amps} A`);
      break;
    default:
      ref = step.id;
  }
  return { title: `${stepWords[step.type]} ${ref}`, detail: parts.filter(Boolean).join(' · ') };
}

function stepVolts(step: WalkStep): Array<[string, number | null]> {
  return step.type === 'pin' ? Object.entries(step.volts) : [];
}

export function WalkPanel({ doc, pinRefs, paths, index, onIndex, onWalk, onClear }: {
  doc: HarnessDocument;
  pinRefs: string[];
  paths: WalkPath[] | null;
  index: number;
  onIndex: (i: number) => void;
  onWalk: (from: string, to: string, state?: string) => Promise<WalkPath[]>;
  onClear: () => void;
}) {
  const [from, setFrom] = useState('');
  const [to, setTo] = useState('');
  const [state, setState] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const path = paths?.[index];
  return (
    <div className="flex flex-col gap-3">
      <p className="text-sm text-ink-muted">Walk from one pin to another: every pin, wire, mate, splice, fuse and contact on the way, with the volts to expect.</p>
      <form
        className="flex flex-col gap-2"
        onSubmit={(e) => {
          e.preventDefault();
          setError(null);
          setBusy(true);
          onWalk(from.trim(), to.trim(), state || undefined)
            .then((p) => p.length === 0 && setError(`No conductive path joins ${from} and ${to}${state ? ' in this state' : ''}.`))
            .catch((err) => setError(errorMessage(err)))
            .finally(() => setBusy(false));
        }}
      >
        <datalist id="ww-pin-refs">
          {pinRefs.map((r) => (
            <option key={r} value={r} />
          ))}
        </datalist>
        <label className="font-medium" htmlFor="walk-from">From pin</label>
        <input id="walk-from" list="ww-pin-refs" className="min-h-11 rounded-control border border-field bg-surface px-3" value={from} onChange={(e) => setFrom(e.target.value)} placeholder="BATT.+" />
        <label className="font-medium" htmlFor="walk-to">To pin</label>
        <input id="walk-to" list="ww-pin-refs" className="min-h-11 rounded-control border border-field bg-surface px-3" value={to} onChange={(e) => setTo(e.target.value)} placeholder="L1.1" />
        <label className="font-medium" htmlFor="walk-state">In state</label>
        <select id="walk-state" className="min-h-11 rounded-control border border-field bg-surface px-2" value={state} onChange={(e) => setState(e.target.value)}>
          <option value="">Any (every switch position)</option>
          {doc.states.map((s) => (
            <option key={s.id} value={s.id}>
              {s.label ?? s.id}
            </option>
          ))}
        </select>
        <div className="flex gap-2">
          <Button type="submit" tone="primary" busy={busy} disabled={!from || !to}>
            Walk
          </Button>
          {paths ? (
            <Button onClick={onClear}>Clear</Button>
          ) : null}
        </div>
      </form>
      {error ? <p className="font-medium text-bad">✗ {error}</p> : null}
      {paths && paths.length > 1 ? (
        <label className="text-sm">
          Path{' '}
          <select value={index} onChange={(e) => onIndex(Number(e.target.value))} className="min-h-11 rounded-control border border-field bg-surface px-2">
            {paths.map((_, i) => (
              <option key={i} value={i}>
                {i + 1} of {paths.length}
              </option>
            ))}
          </select>
        </label>
      ) : null}
      {path ? (
        <ol className="flex flex-col gap-1" aria-label="Walk steps">
          {path.steps.map((step, i) => {
            const t = stepText(step);
            const v = stepVolts(step);
            return (
              <li key={i} className="rounded-control border border-line px-2 py-1">
                <span className="font-bold">{t.title}</span>
                {t.detail ? <span className="block text-sm text-ink-muted">{t.detail}</span> : null}
                {v.length ? (
                  <span className="tabular block text-sm">
                    {v.map(([st, val]) => (
                      <span key={st} className="mr-3">
                        {doc.states.find((s) => s.id === st)?.label ?? st}: <strong>{voltsText(val)}</strong>
                      </span>
                    ))}
                  </span>
                ) : null}
              </li>
            );
          })}
        </ol>
      ) : null}
    </div>
  );
}
