import { queryOptions, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { http } from '../../lib/http';
import { layerSetKeys } from './keys';
import { layerSetListSchema, layerSetSchema, type LayerSetInput } from './types';

const path = (cruiseId: string) => `/api/cruises/${encodeURIComponent(cruiseId)}/layer-sets`;

/** The cruise's layer sets: the one query of this resource, which the section and delivery screens reuse. */
export const layerSetsQuery = (cruiseId: string) =>
  queryOptions({
    queryKey: layerSetKeys.list(cruiseId),
    queryFn: ({ signal }) => http(path(cruiseId), { schema: layerSetListSchema, signal }),
  });

export function useLayerSets(cruiseId: string) {
  return useQuery(layerSetsQuery(cruiseId));
}

/** A changed set changes the list; grids are keyed by the levels themselves, so they need no drop. */
function invalidateSets(queryClient: QueryClient, cruiseId: string) {
  void queryClient.invalidateQueries({ queryKey: layerSetKeys.list(cruiseId) });
}

export function useCreateLayerSet(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: LayerSetInput) => http(path(cruiseId), { method: 'POST', body: input, schema: layerSetSchema }),
    onSuccess: () => invalidateSets(queryClient, cruiseId),
  });
}

export function useUpdateLayerSet(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...input }: LayerSetInput & { id: string }) =>
      http(`${path(cruiseId)}/${encodeURIComponent(id)}`, { method: 'PATCH', body: input, schema: layerSetSchema }),
    onSuccess: () => invalidateSets(queryClient, cruiseId),
  });
}
