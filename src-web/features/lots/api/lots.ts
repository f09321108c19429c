import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { CreateLotInput, Lot, LotStatus, LotSummary, switchingViewSchema } from '@shared/schemas/receiving';
import type { proposeDecision } from '@shared/compute/evaluate';
import { api } from '../../../lib/api-client';

export interface LotListQuery {
  page: number;
  pageSize: number;
  sort?: string;
  /** 'waiting' = received or inspecting, oldest first (the Dock). */
  status?: LotStatus | 'waiting';
  supplierId?: string;
  partId?: string;
  q?: string;
  receivedFrom?: string;
  receivedTo?: string;
}

export const getLots = (q: LotListQuery) => api<{ items: LotSummary[]; total: number }>('/lots', { query: { ...q } });
export const getLotsQueryOptions = (q: LotListQuery) => queryOptions({ queryKey: ['lots', 'list', q], queryFn: () => getLots(q), placeholderData: keepPreviousData });
/** `refetchMs` keeps the Dock's ages and queue current while it stays open on a screen. */
export const useLots = (q: LotListQuery, refetchMs?: number) => useQuery({ ...getLotsQueryOptions(q), refetchInterval: refetchMs });

export const getLot = (id: string) => api<Lot>(`/lots/${id}`);
export const getLotQueryOptions = (id: string) => queryOptions({ queryKey: ['lots', 'one', id], queryFn: () => getLot(id) });
export const useLot = (id: string) => useQuery(getLotQueryOptions(id));

/** What the stored results say; the same rule the server applies when the decision is sent. */
export type Proposal = ReturnType<typeof proposeDecision>;
export const getProposal = (id: string) => api<Proposal>(`/lots/${id}/proposal`);
export const getProposalQueryOptions = (id: string) => queryOptions({ queryKey: ['lots', 'proposal', id], queryFn: () => getProposal(id) });
export const useProposal = (id: string, enabled = true) => useQuery({ ...getProposalQueryOptions(id), enabled });

export type SwitchingView = z.infer<typeof switchingViewSchema>;
export const getSwitching = (supplierId: string, partId: string) => api<SwitchingView>(`/suppliers/${supplierId}/switching`, { query: { partId } });
export const getSwitchingQueryOptions = (supplierId: string, partId: string) =>
  queryOptions({ queryKey: ['switching', supplierId, partId], queryFn: () => getSwitching(supplierId, partId) });
export const useSwitching = (supplierId: string | undefined, partId: string | undefined) =>
  useQuery({ ...getSwitchingQueryOptions(supplierId ?? '', partId ?? ''), enabled: !!supplierId && !!partId });

export const certificateUrl = (lotId: string) => `/api/lots/${lotId}/certificate`;
export const photoUrl = (photoId: string) => `/api/photos/${photoId}`;
export const thumbnailUrl = (photoId: string) => `/api/photos/${photoId}/thumbnail`;

export function useReceiveLot() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateLotInput) => api<Lot>('/lots', { method: 'POST', body: input }),
    onSuccess: async (lot) => {
      qc.setQueryData(getLotQueryOptions(lot.id).queryKey, lot);
      await Promise.all([qc.invalidateQueries({ queryKey: ['lots', 'list'] }), qc.invalidateQueries({ queryKey: ['switching'] })]);
    },
  });
}

export function useAttachCertificate() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, file }: { id: string; file: File }) => {
      const body = new FormData();
      body.append('file', file);
      return api<Lot>(`/lots/${id}/certificate`, { method: 'POST', body });
    },
    onSuccess: (lot) => qc.setQueryData(getLotQueryOptions(lot.id).queryKey, lot),
  });
}

export function useDecideLot() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...body }: { id: string; decision: 'accept' | 'reject'; comment: string; version: number }) => api<Lot>(`/lots/${id}/decision`, { method: 'POST', body }),
    onSuccess: async (lot) => {
      qc.setQueryData(getLotQueryOptions(lot.id).queryKey, lot);
      await Promise.all([
        qc.invalidateQueries({ queryKey: ['lots', 'list'] }),
        qc.invalidateQueries({ queryKey: ['lots', 'proposal', lot.id] }),
        qc.invalidateQueries({ queryKey: ['switching', lot.supplierId, lot.partId] }),
      ]);
    },
  });
}
