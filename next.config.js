/** Next.js configuration. The app is served by server/main.ts (one port for pages and sync). */
const nextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  // lib/ is plain TypeScript shared with Node; keep Node-only modules out of client bundles.
  serverExternalPackages: ['better-sqlite3', 'ws', 'playwright-core'],
};

export default nextConfig;
