// The Content Security Policy, written once: pages get a fresh script nonce per request (proxy.ts); the API runs
// no script at all (next.config.mjs). Our own origin only; no framing except our PDF preview.

/** @param {{ nonce?: string, frameAncestors?: string, dev?: boolean }} o */
export function contentSecurityPolicy({ nonce, frameAncestors = "'none'", dev = false } = {}) {
  const scripts = nonce ? `'self' 'nonce-${nonce}' 'strict-dynamic'` : "'none'";
  return [
    "default-src 'self'",
    `script-src ${scripts}${dev && nonce ? " 'unsafe-eval'" : ''}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
    `connect-src 'self'${dev ? ' ws: wss:' : ''}`,
    "worker-src 'self' blob:",
    "frame-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    `frame-ancestors ${frameAncestors}`,
  ].join('; ');
}
