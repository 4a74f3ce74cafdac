export const specKeys = {
  all: ['specs'] as const,
  list: () => [...specKeys.all, 'list'] as const,
};
