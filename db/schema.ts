// Database schema (Drizzle ORM, PostgreSQL). The first four tables are better-auth's
// (with its admin plugin's columns); the rest are Benchwarden's own.
import { sql } from "drizzle-orm";
import {
  boolean,
  index,
  integer,
  jsonb,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from "drizzle-orm/pg-core";

const timestamps = {
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
};

// ── better-auth ────────────────────────────────────────────────────────────────────────────
export const user = pgTable("user", {
  id: text("id").primaryKey(),
  name: text("name").notNull(),
  email: text("email").notNull().unique(),
  emailVerified: boolean("email_verified").notNull().default(false),
  image: text("image"),
  /** Comma-separated role names (better-auth admin plugin convention). */
  role: text("role"),
  banned: boolean("banned").default(false),
  banReason: text("ban_reason"),
  banExpires: timestamp("ban_expires", { withTimezone: true }),
  ...timestamps,
});

export const session = pgTable(
  "session",
  {
    id: text("id").primaryKey(),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    token: text("token").notNull().unique(),
    ipAddress: text("ip_address"),
    userAgent: text("user_agent"),
    userId: text("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    impersonatedBy: text("impersonated_by"),
    ...timestamps,
  },
  (t) => [index("session_user_idx").on(t.userId)],
);

export const account = pgTable(
  "account",
  {
    id: text("id").primaryKey(),
    accountId: text("account_id").notNull(),
    providerId: text("provider_id").notNull(),
    userId: text("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    accessToken: text("access_token"),
    refreshToken: text("refresh_token"),
    idToken: text("id_token"),
    accessTokenExpiresAt: timestamp("access_token_expires_at", { withTimezone: true }),
    refreshTokenExpiresAt: timestamp("refresh_token_expires_at", { withTimezone: true }),
    scope: text("scope"),
    password: text("password"),
    ...timestamps,
  },
  (t) => [index("account_user_idx").on(t.userId)],
);

export const verification = pgTable(
  "verification",
  {
    id: text("id").primaryKey(),
    identifier: text("identifier").notNull(),
    value: text("value").notNull(),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    ...timestamps,
  },
  (t) => [index("verification_identifier_idx").on(t.identifier)],
);

// ── Labs and people ────────────────────────────────────────────────────────────────────────
export const lab = pgTable("lab", {
  id: uuid("id").primaryKey().defaultRandom(),
  name: text("name").notNull().unique(),
  room: text("room"),
  ...timestamps,
});

export const labMember = pgTable(
  "lab_member",
  {
    labId: uuid("lab_id")
      .notNull()
      .references(() => lab.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.labId, t.userId] }), index("lab_member_user_idx").on(t.userId)],
);

export const invitation = pgTable(
  "invitation",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    email: text("email").notNull(),
    name: text("name").notNull(),
    roles: text("roles").notNull(),
    labIds: jsonb("lab_ids").$type<string[]>().notNull().default([]),
    /** SHA-256 of the token in the e-mailed link; the token itself is never stored. */
    tokenHash: text("token_hash").notNull().unique(),
    invitedBy: text("invited_by")
      .notNull()
      .references(() => user.id),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    acceptedAt: timestamp("accepted_at", { withTimezone: true }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("invitation_email_idx").on(t.email)],
);

// ── Benches and their revisions ────────────────────────────────────────────────────────────
export const REVIEW_STATES = [
  "draft",
  "submitted",
  "approved",
  "changes-requested",
  "rejected",
  "withdrawn",
  "expired",
  "superseded",
] as const;
export type ReviewState = (typeof REVIEW_STATES)[number];

export const bench = pgTable(
  "bench",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    labId: uuid("lab_id")
      .notNull()
      .references(() => lab.id),
    title: text("title").notNull(),
    authorId: text("author_id")
      .notNull()
      .references(() => user.id),
    ...timestamps,
  },
  (t) => [index("bench_lab_idx").on(t.labId), index("bench_author_idx").on(t.authorId)],
);

export const benchRevision = pgTable(
  "bench_revision",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    benchId: uuid("bench_id")
      .notNull()
      .references(() => bench.id, { onDelete: "cascade" }),
    number: integer("number").notNull(),
    /** The bench document (version 1), as saved. */
    document: jsonb("document").notNull(),
    /** SHA-256 of the canonical JSON of the document. */
    contentHash: text("content_hash").notNull(),
    state: text("state").$type<ReviewState>().notNull().default("draft"),
    /** Optimistic-concurrency counter for the working draft. */
    version: integer("version").notNull().default(1),
    createdBy: text("created_by")
      .notNull()
      .references(() => user.id),
    ...timestamps,
  },
  (t) => [
    uniqueIndex("bench_revision_number_idx").on(t.benchId, t.number),
    index("bench_revision_state_idx").on(t.state),
  ],
);

// ── Audit trail (append-only: a trigger in the migrations refuses UPDATE and DELETE) ──────
export const auditEvent = pgTable(
  "audit_event",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    at: timestamp("at", { withTimezone: true }).notNull().default(sql`clock_timestamp()`),
    actorId: text("actor_id"),
    actorRole: text("actor_role"),
    action: text("action").notNull(),
    benchId: uuid("bench_id"),
    revisionId: uuid("revision_id"),
    contentHash: text("content_hash"),
    ipAddress: text("ip_address"),
    detail: jsonb("detail").$type<Record<string, unknown>>().notNull().default({}),
  },
  (t) => [index("audit_event_bench_idx").on(t.benchId, t.at), index("audit_event_at_idx").on(t.at)],
);

// ── Outbox: e-mails are written in the same transaction as the change they announce ───────
export const OUTBOX_STATES = ["pending", "sent", "failed"] as const;
export type OutboxState = (typeof OUTBOX_STATES)[number];

export const mailOutbox = pgTable(
  "mail_outbox",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    toAddress: text("to_address").notNull(),
    subject: text("subject").notNull(),
    textBody: text("text_body").notNull(),
    htmlBody: text("html_body").notNull(),
    state: text("state").$type<OutboxState>().notNull().default("pending"),
    attempts: integer("attempts").notNull().default(0),
    nextAttemptAt: timestamp("next_attempt_at", { withTimezone: true }).notNull().defaultNow(),
    lastError: text("last_error"),
    sentAt: timestamp("sent_at", { withTimezone: true }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("mail_outbox_due_idx").on(t.state, t.nextAttemptAt)],
);
