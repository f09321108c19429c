import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ScorecardList, ScorecardPeriod } from '@shared/schemas/scorecard';
import { api } from '../../../lib/api-client';

export interface ScorecardParams {
  period: ScorecardPeriod;
  from?: string;
  to?: string;
}

export const getScorecardsQueryOptions = (q: ScorecardParams, enabled = true) =>
  queryOptions({ queryKey: ['scorecards', 'list', q], queryFn: () => api<ScorecardList>('/scorecards', { query: { ...q } }), placeholderData: keepPreviousData, enabled });
export const useScorecards = (q: ScorecardParams, enabled = true) => useQuery(getScorecardsQueryOptions(q, enabled));
