/** @type {import('next').NextConfig} */

const dev = process.env.NODE_ENV !== 'production';

/** Content security: our own origin only; no framing except our PDF preview inside our own pages. */
function csp(frameAncestors) {
  return [
    "default-src 'self'",
    `script-src 'self' 'unsafe-inline'${dev ? " 'unsafe-eval'" : ''}`,
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

const common = [
  { key: 'X-Content-Type-Options', value: 'nosniff' },
  { key: 'Referrer-Policy', value: 'strict-origin-when-cross-origin' },
  { key: 'Permissions-Policy', value: 'camera=(), microphone=(), geolocation=()' },
];

const nextConfig = {
  serverExternalPackages: ['@electric-sql/pglite', '@react-pdf/renderer'],
  poweredByHeader: false,
  async headers() {
    return [
      { source: '/:path*', headers: [...common, { key: 'Content-Security-Policy', value: csp("'none'") }, { key: 'X-Frame-Options', value: 'DENY' }] },
      // The report PDF is previewed in an iframe of our own report page.
      { source: '/api/reports/:id/pdf', headers: [...common, { key: 'Content-Security-Policy', value: csp("'self'") }, { key: 'X-Frame-Options', value: 'SAMEORIGIN' }] },
      { source: '/r/:token', headers: [{ key: 'Referrer-Policy', value: 'no-referrer' }, { key: 'Cache-Control', value: 'private, no-store' }] },
    ];
  },
};

export default nextConfig;
