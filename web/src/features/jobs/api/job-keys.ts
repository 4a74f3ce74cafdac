export const jobKeys = {
  all: ['jobs'] as const,
  runs: (page: number) => [...jobKeys.all, 'runs', { page }] as const,
  run: (id: number) => [...jobKeys.all, 'run', id] as const,
};
