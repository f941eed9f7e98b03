/**
 * Query keys of a cruise and everything listed under it. Each resource has its own branch
 * (`['cruises', 'stations', id]`, not nested under the detail), so invalidating one never
 * sweeps up another by prefix and mutations can name exactly what they change.
 */
export const cruiseKeys = {
  all: ['cruises'] as const,
  list: () => [...cruiseKeys.all, 'list'] as const,
  detail: (id: string) => [...cruiseKeys.all, 'detail', id] as const,
  stations: (id: string) => [...cruiseKeys.all, 'stations', id] as const,
  casts: (id: string) => [...cruiseKeys.all, 'casts', id] as const,
  members: (id: string) => [...cruiseKeys.all, 'members', id] as const,
  invitations: (id: string) => [...cruiseKeys.all, 'invitations', id] as const,
  audit: (id: string) => [...cruiseKeys.all, 'audit', id] as const,
};
