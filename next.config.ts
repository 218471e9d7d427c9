import type { NextConfig } from 'next';

const nextConfig: NextConfig = {
  // Native or Node-only packages stay outside the server bundle.
  serverExternalPackages: ['sharp', '@node-rs/argon2', 'postgres', 'opencv-wasm', 'pg-boss', 'pg', 'nodemailer'],
  poweredByHeader: false,
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
