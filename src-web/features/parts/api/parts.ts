import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Construction, CreatePartInput, Part } from '@shared/schemas/master-data';
import { api } from '../../../lib/api-client';

export interface PartListQuery {
  page: number;
  pageSize: number;
  sort?: string;
  q?: string;
  construction?: Construction;
}

export const getParts = (q: PartListQuery) => api<{ items: Part[]; total: number }>('/parts', { query: { ...q } });
export const getPartsQueryOptions = (q: PartListQuery) => queryOptions({ queryKey: ['parts', 'list', q], queryFn: () => getParts(q), placeholderData: keepPreviousData });
export const useParts = (q: PartListQuery) => useQuery(getPartsQueryOptions(q));

export const getPart = (id: string) => api<Part>(`/parts/${id}`);
export const getPartQueryOptions = (id: string) => queryOptions({ queryKey: ['parts', 'one', id], queryFn: () => getPart(id) });
export const usePart = (id: string) => useQuery(getPartQueryOptions(id));

/** Where the browser opens the part's drawing (served inline as a PDF). */
export const drawingUrl = (id: string) => `/api/parts/${id}/drawing`;

export function useCreatePart() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreatePartInput) => api<Part>('/parts', { method: 'POST', body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['parts'] }),
  });
}

export function useUploadDrawing() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, file }: { id: string; file: File }) => {
      const body = new FormData();
      body.append('file', file);
      return api<Part>(`/parts/${id}/drawing`, { method: 'POST', body });
    },
    // Refetch rather than use the reply: the reply after an upload does not carry activePlanId.
    onSuccess: () => qc.invalidateQueries({ queryKey: ['parts'] }),
  });
}
