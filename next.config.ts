import type { NextConfig } from "next";
import { checkEnv } from "./src/env";

// Fail at start, with a message naming the setting, rather than on the first query.
checkEnv();

const nextConfig: NextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  typedRoutes: false,
};

export default nextConfig;
