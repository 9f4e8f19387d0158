import { useMemo } from 'react';
import type { Observation } from '@shared/readings/mark';
import { formatOhms, formatVolts } from '@shared/readings/expected';
import { Button, Caution, FormError, useToast } from '@/components';
import { errorMessage } from '@/lib/api';
import { ohmsKey, useEvaluation, useOhms, useSaveReadingSet, useStateReadings, type Evaluation, type SuspectItem } from '../api';
import { markLocal, useDraftSet } from '../readingSet';
import { componentById, stateLabel, stateWords, type Doc } from '../model';
import { Verdict } from './Verdict';

export function observationWhat(doc: Doc, o: Observation): string {
  if (o.kind === 'fuse') return `Fuse ${o.fuse}`;
  if (o.kind === 'volts') return `${o.pin} to ground, ${stateWords(doc, o.state)}`;
  return `${o.a} to ${o.b}, ohms, ${stateWords(doc, o.state)}`;
}

/** The set's readings, each marked in or out of range at once (browser-side, same rules as the server). */
export function useMarks(revisionId: string, doc: Doc, observations: readonly Observation[], tolerances: ReadonlyMap<string, { below: number; above: number }>) {
  const states = useMemo(() => [...new Set(observations.flatMap((o) => (o.kind === 'volts' ? [o.state] : [])))], [observations]);
  const { byState } = useStateReadings(revisionId, states);
  const asks = useMemo(() => observations.flatMap((o) => (o.kind === 'ohms' ? [{ a: o.a, b: o.b, state: o.state }] : [])), [observations]);
  const ohms = useOhms(revisionId, asks);
  return observations.map((o) => {
    if (o.kind === 'volts') {
      const pins = byState.get(o.state);
      return markLocal(o, { volts: pins ? (pins.get(o.pin) ?? null) : undefined }, tolerances.get(o.pin));
    }
    if (o.kind === 'ohms') {
      const k = ohmsKey(o);
      return markLocal(o, { ohms: ohms.has(k) ? ohms.get(k)! : undefined });
    }
    return markLocal(o, {});
  });
}

function predictedText(p: Record<string, unknown>): string | null {
  if (typeof p.fuse === 'string') return `fuse ${p.fuse} ${p.blowsOnInsert ? 'blows on insert' : 'holds'}`;
  if (typeof p.pin === 'string') return `${p.pin}: ${typeof p.volts === 'number' ? formatVolts(p.volts) : 'no steady reading'}`;
  if (typeof p.a === 'string') return `${p.a} to ${String(p.b)}: ${typeof p.ohms === 'number' ? formatOhms(p.ohms) : 'open (OL)'}`;
  return null;
}

function unplugState(doc: Doc, connector: string, mate: string): string | null {
  const s = doc.states.find((x) => x.unplugged?.includes(connector) || x.unplugged?.includes(mate));
  return s ? s.id : null;
}

export function SuspectsList({ doc, evaluation }: { doc: Doc; evaluation: Evaluation }) {
  const { suspects, nextUnplug } = evaluation;
  const top = suspects.slice(0, 5);
  const best = top[0]?.score ?? 0;
  const unplugAt = nextUnplug ? unplugState(doc, nextUnplug.connector, nextUnplug.mate) : null;
  const label = (id: string) => componentById(doc, id)?.label;
  return (
    <div className="flex flex-col gap-3">
      {nextUnplug ? (
        <div data-testid="next-unplug" className="rounded-panel border-2 border-accent bg-accent-soft px-4 py-3">
          <p className="text-sm font-bold uppercase tracking-wide">Next connector to unplug</p>
          <p className="text-lg font-bold">
            {nextUnplug.connector.replace(/[AB]$/, '')}: {nextUnplug.connector} from {nextUnplug.mate}
          </p>
          {label(nextUnplug.connector) ? <p>{label(nextUnplug.connector)}</p> : null}
          <p className="text-sm">
            Splits the suspects {nextUnplug.splits[0]} / {nextUnplug.splits[1]}.
            {unplugAt ? ` Then take readings in the state "${stateLabel(doc, unplugAt)}".` : ''}
          </p>
        </div>
      ) : top.length > 0 ? (
        <div data-testid="no-unplug" className="rounded-panel border-2 border-line px-4 py-3">
          <p className="font-bold">No connector left to unplug that splits these suspects.</p>
          <p className="text-sm">Inspect the first suspect: look at the harness where it says, with the battery disconnected.</p>
        </div>
      ) : null}
      {top.length > 1 && top[0].score === top[1].score ? (
        <p>The first {top.filter((x) => x.score === best).length} fit the readings equally well so far{nextUnplug ? ': unplug the connector above and measure again to tell them apart' : ''}.</p>
      ) : null}
      {top.length === 0 ? (
        <p>No single fault explains these readings. Check the readings, or the harness may differ from its documentation.</p>
      ) : (
        <ol aria-label="Suspects" className="flex flex-col gap-2">
          {top.map((s: SuspectItem, i) => {
            const predicted = s.predicted.map(predictedText).filter(Boolean).slice(0, 4);
            return (
              <li key={`${s.fault.kind}-${s.fault.ref}-${i}`} className="rounded-panel border border-line bg-surface px-3 py-2" data-suspect={s.fault.ref}>
                <p className="font-bold">
                  <span className="tabular mr-1">{i + 1}.</span>
                  {s.description}
                  {i === 0 && (top.length === 1 || s.score > top[1].score) ? <span className="ml-2 text-sm font-medium">(most likely)</span> : null}
                </p>
                {predicted.length ? <p className="text-sm">Would make the meter show: {predicted.join('; ')}.</p> : null}
              </li>
            );
          })}
        </ol>
      )}
    </div>
  );
}

interface ReadingsPanelProps {
  revisionId: string;
  doc: Doc;
  orderId: string | null;
  tolerances: ReadonlyMap<string, { below: number; above: number }>;
}

/** The readings taken so far (marked), saving the set, and the suspects they point to. */
export function ReadingsPanel({ revisionId, doc, orderId, tolerances }: ReadingsPanelProps) {
  const { set, remove, markSaved, clear, dirty } = useDraftSet(revisionId, orderId);
  const marks = useMarks(revisionId, doc, set.observations, tolerances);
  const evaluation = useEvaluation(revisionId, set.observations);
  const save = useSaveReadingSet();
  const { notify } = useToast();
  const fuseOut = set.observations.some((o) => o.kind === 'fuse' && o.blowsOnInsert);

  const onSave = () =>
    save.mutate(
      { id: set.savedId, version: set.version, revisionId, observations: set.observations, ...(orderId ? { repairOrderId: orderId } : {}) },
      {
        onSuccess: (rs) => {
          markSaved(rs.id, rs.version, rs.updatedAt ?? rs.takenAt, set.observations);
          notify(`Saved ${set.observations.length} reading${set.observations.length === 1 ? '' : 's'}${orderId ? ' to the repair order' : ''}.`, 'ok');
        },
      },
    );

  return (
    <section aria-labelledby="readings-h" className="flex flex-col gap-3">
      <h2 id="readings-h" className="text-xl font-bold">
        Readings taken {set.observations.length ? `(${set.observations.length})` : ''}
      </h2>
      {set.observations.length === 0 ? (
        <p className="text-ink-muted">No readings yet. Use “Take a reading” on a cavity or a step, and each one is marked in or out of range here.</p>
      ) : (
        <ul aria-label="Readings taken" className="flex flex-col gap-2">
          {set.observations.map((o, i) => (
            <li key={i} className="flex flex-wrap items-center justify-between gap-2 rounded-panel border border-line bg-surface px-3 py-2">
              <div className="min-w-0 flex-1">
                <p className="font-medium">{observationWhat(doc, o)}</p>
                <Verdict inRange={marks[i].inRange} text={marks[i].verdict} />
              </div>
              <Button tone="quiet" onClick={() => remove(i)} aria-label={`Remove reading: ${observationWhat(doc, o)}`}>
                Remove
              </Button>
            </li>
          ))}
        </ul>
      )}
      {fuseOut ? <Caution id="arcingFuse" compact /> : null}
      {set.observations.length ? (
        <div className="no-print flex flex-wrap items-center gap-2">
          <Button tone="primary" onClick={onSave} busy={save.isPending} disabled={!dirty}>
            {set.savedId ? 'Save changes' : orderId ? 'Save readings to the order' : 'Save readings'}
          </Button>
          <Button onClick={clear}>Start a new set</Button>
          {set.savedAt && !dirty ? <span className="text-sm">Saved {new Date(set.savedAt).toLocaleTimeString()}.</span> : null}
        </div>
      ) : null}
      {save.error ? <FormError error={save.error} title="The readings were not saved" /> : null}

      <h2 className="mt-2 text-xl font-bold">Suspects</h2>
      {set.observations.length === 0 ? (
        <p className="text-ink-muted">Suspects appear once there is a reading.</p>
      ) : evaluation.error ? (
        <p role="alert" className="text-bad">
          ✗ Could not rank the suspects: {errorMessage(evaluation.error)}
        </p>
      ) : evaluation.data ? (
        <div aria-busy={evaluation.isFetching || undefined}>
          <SuspectsList doc={doc} evaluation={evaluation.data} />
        </div>
      ) : (
        <p>Ranking the suspects…</p>
      )}
    </section>
  );
}
