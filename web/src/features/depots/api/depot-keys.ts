export const depotKeys = {
  all: ['depots'] as const,
  list: () => [...depotKeys.all, 'list'] as const,
};
