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
