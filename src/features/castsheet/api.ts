import { queryOptions, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { http } from '../../lib/http';
import { cruiseKeys } from '../cruises';
import { sectionKeys } from '../sections';
import { castKeys } from './keys';
import { castHistoryResponseSchema } from '../../../shared/api/castHistory';
import {
  castDetailSchema,
  castQcSchema,
  flagLogEntrySchema,
  flagResultWithChangeSchema,
  neighboursSchema,
  pendingSchema,
  type FlagEdit,
  type QcTestId,
} from './types';

export const castQuery = (castId: string) =>
  queryOptions({
    queryKey: castKeys.detail(castId),
    queryFn: ({ signal }) => http(`/api/casts/${encodeURIComponent(castId)}`, { schema: castDetailSchema, signal }),
  });

/** One cast with its columns, inversions, fitness, flags and notes. */
export function useCast(castId: string) {
  return useQuery(castQuery(castId));
}

const enc = encodeURIComponent;

/** The proposals of the automatic tests for a cast, and the inversions its intake found. */
export function useCastQc(castId: string) {
  return useQuery({
    queryKey: castKeys.qc(castId),
    queryFn: ({ signal }) => http(`/api/casts/${enc(castId)}/qc`, { schema: castQcSchema, signal }),
  });
}

/** Every flag change of a cast, newest first. */
export function useFlagLog(castId: string) {
  return useQuery({
    queryKey: castKeys.flagLog(castId),
    queryFn: ({ signal }) =>
      http(`/api/casts/${enc(castId)}/flag-log`, { schema: z.array(flagLogEntrySchema), signal }),
  });
}

/** Every version of the cast's station and cast (files, who, when, carried flags). */
export function useCastHistory(castId: string) {
  return useQuery({
    queryKey: castKeys.history(castId),
    queryFn: ({ signal }) => http(`/api/casts/${enc(castId)}/history`, { schema: castHistoryResponseSchema, signal }),
  });
}

/**
 * The previous and next station's casts along a line (null: the cruise's default line), and the same station in
 * the earlier occupations of that line, for overlays.
 */
export function useNeighbours(castId: string, line: string | null = null) {
  return useQuery({
    queryKey: castKeys.neighbours(castId, line),
    queryFn: ({ signal }) =>
      http(`/api/casts/${enc(castId)}/neighbours${line ? `?line=${enc(line)}` : ''}`, {
        schema: neighboursSchema,
        signal,
      }),
    staleTime: 60_000,
  });
}

/** Pending proposals per cast of the cruise (for stepping to the next cast that has some). */
export function usePendingProposals(cruiseId: string) {
  return useQuery({
    queryKey: castKeys.pending(cruiseId),
    queryFn: ({ signal }) => http(`/api/cruises/${enc(cruiseId)}/qc/pending`, { schema: pendingSchema, signal }),
  });
}

/**
 * Flags feed what is computed from the casts, so any flag change invalidates this cast, its QC and flag log,
 * the cruise's cast list and pending counts, and every section product of the cruise.
 */
function invalidateFlags(queryClient: QueryClient, cruiseId: string, castId: string) {
  for (const key of [
    castKeys.detail(castId),
    castKeys.qc(castId),
    castKeys.flagLog(castId),
    castKeys.pending(cruiseId),
    cruiseKeys.casts(cruiseId),
    sectionKeys.data(cruiseId),
  ]) {
    void queryClient.invalidateQueries({ queryKey: key });
  }
}

/** Set a quality flag on a pressure range. */
export function useSetFlag(cruiseId: string, castId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (edit: FlagEdit) =>
      http(`/api/casts/${enc(castId)}/flags`, { method: 'POST', body: edit, schema: flagResultWithChangeSchema }),
    onSuccess: () => invalidateFlags(queryClient, cruiseId, castId),
  });
}

export interface Decision {
  ids?: string[];
  test?: QcTestId;
  decision: 'accept' | 'reject';
  reason?: string;
}

/** Accept or reject proposals, by id or all pending of one test. */
export function useDecideProposals(cruiseId: string, castId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (d: Decision) =>
      http(`/api/casts/${enc(castId)}/qc/decisions`, {
        method: 'POST',
        body: d,
        schema: z.object({ decided: z.number(), levels: z.number() }),
      }),
    onSuccess: () => invalidateFlags(queryClient, cruiseId, castId),
  });
}

/** Reopen rejected proposals (back to pending), by id or all rejected ones of a test. */
export function useReopenProposals(cruiseId: string, castId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (d: { ids?: string[]; test?: QcTestId; reason?: string }) =>
      http(`/api/casts/${enc(castId)}/qc/reopen`, {
        method: 'POST',
        body: d,
        schema: z.object({ reopened: z.number() }),
      }),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: castKeys.qc(castId) });
      void queryClient.invalidateQueries({ queryKey: castKeys.pending(cruiseId) });
    },
  });
}

/** Undo one entry of the flag log. */
export function useUndoFlagChange(cruiseId: string, castId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (changeId: string) =>
      http(`/api/casts/${enc(castId)}/flag-log/undo`, {
        method: 'POST',
        body: { changeId },
        schema: flagResultWithChangeSchema,
      }),
    onSuccess: () => invalidateFlags(queryClient, cruiseId, castId),
  });
}
