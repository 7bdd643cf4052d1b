/** Query keys for jobs. */
export const jobKeys = {
  all: ['jobs'] as const,
  list: (filter: { q?: string; status?: string }) => ['jobs', 'list', filter] as const,
  detail: (id: string) => ['jobs', 'detail', id] as const,
};
