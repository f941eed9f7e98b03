/** Query keys of layer sets (the section area reads them too, under sectionKeys.layerSets). */
export const layerSetKeys = {
  all: ['layer-sets'] as const,
  list: (cruiseId: string) => [...layerSetKeys.all, 'list', cruiseId] as const,
};
