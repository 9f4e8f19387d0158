/** TanStack Query hooks of the bus messages feature, and the capture upload with its progress. */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CaptureDetail, CaptureRow, CatalogueResponse, CompareResponse, FindingInput, FindingResponse } from '@shared/api/bus';
import type { HarnessDetail, HarnessSummary } from '@shared/api/harness';
import { api, ApiError } from '@/lib/api';

export const busKeys = {
  harnesses: ['bus', 'harnesses'] as const,
  harness: (id: string) => ['bus', 'harness', id] as const,
  catalogue: (revisionId: string) => ['bus', 'catalogue', revisionId] as const,
  captures: (harnessId: string) => ['bus', 'captures', harnessId] as const,
  capture: (id: string) => ['bus', 'capture', id] as const,
  compare: (rest: string, moved: string, revision: string) => ['bus', 'compare', rest, moved, revision] as const,
};

export function useBusHarnesses() {
  return useQuery({ queryKey: busKeys.harnesses, queryFn: ({ signal }) => api.get<{ harnesses: HarnessSummary[] }>('/api/harnesses', signal) });
}

export function useBusHarness(id: string | undefined) {
  return useQuery({ queryKey: busKeys.harness(id ?? ''), enabled: !!id, queryFn: ({ signal }) => api.get<HarnessDetail>(`/api/harnesses/${id}`, signal) });
}

export function useCatalogue(revisionId: string | null | undefined) {
  return useQuery({
    queryKey: busKeys.catalogue(revisionId ?? ''),
    enabled: !!revisionId,
    queryFn: ({ signal }) => api.get<CatalogueResponse>(`/api/revisions/${revisionId}/messages`, signal),
  });
}

export function useCaptures(harnessId: string | undefined) {
  return useQuery({
    queryKey: busKeys.captures(harnessId ?? ''),
    enabled: !!harnessId,
    queryFn: ({ signal }) => api.get<{ captures: CaptureRow[] }>(`/api/harnesses/${harnessId}/captures`, signal),
  });
}

export function useCapture(id: string | null) {
  return useQuery({ queryKey: busKeys.capture(id ?? ''), enabled: !!id, queryFn: ({ signal }) => api.get<CaptureDetail>(`/api/captures/${id}`, signal) });
}

export function useCompare(rest: string | null, moved: string | null, revisionId: string | null) {
  return useQuery({
    queryKey: busKeys.compare(rest ?? '', moved ?? '', revisionId ?? ''),
    enabled: !!rest && !!moved && rest !== moved,
    queryFn: ({ signal }) => api.get<CompareResponse>(`/api/captures/${rest}/compare/${moved}${revisionId ? `?revision=${revisionId}` : ''}`, signal),
  });
}

export function useFileFinding(revisionId: string | null) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: FindingInput) => api.post<FindingResponse>(`/api/revisions/${revisionId}/findings`, input),
    onSettled: () => qc.invalidateQueries({ queryKey: ['bus'] }),
  });
}

export function useDeleteCapture(harnessId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.delete(`/api/captures/${id}`),
    onSettled: () => qc.invalidateQueries({ queryKey: busKeys.captures(harnessId) }),
  });
}

export interface UploadResult {
  capture: CaptureRow;
  badLines: { lineNo: number; reason: string; text: string }[];
}

/**
 * Sends a capture as multipart with XMLHttpRequest, which (unlike fetch) reports upload
 * progress. `onProgress(share)` runs with 0..1 while the file goes up; the server parses as it
 * receives, so the answer follows the last byte closely.
 */
export function uploadCapture(harnessId: string, file: File, name: string, onProgress: (share: number) => void, revisionId?: string | null): Promise<UploadResult> {
  return new Promise((resolve, reject) => {
    const form = new FormData();
    if (name.trim()) form.append('name', name.trim());
    form.append('file', file, file.name);
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api/harnesses/${harnessId}/captures${revisionId ? `?revision=${revisionId}` : ''}`);
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable && e.total > 0) onProgress(e.loaded / e.total);
    };
    xhr.onerror = () => reject(new ApiError(0, 'network', 'Wirewalk could not reach the server. Check the connection and try again.'));
    xhr.onload = () => {
      let data: unknown;
      try {
        data = JSON.parse(xhr.responseText);
      } catch {
        data = undefined;
      }
      if (xhr.status >= 200 && xhr.status < 300) return resolve(data as UploadResult);
      const err = (data as { error?: { code?: string; message?: string; details?: { path: string; message: string }[] } } | undefined)?.error;
      reject(new ApiError(xhr.status, err?.code ?? `http_${xhr.status}`, err?.message ?? 'The capture could not be uploaded.', err?.details ?? []));
    };
    xhr.send(form);
  });
}
