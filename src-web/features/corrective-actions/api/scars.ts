import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CreateScarInput, EightDStep, Evidence, Scar, ScarStatus, ScarSummary, SupplierNotice } from '@shared/schemas/corrective-action';
import { api } from '../../../lib/api-client';

export interface ScarListQuery {
  page: number;
  pageSize: number;
  sort?: string;
  status?: ScarStatus | 'active';
  supplierId?: string;
  q?: string;
}

export const getScarsQueryOptions = (q: ScarListQuery) =>
  queryOptions({ queryKey: ['scars', 'list', q], queryFn: () => api<{ items: ScarSummary[]; total: number }>('/corrective-actions', { query: { ...q } }), placeholderData: keepPreviousData });
export const useScars = (q: ScarListQuery) => useQuery(getScarsQueryOptions(q));

export const getScarQueryOptions = (id: string) => queryOptions({ queryKey: ['scars', 'one', id], queryFn: () => api<Scar>(`/corrective-actions/${id}`) });
/** `refetchMs` keeps the mail status current while the engineer watches it go out. */
export const useScar = (id: string, refetchMs?: number) => useQuery({ ...getScarQueryOptions(id), refetchInterval: refetchMs });

export const useOpenSteps = () =>
  useQuery({ queryKey: ['scars', 'open-steps'], queryFn: () => api<{ items: { id: string; number: string; step: EightDStep; dueOn: string | null; status: string }[] }>('/corrective-actions/open-steps') });
export const useNotices = () => useQuery({ queryKey: ['supplier-notices'], queryFn: () => api<{ items: SupplierNotice[] }>('/supplier-notices') });

export const evidenceUrl = (scarId: string, evidenceId: string) => `/api/corrective-actions/${scarId}/evidence/${evidenceId}`;

function useScarWrite<I>(fn: (input: I) => Promise<Scar>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: async (s) => {
      qc.setQueryData(getScarQueryOptions(s.id).queryKey, s);
      await Promise.all([qc.invalidateQueries({ queryKey: ['scars', 'list'] }), qc.invalidateQueries({ queryKey: ['scars', 'open-steps'] }), qc.invalidateQueries({ queryKey: ['ncrs'] })]);
    },
  });
}

export const useCreateScar = () => useScarWrite((input: CreateScarInput) => api<Scar>('/corrective-actions', { method: 'POST', body: input }));
export const usePutStep = () =>
  useScarWrite(({ id, step, ...body }: { id: string; step: EightDStep; answer: Record<string, unknown>; submit: boolean; version: number }) => api<Scar>(`/corrective-actions/${id}/steps/${step}`, { method: 'PUT', body }));
export const useReviewStep = () =>
  useScarWrite(({ id, step, ...body }: { id: string; step: EightDStep; decision: 'accept' | 'return'; comment?: string | null; version: number }) =>
    api<Scar>(`/corrective-actions/${id}/steps/${step}/review`, { method: 'POST', body }),
  );
export const useScarTransition = () =>
  useScarWrite(({ id, ...body }: { id: string; to: ScarStatus; version: number; note?: string | null }) => api<Scar>(`/corrective-actions/${id}/transition`, { method: 'POST', body }));

export function useUploadEvidence() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, step, file }: { id: string; step: EightDStep; file: File }) => {
      const f = new FormData();
      f.append('file', file);
      return api<Evidence>(`/corrective-actions/${id}/steps/${step}/evidence`, { method: 'POST', body: f });
    },
    onSuccess: (_, v) => qc.invalidateQueries({ queryKey: getScarQueryOptions(v.id).queryKey }),
  });
}
