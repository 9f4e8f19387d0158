import { useState } from 'react';
import type { MarkerInput } from '@shared/api/orders';
import { Button, FormError } from '@/components';
import { api } from '@/lib/api';
import { useCreateDrawing, useHarnessList, useHarnessRevisions, useRevision } from '../api';

const inputClass = 'block min-h-11 w-full rounded-control border border-field bg-surface px-3 py-2 text-base text-ink';

interface WalkStep {
  type: string;
  id?: string;
  ref?: string;
  component?: string;
}

/**
 * Freeze a view of a harness revision onto the order: walk a circuit (from pin, to pin) to
 * highlight its path, tick wires by hand, and put fault markers and notes on what you found.
 */
export function DrawingForm({ orderId, onDone }: { orderId: string; onDone: () => void }) {
  const harnesses = useHarnessList();
  const [harnessId, setHarnessId] = useState<string | null>(null);
  const revisions = useHarnessRevisions(harnessId);
  const [revisionId, setRevisionId] = useState<string | null>(null);
  const revision = useRevision(revisionId);
  const [title, setTitle] = useState('');
  const [from, setFrom] = useState('');
  const [to, setTo] = useState('');
  const [wires, setWires] = useState<string[]>([]);
  const [pins, setPins] = useState<string[]>([]);
  const [components, setComponents] = useState<string[]>([]);
  const [markers, setMarkers] = useState<MarkerInput[]>([]);
  const [markerKind, setMarkerKind] = useState<'fault' | 'note'>('fault');
  const [markerTarget, setMarkerTarget] = useState('');
  const [markerText, setMarkerText] = useState('');
  const [notes, setNotes] = useState('');
  const [walkError, setWalkError] = useState<unknown>(null);
  const [walking, setWalking] = useState(false);
  const create = useCreateDrawing(orderId);
  const doc = revision.data?.document;

  const walk = async () => {
    if (!revisionId) return;
    setWalkError(null);
    setWalking(true);
    try {
      const r = await api.get<{ paths: { steps: WalkStep[] }[] }>(`/api/revisions/${revisionId}/walk?from=${encodeURIComponent(from.trim())}&to=${encodeURIComponent(to.trim())}`);
      const steps = r.paths[0]?.steps ?? [];
      if (!steps.length) throw new Error(`No path between ${from} and ${to} in this revision.`);
      setWires([...new Set(steps.filter((s) => s.type === 'wire' && s.id).map((s) => s.id!))]);
      setPins([...new Set(steps.filter((s) => s.type === 'pin' && s.ref).map((s) => s.ref!))]);
      setComponents([...new Set(steps.filter((s) => s.type === 'pin' && s.component).map((s) => s.component!))]);
      if (!title) setTitle(`Walk ${from} → ${to}`);
    } catch (error) {
      setWalkError(error);
    } finally {
      setWalking(false);
    }
  };

  return (
    <div className="flex flex-col gap-3 rounded-control border border-line p-3" aria-label="Attach a marked-up drawing" role="group">
      <div className="grid gap-3 sm:grid-cols-2">
        <label className="flex flex-col gap-1">
          <span className="font-medium">Harness</span>
          <select className={inputClass} value={harnessId ?? ''} onChange={(e) => { setHarnessId(e.target.value || null); setRevisionId(null); }}>
            <option value="">Pick a harness</option>
            {harnesses.data?.map((h) => (
              <option key={h.id} value={h.id}>{h.name}</option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1">
          <span className="font-medium">Revision</span>
          <select className={inputClass} value={revisionId ?? ''} onChange={(e) => setRevisionId(e.target.value || null)} disabled={!revisions.data}>
            <option value="">Pick a revision</option>
            {revisions.data?.map((r) => (
              <option key={r.id} value={r.id}>Revision {r.number} ({r.status})</option>
            ))}
          </select>
        </label>
      </div>
      {doc ? (
        <>
          <fieldset className="grid gap-3 sm:grid-cols-3">
            <legend className="font-medium">Walk a circuit</legend>
            <label className="flex flex-col gap-1">From pin<input className={inputClass} value={from} onChange={(e) => setFrom(e.target.value)} placeholder="F3.2" /></label>
            <label className="flex flex-col gap-1">To pin<input className={inputClass} value={to} onChange={(e) => setTo(e.target.value)} placeholder="L1.1" /></label>
            <div className="flex items-end"><Button onClick={() => void walk()} busy={walking} disabled={!from || !to}>Walk</Button></div>
          </fieldset>
          {walkError ? <FormError error={walkError} title="The walk did not work." /> : null}
          <details>
            <summary className="min-h-11 cursor-pointer py-2 font-medium">Wires on the path ({wires.length} highlighted)</summary>
            <ul className="grid gap-1 sm:grid-cols-3">
              {doc.wires.map((w) => (
                <li key={w.id}>
                  <label className="flex min-h-11 items-center gap-2">
                    <input type="checkbox" className="size-5" checked={wires.includes(w.id)} onChange={(e) => setWires((ws) => (e.target.checked ? [...ws, w.id] : ws.filter((x) => x !== w.id)))} />
                    {w.id} {w.color ? `· ${w.color}` : ''} {w.circuit ? `· ${w.circuit}` : ''}
                  </label>
                </li>
              ))}
            </ul>
          </details>
          <fieldset className="grid gap-3 sm:grid-cols-4">
            <legend className="font-medium">Markers ({markers.length})</legend>
            <label className="flex flex-col gap-1">Kind
              <select className={inputClass} aria-label="Marker kind" value={markerKind} onChange={(e) => setMarkerKind(e.target.value as 'fault' | 'note')}>
                <option value="fault">Fault</option>
                <option value="note">Note</option>
              </select>
            </label>
            <label className="flex flex-col gap-1">On
              <select className={inputClass} aria-label="Marker on" value={markerTarget} onChange={(e) => setMarkerTarget(e.target.value)}>
                <option value="">Pick a wire or component</option>
                <optgroup label="Wires">{doc.wires.map((w) => <option key={w.id} value={w.id}>{w.id}</option>)}</optgroup>
                <optgroup label="Components">{doc.components.map((c) => <option key={c.id} value={c.id}>{c.id}{c.label ? ` ${c.label}` : ''}</option>)}</optgroup>
              </select>
            </label>
            <label className="flex flex-col gap-1">Short note<input className={inputClass} value={markerText} maxLength={200} onChange={(e) => setMarkerText(e.target.value)} /></label>
            <div className="flex items-end">
              <Button
                disabled={!markerText.trim()}
                onClick={() => {
                  setMarkers((m) => [...m, { kind: markerKind, target: markerTarget || null, text: markerText.trim() }]);
                  setMarkerText('');
                }}
              >
                Add marker
              </Button>
            </div>
          </fieldset>
          {markers.length ? (
            <ol className="list-decimal pl-6">
              {markers.map((m, i) => (
                <li key={i} className="py-1">
                  <strong>{m.kind === 'fault' ? 'Fault' : 'Note'}{m.target ? ` at ${m.target}` : ''}:</strong> {m.text}{' '}
                  <Button tone="quiet" onClick={() => setMarkers((ms) => ms.filter((_, j) => j !== i))}>Remove</Button>
                </li>
              ))}
            </ol>
          ) : null}
          <label className="flex flex-col gap-1"><span className="font-medium">Title</span><input className={inputClass} value={title} onChange={(e) => setTitle(e.target.value)} /></label>
          <label className="flex flex-col gap-1"><span className="font-medium">Notes</span><textarea className={inputClass} rows={2} value={notes} onChange={(e) => setNotes(e.target.value)} /></label>
          {create.error ? <FormError error={create.error} title="The drawing was not attached." /> : null}
          <div>
            <Button
              tone="primary"
              busy={create.isPending}
              disabled={!title.trim()}
              onClick={() =>
                create.mutate(
                  { revisionId: revisionId!, title: title.trim(), highlight: { components, wires, pins, from: from || null, to: to || null }, markers, notes: notes || null },
                  { onSuccess: onDone },
                )
              }
            >
              Attach the drawing to this order
            </Button>
          </div>
        </>
      ) : null}
    </div>
  );
}
