import type { NextConfig } from 'next';
import { API_CONTENT_SECURITY_POLICY, SECURITY_HEADERS } from './lib/auth/security-headers';

const nextConfig: NextConfig = {
  // Native or Node-only packages stay outside the server bundle.
  // piscina starts worker threads from its own files (server/compute/pool.ts).
  serverExternalPackages: [
    'sharp',
    '@node-rs/argon2',
    'postgres',
    'opencv-wasm',
    'pg-boss',
    'pg',
    'nodemailer',
    'piscina',
  ],
  poweredByHeader: false,
  // nosniff, no framing, a referrer policy on every answer; pages get their Content-Security-
  // Policy with a nonce from proxy.ts, API answers one that forbids framing.
  async headers() {
    return [
      { source: '/:path*', headers: SECURITY_HEADERS },
      {
        source: '/api/:path*',
        headers: [{ key: 'Content-Security-Policy', value: API_CONTENT_SECURITY_POLICY }],
      },
    ];
  },
  // A second build folder lets a developer build and serve a branch beside a running one.
  distDir: process.env.NEXT_DIST_DIR ?? '.next',
  // No typescript.ignoreBuildErrors: `next build` type-checks, so every path that builds
  // (npm start, npm run build, npm test) checks the types before it serves anything.
  turbopack: {
    resolveAlias: {
      fs: { browser: './workers/node-builtin-stub.ts' },
      path: { browser: './workers/node-builtin-stub.ts' },
      crypto: { browser: './workers/node-builtin-stub.ts' },
    },
  },
  // forbidden() renders app/forbidden.tsx with status 403.
  experimental: { authInterrupts: true },
};

export default nextConfig;
