import type { QueryClient } from '@tanstack/react-query';
import { preloadPlotly } from '../../components/plot/LazyPlot';
import { sectionQuery } from './api';
import { parseViewState, sectionQueryString } from './viewState';

/**
 * Started by the router as soon as a Section URL is matched, before any screen renders: the
 * plotting library and both frames' data download side by side, instead of one after the other
 * behind the cruise's own request. A view naming a layer set waits for the set's levels (the
 * screen asks then); everything else is exactly the query the screen will make, so it finds the
 * answers in the cache.
 */
export function prefetchSection(queryClient: QueryClient, cruiseId: string | undefined, url: URL): null {
  void preloadPlotly().catch(() => undefined);
  const view = parseViewState(url.searchParams);
  if (!cruiseId || view.layerSet) return null;
  for (const coord of ['pressure', 'density'] as const) {
    void queryClient.prefetchQuery(sectionQuery(cruiseId, sectionQueryString(view, coord, null)));
  }
  return null;
}
