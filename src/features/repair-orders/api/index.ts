import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  Customer,
  CustomerCreate,
  MarkupCreate,
  OrderCreate,
  OrderDetail,
  OrderList,
  OrderListQuery,
  OrderSettings,
  OrderUpdate,
  Procedure,
  PublicReport,
  ReadingSetView,
  ReportSendInput,
  TimeEntryCreate,
  Unit,
  UnitCreate,
} from '@shared/api/orders';
import { api, ApiError } from '@/lib/api';

export const orderKeys = {
  list: (q: OrderListQuery) => ['repair-orders', 'list', q] as const,
  one: (id: string) => ['repair-orders', 'one', id] as const,
  readings: (id: string) => ['repair-orders', 'readings', id] as const,
};

function toQuery(q: Record<string, unknown>): string {
  const p = new URLSearchParams();
  for (const [k, v] of Object.entries(q)) {
    if (v === undefined || v === null || v === '') continue;
    if (Array.isArray(v)) v.forEach((x) => p.append(k, String(x)));
    else p.set(k, String(v));
  }
  const s = p.toString();
  return s ? `?${s}` : '';
}

export function useOrders(q: OrderListQuery) {
  return useQuery({ queryKey: orderKeys.list(q), queryFn: ({ signal }) => api.get<OrderList>(`/api/repair-orders${toQuery(q as Record<string, unknown>)}`, signal), placeholderData: keepPreviousData });
}

export function useOrder(id: string) {
  return useQuery({ queryKey: orderKeys.one(id), queryFn: ({ signal }) => api.get<{ order: OrderDetail }>(`/api/repair-orders/${id}`, signal).then((r) => r.order) });
}

/** Puts a fresh order answer into the cache (every order mutation answers `{ order }`). */
function useSetOrder() {
  const qc = useQueryClient();
  return (order: OrderDetail) => {
    qc.setQueryData(orderKeys.one(order.id), order);
    void qc.invalidateQueries({ queryKey: ['repair-orders', 'list'] });
  };
}

export function useOrderMutation<TInput, TResult extends { order: OrderDetail } = { order: OrderDetail }>(id: string, call: (input: TInput) => Promise<TResult>) {
  const setOrder = useSetOrder();
  const qc = useQueryClient();
  return useMutation({
    mutationFn: call,
    onSuccess: (r) => setOrder(r.order),
    onError: (error) => {
      if (error instanceof ApiError && error.status === 409) void qc.invalidateQueries({ queryKey: orderKeys.one(id) });
    },
  });
}

export const useUpdateOrder = (id: string) => useOrderMutation(id, (input: OrderUpdate) => api.patch<{ order: OrderDetail }>(`/api/repair-orders/${id}`, input));
export const useAddTime = (id: string) => useOrderMutation(id, (input: TimeEntryCreate) => api.post<{ order: OrderDetail }>(`/api/repair-orders/${id}/time-entries`, input));
export const useRemoveTime = (id: string) => useOrderMutation(id, (entryId: string) => api.delete<{ order: OrderDetail }>(`/api/repair-orders/${id}/time-entries/${entryId}`));
export const useAttachProcedure = (id: string) => useOrderMutation(id, (procedureId: string) => api.post<{ order: OrderDetail }>(`/api/repair-orders/${id}/procedures`, { procedureId }));
export const useTickStep = (id: string) =>
  useOrderMutation(id, (input: { opId: string; stepId: string; done: boolean }) => api.put<{ order: OrderDetail }>(`/api/repair-orders/${id}/procedures/${input.opId}/steps/${input.stepId}`, { done: input.done }));
export const useSendReport = (id: string) =>
  useOrderMutation(id, (input: ReportSendInput) => api.post<{ order: OrderDetail; sent: { to: string }; link: { url: string } | null }>(`/api/repair-orders/${id}/report/send`, input));
export const useCreateLink = (id: string) => useOrderMutation(id, (days: number | undefined) => api.post<{ order: OrderDetail; link: { url: string; expiresAt: string } }>(`/api/repair-orders/${id}/links`, days ? { days } : {}));
export const useRevokeLink = (id: string) => useOrderMutation(id, (linkId: string) => api.delete<{ order: OrderDetail }>(`/api/repair-orders/${id}/links/${linkId}`));
export const useUpload = (id: string) =>
  useOrderMutation(id, (files: File[]) => {
    const body = new FormData();
    for (const f of files) body.append('files', f, f.name);
    return api.post<{ order: OrderDetail }>(`/api/repair-orders/${id}/attachments`, body);
  });

export function useAttachmentChange(orderId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: { id: string; caption?: string | null; inReport?: boolean; remove?: boolean }) =>
      input.remove ? api.delete(`/api/attachments/${input.id}`) : api.patch(`/api/attachments/${input.id}`, { caption: input.caption, inReport: input.inReport }),
    onSuccess: () => qc.invalidateQueries({ queryKey: orderKeys.one(orderId) }),
  });
}

export function useCreateDrawing(orderId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: MarkupCreate) => api.post(`/api/repair-orders/${orderId}/drawings`, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: orderKeys.one(orderId) }),
  });
}
export function useRemoveDrawing(orderId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (drawingId: string) => api.delete(`/api/repair-orders/${orderId}/drawings/${drawingId}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: orderKeys.one(orderId) }),
  });
}

/** The reading sets of the order (the readings API); `available: false` while that API is not there. */
export function useOrderReadings(orderId: string) {
  return useQuery({
    queryKey: orderKeys.readings(orderId),
    queryFn: async ({ signal }) => {
      try {
        const r = await api.get<{ readingSets: ReadingSetView[] }>(`/api/reading-sets?repairOrderId=${orderId}`, signal);
        return { available: true, readingSets: r.readingSets };
      } catch (error) {
        if (error instanceof ApiError && error.status === 404) return { available: false, readingSets: [] as ReadingSetView[] };
        throw error;
      }
    },
  });
}

export function usePeople() {
  return useQuery({ queryKey: ['repair-orders', 'people'], queryFn: ({ signal }) => api.get<{ people: { id: string; name: string; role: string }[] }>('/api/repair-orders/people', signal).then((r) => r.people), staleTime: 300_000 });
}
export function useOrderSettings() {
  return useQuery({ queryKey: ['repair-orders', 'settings'], queryFn: ({ signal }) => api.get<{ settings: OrderSettings }>('/api/repair-orders/settings', signal).then((r) => r.settings) });
}
export function useSaveSettings() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (s: OrderSettings) => api.put('/api/repair-orders/settings', s), onSuccess: () => qc.invalidateQueries({ queryKey: ['repair-orders'] }) });
}
export function useProcedures() {
  return useQuery({ queryKey: ['procedures'], queryFn: ({ signal }) => api.get<{ procedures: Procedure[] }>('/api/procedures', signal).then((r) => r.procedures) });
}
export function useCreateProcedure() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (p: { title: string; notes: string | null; steps: string[] }) => api.post('/api/procedures', p), onSuccess: () => qc.invalidateQueries({ queryKey: ['procedures'] }) });
}

export function useCustomers(q: string, page = 1) {
  return useQuery({
    queryKey: ['customers', q, page],
    queryFn: ({ signal }) => api.get<{ customers: Customer[]; total: number; page: number; pageSize: number }>(`/api/customers${toQuery({ q, page })}`, signal),
    placeholderData: keepPreviousData,
  });
}
export function useCustomer(id: string | null) {
  return useQuery({ queryKey: ['customers', 'one', id], enabled: !!id, queryFn: ({ signal }) => api.get<{ customer: Customer; units: Unit[] }>(`/api/customers/${id}`, signal) });
}
export function useCreateCustomer() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (c: CustomerCreate) => api.post<{ customer: Customer }>('/api/customers', c), onSuccess: () => qc.invalidateQueries({ queryKey: ['customers'] }) });
}
export function useCreateUnit() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (u: UnitCreate) => api.post<{ unit: Unit }>('/api/units', u), onSuccess: () => qc.invalidateQueries({ queryKey: ['customers'] }) });
}
export function useCreateOrder() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (o: OrderCreate) => api.post<{ order: OrderDetail }>('/api/repair-orders', o), onSuccess: () => qc.invalidateQueries({ queryKey: ['repair-orders'] }) });
}

export function usePublicReport(token: string) {
  return useQuery({ queryKey: ['public-report', token], retry: false, queryFn: ({ signal }) => api.get<{ report: PublicReport }>(`/api/public/reports/${token}`, signal).then((r) => r.report) });
}

/** Harnesses and their revisions, for attaching a marked-up drawing. */
export function useHarnessList() {
  return useQuery({ queryKey: ['repair-orders', 'harnesses'], queryFn: ({ signal }) => api.get<{ harnesses: { id: string; name: string }[] }>('/api/harnesses', signal).then((r) => r.harnesses) });
}
export function useHarnessRevisions(harnessId: string | null) {
  return useQuery({
    queryKey: ['repair-orders', 'harness', harnessId],
    enabled: !!harnessId,
    queryFn: ({ signal }) => api.get<{ revisions: { id: string; number: number; status: string }[] }>(`/api/harnesses/${harnessId}`, signal).then((r) => r.revisions),
  });
}
export function useRevision(revisionId: string | null) {
  return useQuery({
    queryKey: ['repair-orders', 'revision', revisionId],
    enabled: !!revisionId,
    queryFn: ({ signal }) => api.get<{ document: { components: { id: string; label?: string }[]; wires: { id: string; from: string; to: string; color?: string; circuit?: string }[] } }>(`/api/revisions/${revisionId}`, signal),
  });
}
