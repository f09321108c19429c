import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ApprovalStatus, CreateSupplierInput, Supplier, UpdateSupplierInput } from '@shared/schemas/master-data';
import { api } from '../../../lib/api-client';

export interface SupplierListQuery {
  page: number;
  pageSize: number;
  sort?: string;
  q?: string;
  approvalStatus?: ApprovalStatus;
}

export const getSuppliers = (q: SupplierListQuery) => api<{ items: Supplier[]; total: number }>('/suppliers', { query: { ...q } });
export const getSuppliersQueryOptions = (q: SupplierListQuery) =>
  queryOptions({ queryKey: ['suppliers', 'list', q], queryFn: () => getSuppliers(q), placeholderData: keepPreviousData });
export const useSuppliers = (q: SupplierListQuery) => useQuery(getSuppliersQueryOptions(q));

export const getSupplier = (id: string) => api<Supplier>(`/suppliers/${id}`);
export const getSupplierQueryOptions = (id: string) => queryOptions({ queryKey: ['suppliers', 'one', id], queryFn: () => getSupplier(id) });
export const useSupplier = (id: string | undefined) => useQuery({ ...getSupplierQueryOptions(id ?? ''), enabled: !!id });

export function useCreateSupplier() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateSupplierInput) => api<Supplier>('/suppliers', { method: 'POST', body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['suppliers'] }),
  });
}

export function useUpdateSupplier() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...input }: UpdateSupplierInput & { id: string }) => api<Supplier>(`/suppliers/${id}`, { method: 'PATCH', body: input }),
    onSuccess: (s) => {
      qc.setQueryData(getSupplierQueryOptions(s.id).queryKey, s);
      return qc.invalidateQueries({ queryKey: ['suppliers'] });
    },
  });
}
