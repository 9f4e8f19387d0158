import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Role } from '@shared/api/auth';
import { api } from '@/lib/api';
import { meQueryKey } from '@/lib/me';

export interface Account {
  name: string;
  email: string;
  role: Role;
  shopName: string;
}

const accountKey = ['account'] as const;

export function useAccount() {
  return useQuery({ queryKey: accountKey, queryFn: ({ signal }) => api.get<Account>('/api/account', signal) });
}

export function useUpdateAccount() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: { name: string }) => api.patch<Account | undefined>('/api/account', body),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: accountKey });
      void queryClient.invalidateQueries({ queryKey: meQueryKey });
    },
  });
}

export function useChangePassword() {
  return useMutation({
    mutationFn: (body: { currentPassword: string; newPassword: string }) => api.post('/api/account/password', body),
  });
}
