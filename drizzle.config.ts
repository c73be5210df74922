import { defineConfig } from "drizzle-kit";

// Generation only needs the schema; `migrate` is done by scripts/db.ts, never by next build.
export default defineConfig({
  dialect: "postgresql",
  schema: "./db/schema.ts",
  out: "./migrations",
  dbCredentials: { url: process.env.DATABASE_URL ?? "postgres://localhost/benchwarden" },
});
