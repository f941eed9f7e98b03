import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { http } from '../../lib/http';
import { comparisonSchema, cruiseListSchema, lineListSchema, occupationsSchema } from './types';
import { comparisonBody, type ComparisonView } from './view';

export const comparisonKeys = {
  all: ['comparisons'] as const,
  grid: (body: string) => ['comparisons', 'grid', body] as const,
  occupations: (lineId: string) => ['comparisons', 'occupations', lineId] as const,
  lines: (cruiseId: string) => ['comparisons', 'lines', cruiseId] as const,
  cruises: () => ['comparisons', 'cruises'] as const,
};

export function useComparison(view: ComparisonView) {
  const body = comparisonBody(view);
  const key = JSON.stringify(body);
  return useQuery({
    queryKey: comparisonKeys.grid(key),
    queryFn: ({ signal }) => http('/api/comparisons', { method: 'POST', body, schema: comparisonSchema, signal }),
    enabled: Boolean(view.a && view.b),
    staleTime: 5 * 60_000,
    placeholderData: keepPreviousData,
  });
}

export function useLines(cruiseId: string | null) {
  return useQuery({
    queryKey: comparisonKeys.lines(cruiseId ?? ''),
    queryFn: ({ signal }) =>
      http(`/api/cruises/${encodeURIComponent(cruiseId!)}/lines`, { schema: lineListSchema, signal }),
    enabled: Boolean(cruiseId),
    staleTime: 60_000,
  });
}

export function useMyCruises() {
  return useQuery({
    queryKey: comparisonKeys.cruises(),
    queryFn: ({ signal }) => http('/api/cruises', { schema: cruiseListSchema, signal }),
    staleTime: 60_000,
  });
}

export function useOccupations(lineId: string | null) {
  return useQuery({
    queryKey: comparisonKeys.occupations(lineId ?? ''),
    queryFn: ({ signal }) =>
      http(`/api/lines/${encodeURIComponent(lineId!)}/occupations`, { schema: occupationsSchema, signal }),
    enabled: Boolean(lineId),
    staleTime: 60_000,
  });
}

export function useLinkLine(lineId: string | null) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (other: string) =>
      http(`/api/lines/${encodeURIComponent(lineId!)}/occupations`, {
        method: 'POST',
        body: { line: other },
        schema: occupationsSchema,
      }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['comparisons', 'occupations'] }),
  });
}
