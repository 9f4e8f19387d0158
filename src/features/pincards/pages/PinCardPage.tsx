import { useEffect, useMemo, useRef, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { ReadingsResult } from '@shared/api/harness';
import { api } from '@/lib/api';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router';
import { Button, EmptyState, FormError, Loading, PageHeader, useToast } from '@/components';
import { useRole } from '@/lib/me';
import { cx } from '@/lib/cx';
import { readingsKey, useBookmarks, useHarness, useMarkOpened, useRevision, useSetPinned, useStateReadings, useTolerances } from '../api';
import { FindBox } from '../components/FindBox';
import { BusMessagesForPin } from '@/features/bus';
import { BusChecks, CavityList, PrintTable, type CardContext } from '../components/PinCard';
import { ReadingsPanel } from '../components/ReadingsPanel';
import { TechCautions } from '../components/TechCautions';
import { defaultState, matedPair, pinOptions, stateLabel, type Doc } from '../model';
import { cardPath, findPath, walkPath } from '../paths';
import { useDraftSet } from '../readingSet';

const printPage = '@media print { @page { size: A4 landscape; margin: 8mm; } [data-testid="pin-card"] h1 { font-size: 16pt; } [data-testid="pin-card"] header { margin-bottom: 4pt; } }';

/** A pin card: every cavity of one connector (both halves), what it should read, where to probe; readings and suspects. */
export function Component() {
  const { harnessId = '', revisionId: revParam = '', connectorId = '' } = useParams();
  const [params, setParams] = useSearchParams();
  const orderId = params.get('order');
  const focusPin = params.get('pin') ? (params.get('pin')!.includes('.') ? params.get('pin') : `${connectorId}.${params.get('pin')}`) : null;
  const navigate = useNavigate();
  const role = useRole();
  const harness = useHarness(harnessId);
  // "latest" (from a bookmark) opens the harness's latest published revision.
  const revisionId = revParam === 'latest' ? (harness.data?.harness.publishedRevisionId ?? harness.data?.harness.draftRevisionId ?? undefined) : revParam;
  useEffect(() => {
    if (revParam === 'latest' && revisionId) navigate(cardPath(harnessId, revisionId, connectorId, { order: orderId }), { replace: true });
  }, [revParam, revisionId, harnessId, connectorId, orderId, navigate]);
  const rev = useRevision(revisionId);
  // Ask for the card's state's readings together with the document, not after it (the share
  // link names the state; otherwise "key_on", the usual first check): one round trip less.
  const queryClient = useQueryClient();
  const earlyState = params.get('state') ?? 'key_on';
  useEffect(() => {
    if (!revisionId || revParam === 'latest') return;
    void queryClient.prefetchQuery({
      queryKey: readingsKey(revisionId, earlyState),
      staleTime: 5 * 60_000,
      queryFn: ({ signal }) => api.get<ReadingsResult>(`/api/revisions/${revisionId}/readings?state=${encodeURIComponent(earlyState)}`, signal),
    });
  }, [queryClient, revisionId, revParam, earlyState]);
  const doc = rev.data?.document as unknown as Doc | undefined;
  const states = useMemo(() => doc?.states.map((s) => s.id) ?? [], [doc]);
  const { byState, error: readingsError } = useStateReadings(revisionId, states);
  const tolerances = useTolerances(revisionId);
  const tolMap = useMemo(() => new Map((tolerances.data?.tolerances ?? []).map((t) => [t.pin, { below: t.below, above: t.above }])), [tolerances.data]);
  const pins = useMemo(() => (doc ? pinOptions(doc) : []), [doc]);
  const { add } = useDraftSet(revisionId ?? '', orderId);
  const opened = useMarkOpened();
  const bookmarks = useBookmarks();
  const setPinned = useSetPinned();
  const { notify } = useToast();
  const [copied, setCopied] = useState(false);
  const markedFor = useRef('');

  const pair = doc ? matedPair(doc, connectorId) : null;
  const state = params.get('state') && doc?.states.some((s) => s.id === params.get('state')) ? params.get('state')! : doc ? (defaultState(doc) ?? '') : '';

  useEffect(() => {
    const key = `${harnessId}/${connectorId}`;
    if (pair && markedFor.current !== key) {
      markedFor.current = key;
      opened.mutate({ harnessId, connectorId }, { onError: () => undefined });
    }
  }, [pair, harnessId, connectorId, opened]);

  useEffect(() => {
    if (focusPin && pair) document.getElementById(`cavity-${focusPin.split('.')[1]}`)?.scrollIntoView({ block: 'start' });
  }, [focusPin, pair]);

  if (harness.error) return <FormError error={harness.error} title="This harness could not be opened" />;
  if (rev.error) return <FormError error={rev.error} title="This revision could not be opened" />;
  if (!doc || !revisionId || !harness.data || !rev.data) return <Loading label="Opening the pin card" />;
  if (!pair) {
    return (
      <EmptyState title={`There is no ${connectorId} in this harness`} action={<Link to={findPath(orderId)}>Find a connector</Link>}>
        The revision you opened does not have that connector. It may have been renamed in a later revision.
      </EmptyState>
    );
  }
  const [a, b] = pair.halves;
  const title = b ? `${a.id} / ${b.id}` : a.id;
  const label = a.label ?? b?.label ?? '';
  const rv = rev.data.revision;
  const isPinned = bookmarks.data?.pinned.some((p) => p.harnessId === harnessId && p.connectorId === connectorId) ?? false;
  const shareUrl = `${window.location.origin}${cardPath(harnessId, revisionId, connectorId, { state })}`;
  const ctx: CardContext = {
    doc,
    revisionId,
    harnessId,
    halves: pair.halves,
    state,
    volts: byState,
    tolerances: tolMap,
    pins,
    orderId,
    canSetTolerance: role === 'lead' || role === 'owner',
    onAdd: add,
    focusPin,
  };
  const setState = (s: string) => {
    const p = new URLSearchParams(params);
    p.set('state', s);
    setParams(p, { replace: true });
  };
  const share = async () => {
    try {
      if (navigator.share) await navigator.share({ title: `Pin card ${title}`, url: shareUrl });
      else {
        await navigator.clipboard.writeText(shareUrl);
        setCopied(true);
        notify('Link to this pin card copied.', 'ok');
      }
    } catch {
      setCopied(true);
    }
  };

  return (
    <div className="mx-auto flex max-w-4xl flex-col gap-4 print:max-w-none print:gap-1" data-testid="pin-card">
      <style>{printPage}</style>
      <div className="no-print">
        <FindBox orderId={orderId} />
      </div>
      <PageHeader
        title={`Pin card ${title}`}
        documentTitle={`Pin card ${title}`}
        lead={
          <>
            {label}
            <br />
            {harness.data.harness.name} · revision {rv.number}
            {rv.status === 'draft' ? ' (draft, not published)' : ''}
            {orderId ? ' · readings go to the repair order' : ''}
          </>
        }
        actions={
          <div className="no-print flex flex-wrap gap-2">
            <Button onClick={() => window.print()}>Print</Button>
            <Button onClick={share}>Share link</Button>
            <Button onClick={() => setPinned.mutate({ harnessId, connectorId, pinned: !isPinned })} aria-pressed={isPinned} busy={setPinned.isPending}>
              {isPinned ? 'Unpin' : 'Pin'}
            </Button>
          </div>
        }
      />
      {copied ? (
        <p className="no-print break-all text-sm">
          Share link: <a href={shareUrl}>{shareUrl}</a>
        </p>
      ) : null}
      <p className="hidden text-[8pt] print:block">Open this card on another device: {shareUrl}</p>

      <fieldset className="no-print">
        <legend className="mb-1 font-bold">Machine state for the expected readings</legend>
        <div className="flex flex-wrap gap-2">
          {doc.states.map((s) => (
            <label
              key={s.id}
              className={cx(
                'touch flex cursor-pointer items-center rounded-control border px-3 has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-focus',
                s.id === state ? 'border-ink bg-ink font-bold text-ground' : 'border-field bg-surface',
              )}
            >
              <input type="radio" name="card-state" className="sr-only" checked={s.id === state} onChange={() => setState(s.id)} />
              {stateLabel(doc, s.id)}
            </label>
          ))}
        </div>
      </fieldset>
      {readingsError ? <FormError error={readingsError} title="Expected readings could not be worked out" /> : null}

      <CavityList ctx={ctx} />
      <PrintTable ctx={ctx} />
      <BusChecks ctx={ctx} />
      <div className="no-print"><BusMessagesForPin revisionId={revisionId} document={doc} pinRef={connectorId} showChecks={false} /></div>
      <div className="no-print">
        <Link className="touch inline-flex items-center font-medium" to={walkPath(revisionId, { state, order: orderId })}>
          Walk a circuit of this harness
        </Link>
      </div>
      <div className="no-print">
        <ReadingsPanel revisionId={revisionId} doc={doc} orderId={orderId} tolerances={tolMap} />
      </div>
      <TechCautions />
      <p className="hidden text-[8pt] print:block">
        Readings are expectations from the harness as documented in Wirewalk, not the manufacturer’s specification; the service manual, local codes and licensed practice govern.
        Disconnect the battery before repairing a harness; never fit a larger fuse; a fuse that blows with an arc means stop and find the short; lower or block attachments and relieve hydraulic pressure.
      </p>
    </div>
  );
}
