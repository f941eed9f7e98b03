export const lineKeys = {
  all: ['lines'] as const,
  list: (cruiseId: string) => [...lineKeys.all, 'list', cruiseId] as const,
};
