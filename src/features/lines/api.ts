import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { http } from '../../lib/http';
import { sectionKeys } from '../sections';
import { lineKeys } from './keys';
import { lineListSchema, lineSchema, type LineInput } from './types';

const cruisePath = (cruiseId: string) => `/api/cruises/${encodeURIComponent(cruiseId)}`;

export function useLines(cruiseId: string) {
  return useQuery({
    queryKey: lineKeys.list(cruiseId),
    queryFn: ({ signal }) => http(`${cruisePath(cruiseId)}/lines`, { schema: lineListSchema, signal }),
    staleTime: 60_000,
  });
}

/** A change to a line changes the lines and every section-shaped answer drawn from them. */
function useInvalidate(cruiseId: string) {
  const queryClient = useQueryClient();
  return () => {
    void queryClient.invalidateQueries({ queryKey: lineKeys.list(cruiseId) });
    void queryClient.invalidateQueries({ queryKey: sectionKeys.data(cruiseId) });
  };
}

export function useCreateLine(cruiseId: string) {
  const invalidate = useInvalidate(cruiseId);
  return useMutation({
    mutationFn: (body: LineInput & { name: string }) =>
      http(`${cruisePath(cruiseId)}/lines`, { method: 'POST', body, schema: lineSchema }),
    onSuccess: invalidate,
  });
}

export function useUpdateLine(cruiseId: string) {
  const invalidate = useInvalidate(cruiseId);
  return useMutation({
    mutationFn: ({ id, ...body }: LineInput & { id: string }) =>
      http(`/api/lines/${encodeURIComponent(id)}`, { method: 'PATCH', body, schema: lineSchema }),
    onSuccess: invalidate,
  });
}

export function useDeleteLine(cruiseId: string) {
  const invalidate = useInvalidate(cruiseId);
  return useMutation({
    mutationFn: (id: string) => http(`/api/lines/${encodeURIComponent(id)}`, { method: 'DELETE' }),
    onSuccess: invalidate,
  });
}
