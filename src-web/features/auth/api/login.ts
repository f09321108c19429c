import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LoginInput, SessionUser } from '@shared/schemas/auth';
import { api, setCsrfToken } from '../../../lib/api-client';
import { getMeQueryOptions } from './get-me';

export async function login(input: LoginInput): Promise<SessionUser> {
  setCsrfToken(null); // a fresh session gets a fresh token
  const r = await api<{ user: SessionUser; csrfToken: string }>('/auth/login', { method: 'POST', body: input, quiet401: true });
  setCsrfToken(r.csrfToken);
  return r.user;
}

export function useLogin() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: login,
    onSuccess: (user) => {
      qc.clear();
      qc.setQueryData(getMeQueryOptions().queryKey, user);
    },
  });
}
