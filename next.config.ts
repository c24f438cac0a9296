import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  // npm test builds into its own folder so it never clobbers the build `npm start` serves.
  distDir: process.env.SORTIE_DIST_DIR || ".next",
  // mysql2 and the AWS SDK are Node-only and large; keep them out of the server bundle.
  serverExternalPackages: ["mysql2", "bcryptjs"],
  poweredByHeader: false,
  typedRoutes: false,
  // Pages and API answers get their headers (CSP with a nonce, HSTS…) per request in proxy.ts;
  // static files, which the proxy skips, still get these fixed ones (ASVS V14.4.4, V14.4.6).
  async headers() {
    const fixed = [
      { key: "x-content-type-options", value: "nosniff" },
      { key: "referrer-policy", value: "strict-origin-when-cross-origin" },
    ];
    return [
      { source: "/_next/static/:path*", headers: fixed },
      { source: "/_next/image", headers: fixed },
      { source: "/favicon.ico", headers: fixed },
    ];
  },
};

export default nextConfig;
