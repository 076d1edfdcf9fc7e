import type { NextConfig } from 'next';

const nextConfig: NextConfig = {
  // The engine and the database layer are plain TypeScript; nothing here needs a CDN or remote fonts.
  poweredByHeader: false,
  serverExternalPackages: ['mysql2', 'bcryptjs', 'nodemailer'],
};

export default nextConfig;
