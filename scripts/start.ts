// `npm start`: a private PostgreSQL, migrations, demo data (once), the mail catcher, the outbox
// worker and the production server on http://127.0.0.1:3000. Ctrl-C stops everything it started.
import path from "node:path";
import { buildIfStale } from "./lib/build";
import { stopCluster } from "./lib/postgres";
import { localIdentityProvider, NEXT, provision, TSX } from "./lib/provision";
import { DEMO_PASSWORD, DEMO_USERS } from "../db/seed";
import { log, ROOT, startChild, stopChildren, superviseChild, waitForHttp } from "./lib/system";

const ports = {
  app: Number(process.env.PORT ?? 3000),
  postgres: Number(process.env.BENCHWARDEN_PG_PORT ?? 5433),
  smtp: Number(process.env.BENCHWARDEN_SMTP_PORT ?? 2525),
  catcherWeb: Number(process.env.BENCHWARDEN_CATCHER_PORT ?? 1080),
};

async function main() {
  const started = Date.now();
  const dataDir = path.join(ROOT, ".data");
  const provisioned = await provision({ dataDir, ports, dbName: "benchwarden", seed: true, rateLimitMax: 10 });
  const { cluster } = provisioned;
  // BENCHWARDEN_IDP_PORT: the local stand-in for the institution's sign-in (default: the app's port + 90).
  const idp = localIdentityProvider(provisioned.env.APP_URL!, Number(process.env.BENCHWARDEN_IDP_PORT ?? ports.app + 90));
  const env = { ...provisioned.env, ...idp.env };

  let shuttingDown = false;
  const shutdown = async (signal: string) => {
    if (shuttingDown) return;
    shuttingDown = true;
    log(`${signal}: stopping the app, the mail worker, the mail catcher, the sign-in stand-in and PostgreSQL`);
    await stopChildren();
    stopCluster(cluster);
    process.exit(0);
  };
  process.on("SIGINT", () => void shutdown("SIGINT"));
  process.on("SIGTERM", () => void shutdown("SIGTERM"));

  startChild("mail catcher", TSX, ["scripts/mail-catcher.ts"], { env });
  if (idp.start) startChild("identity provider", TSX, ["scripts/identity-provider.ts"], { env });
  buildIfStale();
  startChild("app", NEXT, ["start", "-H", "127.0.0.1", "-p", String(ports.app)], { env });
  superviseChild("mail worker", TSX, ["scripts/mail-worker.ts"], { env });
  await waitForHttp(`${env.APP_URL}/sign-in`, 60_000);

  const seconds = ((Date.now() - started) / 1000).toFixed(1);
  const accounts = DEMO_USERS.map((u) => `    ${u.roles.join(", ").padEnd(12)} ${u.email}`).join("\n");
  process.stdout.write(`
  Benchwarden is ready (${seconds} s)
    app           ${env.APP_URL}
    mail catcher  ${env.MAIL_CATCHER_URL}   (SMTP on 127.0.0.1:${ports.smtp})
    sign-in       ${idp.start ? `${env.SSO_ISSUER} stands in for the institution's login (any demo e-mail, any password)` : `institutional sign-in through ${env.SSO_ISSUER ?? "(none configured)"}`}
    PostgreSQL    127.0.0.1:${ports.postgres}, data in ${cluster.dataDir}
  Demo sign-ins (password for all: ${DEMO_PASSWORD})
${accounts}
  Press Ctrl-C to stop.
`);
}

main().catch(async (error: unknown) => {
  console.error(`[benchwarden] start failed: ${error instanceof Error ? error.message : String(error)}`);
  await stopChildren();
  process.exit(1);
});
