// npm run dev / npm run demo: the local mail sink plus Crankprint's server in development mode on 127.0.0.1,
// on the embedded database with the demo shop seeded into an empty database. PORT (default 3000) is the app's
// port and MAIL_SINK_PORT (default 2525) the sink's; a busy port is reported and a free one taken instead.
// BETTER_AUTH_URL and SMTP_URL follow the ports. When either child stops, the other is stopped too.
import { spawn } from 'node:child_process';
import { createServer } from 'node:net';

/** Listens on `port` (0: any) on 127.0.0.1 for a moment: the port it got, or null when it is taken. */
function listenOn(port) {
  return new Promise((resolve) => {
    const s = createServer();
    s.once('error', () => resolve(null));
    s.listen(port, '127.0.0.1', () => {
      const got = s.address().port;
      s.close(() => resolve(got));
    });
  });
}

/** The port if it is free on 127.0.0.1, else a free one the system picks (said aloud). */
async function freePort(wanted, what) {
  if ((await listenOn(wanted)) !== null) return wanted;
  const other = await listenOn(0);
  console.log(`Crankprint: port ${wanted} (${what}) is in use; using ${other} instead.`);
  return other;
}

const appPort = await freePort(Number(process.env.PORT || 3000), 'the app');
const mailPort = await freePort(Number(process.env.MAIL_SINK_PORT || 2525), 'the mail sink');
const url = `http://127.0.0.1:${appPort}`;
const env = {
  ...process.env,
  PORT: String(appPort),
  MAIL_SINK_PORT: String(mailPort),
  CRANKPRINT_DEMO: process.env.CRANKPRINT_DEMO ?? '1',
  SMTP_URL: `smtp://127.0.0.1:${mailPort}`,
  BETTER_AUTH_SECRET: process.env.BETTER_AUTH_SECRET ?? 'development-only-secret-not-for-production-use',
  BETTER_AUTH_URL: url,
  NEXT_TELEMETRY_DISABLED: '1',
};

// Each child leads its own process group, so stopping it stops everything it started.
const children = [
  spawn(process.execPath, ['scripts/mail-sink.mjs'], { stdio: 'inherit', env, detached: true }),
  spawn(process.execPath, ['server/serve.mjs', '--dev'], { stdio: 'inherit', env, detached: true }),
];
console.log(`Crankprint: ${url} (sign in as tech@demo.crankprint.test / crank-demo-2026; mail: ${url}/dev/mail)`);

let stopping = false;
let code = 0;
function stopAll(signal, exitCode) {
  if (!stopping) code = exitCode;
  stopping = true;
  for (const c of children) {
    if (c.exitCode === null && c.signalCode === null) {
      try {
        process.kill(-c.pid, signal);
      } catch {
        // already gone
      }
    }
  }
}
for (const s of ['SIGINT', 'SIGTERM', 'SIGHUP']) process.on(s, () => stopAll(s === 'SIGINT' ? 'SIGINT' : 'SIGTERM', 0));
for (const c of children) {
  c.on('exit', (exitCode) => {
    if (!stopping) console.log(`Crankprint: ${c === children[0] ? 'the mail sink' : 'the app'} stopped (${exitCode ?? 'signal'}); stopping the rest.`);
    stopAll('SIGTERM', exitCode || 1);
    if (children.every((k) => k.exitCode !== null || k.signalCode !== null)) process.exit(code);
  });
}
// Whatever happens to this process, its children go with it.
process.on('exit', () => {
  for (const c of children) {
    try {
      process.kill(-c.pid, 'SIGKILL');
    } catch {
      // already gone
    }
  }
});
