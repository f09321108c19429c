import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CreateUserInput, UpdateUserInput, User } from '@shared/schemas/auth';
import { api } from '../../../lib/api-client';

export const getUsers = (page: number) => api<{ items: User[]; total: number }>('/users', { query: { page, pageSize: 100 } });
export const getUsersQueryOptions = (page = 1) => queryOptions({ queryKey: ['users', page], queryFn: () => getUsers(page) });
export const useUsers = (page = 1) => useQuery(getUsersQueryOptions(page));

export function useCreateUser() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateUserInput) => api<User>('/users', { method: 'POST', body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['users'] }),
  });
}

export function useUpdateUser() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...input }: UpdateUserInput & { id: string }) => api<User>(`/users/${id}`, { method: 'PATCH', body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['users'] }),
  });
}

export interface SupplierOption { id: string; code: string; name: string }
export const useSupplierOptions = () =>
  useQuery({
    queryKey: ['suppliers', 'options'],
    queryFn: () => api<{ items: SupplierOption[]; total: number }>('/suppliers', { query: { pageSize: 200 } }),
  });
