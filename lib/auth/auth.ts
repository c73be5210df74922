// better-auth on the server: e-mail + password sign-in, sessions in PostgreSQL (Drizzle adapter),
// roles from lib/auth/permissions.ts through the admin plugin (its own endpoints closed: see
// lib/auth/endpoints.ts). Accounts come only from invitations. Optionally, sign-in through the
// institution's OpenID Connect provider (@better-auth/sso, lib/auth/sso.ts) beside the password.
import "server-only";
import { sso } from "@better-auth/sso";
import { betterAuth } from "better-auth";
import { drizzleAdapter } from "better-auth/adapters/drizzle";
import { nextCookies } from "better-auth/next-js";
import { admin } from "better-auth/plugins";
import { getDb, schema } from "@/db";
import { env } from "@/lib/env";
import { recordAudit } from "@/lib/server/audit";
import { enqueueMail } from "@/lib/mail/outbox";
import { passwordResetMail } from "@/lib/mail/templates";
import { CLIENT_ADDRESS_HEADER } from "./client-address";
import { CLOSED_AUTH_PATHS } from "./endpoints";
import { appOrigins } from "./origins";
import { defaultProviders, resolveInstitutionUser, ssoSettings } from "./sso";
import { ac, roles } from "./permissions";

function createAuth() {
  const e = env();
  const institution = ssoSettings();
  return betterAuth({
    appName: "Benchwarden",
    baseURL: e.APP_URL,
    secret: e.BETTER_AUTH_SECRET,
    // The identity provider's origin is trusted for the server's own discovery, token and key fetches
    // (the SSO plugin checks them against this list); browsers' requests still pass lib/auth/origins.ts.
    trustedOrigins: institution ? [...appOrigins(), new URL(institution.issuer).origin] : appOrigins(),
    // Closed inside the library as well; lib/auth/handler.ts opens only OPEN_AUTH_ENDPOINTS.
    disabledPaths: [...CLOSED_AUTH_PATHS],
    database: drizzleAdapter(getDb(), {
      provider: "pg",
      schema: { user: schema.user, session: schema.session, account: schema.account, verification: schema.verification, ssoProvider: schema.ssoProvider },
      // The SSO plugin links an institutional identity to an account inside one transaction.
      transaction: true,
    }),
    emailAndPassword: {
      enabled: true,
      disableSignUp: true,
      minPasswordLength: 10,
      resetPasswordTokenExpiresIn: 60 * 60,
      revokeSessionsOnPasswordReset: true,
      sendResetPassword: async ({ user, url }) => {
        await enqueueMail(getDb(), passwordResetMail({ to: user.email, name: user.name, url }));
      },
    },
    session: { expiresIn: 60 * 60 * 12, updateAge: 60 * 60 },
    rateLimit: {
      enabled: true,
      window: 60,
      max: 300,
      customRules: {
        "/sign-in/email": { window: 60, max: e.AUTH_RATE_LIMIT_MAX },
        "/request-password-reset": { window: 60, max: 5 },
        // Starting an institutional sign-in checks no secret (the provider does); the library's own
        // default for /sign-in/* (3 in 10 s per address) would refuse a lab behind one NAT.
        "/sign-in/sso": { window: 60, max: 60 },
      },
    },
    advanced: {
      // The address lib/auth/handler.ts decided (trusted proxies or the socket), never a client's header.
      ipAddress: { ipAddressHeaders: [CLIENT_ADDRESS_HEADER] },
    },
    databaseHooks: {
      session: {
        create: {
          after: async (s) => {
            await recordAudit(getDb(), { userId: s.userId, roleText: null, ipAddress: s.ipAddress ?? null }, { action: "signed-in", detail: { userAgent: s.userAgent ?? null } });
          },
        },
      },
    },
    plugins: [
      admin({ ac, roles, defaultRole: "researcher", adminRoles: ["admin"] }),
      sso({
        defaultSSO: defaultProviders(institution),
        resolveUser: resolveInstitutionUser,
        disableImplicitSignUp: true,
        // Nobody registers providers over HTTP (those endpoints are closed); this closes it in the plugin too.
        providersLimit: 0,
      }),
      nextCookies(), // must stay last
    ],
  });
}

type Auth = ReturnType<typeof createAuth>;
const globalForAuth = globalThis as unknown as { benchwardenAuth?: Auth };

/** The better-auth instance, built on first use so that `next build` needs no environment. */
export function getAuth(): Auth {
  globalForAuth.benchwardenAuth ??= createAuth();
  return globalForAuth.benchwardenAuth;
}
