import type { NextConfig } from 'next';

const nextConfig: NextConfig = {
  // Server-only packages that must not be bundled (native-ish or Node-stream heavy).
  serverExternalPackages: ['mysql2', 'smtp-server', 'mailparser', 'nodemailer', 'saxes'],
  poweredByHeader: false,
  // `npm test` builds into its own folder so it never disturbs the app `npm start` serves.
  distDir: process.env.NEXT_DIST_DIR ?? '.next',
};

export default nextConfig;
