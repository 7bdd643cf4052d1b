/**
 * A TCP proxy on a free port of 127.0.0.1 in front of a real server, whose mode a test switches: `pass` forwards,
 * `down` drops every new connection, `stall` accepts connections and never answers (an endpoint that hangs).
 * Switching away from `pass` drops the connections open so far (a client's kept-alive sockets included).
 * `onFirstData` runs once when the next forwarded connection sends its first bytes.
 */
import { createConnection, createServer, type Socket } from 'node:net';

export type ProxyMode = 'pass' | 'down' | 'stall';

export interface SwitchProxy {
  url: string;
  mode: ProxyMode;
  onFirstData: (() => void) | null;
  close(): Promise<void>;
}

export async function startSwitchProxy(upstreamPort: number): Promise<SwitchProxy> {
  const sockets = new Set<Socket>();
  let mode: ProxyMode = 'pass';
  const proxy: SwitchProxy = {
    url: '',
    get mode() {
      return mode;
    },
    set mode(next: ProxyMode) {
      if (next !== 'pass' && mode === 'pass') for (const s of sockets) s.destroy();
      mode = next;
    },
    onFirstData: null,
    close: async () => {},
  };
  const server = createServer((client) => {
    sockets.add(client);
    client.on('close', () => sockets.delete(client));
    client.on('error', () => {});
    if (proxy.mode === 'down') return void client.destroy();
    if (proxy.mode === 'stall') return void client.resume();
    const upstream = createConnection({ host: '127.0.0.1', port: upstreamPort });
    sockets.add(upstream);
    upstream.on('close', () => sockets.delete(upstream));
    upstream.on('error', () => client.destroy());
    client.once('data', () => {
      const hook = proxy.onFirstData;
      proxy.onFirstData = null;
      hook?.();
    });
    client.pipe(upstream).pipe(client);
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as { port: number };
  proxy.url = `http://127.0.0.1:${port}`;
  proxy.close = () =>
    new Promise<void>((resolve) => {
      for (const s of sockets) s.destroy();
      server.close(() => resolve());
    });
  return proxy;
}
