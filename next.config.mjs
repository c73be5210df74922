// Headers every response carries (the Content-Security-Policy with its per-request nonce is set in
// proxy.ts, except for the static files below, which run nothing).
const SECURITY_HEADERS = [
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "Referrer-Policy", value: "same-origin" },
  { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=(), payment=(), usb=()" },
  { key: "X-Frame-Options", value: "DENY" },
  { key: "Cross-Origin-Opener-Policy", value: "same-origin" },
];

/** @type {import('next').NextConfig} */
const nextConfig = {
  // Server-only packages with native or Node-specific code stay outside the bundle.
  serverExternalPackages: ["pg", "puppeteer-core", "nodemailer"],
  poweredByHeader: false,
  typedRoutes: false,
  // The build checks the app's own code; scripts and tests are checked by `tsc` in npm test.
  typescript: { tsconfigPath: "tsconfig.build.json" },
  async headers() {
    return [
      { source: "/:path*", headers: SECURITY_HEADERS },
      { source: "/_next/static/:path*", headers: [{ key: "Content-Security-Policy", value: "default-src 'none'; frame-ancestors 'none'" }] },
    ];
  },
};

export default nextConfig;
