/** Typed JSON errors for route handlers: one shape, a status, a code and a sentence. */
import { NextResponse } from 'next/server';
import type { ZodError } from 'zod';

export interface ApiErrorBody {
  error: { code: string; message: string; fields?: Record<string, string>; [detail: string]: unknown };
}

export class HttpError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fields?: Record<string, string>;
  /** More about the error, merged into the body's `error` object (e.g. the engine's line and column). */
  detail?: Record<string, unknown>;
  /** For a 429: seconds until the client may try again (sent as Retry-After). */
  retryAfterS?: number;
  constructor(status: number, code: string, message: string, fields?: Record<string, string>) {
    super(message);
    this.status = status;
    this.code = code;
    this.fields = fields;
  }
}

export const notFound = (what = 'That record') => new HttpError(404, 'NOT_FOUND', `${what} was not found in your shop.`);
export const conflict = (message: string) => new HttpError(409, 'CONFLICT', message);

/** One sentence per wrong field, keyed by the field's path. */
export function fieldErrors(e: ZodError): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of e.issues) {
    const key = issue.path.join('.') || '_';
    out[key] ??= issue.message;
  }
  return out;
}

export function errorResponse(e: HttpError): NextResponse<ApiErrorBody> {
  const headers = e.retryAfterS ? { 'retry-after': String(e.retryAfterS) } : undefined;
  return NextResponse.json({ error: { ...e.detail, code: e.code, message: e.message, fields: e.fields } }, { status: e.status, headers });
}
