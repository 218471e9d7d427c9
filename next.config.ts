import type { NextConfig } from 'next';

const nextConfig: NextConfig = {
  // Native or Node-only packages stay outside the server bundle.
  serverExternalPackages: ['sharp', '@node-rs/argon2', 'postgres', 'opencv-wasm', 'pg-boss', 'pg', 'nodemailer'],
  poweredByHeader: false,
  // A second build folder lets a developer build and serve a branch beside a running one.
  distDir: process.env.NEXT_DIST_DIR ?? '.next',
  // `npm test` type-checks the whole repository (tsc) before it builds; no need to do it twice.
  typescript: { ignoreBuildErrors: true },
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
