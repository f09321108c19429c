import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CreateGaugeInput, Gauge, GaugeKind, UpdateGaugeInput } from '@shared/schemas/master-data';
import { api } from '../../../lib/api-client';

export type CalibrationFilter = 'overdue' | 'due-soon' | 'ok';

export interface GaugeListQuery {
  page: number;
  pageSize: number;
  sort?: string;
  q?: string;
  kind?: GaugeKind;
  calibration?: CalibrationFilter;
}

export const getGauges = (q: GaugeListQuery) => api<{ items: Gauge[]; total: number }>('/gauges', { query: { ...q } });
export const getGaugesQueryOptions = (q: GaugeListQuery) => queryOptions({ queryKey: ['gauges', 'list', q], queryFn: () => getGauges(q), placeholderData: keepPreviousData });
export const useGauges = (q: GaugeListQuery) => useQuery(getGaugesQueryOptions(q));

export function useCreateGauge() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateGaugeInput) => api<Gauge>('/gauges', { method: 'POST', body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['gauges'] }),
  });
}

export function useUpdateGauge() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...input }: UpdateGaugeInput & { id: string }) => api<Gauge>(`/gauges/${id}`, { method: 'PATCH', body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['gauges'] }),
  });
}
