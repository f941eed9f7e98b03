import { QueryCache, QueryClient } from '@tanstack/react-query';
import { isApiError } from './http';

/** Called when any query finds the session gone; the auth feature points it at `me`. */
let onSignedOut: (() => void) | null = null;
export function setSignedOutHandler(handler: (() => void) | null): void {
  onSignedOut = handler;
}

export function createQueryClient(): QueryClient {
  return new QueryClient({
    queryCache: new QueryCache({
      onError: (error) => {
        if (isApiError(error, 401)) onSignedOut?.();
      },
    }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        refetchOnWindowFocus: false,
        // Client errors will not get better by asking again; network blips might.
        retry: (failureCount, error) => {
          if (isApiError(error) && error.status >= 400 && error.status < 500) return false;
          return failureCount < 2;
        },
      },
      mutations: { retry: false },
    },
  });
}

/** The application's query client (tests build their own with `createQueryClient`). */
export const queryClient = createQueryClient();
