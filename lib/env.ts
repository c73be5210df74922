// Environment variables, parsed once with zod on first use. A missing or wrong value stops the
// server with a sentence naming the variable and what to set; scripts/start.ts sets them all.
import { z } from "zod";

const envSchema = z.object({
  DATABASE_URL: z
    .string({ error: "DATABASE_URL is not set: give the PostgreSQL URL, e.g. postgres://user:pw@127.0.0.1:5433/benchwarden" })
    .startsWith("postgres", "DATABASE_URL must be a postgres:// URL"),
  BETTER_AUTH_SECRET: z
    .string({ error: "BETTER_AUTH_SECRET is not set: give a random string of at least 32 characters" })
    .min(32, "BETTER_AUTH_SECRET must be at least 32 characters long"),
  APP_URL: z.url({ error: "APP_URL must be the app's public URL, e.g. http://127.0.0.1:3000" }).default("http://127.0.0.1:3000"),
  SMTP_HOST: z.string().min(1, "SMTP_HOST must name the SMTP server").default("127.0.0.1"),
  SMTP_PORT: z.coerce
    .number({ error: "SMTP_PORT must be a port number" })
    .int("SMTP_PORT must be a whole number")
    .min(1, "SMTP_PORT must be between 1 and 65535")
    .max(65535, "SMTP_PORT must be between 1 and 65535")
    .default(2525),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  SMTP_SECURE: z.enum(["true", "false"], { error: "SMTP_SECURE must be true or false" }).default("false"),
  MAIL_FROM: z.string().min(3, "MAIL_FROM must be a sender address").default("Benchwarden <benchwarden@optics.example.edu>"),
  MAIL_CATCHER_URL: z.url({ error: "MAIL_CATCHER_URL must be a URL" }).optional(),
  /**
   * How many reverse proxies of our own stand in front of the app. 0 (the default): the client is the
   * socket's peer and X-Forwarded-For is ignored. n ≥ 1: the client is the n-th address from the right
   * of X-Forwarded-For (each trusted proxy appends the address it saw). Set it only behind proxies
   * that append to X-Forwarded-For, or any client can choose its own address.
   */
  TRUSTED_PROXY_COUNT: z.coerce
    .number({ error: "TRUSTED_PROXY_COUNT must be a whole number (0 when no proxy of yours stands in front of the app)" })
    .int("TRUSTED_PROXY_COUNT must be a whole number")
    .min(0, "TRUSTED_PROXY_COUNT must be 0 or more")
    .max(10, "TRUSTED_PROXY_COUNT must be at most 10")
    .default(0),
  /** Tests lower better-auth's sign-in rate limit window; the product keeps it on. */
  AUTH_RATE_LIMIT_MAX: z.coerce.number().int().min(1).default(10),
  /** Where uploads and build sheets are kept: "local" (STORAGE_DIR) or "s3" (the S3_* settings). */
  STORAGE_DRIVER: z.enum(["local", "s3"], { error: "STORAGE_DRIVER must be local or s3" }).default("local"),
  STORAGE_DIR: z.string().min(1, "STORAGE_DIR must name a directory, e.g. .data/uploads").optional(),
  S3_ENDPOINT: z.url({ error: "S3_ENDPOINT must be a URL, e.g. http://127.0.0.1:9000 (leave it out for AWS S3)" }).optional(),
  S3_BUCKET: z.string().min(3, "S3_BUCKET must name a bucket (at least 3 characters)").optional(),
  S3_ACCESS_KEY_ID: z.string().min(1, "S3_ACCESS_KEY_ID must not be empty").optional(),
  S3_SECRET_ACCESS_KEY: z.string().min(1, "S3_SECRET_ACCESS_KEY must not be empty").optional(),
  S3_REGION: z.string().min(1, "S3_REGION must name a region, e.g. us-east-1").optional(),
  /**
   * Sign-in through the institution's OpenID Connect provider (lib/auth/sso.ts). Set SSO_ISSUER,
   * SSO_CLIENT_ID and SSO_CLIENT_SECRET together, or none of them (then only e-mail and password).
   * The provider must send back the redirect address APP_URL/api/auth/sso/callback/institution.
   */
  SSO_ISSUER: z.url({ error: "SSO_ISSUER must be the OpenID provider's issuer URL, e.g. https://login.example.edu/realms/staff" }).optional(),
  SSO_CLIENT_ID: z.string().min(1, "SSO_CLIENT_ID must not be empty").optional(),
  SSO_CLIENT_SECRET: z.string().min(1, "SSO_CLIENT_SECRET must not be empty").optional(),
  /** The words on the sign-in button after "Continue with", e.g. "Northmere University login". */
  SSO_LABEL: z.string().min(1, "SSO_LABEL must not be empty").max(60, "SSO_LABEL must be at most 60 characters").default("your institution's login"),
}).superRefine((e, ctx) => {
  const set = [e.SSO_ISSUER, e.SSO_CLIENT_ID, e.SSO_CLIENT_SECRET].filter((v) => v !== undefined).length;
  if (set > 0 && set < 3) {
    for (const name of ["SSO_ISSUER", "SSO_CLIENT_ID", "SSO_CLIENT_SECRET"] as const) {
      if (e[name] === undefined) ctx.addIssue({ code: "custom", path: [name], message: `${name} is not set: institutional sign-in needs SSO_ISSUER, SSO_CLIENT_ID and SSO_CLIENT_SECRET together (or none of them)` });
    }
  }
});

export type Env = z.infer<typeof envSchema>;

let cached: Env | null = null;

export function env(): Env {
  if (cached) return cached;
  const parsed = envSchema.safeParse(process.env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  - ${i.path.join(".")}: ${i.message}`);
    throw new Error(`Benchwarden cannot start: the environment is incomplete.\n${lines.join("\n")}`);
  }
  cached = parsed.data;
  return cached;
}
