/** TanStack Query hooks for harnesses and revisions (the harness API). */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { DiffResult, HarnessDetail, HarnessSummary, ModelSummary, RevisionSummary, RevisionView, SaveResult } from '@shared/api/harness';
import type { HarnessDocument } from '@shared/harness';
import { api } from '@/lib/api';
import type { Positions } from '@shared/drawing/geometry';

export const harnessKeys = {
  list: ['harnesses', 'list'] as const,
  detail: (id: string) => ['harnesses', 'detail', id] as const,
  revision: (id: string) => ['revisions', id] as const,
  diff: (a: string, b: string) => ['revisions', a, 'diff', b] as const,
  models: ['models'] as const,
};

export function useHarnessList() {
  return useQuery({ queryKey: harnessKeys.list, queryFn: ({ signal }) => api.get<{ harnesses: HarnessSummary[] }>('/api/harnesses', signal) });
}

export function useModels() {
  return useQuery({ queryKey: harnessKeys.models, queryFn: ({ signal }) => api.get<{ models: ModelSummary[] }>('/api/models', signal) });
}

export function useHarness(id: string | undefined) {
  return useQuery({
    queryKey: harnessKeys.detail(id ?? ''),
    enabled: !!id,
    queryFn: ({ signal }) => api.get<HarnessDetail>(`/api/harnesses/${id}`, signal),
  });
}

export interface LoadedRevision {
  revision: RevisionSummary;
  document: HarnessDocument;
  positions: Positions;
}

export function fetchRevision(id: string, signal?: AbortSignal) {
  return api.get<RevisionView>(`/api/revisions/${id}`, signal) as Promise<LoadedRevision>;
}

export function useRevision(id: string | undefined | null) {
  return useQuery({
    queryKey: harnessKeys.revision(id ?? ''),
    enabled: !!id,
    // The editor owns the draft once it is open: no refetch behind its back.
    staleTime: Infinity,
    refetchOnWindowFocus: false,
    queryFn: ({ signal }) => fetchRevision(id!, signal),
  });
}

export function useDiff(a: string | null, b: string | null) {
  return useQuery({
    queryKey: harnessKeys.diff(a ?? '', b ?? ''),
    enabled: !!a && !!b,
    queryFn: ({ signal }) => api.get<DiffResult>(`/api/revisions/${a}/diff/${b}`, signal),
  });
}

export function saveDocument(revisionId: string, version: number, document: HarnessDocument, positions: Positions) {
  return api.put<SaveResult>(`/api/revisions/${revisionId}/document`, { version, document, positions });
}

export function importDocument(document: unknown, modelId?: string | null) {
  const q = modelId ? `?model=${encodeURIComponent(modelId)}` : '';
  return api.post<{ harnessId: string; revisionId: string }>(`/api/harnesses/import${q}`, document);
}

export function savePositions(revisionId: string, version: number, positions: Positions) {
  return api.put<SaveResult>(`/api/revisions/${revisionId}/positions`, { version, positions });
}

export function useImportHarness() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ document, modelId }: { document: unknown; modelId?: string | null }) => importDocument(document, modelId),
    onSuccess: () => void qc.invalidateQueries({ queryKey: ['harnesses'] }),
  });
}

export function usePublish(harnessId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ revisionId, note, version }: { revisionId: string; note: string; version: number }) =>
      api.post<{ revision: RevisionSummary }>(`/api/revisions/${revisionId}/publish`, { note, version }),
    onSuccess: (_data, vars) => {
      // The open revision is no longer a draft: load it again, read only.
      void qc.invalidateQueries({ queryKey: harnessKeys.revision(vars.revisionId) });
      void qc.invalidateQueries({ queryKey: harnessKeys.detail(harnessId) });
      void qc.invalidateQueries({ queryKey: harnessKeys.list });
    },
  });
}

export function useStartDraft(harnessId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<{ revision: RevisionSummary; created: boolean }>(`/api/harnesses/${harnessId}/draft`),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: harnessKeys.detail(harnessId) });
      void qc.invalidateQueries({ queryKey: harnessKeys.list });
    },
  });
}
