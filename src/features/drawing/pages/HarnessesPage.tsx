/** `/harnesses`: the shop's harnesses; a lead starts a blank drawing or imports a document. */
import { useRef, useState } from 'react';
import { Link, useNavigate } from 'react-router';
import { validateDocument } from '@shared/harness';
import { Button, EmptyState, FormError, Loading, PageHeader, Panel } from '@/components';
import { errorMessage } from '@/lib/api';
import { useMe } from '@/lib/me';
import { useHarnessList, useImportHarness, useModels } from '../api/harness';
import { emptyDocument } from '../edit';

export function Component() {
  const list = useHarnessList();
  const models = useModels();
  const { me } = useMe();
  const canEdit = me?.role === 'lead' || me?.role === 'owner';
  const importer = useImportHarness();
  const navigate = useNavigate();
  const [name, setName] = useState('');
  const [modelId, setModelId] = useState('');
  const [error, setError] = useState<string | null>(null);
  const file = useRef<HTMLInputElement>(null);

  const create = async (document: unknown) => {
    setError(null);
    try {
      const out = await importer.mutateAsync({ document, modelId: modelId || null });
      navigate(`/harnesses/${out.harnessId}/drawing`);
    } catch (e) {
      setError(errorMessage(e));
    }
  };

  return (
    <main className="mx-auto flex max-w-5xl flex-col gap-4 p-4">
      <PageHeader title="Harnesses" lead="Every harness the shop has documented: open one to see its drawing." />
      {canEdit ? (
        <Panel title="Start a harness">
          <form
            className="flex flex-wrap items-end gap-3"
            onSubmit={(e) => {
              e.preventDefault();
              if (!name.trim()) {
                setError('Give the harness a name, e.g. "Front attachment circuit, loader series K".');
                return;
              }
              void create(emptyDocument(name.trim()));
            }}
          >
            <label className="flex grow flex-col gap-1">
              <span className="font-medium">Name</span>
              <input className="min-h-11 rounded-control border border-field bg-surface px-3" value={name} onChange={(e) => setName(e.target.value)} />
            </label>
            <label className="flex flex-col gap-1">
              <span className="font-medium">Machine or attachment</span>
              <select className="min-h-11 rounded-control border border-field bg-surface px-2" value={modelId} onChange={(e) => setModelId(e.target.value)}>
                <option value="">Not filed under a model</option>
                {(models.data?.models ?? []).map((m) => (
                  <option key={m.id} value={m.id}>
                    {m.displayName}
                  </option>
                ))}
              </select>
            </label>
            <Button type="submit" tone="primary" busy={importer.isPending}>
              New blank drawing
            </Button>
            <Button onClick={() => file.current?.click()}>Import a document…</Button>
            <input
              ref={file}
              type="file"
              accept="application/json,.json"
              className="hidden"
              aria-label="Import a harness document file"
              onChange={async (e) => {
                const f = e.target.files?.[0];
                if (!f) return;
                try {
                  const parsed = JSON.parse(await f.text()) as unknown;
                  const r = validateDocument(parsed);
                  if (!r.ok) {
                    setError(`That file is not a valid harness document: ${r.problems.slice(0, 3).map((p) => `${p.path} ${p.message}`).join('; ')}`);
                    return;
                  }
                  await create(r.doc);
                } catch (err) {
                  setError(`Could not read that file: ${errorMessage(err)}`);
                }
              }}
            />
          </form>
          {error ? <p className="mt-2 font-medium text-bad">✗ {error}</p> : null}
        </Panel>
      ) : null}
      {list.isPending ? <Loading label="Loading harnesses" /> : null}
      {list.error ? <FormError error={list.error} /> : null}
      {list.data && list.data.harnesses.length === 0 ? <EmptyState title="No harnesses yet">Start one above, or import a harness document.</EmptyState> : null}
      {list.data?.harnesses.length ? (
        <ul className="flex flex-col divide-y divide-line rounded-panel border border-line bg-surface" aria-label="Harnesses">
          {list.data.harnesses.map((h) => (
            <li key={h.id} className="flex flex-wrap items-center justify-between gap-2 p-3">
              <div>
                <Link to={`/harnesses/${h.id}/drawing`} className="text-lg font-bold">
                  {h.name}
                </Link>
                <p className="text-sm text-ink-muted">
                  {h.modelName ?? 'Not filed under a model'} ·{' '}
                  {h.publishedNumber ? `published revision ${h.publishedNumber}` : 'not published yet'}
                  {h.draftRevisionId ? ' · draft in progress' : ''}
                </p>
              </div>
            </li>
          ))}
        </ul>
      ) : null}
    </main>
  );
}
