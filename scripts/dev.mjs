// npm run dev / npm run demo: the local mail sink plus `next dev` on 127.0.0.1, on the embedded database with
// the demo shop seeded into an empty database. Development defaults only; production sets its own.
import { spawn } from 'node:child_process';

const env = {
  ...process.env,
  CRANKPRINT_DEMO: process.env.CRANKPRINT_DEMO ?? '1',
  SMTP_URL: process.env.SMTP_URL ?? 'smtp://127.0.0.1:2525',
  BETTER_AUTH_SECRET: process.env.BETTER_AUTH_SECRET ?? 'development-only-secret-not-for-production-use',
  BETTER_AUTH_URL: process.env.BETTER_AUTH_URL ?? 'http://127.0.0.1:3000',
  NEXT_TELEMETRY_DISABLED: '1',
};

const children = [
  spawn(process.execPath, ['scripts/mail-sink.mjs'], { stdio: 'inherit', env }),
  spawn('npx', ['next', 'dev', '-H', '127.0.0.1', '-p', process.env.PORT ?? '3000'], { stdio: 'inherit', env }),
];
console.log('Crankprint: http://127.0.0.1:3000 (mail sink page: /dev/mail)');

const stop = (signal) => {
  for (const c of children) c.kill(signal);
};
process.on('SIGINT', () => stop('SIGINT'));
process.on('SIGTERM', () => stop('SIGTERM'));
for (const c of children) c.on('exit', (code) => {
  stop('SIGTERM');
  process.exit(code ?? 0);
});
