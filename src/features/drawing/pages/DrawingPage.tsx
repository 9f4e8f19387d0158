/**
 * `/harnesses/:harnessId/drawing[?revision=ID]`: the draft in the editor for a
 * lead or owner; any published revision read only for everyone, with the
 * revision history and what changed.
 */
import { useEffect, useMemo, useState, type ReactNode } from 'react';
import { useNavigate, useParams, useSearchParams } from 'react-router';
import { Button, EmptyState, FormError, Loading } from '@/components';
import { useMe } from '@/lib/me';
import { errorMessage } from '@/lib/api';
import { useHarness, useRevision, useStartDraft } from '../api/harness';
import { DrawingEditor } from '../components/DrawingEditor';
import { HarnessDrawing } from '../components/HarnessDrawing';
import { RevisionHistory } from '../components/RevisionHistory';
import { fillPositions } from '@shared/drawing/geometry';
import { prepareLayout } from '../layoutClient';

/** The drawing fills the room below the header (see AppLayout). */
export const handle = { fill: true };

export function Component() {
  const { harnessId } = useParams();
  const [params] = useSearchParams();
  const { me } = useMe();
  const harness = useHarness(harnessId);
  const canEdit = me?.role === 'lead' || me?.role === 'owner';
  const revisions = harness.data?.revisions ?? [];
  const wanted = params.get('revision');
  const pick = wanted ?? (canEdit ? harness.data?.harness.draftRevisionId : null) ?? harness.data?.harness.publishedRevisionId ?? revisions[0]?.id ?? null;
  const revision = useRevision(pick);
  // A draft never laid out is laid out on opening: the worker starts as soon as that is known. (One
  // laid out already warms the worker up later, once it is drawn: see DrawingEditor.)
  const unplaced = !!revision.data && revision.data.document.components.length > 0 && Object.keys(revision.data.positions ?? {}).length === 0;
  useEffect(() => {
    if (canEdit && unplaced) prepareLayout();
  }, [canEdit, unplaced]);

  if (harness.isPending || (pick && revision.isPending)) return <Padded><Loading label="Opening the drawing" /></Padded>;
  if (harness.error) return <Padded><FormError error={harness.error} title="Wirewalk could not open this harness." /></Padded>;
  if (!pick) return <Padded><EmptyState title="Nothing to show yet">This harness has no published revision yet.</EmptyState></Padded>;
  if (revision.error || !revision.data) return <Padded><FormError error={revision.error} title="Wirewalk could not open this revision." /></Padded>;
  const h = harness.data!.harness;
  const r = revision.data;
  if (r.revision.status === 'draft' && canEdit) {
    return <DrawingEditor key={r.revision.id} harness={h} revision={r.revision} revisions={revisions} document={r.document} positions={r.positions ?? {}} />;
  }
  return <ReadOnlyDrawing harnessId={h.id} name={h.name} canEdit={canEdit} draftId={h.draftRevisionId} revisions={revisions} view={r} />;
}

/** The page's usual margins, for what is not the drawing (the layout gives the drawing none). */
const Padded = ({ children }: { children: ReactNode }) => <div className="px-3 py-5 sm:px-6">{children}</div>;

function ReadOnlyDrawing({ harnessId, name, canEdit, draftId, revisions, view }: {
  harnessId: string;
  name: string;
  canEdit: boolean;
  draftId: string | null;
  revisions: import('@shared/api/harness').RevisionSummary[];
  view: import('../api/harness').LoadedRevision;
}) {
  const navigate = useNavigate();
  const startDraft = useStartDraft(harnessId);
  const [error, setError] = useState<string | null>(null);
  const [revisionsOpen, setRevisionsOpen] = useState(false);
  const positions = useMemo(() => fillPositions(view.document, view.positions ?? {}), [view]);
  const r = view.revision;
  return (
    <div className="flex min-h-0 flex-1 flex-col">
      <div className="flex flex-wrap items-center gap-3 border-b border-line bg-surface px-3 py-2">
        <h1 className="text-lg font-bold">
          {view.document.name || name}{' '}
          <span className="text-sm font-normal text-ink-muted">
            revision {r.number} · {r.status === 'published' ? 'published, read only' : 'draft, read only'}
          </span>
        </h1>
        <span className="grow" />
        <a className="min-h-11 content-center px-2" href={`/api/revisions/${r.id}/export?download`}>
          Export the document
        </a>
        {canEdit ? (
          draftId ? (
            <Button tone="primary" onClick={() => navigate(`/harnesses/${harnessId}/drawing`)}>
              Open the draft
            </Button>
          ) : (
            <Button
              tone="primary"
              busy={startDraft.isPending}
              onClick={() =>
                startDraft.mutate(undefined, {
                  onSuccess: (out) => navigate(`/harnesses/${harnessId}/drawing?revision=${out.revision.id}`),
                  onError: (e) => setError(errorMessage(e)),
                })
              }
            >
              Start a new draft
            </Button>
          )
        ) : null}
      </div>
      {error ? <p className="px-3 text-bad">✗ {error}</p> : null}
      {/* On a phone the drawing takes the screen and the revisions fold away under it; beside it on a wide screen. */}
      <div className="flex min-h-0 flex-1 flex-col lg:flex-row">
        <div className="min-h-48 min-w-0 flex-[3]">
          <HarnessDrawing document={view.document} positions={positions} />
        </div>
        <aside
          className={`min-h-0 overflow-y-auto border-t border-line bg-surface p-3 lg:w-[20rem] lg:flex-none lg:border-t-0 lg:border-l ${revisionsOpen ? 'flex-[2]' : 'flex-none'}`}
          aria-label="Revision history"
        >
          <h2 className="font-bold lg:mb-2">
            <button
              type="button"
              className="flex min-h-11 w-full items-center justify-between lg:hidden"
              aria-expanded={revisionsOpen}
              aria-controls="revision-list"
              onClick={() => setRevisionsOpen((o) => !o)}
            >
              Revisions ({revisions.length}) <span aria-hidden="true">{revisionsOpen ? '▾' : '▸'}</span>
            </button>
            <span className="hidden lg:inline">Revisions</span>
          </h2>
          <div id="revision-list" className={revisionsOpen ? 'mt-2' : 'hidden lg:block'}>
            <RevisionHistory harnessId={harnessId} revisions={revisions} currentId={r.id} />
          </div>
        </aside>
      </div>
    </div>
  );
}
