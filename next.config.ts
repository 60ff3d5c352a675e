import type { NextConfig } from "next";
import { checkEnv } from "./src/env";

// Fail at start, with a message naming the setting, rather than on the first query.
checkEnv();

const dev = process.env.NODE_ENV === "development";

// Next inlines its bootstrap and flight data as <script> tags, and React Flow
// positions nodes with style attributes, so without per-request nonces scripts
// and styles need 'unsafe-inline' beside 'self'; nothing loads from another
// origin. Dev mode's fast refresh also evaluates code ('unsafe-eval').
// img-src allows data: and blob: for the graph's PNG export (html-to-image).
const contentSecurityPolicy = [
  "default-src 'self'",
  `script-src 'self' 'unsafe-inline'${dev ? " 'unsafe-eval'" : ""}`,
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self' data:",
  `connect-src 'self'${dev ? " ws:" : ""}`,
  "object-src 'none'",
  "base-uri 'self'",
  "form-action 'self'",
  "frame-ancestors 'none'",
].join("; ");

const securityHeaders = [
  { key: "Content-Security-Policy", value: contentSecurityPolicy },
  { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "X-Frame-Options", value: "DENY" },
  {
    key: "Permissions-Policy",
    value: "camera=(), microphone=(), geolocation=(), payment=(), usb=(), interest-cohort=()",
  },
];

const nextConfig: NextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  // Next would hash every page's HTML on every request to make an ETag. Public pages are served
  // from its cache and are a few KB gzipped, so the hash costs more CPU than a 304 saves in
  // bytes; the graph API makes its own ETags (src/server/http-cache.ts).
  generateEtags: false,
  typedRoutes: false,
  async headers() {
    return [{ source: "/:path*", headers: securityHeaders }];
  },
};

export default nextConfig;
