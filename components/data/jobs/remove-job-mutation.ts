'use client';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '../api';
import { jobKeys } from './keys';
import { removeJob } from '@/server/api/routes/jobs';

/** Removes a job with everything on it (owners only; the server checks). */
export function useRemoveJob() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (jobId: string) => call(removeJob, { params: { jobId } }).then((r) => r.removed),
    onSuccess: () => qc.invalidateQueries({ queryKey: jobKeys.all }),
  });
}
