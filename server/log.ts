/**
 * Structured logs (pino): JSON lines in production, readable lines in development. One line per API request
 * (route, status, duration, shop and member), errors with their stack, each carrying the request id the server
 * gave the request (X-Request-Id). Never a secret, session, share token or capture contents: only the fields
 * written below are logged, and the usual secret fields are redacted should one slip into an error.
 */
import 'server-only';
import { AsyncLocalStorage } from 'node:async_hooks';
import pino, { type Logger } from 'pino';
import pretty from 'pino-pretty';
import { processShared } from '@/db/process-state.mjs';

const g = processShared<{ log?: Logger }>('log', () => ({}));

function build(): Logger {
  const options = {
    level: process.env.LOG_LEVEL || 'info',
    base: { service: 'crankprint' },
    redact: { paths: ['cookie', 'authorization', 'token', 'password', '*.cookie', '*.authorization', '*.token', '*.password'], censor: '[hidden]' },
  };
  if (process.env.NODE_ENV === 'production' || process.env.LOG_FORMAT === 'json') return pino(options);
  return pino(options, pretty({ colorize: !!process.stdout.isTTY, sync: true, ignore: 'pid,hostname,service' }));
}

export const log: Logger = (g.log ??= build());

/** The id the server gave this request (server/serve.mjs), or '-' when none. */
export function requestIdOf(headers: Headers): string {
  return headers.get('x-request-id') ?? '-';
}

/** The short form of a request id that a person can read out: its first eight characters. */
export function shortId(requestId: string): string {
  return requestId.slice(0, 8);
}

/** Characters of an error message a log line keeps: enough for the reason, never a query's parameters. */
const MESSAGE_CHARS = 300;

/**
 * An error as a log line may hold it: name, code, the first line of its message (a failed query's text says
 * "params: …" with the capture's result in it: cut there), the first stack frames, and the same of its cause.
 */
export function safeError(e: unknown, depth = 0): Record<string, unknown> | undefined {
  if (e === undefined || e === null) return undefined;
  if (!(e instanceof Error)) return { message: String(e).slice(0, MESSAGE_CHARS) };
  const message = e.message.split(/\n|params:/)[0].slice(0, MESSAGE_CHARS);
  const code = (e as { code?: unknown }).code;
  return {
    name: e.name,
    ...(typeof code === 'string' || typeof code === 'number' ? { code } : {}),
    message,
    // Frames only: a stack begins with the whole message, parameters included.
    stack: e.stack
      ?.split('\n')
      .filter((l) => /^\s+at /.test(l))
      .slice(0, 5)
      .join('\n'),
    ...(depth < 2 && e.cause ? { cause: safeError(e.cause, depth + 1) } : {}),
  };
}

const requests = processShared('requests', () => new AsyncLocalStorage<{ requestId: string }>());

/** Runs `fn` as the work of one request: lines logged inside it (better-auth's included) carry its id. */
export function inRequest<T>(requestId: string, fn: () => T): T {
  return requests.run({ requestId }, fn);
}

/** The id of the request whose work is running, if any. */
export function currentRequestId(): string | undefined {
  return requests.getStore()?.requestId;
}

/** better-auth's lines, through this log with the request id; an error argument is kept as safeError keeps it, nothing else. */
export function authLogLine(level: 'debug' | 'info' | 'warn' | 'error', message: string, ...args: unknown[]): void {
  const err = args.find((a) => a instanceof Error);
  log[level]({ requestId: currentRequestId() ?? '-', source: 'better-auth', ...(err ? { err: safeError(err) } : {}) }, message);
}
