import { useState } from 'react';
import { Link } from 'react-router';
import type { RevisionSummary } from '@shared/api/harness';
import { diffSections } from '@shared/harness/diff';
import { FormError } from '@/components';
import { useDiff } from '../api/harness';

const when = (iso: string | null) => (iso ? new Date(iso).toLocaleString([], { dateStyle: 'medium', timeStyle: 'short' }) : '');
const show = (v: unknown) => (v === undefined ? '—' : typeof v === 'string' ? v : JSON.stringify(v));

/** Every revision of the harness (newest first), and what changed between two of them. */
export function RevisionHistory({ harnessId, revisions, currentId }: { harnessId: string; revisions: RevisionSummary[]; currentId: string }) {
  const [compare, setCompare] = useState<string | null>(null);
  const diff = useDiff(compare, compare ? currentId : null);
  return (
    <div className="flex flex-col gap-3">
      <ol className="flex flex-col gap-2" aria-label="Revisions">
        {revisions.map((r) => (
          <li key={r.id} className="rounded-control border border-line p-2">
            <div className="flex items-baseline justify-between gap-2">
              <Link to={`/harnesses/${harnessId}/drawing?revision=${r.id}`} className="font-bold">
                Revision {r.number} · {r.status === 'draft' ? 'draft' : 'published'}
              </Link>
              {r.id === currentId ? <span className="text-sm text-ink-muted">open</span> : null}
            </div>
            <p className="text-sm text-ink-muted">
              {r.status === 'published'
                ? `Published ${when(r.publishedAt)}${r.publishedBy ? ` by ${r.publishedBy.name}` : ''}`
                : `Last saved ${when(r.updatedAt)}${r.updatedBy ? ` by ${r.updatedBy.name}` : ''}`}
            </p>
            {r.publishNote ? <p className="text-sm">“{r.publishNote}”</p> : null}
            {r.id !== currentId ? (
              <button className="mt-1 text-sm text-accent underline" onClick={() => setCompare(r.id)}>
                What changed since this one
              </button>
            ) : null}
          </li>
        ))}
      </ol>
      {compare ? (
        <section aria-label="Changes">
          <h3 className="font-bold">Changes from revision {revisions.find((r) => r.id === compare)?.number} to the open one</h3>
          {diff.error ? <FormError error={diff.error} /> : null}
          {diff.isPending ? <p className="text-sm text-ink-muted">Comparing…</p> : null}
          {diff.data ? (
            <div className="flex flex-col gap-2 text-sm">
              {diff.data.diff.document.map((f) => (
                <p key={f.field}>
                  Document {f.field}: {show(f.before)} → {show(f.after)}
                </p>
              ))}
              {diffSections.map((sec) => {
                const d = diff.data.diff[sec];
                if (!d.added.length && !d.removed.length && !d.changed.length) return null;
                return (
                  <div key={sec}>
                    <p className="font-medium capitalize">{sec}</p>
                    <ul className="pl-4">
                      {d.added.map((a) => (
                        <li key={`a${a.id}`}>+ added {a.id}</li>
                      ))}
                      {d.removed.map((a) => (
                        <li key={`r${a.id}`}>− removed {a.id}</li>
                      ))}
                      {d.changed.map((c) => (
                        <li key={`c${c.id}`}>
                          ~ {c.id}: {c.changes.map((f) => `${f.field} ${show(f.before)} → ${show(f.after)}`).join('; ')}
                        </li>
                      ))}
                    </ul>
                  </div>
                );
              })}
              {diff.data.diff.document.length === 0 && diffSections.every((s) => !diff.data.diff[s].added.length && !diff.data.diff[s].removed.length && !diff.data.diff[s].changed.length) ? <p>No changes.</p> : null}
            </div>
          ) : null}
        </section>
      ) : null}
    </div>
  );
}
