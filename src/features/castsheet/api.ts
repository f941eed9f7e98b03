import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { http } from '../../lib/http';
import { cruiseKeys } from '../cruises';
import { sectionKeys } from '../sections';
import { castKeys } from './keys';
import { castDetailSchema, flagResultSchema, type FlagEdit } from './types';

export const castQuery = (castId: string) =>
  queryOptions({
    queryKey: castKeys.detail(castId),
    queryFn: ({ signal }) => http(`/api/casts/${encodeURIComponent(castId)}`, { schema: castDetailSchema, signal }),
  });

/** One cast with its columns, inversions, fitness, flags and notes. */
export function useCast(castId: string) {
  return useQuery(castQuery(castId));
}

/**
 * Set a quality flag on a pressure range. Flags feed what is computed from the casts, so the edit
 * invalidates this cast, the cruise's cast list and every section product of the cruise.
 */
export function useSetFlag(cruiseId: string, castId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (edit: FlagEdit) =>
      http(`/api/casts/${encodeURIComponent(castId)}/flags`, { method: 'POST', body: edit, schema: flagResultSchema }),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: castKeys.detail(castId) });
      void queryClient.invalidateQueries({ queryKey: cruiseKeys.casts(cruiseId) });
      void queryClient.invalidateQueries({ queryKey: sectionKeys.data(cruiseId) });
    },
  });
}
