import { lazy, Suspense, useId, useMemo, useState, type FormEvent } from 'react';
import { Link, useSearchParams } from 'react-router';
import type { WalkStep } from '@shared/engine';
import { expectedVolts, formatOhms } from '@shared/readings/expected';
import { wireColourLabel } from '@shared/standards/iec60757';
import { Button, Caution, EmptyState, FormError, Loading, PageHeader, WireSwatch } from '@/components';
import { cx } from '@/lib/cx';
import { useHarnesses, useRevision, useTolerances, useWalk } from '../api';
import { FindBox } from '../components/FindBox';
import { ReadingEntry } from '../components/ReadingEntry';
import { ReadingsPanel } from '../components/ReadingsPanel';
import { StateSelect } from '../components/StateSelect';
import { TechCautions } from '../components/TechCautions';
import { componentById, pinOptions, stateLabel, voltsText, type Doc, type PinOption } from '../model';
import { cardPath, walkPath } from '../paths';
import { useDraftSet } from '../readingSet';

const Drawing = lazy(() => import('@/features/drawing').then((m) => ({ default: m.HarnessDrawing })));

const field = 'block w-full min-h-11 rounded-control border border-field bg-surface px-3 py-2 text-base text-ink';

function PickHarness({ orderId }: { orderId: string | null }) {
  const list = useHarnesses(null);
  if (list.isPending) return <Loading label="Loading harnesses" />;
  if (list.error) return <FormError error={list.error} />;
  const rows = list.data.harnesses.filter((h) => h.publishedRevisionId || h.draftRevisionId);
  if (!rows.length) return <EmptyState title="No published harness yet">A lead publishes a harness once it is documented.</EmptyState>;
  return (
    <div>
      <h2 className="mb-2 text-lg font-bold">Which harness?</h2>
      <ul className="flex flex-col gap-1">
        {rows.map((h) => (
          <li key={h.id}>
            <Link
              className="touch flex items-center justify-between rounded-control border border-line bg-surface px-3 py-2 text-ink no-underline hover:bg-sunken"
              to={walkPath((h.publishedRevisionId ?? h.draftRevisionId)!, { order: orderId })}
            >
              <span>{h.name}</span>
              <span className="text-sm text-ink-muted">{h.modelName ?? ''}</span>
            </Link>
          </li>
        ))}
      </ul>
    </div>
  );
}

interface StepProps {
  doc: Doc;
  step: WalkStep;
  state: string;
  pins: readonly PinOption[];
  tolerances: ReadonlyMap<string, { below: number; above: number }>;
  onAdd: ReturnType<typeof useDraftSet>['add'];
  harnessId: string | null;
  revisionId: string;
  orderId: string | null;
}

function StepRow({ doc, step, state, pins, tolerances, onAdd, harnessId, revisionId, orderId }: StepProps) {
  const [entry, setEntry] = useState(false);
  switch (step.type) {
    case 'pin': {
      const v = step.volts[state];
      const range = v === undefined ? null : expectedVolts(v, tolerances.get(step.ref));
      const comp = componentById(doc, step.component);
      return (
        <li className="rounded-panel border border-line bg-surface p-3" data-step="pin" data-ref={step.ref}>
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <p className="text-lg font-bold">
              {harnessId && (comp?.kind === 'connector' || comp?.kind === 'module') ? (
                <Link to={cardPath(harnessId, revisionId, step.component, { pin: step.ref, order: orderId, state })}>{step.ref}</Link>
              ) : (
                step.ref
              )}
              {step.cavityFunction ? <span className="font-medium"> · {step.cavityFunction}</span> : null}
            </p>
            <p className="tabular text-sm">{formatOhms(step.ohmsFromStart)} from the start</p>
          </div>
          {comp?.label ? <p className="text-sm">{comp.label}</p> : null}
          <p className="tabular text-reading">
            {voltsText(v)} <span className="text-base font-medium">{range ? (range.value === null ? '(no steady reading)' : `allow ${range.text}`) : ''}</span>
          </p>
          <details>
            <summary className="touch flex cursor-pointer items-center gap-1 font-medium text-accent"><span aria-hidden="true">▸</span> Every state</summary>
            <ul className="tabular">
              {doc.states.map((s) => (
                <li key={s.id} className="flex justify-between border-t border-line py-1">
                  <span>{stateLabel(doc, s.id)}</span>
                  <span>{voltsText(step.volts[s.id])}</span>
                </li>
              ))}
            </ul>
          </details>
          <Button className="mt-1" onClick={() => setEntry((x) => !x)} aria-expanded={entry}>
            Take a reading at {step.ref}
          </Button>
          {entry ? (
            <div className="mt-2">
              <ReadingEntry doc={doc} pins={pins} initial={{ kind: 'volts', pin: step.ref, state }} onAdd={onAdd} onDone={() => setEntry(false)} />
            </div>
          ) : null}
        </li>
      );
    }
    case 'wire':
      return (
        <li className="ml-4 border-l-4 border-line py-1 pl-3" data-step="wire">
          <p className="flex flex-wrap items-center gap-x-2">
            <span className="font-bold">Wire {step.id}</span>
            {step.color ? <WireSwatch colour={step.color} /> : null}
            {step.color ? <span className="text-sm">{wireColourLabel(step.color)}</span> : null}
            <span>{'mm2' in step.size ? `${step.size.mm2} mm²` : `${step.size.awg} AWG`}</span>
            <span>{step.lengthM} m</span>
            {step.circuit ? <span>circuit {step.circuit}</span> : null}
            <span className="tabular text-sm">{formatOhms(step.ohms)}</span>
          </p>
        </li>
      );
    case 'mate':
      return (
        <li className="ml-4 border-l-4 border-line py-1 pl-3" data-step="mate">
          <span className="font-bold">Mate</span> {step.cavity} ↔ {step.mateCavity}
        </li>
      );
    case 'splice':
      return (
        <li className="ml-4 border-l-4 border-line py-1 pl-3" data-step="splice">
          <span className="font-bold">Splice {step.id}</span>: the wires meet here
        </li>
      );
    case 'fuse':
      return (
        <li className="rounded-panel border-2 border-ink bg-surface p-3" data-step="fuse" data-ref={step.id}>
          <p className="text-lg font-bold">
            Fuse {step.id}: {step.amps} A{step.colour ? `, ${step.colour.name.toLowerCase()}` : ''}
          </p>
          {componentById(doc, step.id)?.label ? <p>{componentById(doc, step.id)?.label}</p> : null}
          <p className="text-sm">Fit only a {step.amps} A fuse here.</p>
          <div className="mt-2 flex flex-wrap gap-2">
            <Button onClick={() => onAdd({ kind: 'fuse', fuse: step.id, blowsOnInsert: true })}>Fuse {step.id} blows on insert</Button>
            <Button onClick={() => onAdd({ kind: 'fuse', fuse: step.id, blowsOnInsert: false })}>Fuse {step.id} holds</Button>
          </div>
        </li>
      );
    case 'switch':
      return (
        <li className="ml-4 border-l-4 border-line py-1 pl-3" data-step="switch">
          <span className="font-bold">Switch {step.id}</span> closed in {step.positions.join(', ') || 'no position'}
        </li>
      );
    case 'relay-contact':
      return (
        <li className="ml-4 border-l-4 border-line py-1 pl-3" data-step="relay">
          <span className="font-bold">Relay {step.id}</span>, contact 30–{step.contact} {step.contact === '87' ? '(closed when energised)' : '(closed when released)'}
        </li>
      );
    case 'resistor':
    case 'load':
      return (
        <li className="ml-4 border-l-4 border-line py-1 pl-3" data-step={step.type}>
          <span className="font-bold">
            {step.type === 'load' ? 'Load' : 'Resistor'} {step.id}
          </span>{' '}
          {componentById(doc, step.id)?.label ?? ''} <span className="tabular text-sm">{formatOhms(step.ohms)}</span>
        </li>
      );
    case 'chassis':
      return (
        <li className="ml-4 border-l-4 border-line py-1 pl-3" data-step="chassis">
          <span className="font-bold">Chassis</span> from {step.from} to {step.to || 'chassis'} <span className="tabular text-sm">{formatOhms(step.ohms)}</span>
        </li>
      );
  }
}

/** Walk a circuit between two points: every step in order with what it should read. */
export function Component() {
  const [params, setParams] = useSearchParams();
  const id = useId();
  const orderId = params.get('order');
  const revisionId = params.get('revision') ?? undefined;
  const from = params.get('from') ?? '';
  const to = params.get('to') ?? '';
  const rev = useRevision(revisionId);
  const doc = rev.data?.document as unknown as Doc | undefined;
  const state = params.get('state') && doc?.states.some((s) => s.id === params.get('state')) ? params.get('state')! : (doc?.states[0]?.id ?? '');
  const walk = useWalk(revisionId, from, to, params.get('walkState') ?? '');
  const tolerances = useTolerances(revisionId);
  const tolMap = useMemo(() => new Map((tolerances.data?.tolerances ?? []).map((t) => [t.pin, { below: t.below, above: t.above }])), [tolerances.data]);
  const pins = useMemo(() => (doc ? pinOptions(doc) : []), [doc]);
  const { add } = useDraftSet(revisionId ?? '', orderId);
  const [fromText, setFromText] = useState(from);
  const [toText, setToText] = useState(to);
  const [pathIndex, setPathIndex] = useState(0);
  const [formError, setFormError] = useState<string | null>(null);

  const header = (
    <>
      <div className="no-print">
        <FindBox orderId={orderId} />
      </div>
      <PageHeader title="Walk a circuit" lead="Every pin, wire, mate, splice, fuse, switch and relay contact between two points, with what each should read." />
    </>
  );
  if (!revisionId) {
    return (
      <div className="mx-auto flex max-w-3xl flex-col gap-4">
        {header}
        <PickHarness orderId={orderId} />
      </div>
    );
  }
  if (rev.error) return <FormError error={rev.error} title="This harness could not be opened" />;
  if (!doc || !rev.data) return <Loading label="Opening the harness" />;
  const revData = rev.data;

  const known = new Set(pins.map((p) => p.ref));
  const set = (next: Record<string, string | null>) => {
    const p = new URLSearchParams(params);
    for (const [k, v] of Object.entries(next)) {
      if (v) p.set(k, v);
      else p.delete(k);
    }
    setParams(p, { replace: false });
  };
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const bad = [fromText, toText].filter((r) => !known.has(r));
    if (bad.length) return setFormError(`There is no pin ${bad.map((b) => `"${b}"`).join(' or ')} in this harness. Start typing a connector (X30B) and pick a cavity.`);
    setFormError(null);
    setPathIndex(0);
    set({ from: fromText, to: toText });
  };
  const paths = walk.data?.paths ?? [];
  const path = paths[Math.min(pathIndex, Math.max(0, paths.length - 1))];
  const highlight = path
    ? {
        pins: path.steps.flatMap((s) => (s.type === 'pin' ? [s.ref] : [])),
        wires: path.steps.flatMap((s) => (s.type === 'wire' ? [s.id] : [])),
      }
    : undefined;
  const hasDrawing = Object.keys(revData.positions ?? {}).length > 0;
  const hasFuse = path?.steps.some((s) => s.type === 'fuse');
  const listId = `${id}-pins`;

  return (
    <div className="mx-auto flex max-w-4xl flex-col gap-4">
      {header}
      <p>
        {doc.name} · revision {revData.revision.number}
        {orderId ? ' · readings go to the repair order' : ''}
      </p>
      <form onSubmit={submit} aria-label="Walk between two pins" className="grid gap-3 sm:grid-cols-2">
        <datalist id={listId}>
          {pins.map((p) => (
            <option key={p.ref} value={p.ref}>
              {p.text}
            </option>
          ))}
        </datalist>
        <label className="flex flex-col gap-1">
          <span className="font-medium">From</span>
          <input className={field} list={listId} value={fromText} onChange={(e) => setFromText(e.target.value.trim())} autoComplete="off" spellCheck={false} placeholder="e.g. F2.2" />
        </label>
        <label className="flex flex-col gap-1">
          <span className="font-medium">To</span>
          <input className={field} list={listId} value={toText} onChange={(e) => setToText(e.target.value.trim())} autoComplete="off" spellCheck={false} placeholder="e.g. X40.1" />
        </label>
        <label className="flex flex-col gap-1">
          <span className="font-medium">Expected readings for</span>
          <StateSelect className={field} doc={doc} value={state} onChange={(v) => set({ state: v })} />
        </label>
        <div className="flex items-end">
          <Button type="submit" tone="primary">
            Walk
          </Button>
        </div>
        {formError ? (
          <p role="alert" className="font-medium text-bad sm:col-span-2">
            ✗ {formError}
          </p>
        ) : null}
      </form>

      {from && to ? (
        walk.isPending ? (
          <Loading label="Walking the circuit" />
        ) : walk.error ? (
          <FormError error={walk.error} />
        ) : !path ? (
          <EmptyState title={`No conductive path from ${from} to ${to}`}>With every switch and relay contact as documented, nothing joins these two points.</EmptyState>
        ) : (
          <>
            {paths.length > 1 ? (
              <fieldset>
                <legend className="mb-1 font-bold">Paths, shortest first</legend>
                <div className="flex flex-wrap gap-2">
                  {paths.slice(0, 6).map((p, i) => (
                    <label
                      key={i}
                      className={cx('touch flex cursor-pointer items-center rounded-control border px-3', i === pathIndex ? 'border-ink bg-ink font-bold text-ground' : 'border-field bg-surface')}
                    >
                      <input type="radio" className="sr-only" name="walk-path" checked={i === pathIndex} onChange={() => setPathIndex(i)} />
                      Path {i + 1} · {formatOhms(p.ohms)}
                    </label>
                  ))}
                </div>
              </fieldset>
            ) : null}
            <p className="tabular">
              {path.steps.filter((s) => s.type === 'pin').length} pins, {formatOhms(path.ohms)} in series from {from} to {to}.
            </p>
            {hasFuse ? <Caution id="fuseRating" compact /> : null}
            <ol aria-label="Walk steps" className="flex flex-col gap-2">
              {path.steps.map((s, i) => (
                <StepRow
                  key={i}
                  doc={doc}
                  step={s}
                  state={state}
                  pins={pins}
                  tolerances={tolMap}
                  onAdd={add}
                  harnessId={revData.revision.harnessId}
                  revisionId={revisionId}
                  orderId={orderId}
                />
              ))}
            </ol>
            {hasDrawing ? (
              <section aria-label="The walk on the drawing" className="h-96 overflow-hidden rounded-panel border border-line">
                <Suspense fallback={<Loading label="Loading the drawing" />}>
                  <Drawing document={doc as never} positions={revData.positions} highlight={highlight} />
                </Suspense>
              </section>
            ) : (
              <p className="text-sm text-ink-muted">This harness has no drawing yet, so the walk is shown as a list only.</p>
            )}
          </>
        )
      ) : null}
      <div className="flex flex-col gap-2">
        <h2 className="text-lg font-bold">Other readings</h2>
        <ReadingEntry doc={doc} pins={pins} initial={{ kind: 'ohms', pin: from || undefined, state }} onAdd={add} />
      </div>
      <ReadingsPanel revisionId={revisionId} doc={doc} orderId={orderId} tolerances={tolMap} />
      <TechCautions />
    </div>
  );
}
