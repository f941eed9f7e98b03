/** Query keys of derived variables and of formula previews (by cast and formula text). */
export const derivedKeys = {
  all: ['derived'] as const,
  list: (cruiseId: string) => [...derivedKeys.all, 'list', cruiseId] as const,
  preview: (castId: string, formula: string) => [...derivedKeys.all, 'preview', castId, formula] as const,
};
