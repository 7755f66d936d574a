// Security headers for every response. The app runs under this policy: no third-party
// origins, fonts and scripts served from the app itself.
const isDev = process.env.NODE_ENV !== "production";

const csp = [
  "default-src 'self'",
  // Next's App Router streams inline bootstrap scripts; 'unsafe-eval' only for dev tooling.
  `script-src 'self' 'unsafe-inline'${isDev ? " 'unsafe-eval'" : ""}`,
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self'",
  "connect-src 'self'",
  "frame-ancestors 'none'",
  "form-action 'self'",
  "base-uri 'self'",
  "object-src 'none'",
].join("; ");

// File downloads are never a page: nothing runs, nothing loads, and a file opened directly is
// sandboxed (no script, no same-origin access).
const downloadCsp = "default-src 'none'; sandbox; frame-ancestors 'none'";
// The download routes, as one path-to-regexp pattern (no leading slash).
const DOWNLOADS = "(?:api/files/[^/]+|api/briefings/[^/]+/photo/|api/briefings/[^/]+/pdf|api/credentials/export|api/gear/export)";

/** @type {import('next').NextConfig} */
const nextConfig = {
  // A second build directory lets a developer run a dev server beside a production build.
  distDir: process.env.NEXT_DIST_DIR || ".next",
  poweredByHeader: false,
  reactStrictMode: true,
  serverExternalPackages: ["knex", "mysql2", "twilio", "nodemailer", "highs", "bcryptjs"],
  async headers() {
    // One Content-Security-Policy per response, never two that replace each other: file
    // downloads (evidence, pole-check photos, the briefing PDF, CSV exports) get the sandboxed
    // download policy, the same their routes set themselves; everything else the app's policy
    // (issue 15, finding 14: the global policy used to replace a download's sandbox).
    return [
      { source: `/:path((?!${DOWNLOADS}).*)`, headers: [{ key: "Content-Security-Policy", value: csp }] },
      { source: `/:path(${DOWNLOADS}.*)`, headers: [{ key: "Content-Security-Policy", value: downloadCsp }] },
      // Issue 19: the board route answers with bytes it compressed once per change
      // (lib/board/data-serve.ts) when its client asks for them (x-board-gzip: 1) and accepts
      // gzip; this tells Next's own compression that they are already encoded.
      {
        source: "/api/board",
        has: [
          { type: "header", key: "x-board-gzip", value: "1" },
          { type: "header", key: "accept-encoding", value: ".*gzip.*" },
        ],
        headers: [{ key: "Content-Encoding", value: "gzip" }],
      },
      {
        source: "/:path*",
        headers: [
          { key: "X-Content-Type-Options", value: "nosniff" },
          { key: "X-Frame-Options", value: "DENY" },
          { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
          { key: "Permissions-Policy", value: "camera=(self), geolocation=(self), microphone=()" },
        ],
      },
    ];
  },
};

export default nextConfig;
