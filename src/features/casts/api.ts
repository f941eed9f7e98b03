import { queryOptions, useQuery } from '@tanstack/react-query';
import { http } from '../../lib/http';
import { cruiseKeys } from '../cruises';
import { castListSchema } from './types';

export const castsQuery = (cruiseId: string) =>
  queryOptions({
    queryKey: cruiseKeys.casts(cruiseId),
    queryFn: ({ signal }) =>
      http(`/api/cruises/${encodeURIComponent(cruiseId)}/casts`, { schema: castListSchema, signal }),
  });

export function useCasts(cruiseId: string) {
  return useQuery(castsQuery(cruiseId));
}
