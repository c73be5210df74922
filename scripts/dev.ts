// `npm run dev`: the same private PostgreSQL, demo data and mail catcher as `npm start`, with
// `next dev` (hot reload) instead of the production build. PORT picks the app port (default 3000).
import path from "node:path";
import { stopCluster } from "./lib/postgres";
import { localIdentityProvider, NEXT, provision, TSX } from "./lib/provision";
import { log, ROOT, startChild, stopChildren } from "./lib/system";

const ports = {
  app: Number(process.env.PORT ?? 3000),
  postgres: Number(process.env.BENCHWARDEN_PG_PORT ?? 5433),
  smtp: Number(process.env.BENCHWARDEN_SMTP_PORT ?? 2525),
  catcherWeb: Number(process.env.BENCHWARDEN_CATCHER_PORT ?? 1080),
};

async function main() {
  const { cluster, env } = await provision({ dataDir: path.join(ROOT, ".data"), ports, dbName: "benchwarden", seed: true, rateLimitMax: 100 });
  // BENCHWARDEN_IDP_PORT: the local stand-in for the institution's sign-in (default: the app's port + 90).
  const idp = localIdentityProvider(env.APP_URL!, Number(process.env.BENCHWARDEN_IDP_PORT ?? ports.app + 90));
  const devEnv: NodeJS.ProcessEnv = { ...env, ...idp.env, NODE_ENV: "development" as const };
  const stop = async () => {
    await stopChildren();
    if (process.env.BENCHWARDEN_KEEP_DB !== "1") stopCluster(cluster);
    process.exit(0);
  };
  process.on("SIGINT", () => void stop());
  process.on("SIGTERM", () => void stop());
  startChild("mail catcher", TSX, ["scripts/mail-catcher.ts"], { env: devEnv });
  startChild("mail worker", TSX, ["scripts/mail-worker.ts"], { env: devEnv });
  if (idp.start) startChild("identity provider", TSX, ["scripts/identity-provider.ts"], { env: devEnv });
  startChild("next dev", NEXT, ["dev", "-H", "127.0.0.1", "-p", String(ports.app)], { env: devEnv });
  log(`dev server on ${env.APP_URL}; mail catcher ${env.MAIL_CATCHER_URL}`);
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
