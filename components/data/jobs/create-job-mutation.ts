'use client';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { JobInput } from '@/domain/job';
import { call } from '../api';
import { jobKeys } from './keys';
import { createJob } from '@/server/api/routes/jobs';

export function useCreateJob() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: JobInput) => call(createJob, { json: input }).then((r) => r.job),
    onSuccess: () => qc.invalidateQueries({ queryKey: jobKeys.all }),
  });
}
