/**
 * `/bus` (pick a harness) and `/bus/:harnessId`: the harness's bus message catalogue, its
 * uploaded captures, and the compare view where a lead files a changed byte into the draft.
 */
import { useMemo, useRef, useState } from 'react';
import { Link, useParams } from 'react-router';
import { useQueryClient } from '@tanstack/react-query';
import type { CaptureRow, CompareResponse } from '@shared/api/bus';
import type { ByteChange } from '@shared/can/compare';
import { identifierLabel } from '@shared/can/compare';
import { Button, EmptyState, FormError, Loading, PageHeader, Panel, ProgressBar, Tag } from '@/components';
import { api, errorMessage } from '@/lib/api';
import { useMe } from '@/lib/me';
import { busKeys, uploadCapture, useBusHarness, useBusHarnesses, useCapture, useCaptures, useCatalogue, useCompare, useDeleteCapture, useFileFinding, type UploadResult } from '../api';
import { IdentifierCell, SignalList } from '../components/MessageParts';

const inputClass = 'min-h-11 rounded-control border border-field bg-surface px-3';

export function Component() {
  const { harnessId } = useParams();
  return harnessId ? <HarnessBus harnessId={harnessId} /> : <PickHarness />;
}

function PickHarness() {
  const list = useBusHarnesses();
  return (
    <main className="mx-auto flex max-w-5xl flex-col gap-4 p-4">
      <PageHeader title="Bus messages" lead="What each controller says on the two-wire bus: the catalogue, captures from the machine, and what changed between two of them." />
      {list.isPending ? <Loading label="Loading harnesses" /> : null}
      {list.error ? <FormError error={list.error} /> : null}
      {list.data && list.data.harnesses.length === 0 ? <EmptyState title="No harness yet">A lead documents a harness first; its bus messages live with it.</EmptyState> : null}
      <ul className="flex flex-col divide-y divide-line rounded-panel border border-line bg-surface">
        {(list.data?.harnesses ?? []).map((h) => (
          <li key={h.id}>
            <Link className="flex min-h-11 flex-wrap items-center justify-between gap-2 px-4 py-3 hover:bg-sunken" to={`/bus/${h.id}`}>
              <span className="font-medium">{h.name}</span>
              <span className="text-sm text-ink-muted">{h.modelName ?? 'Not filed under a model'}</span>
            </Link>
          </li>
        ))}
      </ul>
    </main>
  );
}

function HarnessBus({ harnessId }: { harnessId: string }) {
  const { me } = useMe();
  const canEdit = me?.role === 'lead' || me?.role === 'owner';
  const harness = useBusHarness(harnessId);
  const qc = useQueryClient();
  const [startError, setStartError] = useState<string | null>(null);
  const summary = harness.data?.harness;
  const revisionId = (canEdit ? summary?.draftRevisionId : null) ?? summary?.publishedRevisionId ?? null;
  const catalogue = useCatalogue(revisionId);
  const isDraft = catalogue.data?.revision.status === 'draft';
  const [rest, setRest] = useState<string | null>(null);
  const [moved, setMoved] = useState<string | null>(null);

  if (harness.isPending) return <Loading label="Loading the harness" />;
  if (harness.error || !summary) return <main className="p-4"><FormError error={harness.error} /></main>;

  const startDraft = async () => {
    setStartError(null);
    try {
      await api.post(`/api/harnesses/${harnessId}/draft`);
      await qc.invalidateQueries({ queryKey: ['bus'] });
    } catch (e) {
      setStartError(errorMessage(e));
    }
  };

  return (
    <main className="mx-auto flex max-w-6xl flex-col gap-4 p-4">
      <PageHeader
        title={`Bus messages: ${summary.name}`}
        documentTitle="Bus messages"
        lead="Which controller sends which message, what its bytes mean, and captures of the bus to find out."
        actions={<Link className="underline" to="/bus">All harnesses</Link>}
      />
      <Panel
        title="Catalogue"
        description={catalogue.data ? `${catalogue.data.revision.status === 'draft' ? 'Draft' : 'Published'} revision ${catalogue.data.revision.number} · ${catalogue.data.messages.length} message(s)` : undefined}
        actions={
          canEdit && !summary.draftRevisionId ? (
            <Button onClick={startDraft}>Start a draft to add findings</Button>
          ) : catalogue.data ? (
            <Tag strong={isDraft}>{isDraft ? 'Draft' : 'Published'}</Tag>
          ) : null
        }
      >
        {startError ? <FormError error={startError} /> : null}
        {!revisionId ? <EmptyState title="Nothing published yet">A lead publishes the harness first.</EmptyState> : null}
        {catalogue.isPending && revisionId ? <Loading label="Loading the catalogue" /> : null}
        {catalogue.data && catalogue.data.messages.length === 0 ? <p className="text-ink-muted">No message documented yet. Compare two captures to find one.</p> : null}
        {catalogue.data && catalogue.data.messages.length > 0 ? (
          <div className="overflow-x-auto">
            <table className="w-full text-left" aria-label="Message catalogue">
              <thead>
                <tr className="border-b border-line">
                  <th className="py-2 pr-3">Identifier</th>
                  <th className="py-2 pr-3">Sent by</th>
                  <th className="py-2 pr-3">Message</th>
                  <th className="py-2">Signals</th>
                  {canEdit && isDraft ? <th className="py-2" /> : null}
                </tr>
              </thead>
              <tbody>
                {catalogue.data.messages.map((v) => (
                  <tr key={v.key} className="border-b border-line align-top" data-message={v.key}>
                    <td className="py-2 pr-3"><IdentifierCell view={v} /></td>
                    <td className="py-2 pr-3">{v.senderLabel ?? v.message.sender ?? '—'}{v.message.sender ? <span className="block text-sm text-ink-muted">{v.message.sender}</span> : null}</td>
                    <td className="py-2 pr-3">
                      <div className="font-medium">{v.message.name ?? 'Unnamed'}</div>
                      {v.message.meaning ? <p className="max-w-prose text-sm text-ink-muted">{v.message.meaning}</p> : null}
                    </td>
                    <td className="py-2"><SignalList signals={v.message.signals} /></td>
                    {canEdit && isDraft && catalogue.data ? (
                      <td className="py-2"><RemoveMessage revisionId={catalogue.data.revision.id} version={catalogue.data.revision.version} messageKey={v.key} /></td>
                    ) : null}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        ) : null}
        {canEdit && isDraft && catalogue.data ? <AddMessage revisionId={catalogue.data.revision.id} version={catalogue.data.revision.version} modules={catalogue.data.modules} /> : null}
      </Panel>
      <CapturesPanel harnessId={harnessId} revisionId={revisionId} canUpload={me?.role !== 'writer'} rest={rest} moved={moved} setRest={setRest} setMoved={setMoved} myId={me?.user.id ?? null} canDeleteAny={canEdit} />
      <ComparePanel rest={rest} moved={moved} revisionId={revisionId} canFile={canEdit && isDraft} version={catalogue.data?.revision.version ?? null} />
    </main>
  );
}

function CapturesPanel(props: {
  harnessId: string;
  revisionId: string | null;
  canUpload: boolean;
  canDeleteAny: boolean;
  myId: string | null;
  rest: string | null;
  moved: string | null;
  setRest: (id: string | null) => void;
  setMoved: (id: string | null) => void;
}) {
  const { harnessId, revisionId, rest, moved, setRest, setMoved } = props;
  const list = useCaptures(harnessId);
  const qc = useQueryClient();
  const del = useDeleteCapture(harnessId);
  const file = useRef<HTMLInputElement>(null);
  const [name, setName] = useState('');
  const [progress, setProgress] = useState<number | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [last, setLast] = useState<UploadResult | null>(null);
  const [shown, setShown] = useState<string | null>(null);

  const send = async () => {
    const f = file.current?.files?.[0];
    if (!f) {
      setError('Choose a candump log first (recorded with candump -l).');
      return;
    }
    setError(null);
    setLast(null);
    setProgress(0);
    try {
      const out = await uploadCapture(harnessId, f, name, setProgress, revisionId);
      setLast(out);
      setName('');
      if (file.current) file.current.value = '';
      await qc.invalidateQueries({ queryKey: busKeys.captures(harnessId) });
      if (!rest) setRest(out.capture.id);
      else if (!moved) setMoved(out.capture.id);
    } catch (e) {
      setError(errorMessage(e));
    } finally {
      setProgress(null);
    }
  };

  const captures = list.data?.captures ?? [];
  return (
    <Panel title="Captures" description="Logs of the bus recorded with candump -l. Record one with the control at rest and one while moving it, then compare them.">
      <div className="flex flex-col gap-4">
        {props.canUpload ? (
          <form
            className="flex flex-wrap items-end gap-3"
            onSubmit={(e) => {
              e.preventDefault();
              void send();
            }}
          >
            <label className="flex flex-col gap-1">
              <span className="font-medium">Log file</span>
              <input ref={file} type="file" accept=".log,.txt,text/plain" className="min-h-11" aria-label="Capture log file" />
            </label>
            <label className="flex grow flex-col gap-1">
              <span className="font-medium">Name (what the machine was doing)</span>
              <input className={inputClass} value={name} onChange={(e) => setName(e.target.value)} placeholder="Roller at rest, engine idling" />
            </label>
            <Button type="submit" tone="primary" busy={progress !== null}>Upload capture</Button>
          </form>
        ) : null}
        {progress !== null ? <ProgressBar label={progress < 1 ? 'Sending the capture' : 'Reading the capture'} value={progress < 1 ? progress : undefined} /> : null}
        {error ? <FormError error={error} /> : null}
        {last ? (
          <p role="status">
            ✓ “{last.capture.name}”: {last.capture.frames.toLocaleString()} frames, {last.capture.identifierCount} identifiers.
            {last.capture.badLineCount > 0
              ? ` ${last.capture.badLineCount} line(s) could not be read: ${last.badLines
                  .slice(0, 5)
                  .map((b) => `line ${b.lineNo} (${b.reason})`)
                  .join('; ')}${last.capture.badLineCount > 5 ? ' …' : ''}.`
              : ' Every line was read.'}
          </p>
        ) : null}
        {list.isPending ? <Loading label="Loading captures" /> : null}
        {captures.length === 0 && !list.isPending ? <p className="text-ink-muted">No capture yet.</p> : null}
        {captures.length > 0 ? (
          <div className="overflow-x-auto">
            <table className="w-full text-left" aria-label="Captures">
              <thead>
                <tr className="border-b border-line">
                  <th className="py-2 pr-3">Capture</th>
                  <th className="py-2 pr-3 text-right">Frames</th>
                  <th className="py-2 pr-3 text-right">Identifiers</th>
                  <th className="py-2 pr-3 text-right">Seconds</th>
                  <th className="py-2 pr-3 text-right">Bad lines</th>
                  <th className="py-2 pr-3">Compare as</th>
                  <th className="py-2" />
                </tr>
              </thead>
              <tbody>
                {captures.map((c) => (
                  <tr key={c.id} className="border-b border-line" data-capture={c.name}>
                    <td className="py-2 pr-3">
                      <div className="font-medium">{c.name}</div>
                      <div className="text-sm text-ink-muted">{c.fileName} · {c.uploadedBy?.name ?? 'someone'} · {new Date(c.uploadedAt).toLocaleString()}</div>
                    </td>
                    <td className="py-2 pr-3 text-right tabular">{c.frames.toLocaleString()}</td>
                    <td className="py-2 pr-3 text-right tabular">{c.identifierCount}</td>
                    <td className="py-2 pr-3 text-right tabular">{c.durationS === null ? '—' : c.durationS.toFixed(1)}</td>
                    <td className="py-2 pr-3 text-right tabular">{c.badLineCount}</td>
                    <td className="py-2 pr-3">
                      <div className="flex gap-2">
                        <Button tone={rest === c.id ? 'primary' : 'secondary'} aria-pressed={rest === c.id} onClick={() => setRest(rest === c.id ? null : c.id)}>At rest</Button>
                        <Button tone={moved === c.id ? 'primary' : 'secondary'} aria-pressed={moved === c.id} onClick={() => setMoved(moved === c.id ? null : c.id)}>Moved</Button>
                      </div>
                    </td>
                    <td className="py-2">
                      <div className="flex gap-2">
                        <Button tone="quiet" onClick={() => setShown(shown === c.id ? null : c.id)}>{shown === c.id ? 'Hide' : 'Identifiers'}</Button>
                        {props.canDeleteAny || c.uploadedBy?.id === props.myId ? (
                          <Button tone="quiet" busy={del.isPending && del.variables === c.id} onClick={() => {
                            if (rest === c.id) setRest(null);
                            if (moved === c.id) setMoved(null);
                            del.mutate(c.id);
                          }}>Delete</Button>
                        ) : null}
                      </div>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        ) : null}
        {shown ? <CaptureDetailTable id={shown} row={captures.find((c) => c.id === shown)} /> : null}
      </div>
    </Panel>
  );
}

const hex2 = (v: number) => v.toString(16).toUpperCase().padStart(2, '0');

function CaptureDetailTable({ id, row }: { id: string; row: CaptureRow | undefined }) {
  const detail = useCapture(id);
  if (detail.isPending) return <Loading label="Loading the capture" />;
  if (detail.error) return <FormError error={detail.error} />;
  const ids = detail.data.summary.identifiers;
  return (
    <section aria-label={`Identifiers in ${row?.name ?? 'the capture'}`} className="overflow-x-auto">
      <h3 className="mb-2 font-bold">Identifiers in “{row?.name}”</h3>
      <table className="w-full text-left text-sm">
        <thead>
          <tr className="border-b border-line">
            <th className="py-1 pr-3">Identifier</th>
            <th className="py-1 pr-3 text-right">Frames</th>
            <th className="py-1 pr-3 text-right">Rate</th>
            <th className="py-1">Bytes 1–8 (lowest–highest value seen)</th>
          </tr>
        </thead>
        <tbody>
          {ids.map((x) => (
            <tr key={x.key} className="border-b border-line align-top">
              <td className="py-1 pr-3"><span className="font-mono font-bold">{x.key}</span><span className="block text-ink-muted">{identifierLabel(x)}</span></td>
              <td className="py-1 pr-3 text-right tabular">{x.count}</td>
              <td className="py-1 pr-3 text-right tabular">{x.rateHz === null ? '—' : `${x.rateHz.toFixed(1)} /s`}</td>
              <td className="py-1 font-mono tabular">
                {x.bytes.slice(0, 8).map((b) => (b.min === b.max ? hex2(b.min) : `${hex2(b.min)}–${hex2(b.max)}`)).join('  ')}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}

function ComparePanel({ rest, moved, revisionId, canFile, version }: { rest: string | null; moved: string | null; revisionId: string | null; canFile: boolean; version: number | null }) {
  const cmp = useCompare(rest, moved, revisionId);
  return (
    <Panel title="Compare" description="The bytes that changed between the capture at rest and the capture moved, clearest first.">
      {!rest || !moved ? <p className="text-ink-muted">Mark one capture “At rest” and another “Moved”.</p> : null}
      {rest && moved && rest === moved ? <p className="text-ink-muted">Pick two different captures.</p> : null}
      {cmp.isFetching && !cmp.data ? <ProgressBar label="Comparing the captures" /> : null}
      {cmp.error ? <FormError error={cmp.error} /> : null}
      {cmp.data && rest && moved ? <CompareResult data={cmp.data} canFile={canFile} version={version} revisionId={revisionId} /> : null}
    </Panel>
  );
}

function CompareResult({ data, canFile, version, revisionId }: { data: CompareResponse; canFile: boolean; version: number | null; revisionId: string | null }) {
  const { comparison, catalogued } = data;
  const bytes = useMemo(() => new Set(catalogued.bytes), [catalogued]);
  const messages = useMemo(() => new Set(catalogued.messages), [catalogued]);
  const ranked = comparison.changedBytes.slice(0, 50);
  return (
    <div className="flex flex-col gap-3">
      <p>
        “{data.rest.name}” (rest) against “{data.moved.name}” (moved): {comparison.changedBytes.length} byte(s) changed in {comparison.changed.length} identifier(s);{' '}
        {comparison.unchanged.length} identifier(s) the same
        {comparison.onlyAtRest.length ? `; only at rest: ${comparison.onlyAtRest.map((x) => x.key).join(', ')}` : ''}
        {comparison.onlyMoved.length ? `; only moved: ${comparison.onlyMoved.map((x) => x.key).join(', ')}` : ''}.
      </p>
      {ranked.length === 0 ? <p className="text-ink-muted">Nothing changed between these two captures.</p> : null}
      <ol className="flex flex-col divide-y divide-line rounded-panel border border-line" aria-label="Ranked changes">
        {ranked.map((c, i) => (
          <ChangeRow key={`${c.key}:${c.index}`} rank={i + 1} change={c} rest={data.rest.id} moved={data.moved.id} canFile={canFile} version={version} revisionId={revisionId} catalogued={bytes.has(`${c.key}:${c.index}`)} known={messages.has(c.key)} />
        ))}
      </ol>
    </div>
  );
}

function ChangeRow(props: { rank: number; change: ByteChange; rest: string; moved: string; canFile: boolean; version: number | null; revisionId: string | null; catalogued: boolean; known: boolean }) {
  const { change: c } = props;
  const file = useFileFinding(props.revisionId);
  const [open, setOpen] = useState(false);
  const [name, setName] = useState(`Byte ${c.position} (found on the bus)`);
  const [done, setDone] = useState<string | null>(null);
  return (
    <li className="flex flex-col gap-2 p-3" data-change={`${c.key}:${c.position}`}>
      <div className="flex flex-wrap items-center justify-between gap-3">
        <div className="min-w-0">
          <span className="mr-2 tabular text-ink-muted">{props.rank}.</span>
          <span className="font-mono font-bold">{c.key}</span> <span className="font-medium">{c.sentence}</span>
          <span className="block text-sm text-ink-muted">
            {identifierLabel(c)} · clarity {Math.round(c.score * 100)} %
          </span>
        </div>
        <div className="flex items-center gap-2">
          {props.catalogued ? <Tag>In the catalogue</Tag> : props.known ? <Tag>Message known, byte not</Tag> : <Tag>New</Tag>}
          {props.canFile && !done ? <Button onClick={() => setOpen(!open)}>File this</Button> : null}
        </div>
      </div>
      {done ? <p role="status">✓ {done}</p> : null}
      {open && !done ? (
        <form
          className="flex flex-wrap items-end gap-3"
          onSubmit={(e) => {
            e.preventDefault();
            if (props.version === null) return;
            file.mutate(
              { version: props.version, rest: props.rest, moved: props.moved, key: c.key, index: c.index, name: name.trim() || undefined },
              {
                onSuccess: (out) => {
                  setDone(out.created === 'message' ? `Filed as a new message ${out.message.key} in the draft.` : `Filed as signal “${name.trim()}” on ${out.message.key} in the draft.`);
                  setOpen(false);
                },
              },
            );
          }}
        >
          <label className="flex grow flex-col gap-1">
            <span className="font-medium">Signal name</span>
            <input className={inputClass} value={name} onChange={(e) => setName(e.target.value)} />
          </label>
          <Button type="submit" tone="primary" busy={file.isPending}>File in the draft</Button>
          {file.error ? <FormError error={file.error} /> : null}
        </form>
      ) : null}
    </li>
  );
}

function RemoveMessage({ revisionId, version, messageKey }: { revisionId: string; version: number; messageKey: string }) {
  const qc = useQueryClient();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  return (
    <div>
      <Button tone="quiet" busy={busy} aria-label={`Remove ${messageKey} from the draft`} onClick={async () => {
        setBusy(true);
        setError(null);
        try {
          await api.delete(`/api/revisions/${revisionId}/messages/${messageKey}?version=${version}`);
        } catch (e) {
          setError(errorMessage(e));
        } finally {
          setBusy(false);
          await qc.invalidateQueries({ queryKey: busKeys.catalogue(revisionId) });
        }
      }}>Remove</Button>
      {error ? <FormError error={error} /> : null}
    </div>
  );
}

/** A new catalogue entry by hand: identifier, 11- or 29-bit, sender, name, meaning (signals come from findings or the API). */
function AddMessage({ revisionId, version, modules }: { revisionId: string; version: number; modules: { id: string; label: string | null }[] }) {
  const qc = useQueryClient();
  const [id, setId] = useState('');
  const [extended, setExtended] = useState(true);
  const [sender, setSender] = useState('');
  const [name, setName] = useState('');
  const [meaning, setMeaning] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<unknown>(null);
  const submit = async () => {
    setBusy(true);
    setError(null);
    try {
      const message = { id: id.trim().toUpperCase(), extended, ...(sender ? { sender } : {}), ...(name.trim() ? { name: name.trim() } : {}), ...(meaning.trim() ? { meaning: meaning.trim() } : {}) };
      await api.post(`/api/revisions/${revisionId}/messages`, { version, message });
      setId('');
      setName('');
      setMeaning('');
    } catch (e) {
      setError(e);
    } finally {
      setBusy(false);
      await qc.invalidateQueries({ queryKey: busKeys.catalogue(revisionId) });
    }
  };
  return (
    <form className="mt-4 flex flex-wrap items-end gap-3 border-t border-line pt-4" aria-label="Add a message" onSubmit={(e) => { e.preventDefault(); void submit(); }}>
      <label className="flex flex-col gap-1">
        <span className="font-medium">Identifier (hex)</span>
        <input className={inputClass} value={id} onChange={(e) => setId(e.target.value)} placeholder="18FF1121" required />
      </label>
      <label className="flex flex-col gap-1">
        <span className="font-medium">Length</span>
        <select className={inputClass} value={extended ? '29' : '11'} onChange={(e) => setExtended(e.target.value === '29')}>
          <option value="29">29-bit (SAE J1939)</option>
          <option value="11">11-bit</option>
        </select>
      </label>
      <label className="flex flex-col gap-1">
        <span className="font-medium">Sent by</span>
        <select className={inputClass} value={sender} onChange={(e) => setSender(e.target.value)}>
          <option value="">Not known yet</option>
          {modules.map((m) => <option key={m.id} value={m.id}>{m.id}{m.label ? ` · ${m.label}` : ''}</option>)}
        </select>
      </label>
      <label className="flex grow flex-col gap-1">
        <span className="font-medium">Name</span>
        <input className={inputClass} value={name} onChange={(e) => setName(e.target.value)} />
      </label>
      <label className="flex w-full flex-col gap-1">
        <span className="font-medium">What it means</span>
        <input className={inputClass} value={meaning} onChange={(e) => setMeaning(e.target.value)} />
      </label>
      <Button type="submit" tone="primary" busy={busy}>Add message</Button>
      {error ? <FormError error={error} /> : null}
    </form>
  );
}
