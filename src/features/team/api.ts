import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { http } from '../../lib/http';
import { authKeys, signedInSchema, type Role } from '../auth';
import { cruiseKeys } from '../cruises';
import { invitationListSchema, invitationPreviewSchema, inviteResultSchema, memberListSchema } from './types';

const base = (cruiseId: string) => `/api/cruises/${encodeURIComponent(cruiseId)}`;

export const invitationKeys = {
  all: ['invitation'] as const,
  preview: (token: string) => [...invitationKeys.all, token] as const,
};

export const membersQuery = (cruiseId: string) =>
  queryOptions({
    queryKey: cruiseKeys.members(cruiseId),
    queryFn: ({ signal }) => http(`${base(cruiseId)}/members`, { schema: memberListSchema, signal }),
  });

export const invitationsQuery = (cruiseId: string) =>
  queryOptions({
    queryKey: cruiseKeys.invitations(cruiseId),
    queryFn: ({ signal }) => http(`${base(cruiseId)}/invitations`, { schema: invitationListSchema, signal }),
  });

export function useMembers(cruiseId: string) {
  return useQuery(membersQuery(cruiseId));
}

/** Pending and past invitations; only the chief scientist may list them, so callers pass `enabled`. */
export function useInvitations(cruiseId: string, enabled: boolean) {
  return useQuery({ ...invitationsQuery(cruiseId), enabled });
}

export function useInviteMember(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { email: string; role: Role }) =>
      http(`${base(cruiseId)}/members`, { method: 'POST', body: input, schema: inviteResultSchema }),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: cruiseKeys.invitations(cruiseId) });
      void queryClient.invalidateQueries({ queryKey: cruiseKeys.audit(cruiseId) });
    },
  });
}

export function useChangeRole(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { userId: string; role: Role }) =>
      http(`${base(cruiseId)}/members/${encodeURIComponent(input.userId)}`, {
        method: 'PATCH',
        body: { role: input.role },
      }),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: cruiseKeys.members(cruiseId) });
      void queryClient.invalidateQueries({ queryKey: cruiseKeys.audit(cruiseId) });
      // If you changed your own role, what you may do on this cruise changed too.
      void queryClient.invalidateQueries({ queryKey: authKeys.me() });
      void queryClient.invalidateQueries({ queryKey: cruiseKeys.detail(cruiseId) });
    },
  });
}

export function useRemoveMember(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (userId: string) =>
      http(`${base(cruiseId)}/members/${encodeURIComponent(userId)}`, { method: 'DELETE' }),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: cruiseKeys.members(cruiseId) });
      void queryClient.invalidateQueries({ queryKey: cruiseKeys.audit(cruiseId) });
    },
  });
}

export function useInvitation(token: string) {
  return useQuery({
    queryKey: invitationKeys.preview(token),
    queryFn: ({ signal }) =>
      http(`/api/invitations/${encodeURIComponent(token)}`, { schema: invitationPreviewSchema, signal }),
    staleTime: Infinity,
  });
}

export function useAcceptInvitation(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { name?: string; password: string }) =>
      http(`/api/invitations/${encodeURIComponent(token)}/accept`, {
        method: 'POST',
        body: input,
        schema: signedInSchema,
        changesSession: true,
      }),
    onSuccess: async () => {
      // A new session (possibly a different person): start from a clean cache.
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== authKeys.all[0] });
      queryClient.removeQueries({ queryKey: invitationKeys.preview(token) });
      await queryClient.invalidateQueries({ queryKey: authKeys.me() });
    },
  });
}
