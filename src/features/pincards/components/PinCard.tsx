import { useMemo, useState } from 'react';
import { Link } from 'react-router';
import type { Component } from '@shared/harness/schema';
import type { Observation } from '@shared/readings/mark';
import { expectedOhms, expectedVolts, formatOhms } from '@shared/readings/expected';
import { wireColourLabel } from '@shared/standards/iec60757';
import { Button, WireSwatch } from '@/components';
import { cx } from '@/lib/cx';
import { ohmsKey, useOhms, useSetTolerance, type OhmsAsk } from '../api';
import { componentPinIds } from '@shared/harness/pins';
import { busLines, pinFunction, powerOffState, probeText, sizeText, stateLabel, stateWords, voltsText, wireEnds, type Doc, type PinOption } from '../model';
import { walkPath } from '../paths';
import { ReadingEntry } from './ReadingEntry';

export interface CardContext {
  doc: Doc;
  revisionId: string;
  harnessId: string;
  halves: Component[];
  state: string;
  /** state → pin → expected volts. */
  volts: ReadonlyMap<string, ReadonlyMap<string, number | null>>;
  tolerances: ReadonlyMap<string, { below: number; above: number }>;
  pins: readonly PinOption[];
  orderId: string | null;
  canSetTolerance: boolean;
  onAdd: (o: Observation) => void;
  /** The cavity the card was opened on (from search). */
  focusPin: string | null;
}

const lineWords = { can_h: 'CAN_H', can_l: 'CAN_L' } as const;

function ExpectedLine({ ctx, at: ref, state }: { ctx: CardContext; at: string; state: string }) {
  const pins = ctx.volts.get(state);
  const v = pins ? (pins.has(ref) ? pins.get(ref)! : null) : undefined;
  if (v === undefined) return <span className="text-ink-muted">Working out…</span>;
  const range = expectedVolts(v, ctx.tolerances.get(ref));
  return (
    <span className="tabular text-reading print:text-[8pt]">
      {voltsText(v)}
      <span className="ml-2 text-base font-medium print:text-[8pt]">{range.value === null ? '(a meter shows no steady reading)' : `allow ${range.text}`}</span>
    </span>
  );
}

function ToleranceForm({ ctx, at: ref }: { ctx: CardContext; at: string }) {
  const t = ctx.tolerances.get(ref);
  const [below, setBelow] = useState(String(t?.below ?? ''));
  const [above, setAbove] = useState(String(t?.above ?? ''));
  const set = useSetTolerance(ctx.revisionId, ctx.harnessId);
  const b = Number(below.replace(',', '.'));
  const a = Number(above.replace(',', '.'));
  const valid = below !== '' && above !== '' && Number.isFinite(a) && Number.isFinite(b) && a >= 0 && b >= 0 && a + b > 0;
  const input = 'block min-h-11 w-24 rounded-control border border-field bg-surface px-2 text-base text-ink tabular';
  return (
    <form
      className="flex flex-wrap items-end gap-2"
      aria-label={`Tolerance for ${ref}`}
      onSubmit={(e) => {
        e.preventDefault();
        if (valid) set.mutate({ pin: ref, below: b, above: a });
      }}
    >
      <label className="flex flex-col text-sm font-medium">
        V below
        <input className={input} inputMode="decimal" value={below} onChange={(e) => setBelow(e.target.value)} />
      </label>
      <label className="flex flex-col text-sm font-medium">
        V above
        <input className={input} inputMode="decimal" value={above} onChange={(e) => setAbove(e.target.value)} />
      </label>
      <Button type="submit" disabled={!valid} busy={set.isPending}>
        Set tolerance
      </Button>
      {t ? (
        <Button tone="quiet" onClick={() => set.mutate({ pin: ref, remove: true })}>
          Use the default
        </Button>
      ) : null}
      {set.error ? <span className="text-bad">✗ Not saved: {set.error instanceof Error ? set.error.message : 'try again'}</span> : null}
    </form>
  );
}

function HalfCell({ ctx, comp, pinId, line }: { ctx: CardContext; comp: Component; pinId: string; line: 'can_h' | 'can_l' | undefined }) {
  const ref = `${comp.id}.${pinId}`;
  const [entry, setEntry] = useState(false);
  const ends = wireEnds(ctx.doc, ref);
  return (
    <div className="flex min-w-0 flex-col gap-2" data-pin={ref}>
      <p className="font-bold">
        {ref}
        {line ? <span className="ml-2 rounded-control border border-ink px-1.5 text-sm">bus {lineWords[line]}</span> : null}
      </p>
      {ends.length === 0 ? <p className="text-ink-muted">No wire documented in this cavity.</p> : null}
      {ends.map((e) => (
        <div key={e.wire.id} className="flex flex-col gap-0.5">
          <p className="flex flex-wrap items-center gap-x-2">
            <WireSwatch colour={e.wire.color ?? ''} />
            <span className="text-sm">{e.wire.color ? wireColourLabel(e.wire.color) : 'colour not documented'}</span>
            <span>{sizeText(e.wire)}</span>
            <span>wire {e.wire.id}</span>
            {e.wire.circuit ? <span className="font-medium">circuit {e.wire.circuit}</span> : null}
          </p>
          <p>
            Goes to <span className="font-medium">{e.toText}</span>
            {e.onward.length ? <span> → on to {e.onward.join(', ')}</span> : null}
          </p>
        </div>
      ))}
      <div>
        <p className="text-sm font-medium">Expected, {stateWords(ctx.doc, ctx.state)}</p>
        <ExpectedLine ctx={ctx} at={ref} state={ctx.state} />
        {ctx.tolerances.has(ref) ? <p className="text-sm">Tolerance set by a lead.</p> : null}
      </div>
      <p className="text-sm">Probe: {probeText(ctx.doc, ref, ctx.state)}.</p>
      <details className="no-print">
        <summary className="touch flex cursor-pointer items-center gap-1 font-medium text-accent"><span aria-hidden="true">▸</span> Every state{ctx.canSetTolerance ? " and tolerance" : ""}</summary>
        <table className="tabular w-full text-left">
          <tbody>
            {ctx.doc.states.map((s) => {
              const v = ctx.volts.get(s.id)?.get(ref);
              const range = v === undefined ? null : expectedVolts(v, ctx.tolerances.get(ref));
              return (
                <tr key={s.id} className="border-t border-line">
                  <th scope="row" className="py-1 pr-2 font-medium">
                    {stateLabel(ctx.doc, s.id)}
                  </th>
                  <td className="py-1 pr-2">{voltsText(v)}</td>
                  <td className="py-1 text-sm">{range?.value === null ? '' : range?.text}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
        {ctx.canSetTolerance ? <ToleranceForm ctx={ctx} at={ref} /> : null}
      </details>
      <div className="no-print flex flex-wrap gap-2">
        <Button onClick={() => setEntry((x) => !x)} aria-expanded={entry}>
          Take a reading at {ref}
        </Button>
        {ends[0] ? (
          <Link className="touch inline-flex items-center font-medium" to={walkPath(ctx.revisionId, { from: ref, to: ends[0].onward[0] ?? ends[0].to, state: ctx.state, order: ctx.orderId })}>
            Walk from here
          </Link>
        ) : null}
      </div>
      {entry ? <ReadingEntry doc={ctx.doc} pins={ctx.pins} initial={{ kind: 'volts', pin: ref, state: ctx.state }} onAdd={ctx.onAdd} onDone={() => setEntry(false)} /> : null}
    </div>
  );
}

/** One connector (both halves of a mated pair): one block per cavity, screen layout. */
export function CavityList({ ctx }: { ctx: CardContext }) {
  const lines = useMemo(() => busLines(ctx.doc), [ctx.doc]);
  const [a, b] = ctx.halves;
  const ids = componentPinIds(a);
  const idsB = b ? componentPinIds(b) : [];
  return (
    <ol aria-label="Cavities" className="flex flex-col gap-3 print:hidden">
      {ids.map((pid, k) => {
        const fn = pinFunction(a, pid) ?? (b && idsB[k] ? pinFunction(b, idsB[k]) : undefined);
        const focus = ctx.focusPin === `${a.id}.${pid}` || (b && ctx.focusPin === `${b.id}.${idsB[k]}`);
        return (
          <li
            key={pid}
            id={`cavity-${pid}`}
            className={cx('rounded-panel border bg-surface p-3', focus ? 'border-4 border-accent' : 'border-line')}
            aria-label={`Cavity ${pid}${fn ? `: ${fn}` : ''}`}
          >
            <h3 className="mb-2 text-lg font-bold">
              Cavity {pid}
              {fn ? <span className="font-medium"> · {fn}</span> : null}
            </h3>
            <div className={cx('grid gap-4', b ? 'sm:grid-cols-2' : '')}>
              <HalfCell ctx={ctx} comp={a} pinId={pid} line={lines.get(`${a.id}.${pid}`)} />
              {b && idsB[k] ? (
                <div className="border-t border-line pt-3 sm:border-t-0 sm:border-l sm:pt-0 sm:pl-4">
                  <p className="mb-1 text-sm text-ink-muted">mates with</p>
                  <HalfCell ctx={ctx} comp={b} pinId={idsB[k]} line={lines.get(`${b.id}.${idsB[k]}`)} />
                </div>
              ) : null}
            </div>
          </li>
        );
      })}
    </ol>
  );
}

/** For cavities on the data bus: each line near 2.5 V idle, and the two lines' resistance with the power off. */
export function BusChecks({ ctx }: { ctx: CardContext }) {
  const lines = useMemo(() => busLines(ctx.doc), [ctx.doc]);
  const off = powerOffState(ctx.doc);
  const pairs: OhmsAsk[] = [];
  const refs: Array<{ ref: string; line: 'can_h' | 'can_l' }> = [];
  for (const h of ctx.halves) {
    const ids = componentPinIds(h).map((p) => `${h.id}.${p}`);
    const hi = ids.find((r) => lines.get(r) === 'can_h');
    const lo = ids.find((r) => lines.get(r) === 'can_l');
    for (const r of ids) {
      const l = lines.get(r);
      if (l) refs.push({ ref: r, line: l });
    }
    if (hi && lo && off) pairs.push({ a: hi, b: lo, state: off });
  }
  const ohms = useOhms(ctx.revisionId, pairs);
  if (!refs.length) return null;
  const idle = ctx.doc.states.find((s) => s.id === 'key_on')?.id ?? ctx.state;
  return (
    <section aria-labelledby="bus-h" className="rounded-panel border border-line bg-surface p-3 print:break-inside-avoid print:rounded-none print:border-0 print:p-0 print:text-[8pt]">
      <h2 id="bus-h" className="text-lg font-bold print:text-[9pt]">
        Bus checks
      </h2>
      <ul className="flex flex-col gap-2 print:hidden">
        {refs.map(({ ref, line }) => (
          <li key={ref}>
            <span className="font-bold">{ref}</span> ({lineWords[line]}): with the bus idle each line sits near 2.5 V to ground. Here, {stateWords(ctx.doc, idle)}:{' '}
            <ExpectedLine ctx={ctx} at={ref} state={idle} />
          </li>
        ))}
        {pairs.map((p) => {
          const v = ohms.get(ohmsKey(p));
          return (
            <li key={ohmsKey(p)}>
              <span className="font-bold">
                {p.a} to {p.b}
              </span>
              , ohms, {stateWords(ctx.doc, p.state)} (power off): about 60 Ω with both 120 Ω terminators present.{' '}
              <span className="tabular text-reading print:text-[8pt]">{v === undefined ? 'Working out…' : v === null ? 'open (OL) as documented' : `This harness: ${formatOhms(v)}, allow ${expectedOhms(v).text}`}</span>
            </li>
          );
        })}
      </ul>
      <p className="hidden print:block">
        Each line near 2.5 V to ground with the bus idle; about 60 Ω between the lines, power off, with both 120 Ω terminators.{' '}
        {refs.map(({ ref, line }) => {
          const v = ctx.volts.get(idle)?.get(ref);
          return (
            <span key={ref} className="mr-3 inline-block">
              {ref} {lineWords[line]} {stateWords(ctx.doc, idle)}: {voltsText(v)}
              {v !== undefined && v !== null ? ` (${expectedVolts(v, ctx.tolerances.get(ref)).text})` : ''}
            </span>
          );
        })}
        {pairs.map((p) => {
          const v = ohms.get(ohmsKey(p));
          return (
            <span key={ohmsKey(p)} className="mr-3 inline-block">
              {p.a}–{p.b} power off: {v === undefined ? '' : v === null ? 'open (OL)' : `${formatOhms(v)} (${expectedOhms(v).text})`}
            </span>
          );
        })}
      </p>
    </section>
  );
}

/** The print layout: one connector on one page, black on white, colour codes spelled out, every state a column. */
export function PrintTable({ ctx }: { ctx: CardContext }) {
  const states = ctx.doc.states;
  const rows = ctx.halves.flatMap((h) => componentPinIds(h).map((pid) => ({ comp: h, pid, ref: `${h.id}.${pid}` })));
  return (
    <table className="hidden w-full border-collapse text-left text-[8pt] leading-tight print:table" data-print-table>
      <thead>
        <tr>
          {['Pin', 'Function', 'Wire', 'Colour', 'Size', 'Circuit', 'Goes to'].map((h) => (
            <th key={h} className="border border-black px-0.5 py-0.5">
              {h}
            </th>
          ))}
          {states.map((s) => (
            <th key={s.id} className="border border-black px-0.5 py-0.5">
              {stateLabel(ctx.doc, s.id)} (V)
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {rows.map(({ comp, pid, ref }) => {
          const ends = wireEnds(ctx.doc, ref);
          const w = ends[0]?.wire;
          return (
            <tr key={ref}>
              <td className="border border-black px-0.5 font-bold whitespace-nowrap">{ref}</td>
              <td className="min-w-[11em] border border-black px-0.5">{pinFunction(comp, pid) ?? ''}</td>
              <td className="border border-black px-0.5 whitespace-nowrap">{ends.map((e) => e.wire.id).join(', ')}</td>
              <td className="border border-black px-0.5 whitespace-nowrap">{w?.color ? <><b>{w.color}</b> ({wireColourLabel(w.color) ?? ''})</> : ''}</td>
              <td className="border border-black px-0.5 whitespace-nowrap">{w ? sizeText(w) : ''}</td>
              <td className="border border-black px-0.5 whitespace-nowrap">{w?.circuit ?? ''}</td>
              <td className="border border-black px-0.5 whitespace-nowrap">{ends.map((e) => e.to).join(', ')}</td>
              {states.map((s) => {
                const v = ctx.volts.get(s.id)?.get(ref);
                return (
                  <td key={s.id} className="tabular border border-black px-0.5">
                    {v === undefined ? '' : v === null ? 'float' : v.toFixed(2)}
                  </td>
                );
              })}
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}
