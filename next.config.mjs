/** @type {import('next').NextConfig} */
const nextConfig = {
  // Server-only packages with native or Node-specific code stay outside the bundle.
  serverExternalPackages: ["pg", "puppeteer-core", "nodemailer", "pino"],
  poweredByHeader: false,
  typedRoutes: false,
  // The build checks the app's own code; scripts and tests are checked by `tsc` in npm test.
  typescript: { tsconfigPath: "tsconfig.build.json" },
};

export default nextConfig;
