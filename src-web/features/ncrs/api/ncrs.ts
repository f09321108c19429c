import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  CreateDefectCodeInput, CreateDispositionsInput, CreateNcrInput, DefectCode, HeldLot, Ncr, NcrForSupplier, NcrPhoto, NcrStatus, NcrSummary, UpdateDefectCodeInput,
} from '@shared/schemas/ncr';
import { api } from '../../../lib/api-client';

export interface NcrListQuery {
  page: number;
  pageSize: number;
  sort?: string;
  status?: NcrStatus | 'active';
  supplierId?: string;
  q?: string;
}

export const getNcrsQueryOptions = (q: NcrListQuery) =>
  queryOptions({ queryKey: ['ncrs', 'list', q], queryFn: () => api<{ items: NcrSummary[]; total: number }>('/ncrs', { query: { ...q } }), placeholderData: keepPreviousData });
export const useNcrs = (q: NcrListQuery) => useQuery(getNcrsQueryOptions(q));

export const getNcrQueryOptions = (id: string) => queryOptions({ queryKey: ['ncrs', 'one', id], queryFn: () => api<Ncr>(`/ncrs/${id}`) });
export const useNcr = (id: string) => useQuery(getNcrQueryOptions(id));
/** A supplier user's reduced view of its own NCR (same route, fewer fields). */
export const useSupplierNcr = (id: string) => useQuery({ queryKey: ['ncrs', 'supplier', id], queryFn: () => api<NcrForSupplier>(`/ncrs/${id}`) });

export const useHeldLots = (enabled = true) => useQuery({ queryKey: ['ncrs', 'held-lots'], queryFn: () => api<{ items: HeldLot[] }>('/ncrs/held-lots'), enabled });

export const ncrPhotoUrl = (ncrId: string, photoId: string) => `/api/ncrs/${ncrId}/photos/${photoId}`;
export const ncrThumbUrl = (ncrId: string, photoId: string) => `/api/ncrs/${ncrId}/photos/${photoId}/thumbnail`;
export const ncrQrUrl = (ncrId: string) => `/api/ncrs/${ncrId}/qr.svg`;
export const ncrHoldTagApiUrl = (ncrId: string) => `/api/ncrs/${ncrId}/hold-tag`;

function useNcrWrite<I>(fn: (input: I) => Promise<Ncr>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: async (n) => {
      qc.setQueryData(getNcrQueryOptions(n.id).queryKey, n);
      await Promise.all([qc.invalidateQueries({ queryKey: ['ncrs', 'list'] }), qc.invalidateQueries({ queryKey: ['ncrs', 'held-lots'] }), qc.invalidateQueries({ queryKey: ['lots'] })]);
    },
  });
}

export const useCreateNcr = () => useNcrWrite((input: CreateNcrInput) => api<Ncr>('/ncrs', { method: 'POST', body: input }));
export const useNcrTransition = () =>
  useNcrWrite(({ id, ...body }: { id: string; to: NcrStatus; version: number; note?: string | null }) => api<Ncr>(`/ncrs/${id}/transition`, { method: 'POST', body }));
/** 401 here means "wrong password", not "signed out": the dialog shows it and the session stays. */
export const useDisposition = () =>
  useNcrWrite(({ id, ...body }: CreateDispositionsInput & { id: string }) => api<Ncr>(`/ncrs/${id}/dispositions`, { method: 'POST', body, quiet401: true }));

export function useUploadNcrPhoto() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, file, caption }: { id: string; file: File; caption?: string }) => {
      const f = new FormData();
      f.append('file', file);
      if (caption) f.append('caption', caption);
      return api<NcrPhoto>(`/ncrs/${id}/photos`, { method: 'POST', body: f });
    },
    onSuccess: (_, v) => qc.invalidateQueries({ queryKey: getNcrQueryOptions(v.id).queryKey }),
  });
}

export const useDefectCodes = (includeInactive = false) =>
  useQuery({ queryKey: ['defect-codes', includeInactive], queryFn: () => api<{ items: DefectCode[] }>('/defect-codes', { query: { includeInactive: includeInactive ? 'true' : undefined } }), staleTime: 5 * 60_000 });

export function useCreateDefectCode() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (input: CreateDefectCodeInput) => api<DefectCode>('/defect-codes', { method: 'POST', body: input }), onSuccess: () => qc.invalidateQueries({ queryKey: ['defect-codes'] }) });
}

export function useUpdateDefectCode() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...body }: UpdateDefectCodeInput & { id: string }) => api<DefectCode>(`/defect-codes/${id}`, { method: 'PATCH', body }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['defect-codes'] }),
  });
}
