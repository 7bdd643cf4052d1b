/** Contracts of the routes without a shop: health, this description, and better-auth's own endpoints (server/api/contract.ts). */
import { z } from 'zod';
import { route } from '../contract';

export const health = route({
  method: 'GET',
  path: '/api/health',
  summary: 'Whether the server and its database answer (for load balancers); with object storage, whether the bucket answers.',
  access: 'anyone',
  output: z.object({ ok: z.boolean(), database: z.enum(['embedded', 'postgresql']), storage: z.enum(['ok', 'degraded']).optional() }),
  errors: [503],
});

export const openApi = route({
  method: 'GET',
  path: '/api/openapi.json',
  summary: 'This description.',
  access: 'anyone',
  output: z.looseObject({ openapi: z.literal('3.1.0') }),
});

const authPath = z.object({ path: z.string() });

export const authGet = route({
  method: 'GET',
  path: '/api/auth/{path}',
  summary: 'better-auth’s session endpoints, e.g. get-session, verify-email.',
  access: 'anyone',
  params: authPath,
  output: z.looseObject({}),
});

export const authPost = route({
  method: 'POST',
  path: '/api/auth/{path}',
  summary:
    'better-auth’s endpoints: sign-in/email, sign-up/email, sign-out, request-password-reset, reset-password, organization/set-active, organization/accept-invitation. Sign-in, sign-up and resets spend a per-client budget.',
  access: 'anyone',
  params: authPath,
  body: z.looseObject({}),
  output: z.looseObject({}),
  errors: [413],
});
