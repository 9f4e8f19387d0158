/**
 * TanStack Query hooks for pin cards, walks and readings. Shapes follow
 * shared/api/harness.ts and shared/api/readings.ts (types only here, so the
 * pin-card route does not ship zod).
 */
import { useMutation, useQueries, useQuery, useQueryClient } from '@tanstack/react-query';
import type { HarnessDetail, HarnessSummary, ModelSummary, ReadingsResult, RevisionView, SearchResult } from '@shared/api/harness';
import type { ConnectorBookmark } from '@shared/api/readings';
import type { WalkStep } from '@shared/engine';
import type { Observation, MarkedReading } from '@shared/readings/mark';
import type { ReadingSet } from '@shared/api/readings';
import { api } from '@/lib/api';

export type { Observation, MarkedReading };

export function useModels() {
  return useQuery({ queryKey: ['models'], queryFn: ({ signal }) => api.get<{ models: ModelSummary[] }>('/api/models', signal) });
}

export function useHarnesses(modelId: string | null) {
  return useQuery({
    queryKey: ['harnesses', { model: modelId }],
    queryFn: ({ signal }) => api.get<{ harnesses: HarnessSummary[] }>(`/api/harnesses${modelId ? `?model=${encodeURIComponent(modelId)}` : ''}`, signal),
  });
}

export function useHarness(id: string | undefined) {
  return useQuery({ queryKey: ['harness', id], enabled: !!id, queryFn: ({ signal }) => api.get<HarnessDetail>(`/api/harnesses/${id}`, signal) });
}

/** A revision's document. Published revisions never change, so keep it. */
export function useRevision(id: string | undefined) {
  return useQuery({
    queryKey: ['revision', id],
    enabled: !!id,
    staleTime: 5 * 60_000,
    queryFn: ({ signal }) => api.get<RevisionView>(`/api/revisions/${id}`, signal),
  });
}

export const readingsKey = (rev: string, state: string) => ['revision', rev, 'readings', state] as const;

/** Expected volts of every pin, one query per state; answers a map state → (pin → volts). */
export function useStateReadings(revisionId: string | undefined, states: readonly string[]) {
  const results = useQueries({
    queries: states.map((state) => ({
      queryKey: readingsKey(revisionId ?? '', state),
      enabled: !!revisionId,
      staleTime: 5 * 60_000,
      queryFn: ({ signal }: { signal: AbortSignal }) => api.get<ReadingsResult>(`/api/revisions/${revisionId}/readings?state=${encodeURIComponent(state)}`, signal),
    })),
  });
  const byState = new Map<string, Map<string, number | null>>();
  results.forEach((r, i) => {
    if (r.data) byState.set(states[i], new Map(r.data.pins.map((p) => [p.ref, p.volts])));
  });
  return { byState, pending: results.some((r) => r.isPending), error: results.find((r) => r.error)?.error ?? null };
}

export interface OhmsAsk {
  a: string;
  b: string;
  state: string;
}

/** Expected two-point resistances (power off), one query per pair. */
export function useOhms(revisionId: string | undefined, asks: readonly OhmsAsk[]) {
  const results = useQueries({
    queries: asks.map((q) => ({
      queryKey: ['revision', revisionId ?? '', 'ohms', q.a, q.b, q.state],
      enabled: !!revisionId,
      staleTime: 5 * 60_000,
      queryFn: ({ signal }: { signal: AbortSignal }) =>
        api.get<{ ohms: number | null }>(`/api/revisions/${revisionId}/ohms?a=${encodeURIComponent(q.a)}&b=${encodeURIComponent(q.b)}&state=${encodeURIComponent(q.state)}`, signal),
    })),
  });
  const byKey = new Map<string, number | null>();
  results.forEach((r, i) => {
    if (r.data) byKey.set(ohmsKey(asks[i]), r.data.ohms);
  });
  return byKey;
}
export const ohmsKey = (q: OhmsAsk) => `${q.a}|${q.b}|${q.state}`;

export interface WalkAnswer {
  from: string;
  to: string;
  state: string | null;
  paths: Array<{ ohms: number; steps: WalkStep[] }>;
}

export function useWalk(revisionId: string | undefined, from: string, to: string, state: string) {
  return useQuery({
    queryKey: ['revision', revisionId, 'walk', from, to, state],
    enabled: !!revisionId && !!from && !!to,
    staleTime: 5 * 60_000,
    queryFn: ({ signal }) =>
      api.get<WalkAnswer>(`/api/revisions/${revisionId}/walk?from=${encodeURIComponent(from)}&to=${encodeURIComponent(to)}${state ? `&state=${encodeURIComponent(state)}` : ''}`, signal),
  });
}

export function useSearch(q: string) {
  const text = q.trim();
  return useQuery({
    queryKey: ['search', text],
    enabled: text.length >= 1,
    staleTime: 60_000,
    queryFn: ({ signal }) => api.get<{ results: SearchResult[] }>(`/api/search?q=${encodeURIComponent(text)}&limit=30`, signal),
  });
}

export interface Tolerance {
  pin: string;
  below: number;
  above: number;
}

/** A lead's per-cavity bands. */
export function useTolerances(revisionId: string | undefined) {
  return useQuery({
    queryKey: ['revision', revisionId, 'tolerances'],
    enabled: !!revisionId,
    queryFn: ({ signal }) => api.get<{ tolerances: Tolerance[] }>(`/api/revisions/${revisionId}/tolerances`, signal),
  });
}

export function useSetTolerance(revisionId: string, harnessId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (t: { pin: string; below: number; above: number } | { pin: string; remove: true }) =>
      'remove' in t
        ? api.delete(`/api/harnesses/${harnessId}/tolerances/${encodeURIComponent(t.pin)}`)
        : api.put(`/api/harnesses/${harnessId}/tolerances/${encodeURIComponent(t.pin)}`, { below: t.below, above: t.above }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['revision', revisionId, 'tolerances'] }),
  });
}

export interface BookmarkList {
  pinned: ConnectorBookmark[];
  recent: ConnectorBookmark[];
}

export function useBookmarks() {
  return useQuery({
    queryKey: ['connector-bookmarks'],
    queryFn: ({ signal }) => api.get<BookmarkList>('/api/connector-bookmarks', signal),
  });
}

export function useMarkOpened() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (b: { harnessId: string; connectorId: string }) => api.post('/api/connector-bookmarks/opened', b),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['connector-bookmarks'] }),
  });
}

export function useSetPinned() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (b: { harnessId: string; connectorId: string; pinned: boolean }) => api.put('/api/connector-bookmarks/pinned', b),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['connector-bookmarks'] }),
  });
}

export interface SuspectItem {
  fault: { kind: string; ref: string; at?: number; ohms?: number };
  score: number;
  description: string;
  predicted: Array<Record<string, unknown> & { match?: number }>;
}

export interface Evaluation {
  readings?: MarkedReading[];
  suspects: SuspectItem[];
  nextUnplug: { connector: string; mate: string; splits: [number, number] } | null;
}

/** Marks and suspects from the server for the readings so far; re-asked as readings are added. */
export function useEvaluation(revisionId: string | undefined, observations: readonly Observation[]) {
  return useQuery({
    queryKey: ['revision', revisionId, 'evaluate', observations],
    enabled: !!revisionId && observations.length > 0,
    staleTime: Infinity,
    placeholderData: (prev) => prev,
    queryFn: () => api.post<Evaluation>(`/api/revisions/${revisionId}/evaluate`, { observations }),
  });
}

export type { ReadingSet };

export function useSaveReadingSet() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: { id?: string; version?: number; revisionId: string; repairOrderId?: string; title?: string; observations: Observation[] }) =>
      input.id
        ? api.put<ReadingSet>(`/api/reading-sets/${input.id}`, { version: input.version, observations: input.observations, ...(input.title ? { title: input.title } : {}) })
        : api.post<ReadingSet>('/api/reading-sets', {
            revisionId: input.revisionId,
            observations: input.observations,
            ...(input.repairOrderId ? { repairOrderId: input.repairOrderId } : {}),
            ...(input.title ? { title: input.title } : {}),
          }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['reading-sets'] }),
  });
}
