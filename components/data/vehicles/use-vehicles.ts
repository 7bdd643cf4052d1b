'use client';
import { useQuery } from '@tanstack/react-query';
import { api } from '../api';

export interface VehicleRow {
  id: string;
  vin: string | null;
  year: number | null;
  make: string;
  model: string;
  engine: { cylinders: number; layout: string; firingOrder: number[]; displacementL?: number };
}

export const vehicleKeys = { all: ['vehicles'] as const };

export function useVehicles() {
  return useQuery({
    queryKey: vehicleKeys.all,
    queryFn: ({ signal }) => api<{ vehicles: VehicleRow[] }>('/api/vehicles', { signal }).then((r) => r.vehicles),
  });
}
