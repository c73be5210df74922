// Headers every response carries. Pages get their Content-Security-Policy, with a per-request nonce,
// from proxy.ts; API answers and static files get a fixed one here that allows nothing to run or frame.
const SECURITY_HEADERS = [
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "Referrer-Policy", value: "same-origin" },
  { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=(), payment=(), usb=()" },
  { key: "X-Frame-Options", value: "DENY" },
  { key: "Cross-Origin-Opener-Policy", value: "same-origin" },
];

const NOTHING_RUNS = { key: "Content-Security-Policy", value: "default-src 'none'; frame-ancestors 'none'" };
// A web worker's own script sets the worker's policy: the bundler's worker entry loads the worker's chunks from this
// origin (importScripts) and nothing else (the table editor runs the analysis engine in one).
const WORKER_RUNS = { key: "Content-Security-Policy", value: "default-src 'none'; script-src 'self'; frame-ancestors 'none'" };

/** @type {import('next').NextConfig} */
const nextConfig = {
  // Server-only packages with native or Node-specific code stay outside the bundle.
  serverExternalPackages: ["pg", "puppeteer-core", "nodemailer", "pino"],
  poweredByHeader: false,
  typedRoutes: false,
  // The build checks the app's own code; scripts and tests are checked by `tsc` in npm test.
  typescript: { tsconfigPath: "tsconfig.build.json" },
  async headers() {
    return [
      { source: "/:path*", headers: SECURITY_HEADERS },
      { source: "/api/:path*", headers: [NOTHING_RUNS] },
      { source: "/_next/:path*", headers: [NOTHING_RUNS] },
      { source: "/_next/static/chunks/:file(turbopack-worker-.*)", headers: [WORKER_RUNS] },
      { source: "/favicon.ico", headers: [NOTHING_RUNS] },
    ];
  },
  // forbidden() from next/navigation: a page a role may not open answers 403 (app/forbidden.tsx), not 200.
  experimental: { authInterrupts: true },
};

export default nextConfig;
