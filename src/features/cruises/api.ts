import { queryOptions, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { http } from '../../lib/http';
import { authKeys } from '../auth';
import { lineKeys } from '../lines';
import { sectionKeys } from '../sections';
import {
  planApplyResponseSchema,
  planChangeSchema,
  stationListResponseSchema,
  stationResponseSchema,
  type IMPORT_MODES,
  type StationPatch,
} from '../../../shared/api/stations';
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

// ---- the station plan: edit, remove, reorder, and a station table previewed then applied ----

/** Everything a change of the plan moves: the plan, the counts, the trail, the default line and its sections. */
function invalidatePlan(queryClient: QueryClient, cruiseId: string) {
  void queryClient.invalidateQueries({ queryKey: cruiseKeys.stations(cruiseId) });
  void queryClient.invalidateQueries({ queryKey: cruiseKeys.detail(cruiseId) });
  void queryClient.invalidateQueries({ queryKey: cruiseKeys.list() });
  void queryClient.invalidateQueries({ queryKey: cruiseKeys.audit(cruiseId) });
  void queryClient.invalidateQueries({ queryKey: lineKeys.list(cruiseId) });
  void queryClient.invalidateQueries({ queryKey: sectionKeys.data(cruiseId) });
}

const stationsUrl = (cruiseId: string, rest = '') => `/api/cruises/${encodeURIComponent(cruiseId)}/stations${rest}`;

export function useEditStation(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ stationId, patch }: { stationId: string; patch: StationPatch }) =>
      http(stationsUrl(cruiseId, `/${encodeURIComponent(stationId)}`), {
        method: 'PATCH',
        body: patch,
        schema: stationResponseSchema,
      }),
    onSuccess: () => invalidatePlan(queryClient, cruiseId),
  });
}

export function useRemoveStation(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (stationId: string) =>
      http(stationsUrl(cruiseId, `/${encodeURIComponent(stationId)}`), {
        method: 'DELETE',
        schema: stationListResponseSchema,
      }),
    onSuccess: (stations) => {
      queryClient.setQueryData(cruiseKeys.stations(cruiseId), stations);
      invalidatePlan(queryClient, cruiseId);
    },
  });
}

export function useReorderStations(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (ids: string[]) =>
      http(stationsUrl(cruiseId, '/order'), { method: 'PUT', body: { ids }, schema: stationListResponseSchema }),
    onSuccess: (stations) => {
      queryClient.setQueryData(cruiseKeys.stations(cruiseId), stations);
      invalidatePlan(queryClient, cruiseId);
    },
  });
}

export type ImportMode = (typeof IMPORT_MODES)[number];
export type StationTableRequest = { text: string; mode: ImportMode };

/** What a station table would change in the plan (writes nothing on the server). */
export function usePreviewStationTable(cruiseId: string) {
  return useMutation({
    mutationFn: (req: StationTableRequest) =>
      http(stationsUrl(cruiseId, '/table/preview'), { method: 'POST', body: req, schema: planChangeSchema }),
  });
}

/** Apply exactly the previewed change (its token). */
export function useApplyStationTable(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (req: StationTableRequest & { token: string }) =>
      http(stationsUrl(cruiseId, '/table/apply'), { method: 'POST', body: req, schema: planApplyResponseSchema }),
    onSuccess: (out) => {
      queryClient.setQueryData(cruiseKeys.stations(cruiseId), out.stations);
      invalidatePlan(queryClient, cruiseId);
    },
  });
}
