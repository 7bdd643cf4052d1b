// Who sent a request: the socket's address, or — when the socket is a trusted proxy — the forwarded chain
// walked from the right, skipping trusted hops (proxy-addr's rules, as Express applies them). The server
// (server/serve.mjs) writes the answer into a header only it sets; nothing else reads X-Forwarded-For.
import proxyaddr from 'proxy-addr';

/** The header the server writes the client's address into, after removing any copy a client sent. */
export const CLIENT_HEADER = 'x-crankprint-client';

/**
 * A trust function from CRANKPRINT_TRUSTED_PROXIES: comma-separated addresses, CIDR ranges or proxy-addr's
 * names (loopback, linklocal, uniquelocal). Empty: no proxy is trusted, the socket is the client.
 */
export function trustFrom(list = '') {
  const entries = list.split(',').map((s) => s.trim()).filter(Boolean);
  return proxyaddr.compile(entries);
}

/** The client address of a Node request (`socket.remoteAddress` and `headers['x-forwarded-for']`). */
export function clientAddress(req, trust) {
  return proxyaddr(req, trust) || 'unknown';
}
