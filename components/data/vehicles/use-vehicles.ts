'use client';
import { useQuery } from '@tanstack/react-query';
import type { OutputOf } from '@/server/api/contract';
import { listVehicles } from '@/server/api/routes/catalog';
import { call } from '../api';

/** A vehicle as the vehicles route returns it (its contract's output). */
export type VehicleRow = OutputOf<typeof listVehicles>['vehicles'][number];

export const vehicleKeys = { all: ['vehicles'] as const };

export function useVehicles() {
  return useQuery({
    queryKey: vehicleKeys.all,
    queryFn: ({ signal }) => call(listVehicles, { signal }).then((r) => r.vehicles),
  });
}
