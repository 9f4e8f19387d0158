import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Role } from '@shared/api/auth';
import { api } from '@/lib/api';

export interface Person {
  userId: string;
  name: string;
  email: string;
  role: Role;
  joinedAt: string;
}

export interface PendingInvitation {
  id: string;
  email: string;
  role: Role;
  invitedAt: string;
  expiresAt: string;
}

export interface PeopleList {
  people: Person[];
  invitations: PendingInvitation[];
}

export const peopleKey = ['people'] as const;

export function usePeople() {
  return useQuery({ queryKey: peopleKey, queryFn: ({ signal }) => api.get<PeopleList>('/api/people', signal) });
}

function useInvalidatePeople() {
  const queryClient = useQueryClient();
  return () => queryClient.invalidateQueries({ queryKey: peopleKey });
}

export function useInvite() {
  const invalidate = useInvalidatePeople();
  return useMutation({
    mutationFn: (body: { email: string; role: Role }) => api.post<unknown>('/api/people/invitations', body),
    onSuccess: invalidate,
  });
}

export function useRevokeInvitation() {
  const invalidate = useInvalidatePeople();
  return useMutation({
    mutationFn: (id: string) => api.delete(`/api/people/invitations/${encodeURIComponent(id)}`),
    onSuccess: invalidate,
  });
}

export function useChangeRole() {
  const invalidate = useInvalidatePeople();
  return useMutation({
    mutationFn: ({ userId, role }: { userId: string; role: Role }) => api.patch<unknown>(`/api/people/${encodeURIComponent(userId)}`, { role }),
    onSuccess: invalidate,
  });
}

export function useRemovePerson() {
  const invalidate = useInvalidatePeople();
  return useMutation({
    mutationFn: (userId: string) => api.delete(`/api/people/${encodeURIComponent(userId)}`),
    onSuccess: invalidate,
  });
}
