// npm start (and, with --dev, npm run demo): Next.js behind Crankprint's own HTTP server, which
//   1. names the client from the socket, or from the forwarded chain behind CRANKPRINT_TRUSTED_PROXIES, in a
//      header only it writes (server/client-address.mjs);
//   2. gives every request an id, returned in X-Request-Id and carried into the logs;
//   3. on SIGTERM or SIGINT answers new requests 503, lets the ones under way finish, tells any still running
//      at STOP_AFTER_MS - CUTOFF_MS to give up (uploads stop reading and answer 503), answers 503 itself for
//      any left at the end, closes the database and exits (143 / 130) within STOP_AFTER_MS.
// PORT (default 3000) and HOST (default 127.0.0.1) say where it listens.
import { randomUUID } from 'node:crypto';
import { createServer } from 'node:http';
import { CLIENT_HEADER, clientAddress, trustFrom } from './client-address.mjs';
import { beginStopping, closeDatabase, cutOffWork, shuttingDown } from './lifecycle.mjs';

export const STOP_AFTER_MS = 10_000;
const CUTOFF_MS = 2_000;
const dev = process.argv.includes('--dev');
const port = Number(process.env.PORT || 3000);
const hostname = process.env.HOST || '127.0.0.1';
const trust = trustFrom(process.env.CRANKPRINT_TRUSTED_PROXIES);

process.env.CRANKPRINT_SERVED = '1';

process.env.NODE_ENV ??= dev ? 'development' : 'production';
const { default: next } = await import('next');
const app = next({ dev, hostname, port });
const handle = app.getRequestHandler();
await app.prepare();

/** A 503 in the app's error shape, closing the connection. */
function restarting(res, message, headers = {}) {
  res.writeHead(503, { 'content-type': 'application/json', 'cache-control': 'no-store', connection: 'close', ...headers });
  res.end(JSON.stringify({ error: { code: 'RESTARTING', message } }));
}

const open = new Set();
let allDone = null;

const server = createServer((req, res) => {
  const id = randomUUID();
  res.setHeader('X-Request-Id', id);
  if (shuttingDown()) {
    restarting(res, 'The server is restarting; try again in a few seconds.', { 'retry-after': '5' });
    return;
  }
  delete req.headers[CLIENT_HEADER];
  req.headers[CLIENT_HEADER] = clientAddress(req, trust);
  req.headers['x-request-id'] = id;
  open.add(res);
  res.once('close', () => {
    open.delete(res);
    if (open.size === 0) allDone?.();
  });
  handle(req, res).catch((e) => {
    console.error(e);
    if (!res.headersSent) res.writeHead(500).end();
  });
});

const settled = (ms) => new Promise((resolve) => {
  if (open.size === 0) return resolve();
  const timer = setTimeout(resolve, ms);
  allDone = () => {
    clearTimeout(timer);
    resolve();
  };
});

/** Time kept at the end of a stop for closing the database and Next.js. */
const CLOSE_MS = 1_500;
const sleep = (ms) => new Promise((r) => setTimeout(r, Math.max(0, ms)));

async function stop(signal) {
  if (shuttingDown()) return;
  beginStopping();
  const code = signal === 'SIGINT' ? 130 : 143;
  // Whatever happens below, the process is gone within STOP_AFTER_MS.
  const deadline = Date.now() + STOP_AFTER_MS - 250;
  setTimeout(() => process.exit(code), deadline - Date.now()).unref();
  // Keep listening so that new requests hear a 503 rather than a refused connection; idle ones close.
  server.closeIdleConnections();
  await settled(STOP_AFTER_MS - CUTOFF_MS - CLOSE_MS);
  // Still running: uploads stop reading and answer 503.
  cutOffWork();
  await settled(CUTOFF_MS / 2);
  // Still running after that (a store, an analysis, a call to object storage that hangs): the client hears a 503
  // before the database closes, never a reset.
  for (const res of open) {
    if (!res.headersSent) restarting(res, 'The server restarted before this finished; check the job, and send it again if it is not there.');
  }
  server.close();
  // Let the 503s leave before the connections are cut.
  await sleep(100);
  server.closeAllConnections();
  await Promise.race([closeDatabase().catch(() => {}), sleep(deadline - Date.now() - 400)]);
  await Promise.race([app.close().catch(() => {}), sleep(Math.min(300, deadline - Date.now()))]);
  process.exit(code);
}
process.once('SIGTERM', () => stop('SIGTERM'));
process.once('SIGINT', () => stop('SIGINT'));

server.listen(port, hostname, () => {
  console.log(`Crankprint ${dev ? '(development) ' : ''}listening on http://${hostname}:${server.address().port}`);
});
