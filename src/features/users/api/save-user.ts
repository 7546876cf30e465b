import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateUserInput, UpdateUserInput, UserRow } from '@shared/contracts/users.ts';
import { api } from '@/lib/api-client.ts';
import { userKeys } from './keys.ts';

export const createUser = (input: CreateUserInput) => api<{ data: UserRow }>('/admin/users', { method: 'POST', body: input }).then((r) => r.data);
export const updateUser = (id: string, input: UpdateUserInput) => api<{ data: UserRow }>(`/admin/users/${encodeURIComponent(id)}`, { method: 'PATCH', body: input }).then((r) => r.data);
export const resetPassword = (id: string, password: string) => api<void>(`/admin/users/${encodeURIComponent(id)}/password`, { method: 'POST', body: { password } });

export function useCreateUser() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createUser, onSuccess: () => qc.invalidateQueries({ queryKey: userKeys.all }) });
}

export function useUpdateUser() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, input }: { id: string; input: UpdateUserInput }) => updateUser(id, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: userKeys.all }),
  });
}

export function useResetPassword() {
  return useMutation({ mutationFn: ({ id, password }: { id: string; password: string }) => resetPassword(id, password) });
}
