import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Dashboard } from '@shared/schemas/dashboard';
import { api } from '../../../lib/api-client';

/** The home page's figures for the signed-in role; refreshed every minute while the page is open. */
export const getDashboardQueryOptions = () => queryOptions({ queryKey: ['dashboard'], queryFn: () => api<Dashboard>('/dashboard'), refetchInterval: 60_000, staleTime: 15_000 });
export const useDashboard = () => useQuery(getDashboardQueryOptions());
