import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  // npm test builds into its own folder so it never clobbers the build `npm start` serves.
  distDir: process.env.SORTIE_DIST_DIR || ".next",
  // mysql2 and the AWS SDK are Node-only and large; keep them out of the server bundle.
  serverExternalPackages: ["mysql2", "bcryptjs"],
  poweredByHeader: false,
  typedRoutes: false,
};

export default nextConfig;
