/** Query keys of one cast (the cast sheet). The cruise's cast list lives under cruiseKeys.casts. */
export const castKeys = {
  all: ['cast'] as const,
  detail: (castId: string) => [...castKeys.all, 'detail', castId] as const,
  qc: (castId: string) => [...castKeys.all, 'qc', castId] as const,
  flagLog: (castId: string) => [...castKeys.all, 'flag-log', castId] as const,
  /** the neighbours along a line (null: the default line) and the earlier occupations of that line */
  neighbours: (castId: string, line: string | null = null) => [...castKeys.all, 'neighbours', castId, line] as const,
  history: (castId: string) => [...castKeys.all, 'history', castId] as const,
  /** pending proposals per cast of a cruise */
  pending: (cruiseId: string) => [...castKeys.all, 'pending', cruiseId] as const,
};
