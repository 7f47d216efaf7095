/** @type {import('next').NextConfig} */
const nextConfig = {
  // Sequelize picks its dialect module at run time; bundling it breaks that lookup.
  serverExternalPackages: ["sequelize", "pg", "pg-hstore", "bullmq", "ioredis", "nodemailer"],
  poweredByHeader: false,
  experimental: {
    serverActions: { bodySizeLimit: "25mb" },
  },
};

export default nextConfig;
