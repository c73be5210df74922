// The sentences for a refused institutional sign-in (lib/auth/sso.ts), shared with the sign-in page
// in the browser. The page shows only these, never text taken from its address.

/** Why an institutional sign-in was refused: the code in the sign-in page's address, and its sentence. */
export const SSO_REFUSALS = {
  "not-invited":
    "Your institution signed you in, but Benchwarden has no account for your e-mail address. Accounts come from invitations: ask your lab's administrator or laser safety officer to invite you, then sign in again.",
  deactivated: "Your Benchwarden account is deactivated. If that is a mistake, ask an administrator to reactivate it.",
  "email-not-confirmed":
    "Your institution did not confirm your e-mail address, so Benchwarden cannot tell which account is yours. Ask your institution's IT service desk, or sign in with your e-mail and password.",
  cancelled: "Signing in at your institution was cancelled. Try again, or sign in with your e-mail and password.",
  failed: "Signing in through your institution did not work. Try again, or sign in with your e-mail and password.",
} as const;
export type SsoRefusal = keyof typeof SSO_REFUSALS;

/** The sentence for an `error` value in the sign-in page's address (the provider's and the library's codes included). */
export function ssoRefusalSentence(code: string | null): string | null {
  if (!code) return null;
  if (code in SSO_REFUSALS) return SSO_REFUSALS[code as SsoRefusal];
  if (code === "access_denied") return SSO_REFUSALS.cancelled;
  if (code === "banned") return SSO_REFUSALS.deactivated;
  return SSO_REFUSALS.failed;
}
