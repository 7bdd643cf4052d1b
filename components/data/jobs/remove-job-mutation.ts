'use client';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../api';
import { jobKeys } from './keys';

/** Removes a job with everything on it (owners only; the server checks). */
export function useRemoveJob() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (jobId: string) => api<{ removed: { jobId: string; captures: number } }>(`/api/jobs/${encodeURIComponent(jobId)}`, { method: 'DELETE' }).then((r) => r.removed),
    onSuccess: () => qc.invalidateQueries({ queryKey: jobKeys.all }),
  });
}
