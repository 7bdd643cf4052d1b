/**
 * fetch for the JSON route handlers: typed errors with the server's sentence and field errors. `call()` takes a
 * route's contract (server/api/routes/): its method and path build the request, its output types the answer.
 */
import type { BodyOf, OutputOf, RouteContract } from '@/server/api/contract';
import { urlFor } from '@/server/api/contract';

export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fields: Record<string, string>;
  constructor(status: number, code: string, message: string, fields: Record<string, string> = {}) {
    super(message);
    this.status = status;
    this.code = code;
    this.fields = fields;
  }
}

/** What to tell the user when a call failed: the server's own sentence, or `fallback` when it gave none. */
export function errorText(e: unknown, fallback = 'That did not work; try again.'): string {
  return e instanceof ApiError ? e.message : fallback;
}

export async function api<T>(path: string, init: RequestInit & { json?: unknown } = {}): Promise<T> {
  const { json, ...rest } = init;
  const res = await fetch(path, {
    ...rest,
    headers: { ...(json !== undefined ? { 'content-type': 'application/json' } : {}), ...rest.headers },
    body: json !== undefined ? JSON.stringify(json) : rest.body,
  });
  const body = await res.json().catch(() => null);
  if (!res.ok) {
    const e = body?.error;
    throw new ApiError(res.status, e?.code ?? 'HTTP_ERROR', e?.message ?? `The server answered ${res.status}; try again.`, e?.fields);
  }
  return body as T;
}

type ParamNames<P extends string> = P extends `${string}{${infer N}}${infer Rest}` ? N | ParamNames<Rest> : never;

/** A call to a route by its contract: path parameters, query and JSON body as the contract declares them. */
export interface CallArgs<C extends RouteContract> {
  params?: Record<ParamNames<C['path']>, string>;
  query?: Record<string, string | number | undefined>;
  json?: BodyOf<C>;
  signal?: AbortSignal;
  referrerPolicy?: ReferrerPolicy;
}

export function call<C extends RouteContract>(contract: C, args: CallArgs<C> = {}): Promise<OutputOf<C>> {
  return api<OutputOf<C>>(urlFor(contract, args.params as Record<string, string> | undefined, args.query), {
    method: contract.method,
    signal: args.signal,
    referrerPolicy: args.referrerPolicy,
    // A POST, PUT or PATCH always carries a JSON body (an empty one when the contract has none); a DELETE only when given one.
    ...(args.json !== undefined || (contract.method !== 'GET' && contract.method !== 'DELETE') ? { json: args.json ?? {} } : {}),
  });
}
