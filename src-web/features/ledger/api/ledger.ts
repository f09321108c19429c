import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AuditEvent, AuditVerify } from '@shared/schemas/audit';
import type { LedgerLot } from '@shared/schemas/ledger';
import type { LotStatus, LotSummary } from '@shared/schemas/receiving';
import type { Part, Supplier } from '@shared/schemas/master-data';
import { api } from '../../../lib/api-client';

export const getLedgerLot = (id: string) => api<LedgerLot>(`/ledger/lots/${id}`);
export const getLedgerLotQueryOptions = (id: string) => queryOptions({ queryKey: ['ledger', 'lot', id], queryFn: () => getLedgerLot(id) });
export const useLedgerLot = (id: string) => useQuery(getLedgerLotQueryOptions(id));

/** The chain check reads every record: cache it for a minute, refresh on demand. */
export const getChainStatus = () => api<AuditVerify>('/audit-events/verify');
export const getChainStatusQueryOptions = () => queryOptions({ queryKey: ['audit', 'verify'], queryFn: getChainStatus, staleTime: 60_000 });
export const useChainStatus = () => useQuery(getChainStatusQueryOptions());

export interface AuditListQuery {
  page: number;
  pageSize: number;
  sort?: 'at' | '-at';
  entity?: string;
  entityId?: string;
  actor?: string;
  action?: string;
  from?: string;
  to?: string;
}
export const getAuditEvents = (q: AuditListQuery) => api<{ items: AuditEvent[]; total: number }>('/audit-events', { query: { ...q } });
export const getAuditEventsQueryOptions = (q: AuditListQuery) => queryOptions({ queryKey: ['audit', 'list', q], queryFn: () => getAuditEvents(q), placeholderData: keepPreviousData });
export const useAuditEvents = (q: AuditListQuery) => useQuery(getAuditEventsQueryOptions(q));

export interface LedgerLotSearch {
  page: number;
  pageSize: number;
  sort?: string;
  q?: string;
  supplierId?: string;
  partId?: string;
  status?: LotStatus;
  receivedFrom?: string;
  receivedTo?: string;
}
/** GET /api/lots searches supplier lot, PO and heat numbers and the lot ref; supplier and part are filters. */
export const searchLots = (q: LedgerLotSearch) => api<{ items: LotSummary[]; total: number }>('/lots', { query: { ...q } });
export const searchLotsQueryOptions = (q: LedgerLotSearch) => queryOptions({ queryKey: ['ledger', 'lots', q], queryFn: () => searchLots(q), placeholderData: keepPreviousData });
export const useLedgerLotSearch = (q: LedgerLotSearch) => useQuery(searchLotsQueryOptions(q));

/** Supplier and part choices for the search filters (one page of 200 is the whole list here). */
export const useSupplierChoices = () =>
  useQuery({ queryKey: ['suppliers', 'list', { page: 1, pageSize: 200, sort: 'code' }], queryFn: () => api<{ items: Supplier[]; total: number }>('/suppliers', { query: { page: 1, pageSize: 200, sort: 'code' } }), staleTime: 5 * 60_000 });
export const usePartChoices = () =>
  useQuery({ queryKey: ['parts', 'list', { page: 1, pageSize: 200, sort: 'partNumber' }], queryFn: () => api<{ items: Part[]; total: number }>('/parts', { query: { page: 1, pageSize: 200, sort: 'partNumber' } }), staleTime: 5 * 60_000 });

/** Export addresses, with only the filters that are set. */
function withQuery(path: string, q: Record<string, string | number | undefined | null>): string {
  const p = new URLSearchParams();
  for (const [k, v] of Object.entries(q)) if (v !== undefined && v !== null && v !== '') p.set(k, String(v));
  const s = p.toString();
  return s ? `${path}?${s}` : path;
}
export const exportUrls = {
  lots: (q: Omit<LedgerLotSearch, 'page' | 'pageSize' | 'sort'>) => withQuery('/api/exports/lots.csv', { ...q }),
  readings: (q: { lotId?: string; from?: string; to?: string }) => withQuery('/api/exports/readings.csv', q),
  auditEvents: (q: Omit<AuditListQuery, 'page' | 'pageSize'>) => withQuery('/api/exports/audit-events.csv', { ...q }),
  lotReport: (lotId: string) => `/api/exports/lots/${lotId}/report.pdf`,
};
