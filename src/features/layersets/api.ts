import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { http } from '../../lib/http';
import { sectionKeys } from '../sections/keys';
import { layerSetKeys } from './keys';
import { layerSetListSchema, layerSetSchema, type LayerSetInput } from './types';

const path = (cruiseId: string) => `/api/cruises/${encodeURIComponent(cruiseId)}/layer-sets`;

export function useLayerSets(cruiseId: string) {
  return useQuery({
    queryKey: layerSetKeys.list(cruiseId),
    queryFn: ({ signal }) => http(path(cruiseId), { schema: layerSetListSchema, signal }),
  });
}

/** A changed set changes this list and the section area's copy of it; grids are keyed by the levels themselves. */
function invalidateSets(queryClient: QueryClient, cruiseId: string) {
  void queryClient.invalidateQueries({ queryKey: layerSetKeys.list(cruiseId) });
  void queryClient.invalidateQueries({ queryKey: sectionKeys.layerSets(cruiseId) });
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
