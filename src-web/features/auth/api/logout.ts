import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, setCsrfToken } from '../../../lib/api-client';
import { getMeQueryOptions } from './get-me';

export async function logout(): Promise<void> {
  await api('/auth/logout', { method: 'POST', quiet401: true });
  setCsrfToken(null);
}

export function useLogout() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: logout,
    onSettled: () => {
      qc.clear();
      qc.setQueryData(getMeQueryOptions().queryKey, null);
    },
  });
}
