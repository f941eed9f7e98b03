import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { http } from '../../lib/http';
import { fileVariableListResponseSchema } from '../../../shared/api/resources';
import { sectionKeys } from './keys';
import { geostrophySchema, savedViewListSchema, savedViewSchema, sectionSchema, tsSchema } from './types';

const cruisePath = (cruiseId: string) => `/api/cruises/${encodeURIComponent(cruiseId)}`;

export const sectionQuery = (cruiseId: string, query: string) =>
  queryOptions({
    queryKey: sectionKeys.grid(cruiseId, query),
    queryFn: async ({ signal }) => {
      // six significant digits are far below what a colour map can show, and halve the answer
      const section = await http(`${cruisePath(cruiseId)}/section?${query}&digits=6`, {
        schema: sectionSchema,
        signal,
      });
      performance.mark?.(`section ${section.choices.coord} parsed`);
      return section;
    },
    staleTime: 5 * 60_000,
  });

/** The extra variables the cruise's casts carry (fluorescence, PAR, a second sensor…), with their units. */
export const fileVariablesQuery = (cruiseId: string) =>
  queryOptions({
    queryKey: sectionKeys.fileVariables(cruiseId),
    queryFn: ({ signal }) =>
      http(`${cruisePath(cruiseId)}/file-variables`, { schema: fileVariableListResponseSchema, signal }),
    staleTime: 5 * 60_000,
  });

/** One frame of the section; the last frame stays on screen while the next is computed. */
export function useSection(cruiseId: string, query: string, enabled = true) {
  // A changed query supersedes the last: the superseded request loses its only observer and is
  // aborted (the signal is passed to fetch), so one request per frame is in flight.
  return useQuery({ ...sectionQuery(cruiseId, query), placeholderData: keepPreviousData, enabled });
}

export function useTsPoints(cruiseId: string, every = 4, line: string | null = null) {
  const lineQuery = line ? `&line=${encodeURIComponent(line)}` : '';
  return useQuery({
    queryKey: [...sectionKeys.ts(cruiseId, every), line],
    queryFn: ({ signal }) =>
      http(`${cruisePath(cruiseId)}/ts?every=${every}${lineQuery}`, { schema: tsSchema, signal }),
    staleTime: 5 * 60_000,
  });
}

export function useGeostrophy(cruiseId: string, query: string) {
  return useQuery({
    queryKey: sectionKeys.geostrophy(cruiseId, query),
    queryFn: ({ signal }) => http(`${cruisePath(cruiseId)}/geostrophy?${query}`, { schema: geostrophySchema, signal }),
    staleTime: 5 * 60_000,
    placeholderData: keepPreviousData,
  });
}

export function useSavedViews(cruiseId: string) {
  return useQuery({
    queryKey: sectionKeys.views(cruiseId),
    queryFn: ({ signal }) => http(`${cruisePath(cruiseId)}/views`, { schema: savedViewListSchema, signal }),
  });
}

export function useSaveView(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (view: { name: string; query: string; shared?: boolean }) =>
      http(`${cruisePath(cruiseId)}/views`, { method: 'POST', body: view, schema: savedViewSchema }),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: sectionKeys.views(cruiseId) }),
  });
}

/** The owner's edit of a saved view: its name, its query (the current view) or whether the team shares it. */
export function useEditView(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...patch }: { id: string; name?: string; query?: string; shared?: boolean }) =>
      http(`${cruisePath(cruiseId)}/views/${encodeURIComponent(id)}`, {
        method: 'PATCH',
        body: patch,
        schema: savedViewSchema,
      }),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: sectionKeys.views(cruiseId) }),
  });
}

export function useDeleteView(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (viewId: string) =>
      http(`${cruisePath(cruiseId)}/views/${encodeURIComponent(viewId)}`, { method: 'DELETE' }),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: sectionKeys.views(cruiseId) }),
  });
}
