import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { http } from '../../lib/http';
import { sectionKeys } from '../sections';
import { derivedKeys } from './keys';
import {
  derivedVariableListSchema,
  derivedVariableSchema,
  formulaPreviewSchema,
  type NewDerivedVariable,
} from './types';

const path = (cruiseId: string) => `/api/cruises/${encodeURIComponent(cruiseId)}/derived-variables`;

/** The cruise's derived variables: the one query of this resource, which the section screen reuses. */
export const derivedVariablesQuery = (cruiseId: string) =>
  queryOptions({
    queryKey: derivedKeys.list(cruiseId),
    queryFn: ({ signal }) => http(path(cruiseId), { schema: derivedVariableListSchema, signal }),
  });

export function useDerivedVariables(cruiseId: string) {
  return useQuery(derivedVariablesQuery(cruiseId));
}

/** The formula evaluated on one cast (the preview route), cached by cast and text; null inputs wait. */
export function useFormulaPreview(castId: string | null, formula: string) {
  const text = formula.trim();
  return useQuery({
    queryKey: derivedKeys.preview(castId ?? '', text),
    queryFn: ({ signal }) =>
      http(`/api/casts/${encodeURIComponent(castId ?? '')}/formula-preview`, {
        method: 'POST',
        body: { formula: text },
        schema: formulaPreviewSchema,
        signal,
      }),
    enabled: castId !== null && text.length > 0,
    placeholderData: keepPreviousData,
    staleTime: Infinity,
    retry: false,
  });
}

export function useCreateDerivedVariable(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: NewDerivedVariable) =>
      http(path(cruiseId), { method: 'POST', body: input, schema: derivedVariableSchema }),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: derivedKeys.list(cruiseId) });
    },
  });
}

export function useDeleteDerivedVariable(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => http(`${path(cruiseId)}/${encodeURIComponent(id)}`, { method: 'DELETE' }),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: derivedKeys.list(cruiseId) });
      // A section drawn of the deleted variable no longer exists.
      void queryClient.invalidateQueries({ queryKey: sectionKeys.data(cruiseId) });
    },
  });
}
