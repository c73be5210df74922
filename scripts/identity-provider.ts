// A stand-in for an institution's OpenID Connect provider, for development and tests only
// (oidc-provider on loopback). `npm start`, `npm run dev` and `npm test` run it when no real provider
// is configured (SSO_ISSUER unset) and point the app at it. Its sign-in page takes any e-mail address
// as the login (the password is not checked); the address comes back confirmed
// (email_verified: true) unless the login starts with "unconfirmed", which comes back unconfirmed.
// The people of the demo institution get their names; anyone else is known by the address alone.
import { createHash, generateKeyPairSync, randomBytes } from "node:crypto";
import { createServer } from "node:http";
import Provider, { type Configuration, type KoaContextWithOIDC } from "oidc-provider";
import { DEMO_USERS } from "../db/seed";

const port = Number(process.env.IDP_PORT ?? 3090);
const issuer = `http://127.0.0.1:${port}`;
const clientId = process.env.IDP_CLIENT_ID ?? "benchwarden";
const clientSecret = process.env.IDP_CLIENT_SECRET ?? "";
const redirectUris = (process.env.IDP_REDIRECT_URIS ?? "").split(",").filter(Boolean);
if (!clientSecret || redirectUris.length === 0) {
  console.error("[identity provider] IDP_CLIENT_SECRET and IDP_REDIRECT_URIS must be set");
  process.exit(1);
}

const directory = new Map<string, string>(DEMO_USERS.map((u) => [u.email.toLowerCase(), u.name]));
// Someone the institution knows who has no Benchwarden account (the tests sign in as them).
directory.set("visitor@northmere.example.edu", "Sasha Brannock");

function claimsOf(login: string) {
  const email = login.trim().toLowerCase();
  // A stable subject per address, as a directory's staff number would be.
  const sub = `staff-${createHash("sha256").update(email).digest("hex").slice(0, 16)}`;
  return { sub, email, email_verified: !email.startsWith("unconfirmed"), name: directory.get(email) ?? email };
}

const { privateKey } = generateKeyPairSync("rsa", { modulusLength: 2048 });
const signingKey = { ...privateKey.export({ format: "jwk" }), kid: "fake-idp-1", use: "sig", alg: "RS256" };

const configuration: Configuration = {
  clients: [
    {
      client_id: clientId,
      client_secret: clientSecret,
      redirect_uris: redirectUris,
      grant_types: ["authorization_code"],
      response_types: ["code"],
      token_endpoint_auth_method: "client_secret_basic",
    },
  ],
  // oidc-provider's jwks wants a JSON Web Key Set; node's JWK export is one key of it.
  jwks: { keys: [signingKey as never] },
  cookies: { keys: [randomBytes(32).toString("hex")] },
  claims: { openid: ["sub"], email: ["email", "email_verified"], profile: ["name"] },
  conformIdTokenClaims: false,
  pkce: { required: () => true },
  features: { devInteractions: { enabled: true } },
  async findAccount(_ctx: KoaContextWithOIDC, id: string) {
    if (!id.includes("@")) return undefined;
    return { accountId: id, claims: async () => claimsOf(id) };
  },
  // The institution's own applications need no consent screen: the grant is made on first use.
  async loadExistingGrant(ctx: KoaContextWithOIDC) {
    const oidc = ctx.oidc;
    const client = oidc.client;
    const session = oidc.session;
    if (!client || !session?.accountId) return undefined;
    const grantId = oidc.result?.consent?.grantId ?? session.grantIdFor(client.clientId);
    if (grantId) return oidc.provider.Grant.find(grantId);
    const grant = new oidc.provider.Grant({ clientId: client.clientId, accountId: session.accountId });
    grant.addOIDCScope("openid email profile");
    grant.addOIDCClaims(["email", "email_verified", "name"]);
    await grant.save();
    return grant;
  },
};

const provider = new Provider(issuer, configuration);
createServer(provider.callback()).listen(port, "127.0.0.1", () => {
  console.log(`[identity provider] ${issuer} (a local stand-in for the institution's sign-in)`);
});
