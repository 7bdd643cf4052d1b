/** Contracts of the shop's vehicles and engine profiles (server/api/contract.ts). */
import { z } from 'zod';
import { vehicleSchema } from '@/domain/vehicle';
import { route } from '../contract';
import { createProfileInput, idParam } from '../inputs';
import { engine, id, vehicle } from '../shapes';

export const listVehicles = route({
  method: 'GET',
  path: '/api/vehicles',
  summary: 'The shop’s vehicles.',
  access: { permission: { vehicle: ['read'] } },
  output: z.object({ vehicles: z.array(vehicle) }),
});

export const addVehicle = route({
  method: 'POST',
  path: '/api/vehicles',
  summary: 'Adds a vehicle.',
  access: { permission: { vehicle: ['create'] } },
  body: vehicleSchema,
  output: z.object({ vehicle }),
  errors: [413, 415],
});

export const getVehicle = route({
  method: 'GET',
  path: '/api/vehicles/{vehicleId}',
  summary: 'A vehicle and its jobs’ tests.',
  access: { permission: { vehicle: ['read'] } },
  params: idParam('vehicleId'),
  output: z.looseObject({ vehicle, jobs: z.array(z.looseObject({})) }),
});

const profile = z.looseObject({ id, label: z.string(), engine });

export const listProfiles = route({
  method: 'GET',
  path: '/api/profiles',
  summary: 'Engine profiles: the built-in ones (by key) and the shop’s own (by id).',
  access: { permission: { profile: ['read'] } },
  output: z.object({ builtIn: z.array(z.looseObject({ key: z.string(), label: z.string(), engine })), shop: z.array(profile) }),
});

export const addProfile = route({
  method: 'POST',
  path: '/api/profiles',
  summary: 'Adds a shop engine profile.',
  access: { permission: { profile: ['create'] } },
  body: createProfileInput,
  output: z.object({ profile }),
  errors: [409, 413, 415],
});
