import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Me, Role } from '@shared/api/auth';
import { api } from '@/lib/api';
import { setSignedIn } from '@/lib/me';

export interface Invitation {
  email: string;
  role: Role;
  shopName: string;
  invitedBy: string;
}

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: { email: string; password: string }) => api.post<Me>('/api/auth/sign-in', body),
    onSuccess: (me) => setSignedIn(queryClient, me),
  });
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: (body: { email: string }) => api.post('/api/auth/password-reset', body) });
}

export function useConfirmPasswordReset() {
  return useMutation({
    mutationFn: (body: { token: string; password: string }) => api.post('/api/auth/password-reset/confirm', body),
  });
}

export function useInvitation(token: string) {
  return useQuery({
    queryKey: ['invitation', token],
    queryFn: ({ signal }) => api.get<Invitation>(`/api/invitations/${encodeURIComponent(token)}`, signal),
    staleTime: Infinity,
  });
}

export function useAcceptInvitation(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: { name: string; password: string }) =>
      api.post<Me>(`/api/invitations/${encodeURIComponent(token)}/accept`, body),
    onSuccess: (me) => setSignedIn(queryClient, me),
  });
}
