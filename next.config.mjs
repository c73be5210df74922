/** @type {import('next').NextConfig} */
const nextConfig = {
  // Server-only packages with native or Node-specific code stay outside the bundle.
  serverExternalPackages: ["pg", "puppeteer-core", "nodemailer"],
  poweredByHeader: false,
  typedRoutes: false,
};

export default nextConfig;
