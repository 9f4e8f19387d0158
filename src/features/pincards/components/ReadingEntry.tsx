import { useId, useState, type FormEvent } from 'react';
import type { Observation } from '@shared/readings/mark';
import { Button } from '@/components';
import { cx } from '@/lib/cx';
import { fuses, groundPins, type Doc, type PinOption } from '../model';
import { StateSelect } from './StateSelect';

export type EntryKind = 'volts' | 'ohms' | 'fuse';

interface ReadingEntryProps {
  doc: Doc;
  pins: readonly PinOption[];
  /** What the entry starts on (a cavity's pin, a walk's fuse, the card's state). */
  initial: { kind?: EntryKind; pin?: string; b?: string; state?: string; fuse?: string };
  onAdd: (o: Observation) => void;
  onDone?: () => void;
  /** Which kinds to offer; all three by default. */
  kinds?: readonly EntryKind[];
}

const field = 'block w-full min-h-11 rounded-control border border-field bg-surface px-3 py-2 text-base text-ink';

/** Parses what a tech typed: "12,6" and "12.6" both work; "OL" is open. */
export function parseMeter(text: string): number | null | 'bad' {
  const t = text.trim().replace(',', '.');
  if (/^(ol|open|inf)$/i.test(t)) return null;
  if (!/^-?\d*(\.\d+)?$/.test(t) || t === '' || t === '-') return 'bad';
  return Number(t);
}

/** One meter reading: volts at a pin in a state, ohms between two pins, or "the fuse blows on insert". */
export function ReadingEntry({ doc, pins, initial, onAdd, onDone, kinds = ['volts', 'ohms', 'fuse'] }: ReadingEntryProps) {
  const id = useId();
  const fuseList = fuses(doc);
  const grounds = groundPins(doc);
  const [kind, setKind] = useState<EntryKind>(initial.kind ?? kinds[0]);
  const [pin, setPin] = useState(initial.pin ?? '');
  const [b, setB] = useState(initial.b ?? grounds[0] ?? '');
  const [state, setState] = useState(initial.state ?? doc.states[0]?.id ?? '');
  const [fuse, setFuse] = useState(initial.fuse ?? fuseList[0]?.id ?? '');
  const [value, setValue] = useState('');
  const [noSteady, setNoSteady] = useState(false);
  const [blows, setBlows] = useState(true);
  const [error, setError] = useState<string | null>(null);
  const known = new Set(pins.map((p) => p.ref));

  const submit = (e: FormEvent) => {
    e.preventDefault();
    setError(null);
    if (kind === 'fuse') {
      if (!fuse) return setError('Pick the fuse.');
      onAdd({ kind: 'fuse', fuse, blowsOnInsert: blows });
    } else {
      if (!known.has(pin)) return setError(`There is no pin "${pin}" in this harness. Write it as COMPONENT.PIN, e.g. X30B.1.`);
      if (kind === 'ohms' && !known.has(b)) return setError(`There is no pin "${b}" in this harness.`);
      const parsed = noSteady ? null : parseMeter(value);
      if (parsed === 'bad') return setError(kind === 'ohms' ? 'Enter the ohms the meter showed (a number, or OL for open).' : 'Enter the volts the meter showed, e.g. 12.4.');
      if (kind === 'volts' && parsed === null && !noSteady) return setError('Enter the volts, or tick "no steady reading".');
      if (kind === 'volts') onAdd({ kind: 'volts', pin, state, volts: parsed });
      else onAdd({ kind: 'ohms', a: pin, b, state, ohms: parsed === null || noSteady ? null : parsed });
    }
    setValue('');
    setNoSteady(false);
    onDone?.();
  };

  const listId = `${id}-pins`;
  return (
    <form onSubmit={submit} aria-label="Enter a reading" className="flex flex-col gap-3 rounded-panel border border-line bg-sunken p-3">
      {kinds.length > 1 ? (
        <fieldset className="flex flex-wrap gap-2">
          <legend className="sr-only">What you measured</legend>
          {kinds.map((k) => (
            <label
              key={k}
              className={cx(
                'touch flex cursor-pointer items-center rounded-control border px-3 has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-focus',
                kind === k ? 'border-ink bg-ink font-bold text-ground' : 'border-field bg-surface',
              )}
            >
              <input type="radio" className="sr-only" name={`${id}-kind`} checked={kind === k} onChange={() => setKind(k)} />
              {k === 'volts' ? 'DC volts' : k === 'ohms' ? 'Ohms (power off)' : 'Fuse'}
            </label>
          ))}
        </fieldset>
      ) : null}
      <datalist id={listId}>
        {pins.map((p) => (
          <option key={p.ref} value={p.ref}>
            {p.text}
          </option>
        ))}
      </datalist>
      {kind === 'fuse' ? (
        <>
          <label className="flex flex-col gap-1">
            <span className="font-medium">Fuse</span>
            <select className={field} value={fuse} onChange={(e) => setFuse(e.target.value)}>
              {fuseList.map((f) => (
                <option key={f.id} value={f.id}>
                  {f.id} · {f.amps} A{f.label ? ` · ${f.label}` : ''}
                </option>
              ))}
            </select>
          </label>
          <label className="flex min-h-11 items-center gap-3">
            <input type="checkbox" className="size-5" checked={blows} onChange={(e) => setBlows(e.target.checked)} />
            <span className="font-medium">Fuse blows on insert</span>
          </label>
        </>
      ) : (
        <>
          <label className="flex flex-col gap-1">
            <span className="font-medium">{kind === 'ohms' ? 'From pin (red probe)' : 'Pin (red probe)'}</span>
            <input className={field} list={listId} value={pin} onChange={(e) => setPin(e.target.value.trim())} autoComplete="off" spellCheck={false} />
          </label>
          {kind === 'ohms' ? (
            <label className="flex flex-col gap-1">
              <span className="font-medium">To pin (black probe)</span>
              <input className={field} list={listId} value={b} onChange={(e) => setB(e.target.value.trim())} autoComplete="off" spellCheck={false} />
            </label>
          ) : null}
          <label className="flex flex-col gap-1">
            <span className="font-medium">Machine state</span>
            <StateSelect className={field} doc={doc} value={state} onChange={setState} />
          </label>
          <label className="flex flex-col gap-1">
            <span className="font-medium">{kind === 'ohms' ? 'Meter showed (Ω, or OL)' : 'Meter showed (V)'}</span>
            <input
              className={cx(field, 'tabular text-reading')}
              inputMode="decimal"
              value={value}
              disabled={noSteady}
              onChange={(e) => setValue(e.target.value)}
              autoComplete="off"
            />
          </label>
          <label className="flex min-h-11 items-center gap-3">
            <input type="checkbox" className="size-5" checked={noSteady} onChange={(e) => setNoSteady(e.target.checked)} />
            <span className="font-medium">{kind === 'ohms' ? 'Open (OL)' : 'No steady reading'}</span>
          </label>
        </>
      )}
      {error ? (
        <p role="alert" className="flex gap-1 font-medium text-bad">
          <span aria-hidden="true">✗</span>
          {error}
        </p>
      ) : null}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" tone="primary">
          Add reading
        </Button>
        {onDone ? <Button onClick={onDone}>Close</Button> : null}
      </div>
    </form>
  );
}
