import type { NextConfig } from 'next';
import { API_CSP, STATIC_SECURITY_HEADERS } from './lib/http/security-headers';

const nextConfig: NextConfig = {
  // Server-only packages that must not be bundled (native-ish or Node-stream heavy).
  serverExternalPackages: ['mysql2', 'smtp-server', 'mailparser', 'nodemailer', 'saxes'],
  poweredByHeader: false,
  // `npm test` builds into its own folder so it never disturbs the app `npm start` serves.
  distDir: process.env.NEXT_DIST_DIR ?? '.next',
  // Pages get their nonce policy from proxy.ts; everything else gets these.
  async headers() {
    return [
      { source: '/:path*', headers: [...STATIC_SECURITY_HEADERS] },
      { source: '/api/:path*', headers: [{ key: 'Content-Security-Policy', value: API_CSP }] },
    ];
  },
};

export default nextConfig;
