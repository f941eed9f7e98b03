/** Query keys of layer sets (one list per cruise, read by every screen that offers a set). */
export const layerSetKeys = {
  all: ['layer-sets'] as const,
  list: (cruiseId: string) => [...layerSetKeys.all, 'list', cruiseId] as const,
};
