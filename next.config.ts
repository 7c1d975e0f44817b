import type { NextConfig } from "next";

// The Content Security Policy (with a nonce per request) and HSTS come from proxy.ts.
const securityHeaders = [
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "X-Frame-Options", value: "DENY" },
  { key: "Referrer-Policy", value: "no-referrer" },
  // Motion sensors stay available to our own pages only (participants' sessions need them).
  { key: "Permissions-Policy", value: "accelerometer=(self), gyroscope=(self), magnetometer=(), camera=(), microphone=(), geolocation=()" },
  { key: "Cross-Origin-Opener-Policy", value: "same-origin" },
];

const config: NextConfig = {
  serverExternalPackages: ["knex", "mysql2", "smtp-server", "mailparser", "nodemailer"],
  // Several checkouts' builds can sit side by side (NEXT_DIST_DIR); the default is .next.
  distDir: process.env.NEXT_DIST_DIR ?? ".next",
  poweredByHeader: false,
  // The simulated participant source exists only in test builds (npm test sets this to 1); an
  // explicit "0" lets the bundler drop it from every other build.
  env: { NEXT_PUBLIC_YAWPOINT_TEST_SOURCES: process.env.NEXT_PUBLIC_YAWPOINT_TEST_SOURCES === "1" ? "1" : "0" },
  typedRoutes: false,
  // Type checking is its own stage of `npm test` (tsc --noEmit over the whole tree), so the build skips it.
  typescript: { ignoreBuildErrors: true },
  async headers() {
    return [
      { source: "/:path*", headers: securityHeaders },
      // API answers are data, never pages: nothing in them may run or be framed.
      { source: "/api/:path*", headers: [{ key: "Content-Security-Policy", value: "default-src 'none'; frame-ancestors 'none'" }] },
    ];
  },
};

export default config;
