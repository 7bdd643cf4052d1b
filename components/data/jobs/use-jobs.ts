'use client';
import { useQuery } from '@tanstack/react-query';
import { api } from '../api';
import { jobKeys } from './keys';
import type { JobRow } from './types';

export function useJobs(filter: { q?: string; status?: string }) {
  return useQuery({
    queryKey: jobKeys.list(filter),
    queryFn: ({ signal }) => {
      const p = new URLSearchParams();
      if (filter.q) p.set('q', filter.q);
      if (filter.status) p.set('status', filter.status);
      return api<{ jobs: JobRow[] }>(`/api/jobs?${p}`, { signal }).then((r) => r.jobs);
    },
  });
}
