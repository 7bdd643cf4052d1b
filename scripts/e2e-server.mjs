// The server the browser tests run against: a fresh data directory (or, in the PostgreSQL pass, a fresh
// database) and mail folder, the mail sink, and Crankprint's server (`npm start`) on 127.0.0.1 with the demo shop seeded.
import { spawn } from 'node:child_process';
import { rmSync } from 'node:fs';
import { createDatabase } from './pg-server.mjs';

const port = process.env.E2E_PORT || '3210';
const dataDir = process.env.CRANKPRINT_DATA_DIR || '.e2e/data';
const mailDir = process.env.MAIL_SINK_DIR || '.e2e/mail';
rmSync(dataDir, { recursive: true, force: true });
rmSync(mailDir, { recursive: true, force: true });

const env = {
  ...process.env,
  CRANKPRINT_DATA_DIR: dataDir,
  MAIL_SINK_DIR: mailDir,
  MAIL_SINK_PORT: process.env.MAIL_SINK_PORT || '2626',
  SMTP_URL: `smtp://127.0.0.1:${process.env.MAIL_SINK_PORT || '2626'}`,
  CRANKPRINT_DEMO: '1',
  CRANKPRINT_RATE_LIMIT_SCALE: process.env.CRANKPRINT_RATE_LIMIT_SCALE || '20',
  BETTER_AUTH_URL: `http://127.0.0.1:${port}`,
  BETTER_AUTH_SECRET: process.env.BETTER_AUTH_SECRET || 'e2e-only-secret-0123456789abcdef0123456789',
  NEXT_TELEMETRY_DISABLED: '1',
  PORT: port,
};
// The PostgreSQL pass of `npm test`: a fresh database on the test server instead of the embedded one.
if (process.env.CRANKPRINT_TEST_PG_URL) env.DATABASE_URL = await createDatabase(process.env.CRANKPRINT_TEST_PG_URL, 'e2e');
const children = [
  spawn(process.execPath, ['scripts/mail-sink.mjs'], { stdio: 'inherit', env }),
  spawn(process.execPath, ['server/serve.mjs'], { stdio: 'inherit', env }),
];
const stop = () => children.forEach((c) => c.kill('SIGTERM'));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
children.forEach((c) => c.on('exit', () => { stop(); process.exit(0); }));
