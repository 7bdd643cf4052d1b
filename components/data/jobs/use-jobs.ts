'use client';
import { useQuery } from '@tanstack/react-query';
import { listJobs } from '@/server/api/routes/jobs';
import { call } from '../api';
import { jobKeys } from './keys';
import type { JobRow } from './types';

export function useJobs(filter: { q?: string; status?: string }) {
  return useQuery({
    queryKey: jobKeys.list(filter),
    queryFn: ({ signal }): Promise<JobRow[]> => call(listJobs, { query: { q: filter.q, status: filter.status }, signal }).then((r) => r.jobs),
  });
}
