/**
 * Structured logs (pino): JSON lines in production, readable lines in development. One line per API request
 * (route, status, duration, shop and member), errors with their stack, each carrying the request id the server
 * gave the request (X-Request-Id). Never a secret, session, share token or capture contents: only the fields
 * written below are logged, and the usual secret fields are redacted should one slip into an error.
 */
import 'server-only';
import pino, { type Logger } from 'pino';
import pretty from 'pino-pretty';

const g = globalThis as unknown as { __crankprintLog?: Logger };

function build(): Logger {
  const options = {
    level: process.env.LOG_LEVEL || 'info',
    base: { service: 'crankprint' },
    redact: { paths: ['cookie', 'authorization', 'token', 'password', '*.cookie', '*.authorization', '*.token', '*.password'], censor: '[hidden]' },
  };
  if (process.env.NODE_ENV === 'production' || process.env.LOG_FORMAT === 'json') return pino(options);
  return pino(options, pretty({ colorize: !!process.stdout.isTTY, sync: true, ignore: 'pid,hostname,service' }));
}

export const log: Logger = (g.__crankprintLog ??= build());

/** The id the server gave this request (scripts/serve.mjs), or '-' when none. */
export function requestIdOf(headers: Headers): string {
  return headers.get('x-request-id') ?? '-';
}

/** The short form of a request id that a person can read out: its first eight characters. */
export function shortId(requestId: string): string {
  return requestId.slice(0, 8);
}
