/**
 * Crankprint's server (`npm start`: server/serve.mjs) as a child process for the fault tests and the load
 * benchmark: its own port and database, the demo shop seeded, mail to a closed port.
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { createServer } from 'node:net';

export interface AppServer {
  child: ChildProcess;
  base: string;
  /** Its standard output, line by line, when started with `logs: true`. */
  lines: string[];
}

export function startApp(port: number, env: Record<string, string>, options: { detached?: boolean; logs?: boolean } = {}): AppServer {
  const base = `http://127.0.0.1:${port}`;
  const child = spawn(process.execPath, ['server/serve.mjs'], {
    detached: options.detached,
    stdio: ['ignore', options.logs ? 'pipe' : 'ignore', 'pipe'],
    env: {
      ...process.env,
      CRANKPRINT_DEMO: '1',
      BETTER_AUTH_URL: base,
      BETTER_AUTH_SECRET: 'child-server-secret-0123456789abcdef0123456789',
      NEXT_TELEMETRY_DISABLED: '1',
      PORT: String(port),
      SMTP_URL: 'smtp://127.0.0.1:9',
      ...env,
    },
  });
  child.stderr!.on('data', () => {});
  const lines: string[] = [];
  let rest = '';
  child.stdout?.on('data', (d) => {
    const parts = (rest + String(d)).split('\n');
    rest = parts.pop() ?? '';
    lines.push(...parts);
  });
  return { child, base, lines };
}

/** Resolves once /api/health answers 200, which means the database opened. */
export async function waitReady({ child, base }: AppServer, timeoutMs = 120_000): Promise<void> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (child.exitCode !== null) throw new Error(`the server exited with ${child.exitCode}`);
    if (await fetch(`${base}/api/health`).then((r) => r.ok, () => false)) return;
    await new Promise((r) => setTimeout(r, 150));
  }
  throw new Error(`the server did not start within ${timeoutMs / 1000} s`);
}

/** The exit code (or signal) once the process has gone. */
export function exited(child: ChildProcess): Promise<number | string> {
  return new Promise((r) => (child.exitCode !== null || child.signalCode !== null ? r(child.exitCode ?? child.signalCode ?? -1) : child.once('exit', (code, signal) => r(code ?? signal ?? -1))));
}

/** Signs a demo user in and returns the session cookie. */
export async function signInCookie(base: string, email: string, password = 'crank-demo-2026'): Promise<string> {
  const res = await fetch(`${base}/api/auth/sign-in/email`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: base },
    body: JSON.stringify({ email, password }),
  });
  if (res.status !== 200) throw new Error(`sign-in answered ${res.status}`);
  return res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
}

/** A port of 127.0.0.1 that nothing holds right now, for a server a test or benchmark starts itself. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}
