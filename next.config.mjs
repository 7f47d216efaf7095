// Sent with every response, pages and JSON alike. The policy is what the app's own pages
// need: Next.js's inline bootstrap scripts and uPlot's inline styles ('unsafe-inline'),
// images drawn to data:/blob: URLs, and nothing from other origins. No framing at all.
const contentSecurityPolicy = [
  "default-src 'self'",
  `script-src 'self' 'unsafe-inline'${process.env.NODE_ENV === "development" ? " 'unsafe-eval'" : ""}`,
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self' data:",
  "connect-src 'self'",
  "object-src 'none'",
  "base-uri 'self'",
  "form-action 'self'",
  "frame-ancestors 'none'",
].join("; ");

const securityHeaders = [
  { key: "Content-Security-Policy", value: contentSecurityPolicy },
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "X-Frame-Options", value: "DENY" },
  { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
  { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=(), payment=()" },
];

/** @type {import('next').NextConfig} */
const nextConfig = {
  // Sequelize picks its dialect module at run time; bundling it breaks that lookup.
  serverExternalPackages: ["sequelize", "pg", "pg-hstore", "bullmq", "ioredis", "nodemailer", "mailparser"],
  poweredByHeader: false,
  // A second build (a parallel checkout's or a helper's) can live beside the main one.
  distDir: process.env.NEXT_DIST_DIR || ".next",
  // Pages opened through a share link: never indexed, never cached, never leaking the
  // link through a Referer header.
  async headers() {
    return [
      { source: "/:path*", headers: securityHeaders },
      {
        source: "/shared/:path*",
        headers: [
          { key: "X-Robots-Tag", value: "noindex, nofollow" },
          { key: "Referrer-Policy", value: "no-referrer" },
          { key: "Cache-Control", value: "private, no-store" },
        ],
      },
    ];
  },
  experimental: {
    serverActions: { bodySizeLimit: "25mb" },
  },
};

export default nextConfig;
