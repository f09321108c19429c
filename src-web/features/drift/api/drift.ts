import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { AckSignalInput, ChartResponse, ControlLimit, DriftSignal, FreezeLimitsInput, WatchRow } from '@shared/schemas/drift';
import { api } from '../../../lib/api-client';

export interface ChartKey {
  supplierId: string;
  partId: string;
  characteristicCode: string;
  from?: string;
  to?: string;
}

export const getWatch = () => api<WatchRow[]>('/spc/watch');
export const getWatchQueryOptions = () => queryOptions({ queryKey: ['spc', 'watch'], queryFn: getWatch });
export const useWatch = () => useQuery(getWatchQueryOptions());

export const getChart = (k: ChartKey) => api<ChartResponse>('/spc/charts', { query: { ...k } });
export const getChartQueryOptions = (k: ChartKey) => queryOptions({ queryKey: ['spc', 'chart', k], queryFn: () => getChart(k), placeholderData: keepPreviousData });
export const useChart = (k: ChartKey) => useQuery(getChartQueryOptions(k));

/** A freeze or an acknowledgement changes the chart, its signals and the watch list. */
function useInvalidateSpc() {
  const qc = useQueryClient();
  return () => qc.invalidateQueries({ queryKey: ['spc'] });
}

export function useFreezeLimits() {
  const done = useInvalidateSpc();
  return useMutation({ mutationFn: (input: FreezeLimitsInput) => api<ControlLimit>('/spc/limits', { method: 'POST', body: input }), onSuccess: done });
}

export function useAckSignal() {
  const done = useInvalidateSpc();
  return useMutation({
    mutationFn: ({ id, ...input }: AckSignalInput & { id: string }) => api<DriftSignal>(`/spc/signals/${id}/ack`, { method: 'POST', body: input }),
    onSuccess: done,
  });
}
