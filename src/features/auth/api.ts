import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { http, isApiError } from '../../lib/http';
import { meSchema, signedInSchema, type Me } from './types';

export const authKeys = {
  all: ['auth'] as const,
  me: () => [...authKeys.all, 'me'] as const,
};

/** The signed-in user and memberships, or `null` when nobody is signed in (401). */
export const meQuery = queryOptions({
  queryKey: authKeys.me(),
  queryFn: async ({ signal }): Promise<Me | null> => {
    try {
      return await http('/api/auth/me', { schema: meSchema, signal });
    } catch (error) {
      if (isApiError(error, 401)) return null;
      throw error;
    }
  },
  staleTime: 60_000,
});

export function useMe() {
  return useQuery(meQuery);
}

export interface Credentials {
  email: string;
  password: string;
}

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (credentials: Credentials) =>
      http('/api/auth/login', {
        method: 'POST',
        body: credentials,
        schema: signedInSchema,
        changesSession: true,
      }),
    onSuccess: async () => {
      // Another person may have used this browser: drop everything cached for the last session.
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== authKeys.all[0] });
      await queryClient.fetchQuery({ ...meQuery, staleTime: 0 });
    },
  });
}

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => http('/api/auth/logout', { method: 'POST', changesSession: true }),
    onSettled: () => {
      queryClient.clear();
      queryClient.setQueryData(authKeys.me(), null);
    },
  });
}

export function useRequestPasswordReset() {
  return useMutation({
    mutationFn: (email: string) => http('/api/auth/password-reset', { method: 'POST', body: { email } }),
  });
}

export function useConfirmPasswordReset() {
  return useMutation({
    mutationFn: (input: { token: string; password: string }) =>
      http('/api/auth/password-reset/confirm', { method: 'POST', body: input }),
  });
}
