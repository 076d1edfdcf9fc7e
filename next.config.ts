import type { NextConfig } from 'next';

const nextConfig: NextConfig = {
  // The test run builds into its own folder so a running demo server is never rebuilt under its feet.
  distDir: process.env.NEXT_DIST_DIR ?? '.next',
  poweredByHeader: false,
  serverExternalPackages: ['mysql2', 'bcryptjs', 'nodemailer'],
};

export default nextConfig;
