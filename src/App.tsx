import { useState } from 'react';
import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import { createBrowserRouter, RouterProvider, type RouteObject } from 'react-router-dom';
import { authKeys, requireSession } from './features/auth';
// The router's own hook into the Section screen: a small module, kept out of the screen's chunk.
import { prefetchSection } from './features/sections/prefetch';
import { Progress } from './components/Notice';
import { setSignedOutHandler } from './lib/queryClient';
import SignIn from './routes/SignIn';
import ResetRequest from './routes/ResetRequest';
import ResetConfirm from './routes/ResetConfirm';
import InviteAccept from './routes/InviteAccept';
import SignedInLayout from './routes/SignedInLayout';
import Cruises from './routes/Cruises';
import CruiseLayout from './routes/CruiseLayout';
import NotFound from './routes/NotFound';
import RouteError from './routes/RouteError';

/** A screen loaded on first visit, so its code (maps, tables, later plots) stays out of the first download. */
const lazyScreen = (load: () => Promise<{ default: React.ComponentType }>) => async () => ({
  Component: (await load()).default,
});

/**
 * Every route of the client. Screens live one per file in src/routes/; the cruise area's
 * sub-navigation is CRUISE_TABS in src/features/cruises/nav.ts — add a child route here and
 * an entry there.
 */
export function buildRoutes(queryClient: QueryClient): RouteObject[] {
  return [
    {
      errorElement: <RouteError />,
      HydrateFallback: () => <Progress label="Starting Sigmaline…" />,
      children: [
        { path: '/signin', element: <SignIn /> },
        { path: '/reset', element: <ResetRequest /> },
        { path: '/reset/:token', element: <ResetConfirm /> },
        { path: '/invite/:token', element: <InviteAccept /> },
        {
          loader: requireSession(queryClient),
          element: <SignedInLayout />,
          children: [
            { index: true, element: <Cruises /> },
            {
              path: 'cruises/:id',
              element: <CruiseLayout />,
              children: [
                { index: true, lazy: lazyScreen(() => import('./routes/CruiseDesk')) },
                { path: 'intake', lazy: lazyScreen(() => import('./routes/Intake')) },
                { path: 'casts', lazy: lazyScreen(() => import('./routes/CastSheet')) },
                { path: 'casts/:castId', lazy: lazyScreen(() => import('./routes/CastSheet')) },
                { path: 'layer-sets', lazy: lazyScreen(() => import('./routes/LayerSets')) },
                { path: 'derived', lazy: lazyScreen(() => import('./routes/DerivedVariables')) },
                { path: 'team', lazy: lazyScreen(() => import('./routes/CruiseTeam')) },
                {
                  path: 'section',
                  lazy: lazyScreen(() => import('./routes/Section')),
                  // the plotting library and the frames' data start downloading with the screen's code
                  loader: ({ params, request }) => prefetchSection(queryClient, params.id, new URL(request.url)),
                  // only on entering the screen: the screen itself asks when its controls change the query
                  shouldRevalidate: ({ currentUrl, nextUrl }) => currentUrl.pathname !== nextUrl.pathname,
                },
                { path: 'deliveries', lazy: lazyScreen(() => import('./routes/Deliveries')) },
                { path: 'then-and-now', lazy: lazyScreen(() => import('./routes/ThenAndNow')) },
              ],
            },
            { path: 'admin/mail', lazy: lazyScreen(() => import('./routes/AdminMail')) },
            { path: '*', element: <NotFound /> },
          ],
        },
      ],
    },
  ];
}

export function App({ queryClient }: { queryClient: QueryClient }) {
  // Any query that meets a 401 means the session is gone: mark `me` as signed out, and the
  // session gate sends the person to sign in, keeping where they were.
  const [router] = useState(() => {
    setSignedOutHandler(() => queryClient.setQueryData(authKeys.me(), null));
    return createBrowserRouter(buildRoutes(queryClient));
  });
  return (
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>
  );
}
