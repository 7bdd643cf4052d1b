/**
 * A small reverse proxy for the fleet test (http-proxy): round robin over the instances it is given, adding
 * X-Forwarded-For. An instance that refuses or drops a connection is skipped for a second, and the client hears
 * a 503 with Retry-After (its request never reached an instance that could answer, so it may send it again).
 */
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import httpProxy from 'http-proxy';

export interface LocalProxy {
  base: string;
  /** Requests answered 503 by the proxy itself (no instance reachable). */
  unreachable: number;
  close(): Promise<void>;
}

export async function startProxy(targets: string[]): Promise<LocalProxy> {
  const proxy = httpProxy.createProxyServer({ xfwd: true, proxyTimeout: 120_000 });
  const downUntil = new Map<string, number>();
  let next = 0;
  const state = { unreachable: 0 };
  const pick = () => {
    const now = Date.now();
    for (let k = 0; k < targets.length; k++) {
      const t = targets[next++ % targets.length];
      if ((downUntil.get(t) ?? 0) <= now) return t;
    }
    return targets[next++ % targets.length];
  };
  const server: Server = createServer((req, res) => {
    const target = pick();
    proxy.web(req, res, { target }, () => {
      downUntil.set(target, Date.now() + 1_000);
      state.unreachable++;
      if (!res.headersSent) res.writeHead(503, { 'content-type': 'application/json', 'retry-after': '1', connection: 'close' });
      res.end(JSON.stringify({ error: { code: 'UNREACHABLE', message: 'No instance answered; try again.' } }));
      req.resume();
    });
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  const { port } = server.address() as AddressInfo;
  return {
    base: `http://127.0.0.1:${port}`,
    get unreachable() {
      return state.unreachable;
    },
    close: () =>
      new Promise<void>((r) => {
        server.closeAllConnections();
        server.close(() => r());
        proxy.close();
      }),
  };
}
