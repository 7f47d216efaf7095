/** @type {import('next').NextConfig} */
const nextConfig = {
  // Sequelize picks its dialect module at run time; bundling it breaks that lookup.
  serverExternalPackages: ["sequelize", "pg", "pg-hstore", "bullmq", "ioredis", "nodemailer"],
  poweredByHeader: false,
  // A second build (a parallel checkout's or a helper's) can live beside the main one.
  distDir: process.env.NEXT_DIST_DIR || ".next",
  experimental: {
    serverActions: { bodySizeLimit: "25mb" },
  },
};

export default nextConfig;
