/**
 * Query keys of the section area. Each resource has its own branch under `['sections', …]`,
 * keyed by cruise, so a mutation names exactly what it changes (a saved view invalidates the
 * views list, never the grids). Flag edits and uploads elsewhere invalidate `sectionKeys.data(id)`,
 * the prefix of everything computed from the casts.
 */
export const sectionKeys = {
  all: ['sections'] as const,
  /** Every computed product of a cruise's casts (grids, T–S points, geostrophy). */
  data: (cruiseId: string) => [...sectionKeys.all, 'data', cruiseId] as const,
  grid: (cruiseId: string, query: string) => [...sectionKeys.data(cruiseId), 'grid', query] as const,
  ts: (cruiseId: string, every: number) => [...sectionKeys.data(cruiseId), 'ts', every] as const,
  geostrophy: (cruiseId: string, query: string) => [...sectionKeys.data(cruiseId), 'geostrophy', query] as const,
  /** The extra variables the casts carry (under data: an upload changes them). */
  fileVariables: (cruiseId: string) => [...sectionKeys.data(cruiseId), 'file-variables'] as const,
  views: (cruiseId: string) => [...sectionKeys.all, 'views', cruiseId] as const,
};
