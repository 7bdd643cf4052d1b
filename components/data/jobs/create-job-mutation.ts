'use client';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { JobInput } from '@/domain/job';
import { api } from '../api';
import { jobKeys } from './keys';

export function useCreateJob() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: JobInput) => api<{ job: { id: string } }>('/api/jobs', { method: 'POST', json: input }).then((r) => r.job),
    onSuccess: () => qc.invalidateQueries({ queryKey: jobKeys.all }),
  });
}
