/**
 * A route's contract, written once: method, path, who may call it, its input (path parameters, query, body) and
 * its answer. The route wrapper (server/with-shop.ts) checks the permission and parses the input with it, the
 * OpenAPI document (server/api/description.ts) is generated from it, the browser's `call()`
 * (components/data/api.ts) builds the request and types the answer from it, and the role matrix walks it.
 * Client-safe: zod and the role table only, nothing of the server.
 */
import { z } from 'zod';
import { can, type Permission, ROLE_NAMES } from '@/server/permissions';

export type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
export type FileType = 'application/pdf' | 'application/zip' | 'text/csv';

/** Who may call: members holding a permission, any signed-in user, anyone with a customer link, anyone. */
export type Access = { permission: Permission } | 'signed-in' | 'link' | 'anyone';

export interface RouteContract {
  method: Method;
  /** As the app serves it, in OpenAPI's template form: /api/jobs/{jobId}. */
  path: string;
  summary: string;
  access: Access;
  /** The path's parameters (each `{name}` in `path`). */
  params?: z.ZodObject;
  query?: z.ZodObject;
  /** A JSON body. */
  body?: z.ZodObject;
  /** A body the handler streams itself (not JSON): its description, e.g. a capture file. */
  upload?: z.ZodType;
  /** The 200 answer: a JSON schema, or a file type. */
  output: z.ZodType | FileType;
  /** Error statuses beyond 400/401/403/404/429/500, which every route may give. */
  errors?: number[];
}

/** Declares a contract, keeping its exact types for the wrapper and the client. */
export const route = <const C extends RouteContract>(c: C): C => c;

type Out<T> = T extends z.ZodType ? z.output<T> : unknown;
type In<T> = T extends z.ZodType ? z.input<T> : unknown;
type Empty = Record<never, never>;

/** What the handler receives: parameters, query and body parsed and merged. */
export type InputOf<C extends RouteContract> = (C['params'] extends z.ZodObject ? Out<C['params']> : Empty) &
  (C['query'] extends z.ZodObject ? Out<C['query']> : Empty) &
  (C['body'] extends z.ZodObject ? Out<C['body']> : Empty);

/** What a JSON handler answers (a Response may be returned instead: files, errors with more detail). */
export type OutputOf<C extends RouteContract> = C['output'] extends z.ZodType ? z.output<C['output']> : Response;

/** What the client sends as the body. */
export type BodyOf<C extends RouteContract> = In<C['body']>;

const inputs = new WeakMap<RouteContract, z.ZodType>();

/** The one schema the wrapper parses query, body and path parameters with (merged as they arrive). */
export function inputSchema(c: RouteContract): z.ZodType {
  let s = inputs.get(c);
  if (!s) {
    const base = c.body ?? c.query;
    s = c.params ? (base ? base.extend(c.params.shape) : c.params) : (base ?? z.object({}));
    inputs.set(c, s);
  }
  return s;
}

/** The permission a member needs, or null for routes without a shop. */
export function permissionOf(c: RouteContract): Permission | null {
  return typeof c.access === 'object' ? c.access.permission : null;
}

const ROLE_WORDS: Record<(typeof ROLE_NAMES)[number], string> = { owner: 'owners', technician: 'technicians', advisor: 'advisors' };

/** Who may call, in words (PRODUCT.md's roles), read from the role table itself. */
export function whoMay(c: RouteContract): string {
  if (c.access === 'signed-in') return 'any signed-in user';
  if (c.access === 'link') return 'anyone with the link';
  if (c.access === 'anyone') return 'anyone';
  const permission = c.access.permission;
  const allowed = ROLE_NAMES.filter((r) => can(r, permission));
  if (allowed.length === ROLE_NAMES.length) return 'any member of the shop';
  if (allowed.length === 0) return 'no role';
  return allowed.map((r) => ROLE_WORDS[r]).join(allowed.length === 2 ? ' and ' : ', ');
}

/** The URL for a call: `{name}` filled from params (percent-encoded), the query appended. */
export function urlFor(c: RouteContract, params: Record<string, string> = {}, query?: Record<string, string | number | undefined>): string {
  const path = c.path.replace(/\{([^}]+)\}/g, (_, name: string) => {
    const v = params[name];
    if (v === undefined) throw new Error(`${c.method} ${c.path} needs ${name}`);
    return encodeURIComponent(v);
  });
  const q = new URLSearchParams();
  for (const [k, v] of Object.entries(query ?? {})) if (v !== undefined && v !== '') q.set(k, String(v));
  const qs = q.toString();
  return qs ? `${path}?${qs}` : path;
}
