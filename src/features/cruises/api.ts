import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { http } from '../../lib/http';
import { authKeys } from '../auth';
import { cruiseKeys } from './keys';
import {
  cruiseListSchema,
  cruiseSchema,
  stationListSchema,
  stationSchema,
  type NewCruise,
  type NewStation,
} from './types';

export const cruisesQuery = queryOptions({
  queryKey: cruiseKeys.list(),
  queryFn: ({ signal }) => http('/api/cruises', { schema: cruiseListSchema, signal }),
});

export const cruiseQuery = (id: string) =>
  queryOptions({
    queryKey: cruiseKeys.detail(id),
    queryFn: ({ signal }) => http(`/api/cruises/${encodeURIComponent(id)}`, { schema: cruiseSchema, signal }),
  });

export const stationsQuery = (id: string) =>
  queryOptions({
    queryKey: cruiseKeys.stations(id),
    queryFn: ({ signal }) =>
      http(`/api/cruises/${encodeURIComponent(id)}/stations`, { schema: stationListSchema, signal }),
  });

export function useCruises() {
  return useQuery(cruisesQuery);
}

export function useCruise(id: string) {
  return useQuery(cruiseQuery(id));
}

export function useStations(id: string) {
  return useQuery(stationsQuery(id));
}

export function useCreateCruise() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (cruise: NewCruise) => http('/api/cruises', { method: 'POST', body: cruise, schema: cruiseSchema }),
    onSuccess: (cruise) => {
      queryClient.setQueryData(cruiseKeys.detail(cruise.id), cruise);
      void queryClient.invalidateQueries({ queryKey: cruiseKeys.list() });
      // The creator is now the cruise's chief scientist: their memberships changed.
      void queryClient.invalidateQueries({ queryKey: authKeys.me() });
    },
  });
}

export type CruisePatch = Partial<NewCruise> & { locked?: boolean };

export function useUpdateCruise(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (patch: CruisePatch) =>
      http(`/api/cruises/${encodeURIComponent(id)}`, { method: 'PATCH', body: patch, schema: cruiseSchema }),
    onSuccess: (cruise) => {
      queryClient.setQueryData(cruiseKeys.detail(id), cruise);
      void queryClient.invalidateQueries({ queryKey: cruiseKeys.list() });
      void queryClient.invalidateQueries({ queryKey: cruiseKeys.audit(id) });
    },
  });
}

export function useAddStation(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (station: NewStation) =>
      http(`/api/cruises/${encodeURIComponent(cruiseId)}/stations`, {
        method: 'POST',
        body: station,
        schema: stationSchema,
      }),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: cruiseKeys.stations(cruiseId) });
      // stationCount is shown on the cruise and in the list.
      void queryClient.invalidateQueries({ queryKey: cruiseKeys.detail(cruiseId) });
      void queryClient.invalidateQueries({ queryKey: cruiseKeys.list() });
      void queryClient.invalidateQueries({ queryKey: cruiseKeys.audit(cruiseId) });
    },
  });
}
