import type { QueryClient } from '@tanstack/react-query';
import { Navigate, redirect, useLocation, type LoaderFunctionArgs } from 'react-router-dom';
import type { ReactNode } from 'react';
import { meQuery, useMe } from './api';
import type { Me } from './types';

/**
 * Only same-site paths are accepted as a return path after sign-in, so a crafted link
 * cannot send someone elsewhere (`//host`, `https://…`, `/\host`).
 */
export function safeReturnPath(raw: string | null | undefined): string {
  if (!raw || !raw.startsWith('/') || raw.startsWith('//') || raw.startsWith('/\\')) return '/';
  if (raw.startsWith('/signin')) return '/';
  return raw;
}

export function signInPath(returnTo: string): string {
  const next = safeReturnPath(returnTo);
  return next === '/' ? '/signin' : `/signin?next=${encodeURIComponent(next)}`;
}

/** Loader for the signed-in part of the app: signed-out visitors go to /signin, keeping their path. */
export function requireSession(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs): Promise<Me> => {
    const me = await queryClient.ensureQueryData(meQuery);
    if (!me) {
      const url = new URL(request.url);
      throw redirect(signInPath(url.pathname + url.search));
    }
    return me;
  };
}

/**
 * The same rule while the app is open: when the session ends (sign-out elsewhere, expiry),
 * `me` becomes null and the visitor is sent to sign in, keeping where they were.
 */
export function SessionGate({ children }: { children: ReactNode }) {
  const me = useMe();
  const location = useLocation();
  if (me.data === null) {
    return <Navigate to={signInPath(location.pathname + location.search)} replace />;
  }
  return <>{children}</>;
}
