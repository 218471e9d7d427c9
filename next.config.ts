import type { NextConfig } from 'next';

const nextConfig: NextConfig = {
  // Native or Node-only packages stay outside the server bundle.
  serverExternalPackages: ['sharp', '@node-rs/argon2', 'postgres', 'opencv-wasm'],
  poweredByHeader: false,
  // `npm test` type-checks the whole repository (tsc) before it builds; no need to do it twice.
  typescript: { ignoreBuildErrors: true },
  // forbidden() renders app/forbidden.tsx with status 403.
  experimental: { authInterrupts: true },
};

export default nextConfig;
