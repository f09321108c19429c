import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SessionUser } from '@shared/schemas/auth';
import { api, ApiError } from '../../../lib/api-client';

/** The signed-in user, or null when signed out. */
export async function getMe(): Promise<SessionUser | null> {
  try {
    const r = await api<{ user: SessionUser }>('/auth/me', { quiet401: true });
    return r.user;
  } catch (err) {
    if (err instanceof ApiError && err.status === 401) return null;
    throw err;
  }
}

export const getMeQueryOptions = () => queryOptions({ queryKey: ['auth', 'me'], queryFn: getMe, staleTime: 60_000 });
export const useMe = () => useQuery(getMeQueryOptions());
