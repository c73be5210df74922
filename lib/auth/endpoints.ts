// Which of better-auth's HTTP endpoints Benchwarden opens: only those its own screens use (sign-in,
// sign-out, the session, password reset). Everything else — the admin plugin's impersonation,
// passwords, user creation and removal, roles, bans, other people's sessions; sign-up; self-service
// account changes — answers 404 for everyone, admins included. The app's own audited routes
// (/api/admin/*, /api/invitations) are the only way to change a person.

/** Method and path (below /api/auth) of every endpoint the product uses. */
export const OPEN_AUTH_ENDPOINTS: readonly { method: "GET" | "POST"; path: string | RegExp }[] = [
  { method: "POST", path: "/sign-in/email" },
  { method: "POST", path: "/sign-out" },
  { method: "GET", path: "/get-session" },
  { method: "POST", path: "/request-password-reset" },
  { method: "POST", path: "/reset-password" },
  // The link in the reset e-mail: checks the token, then redirects to the reset page.
  { method: "GET", path: /^\/reset-password\/[A-Za-z0-9_-]{1,200}$/ },
  // Institutional sign-in (lib/auth/sso.ts): the start, which answers the provider's address, and the
  // provider's redirect back. lib/auth/handler.ts writes the start's body itself.
  { method: "POST", path: "/sign-in/sso" },
  { method: "GET", path: "/sso/callback/institution" },
  { method: "GET", path: "/ok" },
  { method: "GET", path: "/error" },
];

/**
 * The library's endpoints the product does not use, closed inside better-auth too (disabledPaths),
 * so that even a route wrapper that forgot the allowlist would not open them.
 */
export const CLOSED_AUTH_PATHS: readonly string[] = [
  "/admin/ban-user",
  "/admin/create-user",
  "/admin/get-user",
  "/admin/has-permission",
  "/admin/impersonate-user",
  "/admin/list-user-sessions",
  "/admin/list-users",
  "/admin/remove-user",
  "/admin/revoke-user-session",
  "/admin/revoke-user-sessions",
  "/admin/set-role",
  "/admin/set-user-password",
  "/admin/stop-impersonating",
  "/admin/unban-user",
  "/admin/update-user",
  "/account-info",
  "/change-email",
  "/change-password",
  "/delete-user",
  "/delete-user/callback",
  "/get-access-token",
  "/link-social",
  "/list-accounts",
  "/list-sessions",
  "/refresh-token",
  "/revoke-other-sessions",
  "/revoke-session",
  "/revoke-sessions",
  "/send-verification-email",
  "/sign-in/social",
  "/sign-up/email",
  "/sso/callback",
  "/sso/delete-provider",
  "/sso/get-provider",
  "/sso/providers",
  "/sso/register",
  "/sso/request-domain-verification",
  "/sso/saml2/sp/metadata",
  "/sso/update-provider",
  "/sso/verify-domain",
  "/unlink-account",
  "/update-session",
  "/update-user",
  "/verify-email",
  "/verify-password",
];

export function isOpenAuthEndpoint(method: string, path: string): boolean {
  return OPEN_AUTH_ENDPOINTS.some((e) => e.method === method.toUpperCase() && (typeof e.path === "string" ? e.path === path : e.path.test(path)));
}
