/** @type {import('next').NextConfig} */
import { contentSecurityPolicy } from './server/csp.mjs';

const common = [
  { key: 'X-Content-Type-Options', value: 'nosniff' },
  { key: 'Referrer-Policy', value: 'strict-origin-when-cross-origin' },
  { key: 'Permissions-Policy', value: 'camera=(), microphone=(), geolocation=()' },
];

const nextConfig = {
  serverExternalPackages: ['@electric-sql/pglite', '@react-pdf/renderer', 'rate-limiter-flexible', 'pino', 'pino-pretty', 'piscina'],
  poweredByHeader: false,
  async headers() {
    return [
      // Pages get their CSP, with a script nonce, from proxy.ts; the API runs no script.
      { source: '/:path*', headers: [...common, { key: 'X-Frame-Options', value: 'DENY' }] },
      { source: '/api/:path*', headers: [{ key: 'Content-Security-Policy', value: contentSecurityPolicy() }] },
      // The report PDF is previewed in an iframe of our own report page. Only framing is restricted: the
      // browser's own PDF viewer must not meet the object and script rules written for pages.
      { source: '/api/reports/:id/pdf', headers: [{ key: 'Content-Security-Policy', value: "frame-ancestors 'self'" }, { key: 'X-Frame-Options', value: 'SAMEORIGIN' }] },
      { source: '/r/:token', headers: [{ key: 'Referrer-Policy', value: 'no-referrer' }, { key: 'Cache-Control', value: 'private, no-store' }] },
    ];
  },
};

export default nextConfig;
