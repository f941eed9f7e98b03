import { useCallback, useEffect, useRef, useState } from 'react';
import { queryOptions, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { http, isApiError } from '../../lib/http';
import { cruiseKeys } from '../cruises';
import { sectionKeys } from '../sections';
import { intakeKeys } from './keys';
import { sendFile } from './send';
import {
  columnMappingSchema,
  intakeAnswersSchema,
  uploadPreviewSchema,
  type IntakeAnswers,
  isActive,
  uploadListSchema,
  uploadSchema,
  type ColumnMapping,
  type Upload,
} from './types';

/** How often a queued or processing upload is asked about, ms. */
export const POLL_MS = 1000;

const cruisePath = (cruiseId: string) => `/api/cruises/${encodeURIComponent(cruiseId)}`;

export const uploadsQuery = (cruiseId: string) =>
  queryOptions({
    queryKey: intakeKeys.uploads(cruiseId),
    queryFn: ({ signal }) => http(`${cruisePath(cruiseId)}/uploads`, { schema: uploadListSchema, signal }),
    // The history keeps itself current while anything in it is still being processed.
    refetchInterval: (query) => (query.state.data?.some((u) => isActive(u.status)) ? POLL_MS * 2 : false),
  });

/** The cruise's uploads, newest first. */
export function useUploads(cruiseId: string) {
  return useQuery(uploadsQuery(cruiseId));
}

/** When an upload finishes, the casts it made (and everything computed from them) are new. */
function invalidateAfterProcessing(queryClient: QueryClient, cruiseId: string) {
  void queryClient.invalidateQueries({ queryKey: intakeKeys.uploads(cruiseId) });
  void queryClient.invalidateQueries({ queryKey: cruiseKeys.casts(cruiseId) });
  void queryClient.invalidateQueries({ queryKey: cruiseKeys.detail(cruiseId) });
  void queryClient.invalidateQueries({ queryKey: sectionKeys.data(cruiseId) });
}

/** One upload, polled while it is queued or processing; on finishing, the casts and the history are refreshed. */
export function useUpload(cruiseId: string, uploadId: string | null, initial?: Upload) {
  const queryClient = useQueryClient();
  const query = useQuery({
    queryKey: intakeKeys.upload(uploadId ?? ''),
    queryFn: ({ signal }) =>
      http(`/api/uploads/${encodeURIComponent(uploadId ?? '')}`, { schema: uploadSchema, signal }),
    enabled: uploadId !== null,
    initialData: initial,
    initialDataUpdatedAt: initial ? 0 : undefined,
    refetchInterval: (q) => (q.state.data && isActive(q.state.data.status) ? POLL_MS : false),
  });
  const status = query.data?.status;
  const seen = useRef(status);
  useEffect(() => {
    if (seen.current && isActive(seen.current) && status && !isActive(status))
      invalidateAfterProcessing(queryClient, cruiseId);
    seen.current = status;
  }, [status, cruiseId, queryClient]);
  return query;
}

export function useColumnMapping(cruiseId: string) {
  return useQuery({
    queryKey: intakeKeys.mapping(cruiseId),
    queryFn: ({ signal }) => http(`${cruisePath(cruiseId)}/column-mapping`, { schema: columnMappingSchema, signal }),
  });
}

export function useSaveColumnMapping(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (mapping: ColumnMapping) =>
      http(`${cruisePath(cruiseId)}/column-mapping`, { method: 'PUT', body: { mapping }, schema: columnMappingSchema }),
    onSuccess: (saved) => queryClient.setQueryData(intakeKeys.mapping(cruiseId), saved),
  });
}

/** The cruise's remembered answers about what files lack. */
export const intakeAnswersQuery = (cruiseId: string) =>
  queryOptions({
    queryKey: intakeKeys.answers(cruiseId),
    queryFn: ({ signal }) => http(`${cruisePath(cruiseId)}/intake-answers`, { schema: intakeAnswersSchema, signal }),
  });

/** The first rows of an upload's files as they will be read with these answers (nothing stored). */
export const uploadPreviewQuery = (uploadId: string, answers: IntakeAnswers) =>
  queryOptions({
    queryKey: intakeKeys.preview(uploadId, answers),
    queryFn: ({ signal }) =>
      http(`/api/uploads/${encodeURIComponent(uploadId)}/preview`, {
        method: 'POST',
        body: answers,
        schema: uploadPreviewSchema,
        signal,
      }),
    staleTime: 60_000,
    retry: false,
  });

/** Remember the answers for the cruise, then process again every upload of the batch that waited for them. */
export function useAnswerAndRetry(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async ({ answers, uploadIds }: { answers: IntakeAnswers; uploadIds: readonly string[] }) => {
      const saved = await http(`${cruisePath(cruiseId)}/intake-answers`, {
        method: 'PUT',
        body: answers,
        schema: intakeAnswersSchema,
      });
      queryClient.setQueryData(intakeKeys.answers(cruiseId), saved);
      const retried = [];
      for (const id of uploadIds)
        retried.push(
          await http(`/api/uploads/${encodeURIComponent(id)}/retry`, { method: 'POST', schema: uploadSchema }),
        );
      return retried;
    },
    onSuccess: (uploads) => {
      for (const u of uploads) queryClient.setQueryData(intakeKeys.upload(u.id), u);
      void queryClient.invalidateQueries({ queryKey: intakeKeys.uploads(cruiseId) });
    },
  });
}

export function useRetryUpload(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (uploadId: string) =>
      http(`/api/uploads/${encodeURIComponent(uploadId)}/retry`, { method: 'POST', schema: uploadSchema }),
    onSuccess: (upload) => {
      // The upload is queued again: its own query starts polling, the history shows it queued.
      queryClient.setQueryData(intakeKeys.upload(upload.id), upload);
      void queryClient.invalidateQueries({ queryKey: intakeKeys.uploads(cruiseId) });
    },
  });
}

/** One file being sent from this browser. */
export interface Outgoing {
  key: string;
  name: string;
  size: number;
  /** Bytes sent so far, from XHR upload progress. */
  loaded: number;
  phase: 'waiting' | 'sending' | 'sent' | 'failed';
  error: unknown;
  /** What the server made of it: one upload, or one per entry of a zip. */
  uploads: Upload[];
}

/** Files sent at the same time; the rest wait their turn, each still with its own bar. */
export const PARALLEL_SENDS = 2;

let serial = 0;

/**
 * Send many files, one request each, with a real byte-progress bar per file; then hand the upload
 * records to the cache so each row can follow its processing by polling.
 */
export function useSendFiles(cruiseId: string) {
  const queryClient = useQueryClient();
  const [outgoing, setOutgoing] = useState<Outgoing[]>([]);
  // The queue lives in a ref (the truth, changed only here) and is mirrored into state for rendering,
  // so starting a request never happens inside a state updater.
  const items = useRef<Outgoing[]>([]);
  const files = useRef(new Map<string, File>());
  const running = useRef(0);
  const controllers = useRef(new Map<string, AbortController>());

  const patch = useCallback((key: string, change: Partial<Outgoing>) => {
    items.current = items.current.map((o) => (o.key === key ? { ...o, ...change } : o));
    setOutgoing(items.current);
  }, []);

  const pump = useCallback(() => {
    while (running.current < PARALLEL_SENDS) {
      const next = items.current.find((o) => o.phase === 'waiting');
      if (!next) return;
      const file = files.current.get(next.key);
      if (!file) return;
      files.current.delete(next.key);
      running.current += 1;
      const controller = new AbortController();
      controllers.current.set(next.key, controller);
      patch(next.key, { phase: 'sending' });
      sendFile(cruiseId, file, { signal: controller.signal, onProgress: ({ loaded }) => patch(next.key, { loaded }) })
        .then((uploads) => {
          for (const u of uploads) queryClient.setQueryData(intakeKeys.upload(u.id), u);
          void queryClient.invalidateQueries({ queryKey: intakeKeys.uploads(cruiseId) });
          patch(next.key, { phase: 'sent', loaded: file.size, uploads });
        })
        .catch((error: unknown) => patch(next.key, { phase: 'failed', error }))
        .finally(() => {
          running.current -= 1;
          controllers.current.delete(next.key);
          pump();
        });
    }
  }, [cruiseId, patch, queryClient]);

  const send = useCallback(
    (chosen: Iterable<File>) => {
      const added: Outgoing[] = [];
      for (const file of chosen) {
        const key = `f${++serial}`;
        files.current.set(key, file);
        added.push({ key, name: file.name, size: file.size, loaded: 0, phase: 'waiting', error: null, uploads: [] });
      }
      if (added.length === 0) return;
      items.current = [...items.current, ...added];
      setOutgoing(items.current);
      pump();
    },
    [pump],
  );

  const cancel = useCallback((key: string) => controllers.current.get(key)?.abort(), []);
  const clearFinished = useCallback(() => {
    items.current = items.current.filter((o) => o.phase === 'sending' || o.phase === 'waiting');
    setOutgoing(items.current);
  }, []);

  useEffect(() => {
    const live = controllers.current;
    return () => live.forEach((c) => c.abort());
  }, []);

  return { outgoing, send, cancel, clearFinished };
}

/** A failed send the person can act on (too large, storage down) versus one they cannot. */
export function sendFailureText(error: unknown): string {
  if (isApiError(error)) return error.message;
  return error instanceof Error ? error.message : 'The file could not be sent.';
}

/** Answer an upload whose casts would replace live ones: replace them (history kept) or keep the earlier ones. */
export function useReplaceDecision(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ uploadId, replace }: { uploadId: string; replace: boolean }) =>
      http(`/api/uploads/${encodeURIComponent(uploadId)}/replace-decision`, {
        method: 'POST',
        body: { replace },
        schema: uploadSchema,
      }),
    onSuccess: (upload) => {
      queryClient.setQueryData(intakeKeys.upload(upload.id), upload);
      void queryClient.invalidateQueries({ queryKey: intakeKeys.uploads(cruiseId) });
    },
  });
}

/** Remove an upload that produced no cast. */
export function useRemoveUpload(cruiseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (uploadId: string) => http(`/api/uploads/${encodeURIComponent(uploadId)}`, { method: 'DELETE' }),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: intakeKeys.uploads(cruiseId) }),
  });
}
