import { Link, useSearchParams } from 'react-router';
import { EmptyState, FormError, Loading, PageHeader, Panel } from '@/components';
import { cx } from '@/lib/cx';
import { useBookmarks, useHarnesses, useModels, useRevision, type BookmarkList } from '../api';
import { FindBox } from '../components/FindBox';
import { cardComponents, type Doc } from '../model';
import { cardPath, walkPath } from '../paths';
import type { HarnessSummary } from '@shared/api/harness';

const item = 'touch flex items-center justify-between gap-2 rounded-control border border-line bg-surface px-3 py-2 text-ink no-underline hover:bg-sunken';

function Bookmarks({ data, orderId }: { data: BookmarkList; orderId: string | null }) {
  const { pinned, recent } = data;
  if (!pinned.length && !recent.length) return null;
  const list = (title: string, rows: BookmarkList['pinned']) =>
    rows.length ? (
      <div>
        <h3 className="mb-1 font-bold">{title}</h3>
        <ul className="flex flex-col gap-1">
          {rows.map((b) => (
            <li key={`${b.harnessId}-${b.connectorId}`}>
              <Link className={item} to={`/pin-cards/${b.harnessId}/latest/${encodeURIComponent(b.connectorId)}${orderId ? `?order=${orderId}` : ''}`}>
                <span>
                  <span className="font-bold">{b.connectorId}</span> {b.label ?? ''}
                </span>
                <span className="text-sm text-ink-muted">{b.harnessName}</span>
              </Link>
            </li>
          ))}
        </ul>
      </div>
    ) : null;
  return (
    <Panel title="Your connectors">
      <div className="flex flex-col gap-4">
        {list('Pinned', pinned)}
        {list('Opened lately', recent.filter((r) => !pinned.some((p) => p.harnessId === r.harnessId && p.connectorId === r.connectorId)).slice(0, 8))}
      </div>
    </Panel>
  );
}

function Connectors({ harness, orderId }: { harness: HarnessSummary; orderId: string | null }) {
  const revId = harness.publishedRevisionId ?? harness.draftRevisionId ?? undefined;
  const rev = useRevision(revId);
  if (!revId) return <p>This harness has no published revision yet.</p>;
  if (rev.isPending) return <Loading label="Opening the harness" />;
  if (rev.error) return <FormError error={rev.error} />;
  const doc = rev.data.document as unknown as Doc;
  const comps = cardComponents(doc);
  return (
    <div className="flex flex-col gap-2">
      <Link className="touch inline-flex w-fit items-center font-medium" to={walkPath(revId, { order: orderId })}>
        Walk a circuit of this harness
      </Link>
      <ul aria-label={`Connectors of ${harness.name}`} className="grid gap-1 sm:grid-cols-2">
        {comps.map((c) => (
          <li key={c.id}>
            <Link className={item} to={cardPath(harness.id, revId, c.id, { order: orderId })}>
              <span>
                <span className="font-bold">{c.kind === 'connector' && c.matesWith ? `${c.id} / ${c.matesWith}` : c.id}</span>{' '}
                <span>{c.label ?? ''}</span>
              </span>
              <span className="text-sm text-ink-muted">{c.kind === 'module' ? 'controller' : ''}</span>
            </Link>
          </li>
        ))}
      </ul>
    </div>
  );
}

/** Find a connector: search, your pinned and recent ones, or browse machine → harness → connector. */
export function Component() {
  const [params, setParams] = useSearchParams();
  const orderId = params.get('order');
  const modelId = params.get('model');
  const harnessId = params.get('harness');
  const models = useModels();
  const harnesses = useHarnesses(modelId);
  const bookmarks = useBookmarks();
  const pick = (next: Record<string, string | null>) => {
    const p = new URLSearchParams(params);
    for (const [k, v] of Object.entries(next)) {
      if (v) p.set(k, v);
      else p.delete(k);
    }
    setParams(p);
  };
  const chosen = harnesses.data?.harnesses.find((h) => h.id === harnessId) ?? null;
  const visible = (harnesses.data?.harnesses ?? []).filter((h) => h.publishedRevisionId || h.draftRevisionId);

  return (
    <div className="mx-auto flex max-w-3xl flex-col gap-5">
      <PageHeader title="Find a connector" lead="Search by circuit, wire colour, label or function, or pick the machine, the harness and the connector." />
      <FindBox orderId={orderId} autoFocus />
      {bookmarks.data ? <Bookmarks data={bookmarks.data} orderId={orderId} /> : null}
      <Panel title="Browse">
        <div className="flex flex-col gap-4">
          <div>
            <h3 className="mb-1 font-bold">Machine or attachment</h3>
            {models.isPending ? (
              <Loading label="Loading machines" />
            ) : models.error ? (
              <FormError error={models.error} />
            ) : (
              <ul className="flex flex-wrap gap-2">
                <li>
                  <button type="button" className={cx(item, !modelId && 'border-ink font-bold')} aria-pressed={!modelId} onClick={() => pick({ model: null, harness: null })}>
                    All
                  </button>
                </li>
                {models.data.models.map((m) => (
                  <li key={m.id}>
                    <button type="button" className={cx(item, modelId === m.id && 'border-ink font-bold')} aria-pressed={modelId === m.id} onClick={() => pick({ model: m.id, harness: null })}>
                      {m.displayName} <span className="text-sm text-ink-muted">({m.kind})</span>
                    </button>
                  </li>
                ))}
              </ul>
            )}
          </div>
          <div>
            <h3 className="mb-1 font-bold">Harness</h3>
            {harnesses.isPending ? (
              <Loading label="Loading harnesses" />
            ) : visible.length === 0 ? (
              <EmptyState title="No published harness here yet">A lead publishes a harness once it is documented; then its pin cards open here.</EmptyState>
            ) : (
              <ul className="flex flex-col gap-1">
                {visible.map((h) => (
                  <li key={h.id}>
                    <button type="button" className={cx(item, 'w-full text-left', harnessId === h.id && 'border-ink font-bold')} aria-pressed={harnessId === h.id} onClick={() => pick({ harness: h.id })}>
                      <span>{h.name}</span>
                      <span className="text-sm text-ink-muted">{h.modelName ?? ''}{h.publishedNumber ? ` · rev ${h.publishedNumber}` : ' · draft'}</span>
                    </button>
                  </li>
                ))}
              </ul>
            )}
          </div>
          {chosen ? (
            <div>
              <h3 className="mb-1 font-bold">Connector</h3>
              <Connectors harness={chosen} orderId={orderId} />
            </div>
          ) : null}
        </div>
      </Panel>
    </div>
  );
}
