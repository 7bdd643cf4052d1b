/** @type {import('next').NextConfig} */
const nextConfig = {
  serverExternalPackages: ['@electric-sql/pglite', '@react-pdf/renderer'],
  poweredByHeader: false,
};

export default nextConfig;
