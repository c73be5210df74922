// Sign-in through the institution's OpenID Connect provider (@better-auth/sso), configured from the
// environment (SSO_ISSUER, SSO_CLIENT_ID, SSO_CLIENT_SECRET, SSO_LABEL). Accounts still come only
// from invitations: the provider proves who someone is, and an existing Benchwarden account with the
// same e-mail address — confirmed by the provider — is the one signed in, with the roles and labs an
// administrator gave it. Nobody is created here, and a deactivated account stays out.
import type { SSOOptions, SSOUserResolution, SSOUserResolutionContext, SSOUserResolutionInput } from "@better-auth/sso";
import { env } from "@/lib/env";
import { SSO_REFUSALS } from "./sso-words";

/** The one configured provider's id; it is part of the redirect address the provider must allow. */
export const SSO_PROVIDER_ID = "institution";
export const SSO_CALLBACK_PATH = `/sso/callback/${SSO_PROVIDER_ID}`;

export type SsoSettings = { issuer: string; clientId: string; clientSecret: string; label: string };

/** The configured provider, or null when this installation offers only e-mail and password. */
export function ssoSettings(): SsoSettings | null {
  const e = env();
  if (!e.SSO_ISSUER || !e.SSO_CLIENT_ID || !e.SSO_CLIENT_SECRET) return null;
  return { issuer: e.SSO_ISSUER.replace(/\/+$/, ""), clientId: e.SSO_CLIENT_ID, clientSecret: e.SSO_CLIENT_SECRET, label: e.SSO_LABEL };
}

/** The plugin's configured providers: the institution's, discovered from its issuer's /.well-known/openid-configuration. */
export function defaultProviders(settings: SsoSettings | null): NonNullable<SSOOptions["defaultSSO"]> {
  if (!settings) return [];
  return [
    {
      providerId: SSO_PROVIDER_ID,
      // Only used to pick a provider by e-mail domain; Benchwarden always names the provider instead.
      domain: new URL(settings.issuer).hostname,
      oidcConfig: {
        issuer: settings.issuer,
        discoveryEndpoint: `${settings.issuer}/.well-known/openid-configuration`,
        clientId: settings.clientId,
        clientSecret: settings.clientSecret,
        pkce: true,
        scopes: ["openid", "email", "profile"],
      },
    },
  ];
}

type Found = { id: string; email: string; banned?: boolean | null };

/**
 * Which Benchwarden account a verified identity signs in as. The e-mail must be confirmed by the
 * provider (`email_verified` in its ID token or user info); the account must exist and be active.
 */
export async function resolveInstitutionUser(input: SSOUserResolutionInput, context: SSOUserResolutionContext): Promise<SSOUserResolution> {
  const claims = input.protocol === "oidc" ? { ...input.providerClaims, ...input.verifiedIdTokenClaims } : {};
  const verified = claims.email_verified === true || claims.email_verified === "true";
  const email = input.providerUser.email.trim().toLowerCase();
  if (!verified || !email) return { action: "reject", code: "email-not-confirmed", message: SSO_REFUSALS["email-not-confirmed"] };
  const found = (await context.database.findOne({ model: "user", where: [{ field: "email", value: email }] })) as Found | null;
  if (!found) return { action: "reject", code: "not-invited", message: SSO_REFUSALS["not-invited"] };
  if (found.banned) return { action: "reject", code: "deactivated", message: SSO_REFUSALS.deactivated };
  return { action: "link", userId: found.id, profile: "preserve" };
}
