import { queryOptions, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { http } from '../../lib/http';
import { cruiseKeys } from '../cruises';
import { sectionKeys } from '../sections';
import { castListSchema, removedCastListSchema } from './types';

export const castsQuery = (cruiseId: string) =>
  queryOptions({
    queryKey: cruiseKeys.casts(cruiseId),
    queryFn: ({ signal }) =>
      http(`/api/cruises/${encodeURIComponent(cruiseId)}/casts`, { schema: castListSchema, signal }),
  });

export function useCasts(cruiseId: string) {
  return useQuery(castsQuery(cruiseId));
}

const removedKey = (cruiseId: string) => [...cruiseKeys.casts(cruiseId), 'removed'] as const;

export function useRemovedCasts(cruiseId: string) {
  return useQuery({
    queryKey: removedKey(cruiseId),
    queryFn: ({ signal }) =>
      http(`/api/cruises/${encodeURIComponent(cruiseId)}/removed-casts`, { schema: removedCastListSchema, signal }),
  });
}

/** A cast's life changed: the cast lists, the cruise's figures and every section are new. */
function castsChanged(queryClient: QueryClient, cruiseId: string) {
  void queryClient.invalidateQueries({ queryKey: cruiseKeys.casts(cruiseId) });
  void queryClient.invalidateQueries({ queryKey: cruiseKeys.detail(cruiseId) });
  void queryClient.invalidateQueries({ queryKey: sectionKeys.data(cruiseId) });
}

/** Remove (chief scientist), restore, or decide on a partly read cast (accept / reject). */
export function useCastLife(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ castId, action }: { castId: string; action: 'remove' | 'restore' | 'accept' | 'reject' }) =>
      action === 'remove' || action === 'restore'
        ? http(`/api/casts/${encodeURIComponent(castId)}/${action}`, { method: 'POST', body: {} })
        : http(`/api/casts/${encodeURIComponent(castId)}/partly-read`, { method: 'POST', body: { decision: action } }),
    onSuccess: () => castsChanged(queryClient, cruiseId),
  });
}
