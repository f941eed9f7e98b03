import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { http } from '../../lib/http';
import { deliveryKeys } from './keys';
import { deliveryListSchema, deliverySchema, type Delivery, type NewDelivery } from './types';

const inProgress = (d: Delivery) => d.status === 'queued' || d.status === 'building';

/** The cruise's deliveries; polled while any is still being built, so progress moves on screen. */
export function useDeliveries(cruiseId: string) {
  return useQuery({
    queryKey: deliveryKeys.list(cruiseId),
    queryFn: ({ signal }) =>
      http(`/api/cruises/${encodeURIComponent(cruiseId)}/deliveries`, { schema: deliveryListSchema, signal }),
    refetchInterval: (query) => (query.state.data?.some(inProgress) ? 800 : false),
  });
}

export function useBuildDelivery(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: NewDelivery) =>
      http(`/api/cruises/${encodeURIComponent(cruiseId)}/deliveries`, { method: 'POST', body, schema: deliverySchema }),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: deliveryKeys.list(cruiseId) }),
  });
}

export function useReleaseDelivery(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) =>
      http(`/api/deliveries/${encodeURIComponent(id)}/release`, { method: 'POST', schema: deliverySchema }),
    onSuccess: (delivery) => {
      queryClient.setQueryData(deliveryKeys.detail(delivery.id), delivery);
      void queryClient.invalidateQueries({ queryKey: deliveryKeys.list(cruiseId) });
    },
  });
}

export function useDeleteDelivery(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => http(`/api/deliveries/${encodeURIComponent(id)}`, { method: 'DELETE' }),
    onSuccess: (_void, id) => {
      queryClient.removeQueries({ queryKey: deliveryKeys.detail(id) });
      void queryClient.invalidateQueries({ queryKey: deliveryKeys.list(cruiseId) });
    },
  });
}

export const downloadUrl = (id: string, format: string) =>
  `/api/deliveries/${encodeURIComponent(id)}/download?format=${encodeURIComponent(format)}`;
