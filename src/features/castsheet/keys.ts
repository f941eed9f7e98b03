/** Query keys of one cast (the cast sheet). The cruise's cast list lives under cruiseKeys.casts. */
export const castKeys = {
  all: ['cast'] as const,
  detail: (castId: string) => [...castKeys.all, 'detail', castId] as const,
};
