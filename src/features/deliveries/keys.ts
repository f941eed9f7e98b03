/** Query keys of a cruise's deliveries: the list per cruise, and one delivery by id. */
export const deliveryKeys = {
  all: ['deliveries'] as const,
  list: (cruiseId: string) => [...deliveryKeys.all, 'list', cruiseId] as const,
  detail: (id: string) => [...deliveryKeys.all, 'detail', id] as const,
};
