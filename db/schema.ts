// Database schema (Drizzle ORM, PostgreSQL). The first five tables are better-auth's
// (with its admin plugin's columns, and the SSO plugin's provider table); the rest are Benchwarden's own.
import { sql } from "drizzle-orm";
import {
  boolean,
  doublePrecision,
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

/**
 * Identity providers of @better-auth/sso kept in the database. Benchwarden configures its one
 * institutional provider from the environment (lib/auth/sso.ts) and closes the endpoints that would
 * register more, so this table stays empty; the plugin still reads it when no configured provider
 * matches, and answers "no provider" instead of failing.
 */
export const ssoProvider = pgTable("sso_provider", {
  id: text("id").primaryKey(),
  issuer: text("issuer").notNull(),
  oidcConfig: text("oidc_config"),
  samlConfig: text("saml_config"),
  userId: text("user_id").references(() => user.id, { onDelete: "cascade" }),
  providerId: text("provider_id").notNull().unique(),
  organizationId: text("organization_id"),
  domain: text("domain").notNull(),
  domainVerified: boolean("domain_verified").default(false),
  ...timestamps,
});

// ── Labs and people ────────────────────────────────────────────────────────────────────────
/** The laser safety standards a lab may choose to assess its benches against. */
export const SAFETY_STANDARDS = ["ANSI Z136.1-2014", "IEC 60825-1:2014"] as const;
export type SafetyStandard = (typeof SAFETY_STANDARDS)[number];

export const lab = pgTable("lab", {
  id: uuid("id").primaryKey().defaultRandom(),
  name: text("name").notNull().unique(),
  room: text("room"),
  /** The standard this lab's hazard figures follow (chosen by an admin or officer). */
  safetyStandard: text("safety_standard").$type<SafetyStandard>().notNull().default("ANSI Z136.1-2014"),
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
  (t) => [
    index("bench_lab_idx").on(t.labId),
    index("bench_author_idx").on(t.authorId),
    // The auditor's desk: sort by title, search inside titles (pg_trgm, created in the same migration).
    index("bench_title_idx").on(t.title),
    index("bench_title_trgm_idx").using("gin", t.title.op("gin_trgm_ops")),
  ],
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

// ── Review: decisions, comments, expiry reminders (append-only: triggers in the migrations) ──
export const DECISION_OUTCOMES = ["approved", "changes-requested", "rejected"] as const;
export type DecisionOutcome = (typeof DECISION_OUTCOMES)[number];

/** What the hazard engines said at the moment of signing, kept with the signature. */
export type HazardSummary = Record<string, unknown>;

/** One safety officer's decision on one submitted revision; at most one per revision. */
export const reviewDecision = pgTable(
  "review_decision",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    revisionId: uuid("revision_id")
      .notNull()
      .references(() => benchRevision.id),
    benchId: uuid("bench_id")
      .notNull()
      .references(() => bench.id),
    outcome: text("outcome").$type<DecisionOutcome>().notNull(),
    signerId: text("signer_id")
      .notNull()
      .references(() => user.id),
    /** Name and role as they were when signing; later renames do not rewrite the record. */
    signerName: text("signer_name").notNull(),
    signerRole: text("signer_role").notNull(),
    /** The sentence the signature means, stored verbatim. */
    meaning: text("meaning").notNull(),
    conditions: text("conditions"),
    /** The officer's reason (turned down) or what to change (changes asked). */
    reason: text("reason"),
    validUntil: timestamp("valid_until", { withTimezone: true }),
    /** The content hash of the revision that was decided on. */
    contentHash: text("content_hash").notNull(),
    hazardSummary: jsonb("hazard_summary").$type<HazardSummary>(),
    /** True when the signer re-entered their password just before signing. */
    stepUpVerified: boolean("step_up_verified").notNull().default(false),
    decidedAt: timestamp("decided_at", { withTimezone: true }).notNull().default(sql`clock_timestamp()`),
  },
  (t) => [
    uniqueIndex("review_decision_revision_idx").on(t.revisionId),
    index("review_decision_bench_idx").on(t.benchId, t.decidedAt),
    // The auditor's desk lists sign-offs newest first, filtered by officer, class, or expiry.
    index("review_decision_outcome_decided_idx").on(t.outcome, t.decidedAt, t.id),
    index("review_decision_signer_idx").on(t.signerId, t.decidedAt),
    index("review_decision_class_idx").on(sql`(${t.hazardSummary} -> 'hazardClass' ->> 'value')`, t.decidedAt),
    index("review_decision_valid_until_idx").on(t.validUntil).where(sql`${t.outcome} = 'approved'`),
    // Narrow join keys of every sign-off, so counts filtered on the bench or revision side stay on an index.
    index("review_decision_approved_keys_idx").on(t.benchId, t.revisionId).where(sql`${t.outcome} = 'approved'`),
  ],
);

/** Comments on a revision, in threads (the first comment's id is the thread id), optionally pinned to an element. */
export const reviewComment = pgTable(
  "review_comment",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    revisionId: uuid("revision_id")
      .notNull()
      .references(() => benchRevision.id),
    benchId: uuid("bench_id")
      .notNull()
      .references(() => bench.id),
    threadId: uuid("thread_id").notNull(),
    parentId: uuid("parent_id"),
    /** The bench element the thread is about; null for a general comment. */
    elementId: text("element_id"),
    authorId: text("author_id")
      .notNull()
      .references(() => user.id),
    authorName: text("author_name").notNull(),
    authorRole: text("author_role").notNull(),
    body: text("body").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().default(sql`clock_timestamp()`),
  },
  (t) => [
    index("review_comment_revision_idx").on(t.revisionId, t.createdAt),
    index("review_comment_thread_idx").on(t.threadId),
    index("review_comment_bench_idx").on(t.benchId, t.createdAt),
  ],
);

export const REMINDER_KINDS = ["30-days", "7-days"] as const;
export type ReminderKind = (typeof REMINDER_KINDS)[number];

/** Expiry reminders already written to the outbox; the unique key keeps each from going out twice. */
export const reviewReminder = pgTable(
  "review_reminder",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    decisionId: uuid("decision_id")
      .notNull()
      .references(() => reviewDecision.id),
    kind: text("kind").$type<ReminderKind>().notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().default(sql`clock_timestamp()`),
  },
  (t) => [uniqueIndex("review_reminder_once_idx").on(t.decisionId, t.kind)],
);

// ── Laser register: the institution's inventory of lasers, kept by the safety officers ────────
export const LASER_STATUSES = ["in-service", "out-of-service", "disposed"] as const;
export type LaserStatus = (typeof LASER_STATUSES)[number];

export const laserRegister = pgTable(
  "laser_register",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    labId: uuid("lab_id")
      .notNull()
      .references(() => lab.id),
    /** The class printed on the laser's label ("1", "1M", "2", "2M", "3R", "3B", "4"). */
    labelClass: text("label_class").notNull(),
    /** Emission wavelengths in nm; most lasers have one. */
    wavelengthsNm: jsonb("wavelengths_nm").$type<number[]>().notNull(),
    maxPowerMw: doublePrecision("max_power_mw").notNull(),
    pulseEnergyMj: doublePrecision("pulse_energy_mj"),
    pulseDurationS: doublePrecision("pulse_duration_s"),
    pulseRepetitionRateHz: doublePrecision("pulse_repetition_rate_hz"),
    /** Trains in bursts only: pulses in each burst (pulseRepetitionRateHz stays the average pulses per second). */
    pulsesPerBurst: integer("pulses_per_burst"),
    /** Trains in bursts only: the pulse rate inside a burst. */
    burstPulseRateHz: doublePrecision("burst_pulse_rate_hz"),
    /** Further emission lines with their own power (residual pump, other harmonics); null when none. */
    lines: jsonb("lines").$type<{ wavelengthNm: number; powerMw: number }[]>(),
    /** 1/e² diameter at the exit, as datasheets give it. */
    beamDiameterMm: doublePrecision("beam_diameter_mm").notNull(),
    /** 1/e² full-angle divergence, as datasheets give it. */
    divergenceMrad: doublePrecision("divergence_mrad").notNull(),
    model: text("model").notNull(),
    serialNumber: text("serial_number"),
    location: text("location"),
    status: text("status").$type<LaserStatus>().notNull().default("in-service"),
    responsibleUserId: text("responsible_user_id").references(() => user.id),
    /** Optimistic-concurrency counter. */
    version: integer("version").notNull().default(1),
    ...timestamps,
  },
  (t) => [index("laser_register_lab_idx").on(t.labId), index("laser_register_status_idx").on(t.status)],
);

// ── Build sheets and the technician's as-built record ─────────────────────────────────────
export const SHEET_STATES = ["queued", "rendering", "ready", "failed"] as const;
export type SheetState = (typeof SHEET_STATES)[number];

/** One PDF build sheet per signed-off revision and paper size, cached by the revision's content hash. */
export const buildSheet = pgTable(
  "build_sheet",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    revisionId: uuid("revision_id")
      .notNull()
      .references(() => benchRevision.id),
    contentHash: text("content_hash").notNull(),
    paper: text("paper").$type<"A4" | "Letter">().notNull().default("A4"),
    state: text("state").$type<SheetState>().notNull().default("queued"),
    progressPercent: integer("progress_percent").notNull().default(0),
    storageKey: text("storage_key"),
    sizeBytes: integer("size_bytes"),
    error: text("error"),
    requestedBy: text("requested_by").references(() => user.id),
    ...timestamps,
  },
  (t) => [uniqueIndex("build_sheet_revision_paper_idx").on(t.revisionId, t.paper), index("build_sheet_state_idx").on(t.state)],
);

export const BUILD_STATES = ["in-progress", "completed"] as const;
export type BuildState = (typeof BUILD_STATES)[number];

/** A technician's rebuild of one signed-off revision. */
export const buildRecord = pgTable(
  "build_record",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    revisionId: uuid("revision_id")
      .notNull()
      .references(() => benchRevision.id),
    benchId: uuid("bench_id")
      .notNull()
      .references(() => bench.id),
    contentHash: text("content_hash").notNull(),
    technicianId: text("technician_id")
      .notNull()
      .references(() => user.id),
    state: text("state").$type<BuildState>().notNull().default("in-progress"),
    signedOffAt: timestamp("signed_off_at", { withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    index("build_record_revision_idx").on(t.revisionId),
    // One open build per revision and technician: two simultaneous starts make one build.
    uniqueIndex("build_record_one_open_idx").on(t.revisionId, t.technicianId).where(sql`${t.state} = 'in-progress'`),
  ],
);

/** One line of the as-built checklist: an element placed, a control in place, eyewear available. */
export const buildCheck = pgTable(
  "build_check",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    buildId: uuid("build_id")
      .notNull()
      .references(() => buildRecord.id, { onDelete: "cascade" }),
    /** Stable key from the bench: "element:<id>", "control:<caution id>", "eyewear". */
    itemKey: text("item_key").notNull(),
    done: boolean("done").notNull().default(false),
    measuredPositionMm: doublePrecision("measured_position_mm"),
    withinTolerance: boolean("within_tolerance"),
    note: text("note"),
    recordedBy: text("recorded_by").references(() => user.id),
    ...timestamps,
  },
  (t) => [uniqueIndex("build_check_item_idx").on(t.buildId, t.itemKey)],
);

/** What the technician saw, beside what was predicted. */
export const buildObservation = pgTable(
  "build_observation",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    buildId: uuid("build_id")
      .notNull()
      .references(() => buildRecord.id, { onDelete: "cascade" }),
    apertureId: text("aperture_id"),
    centreSeen: text("centre_seen").$type<"bright" | "dark" | "between" | "unclear">(),
    centrePredicted: text("centre_predicted"),
    spotDiameterMm: doublePrecision("spot_diameter_mm"),
    screenPowerMw: doublePrecision("screen_power_mw"),
    predictedScreenPowerMw: doublePrecision("predicted_screen_power_mw"),
    /** The prediction the reading was compared with, kept so the record never changes with the engine. */
    predictedSpotDiameterMm: doublePrecision("predicted_spot_diameter_mm"),
    predictionEngine: text("prediction_engine"),
    /** The sentences shown when it was recorded (each difference); empty when it matched. */
    reasons: jsonb("reasons").$type<string[]>().notNull().default([]),
    mismatch: boolean("mismatch").notNull().default(false),
    note: text("note"),
    recordedBy: text("recorded_by")
      .notNull()
      .references(() => user.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("build_observation_build_idx").on(t.buildId)],
);

export const UPLOAD_KINDS = ["bench-photo", "screen-photo", "datasheet"] as const;
export type UploadKind = (typeof UPLOAD_KINDS)[number];

/** A file kept by the storage module (local disk or S3-compatible); the row holds its key. */
export const upload = pgTable(
  "upload",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    buildId: uuid("build_id")
      .notNull()
      .references(() => buildRecord.id, { onDelete: "cascade" }),
    kind: text("kind").$type<UploadKind>().notNull(),
    fileName: text("file_name").notNull(),
    contentType: text("content_type").notNull(),
    sizeBytes: integer("size_bytes").notNull(),
    sha256: text("sha256").notNull(),
    storageKey: text("storage_key").notNull(),
    uploadedBy: text("uploaded_by")
      .notNull()
      .references(() => user.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("upload_build_idx").on(t.buildId)],
);

/**
 * A screen photo read against the revision's prediction (readScreenPhoto): what was fitted, or the sentence saying why
 * the photo could not be read. A reading that is compared also records its build_observation (mismatch, reasons, e-mail).
 */
export const photoReading = pgTable(
  "photo_reading",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    buildId: uuid("build_id")
      .notNull()
      .references(() => buildRecord.id, { onDelete: "cascade" }),
    uploadId: uuid("upload_id")
      .notNull()
      .references(() => upload.id, { onDelete: "cascade" }),
    apertureId: text("aperture_id").notNull(),
    /** The observation this reading recorded; null when the photo was refused. */
    observationId: uuid("observation_id").references(() => buildObservation.id, { onDelete: "set null" }),
    /** Why the photo could not be read, in a sentence; null when it was. */
    refusal: text("refusal"),
    /** The fitted values, the prediction compared with, and the profiles for the plot (lib/api/contracts/builds.ts PhotoReadingResult). */
    result: jsonb("result").$type<Record<string, unknown>>(),
    predictionEngine: text("prediction_engine").notNull(),
    readBy: text("read_by")
      .notNull()
      .references(() => user.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("photo_reading_build_idx").on(t.buildId), uniqueIndex("photo_reading_upload_aperture_idx").on(t.uploadId, t.apertureId)],
);

// ── Eyewear on the lab's shelf: laser protective eyewear, each with its protected bands ─────
/** One pair (or model) of laser protective eyewear a lab keeps. */
export const eyewearItem = pgTable(
  "eyewear_item",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    labId: uuid("lab_id")
      .notNull()
      .references(() => lab.id),
    name: text("name").notNull(),
    /** How many pairs are on the shelf. */
    quantity: integer("quantity").notNull().default(1),
    note: text("note"),
    /** Optimistic-concurrency counter. */
    version: integer("version").notNull().default(1),
    ...timestamps,
  },
  (t) => [index("eyewear_item_lab_idx").on(t.labId)],
);

/** A wavelength band an eyewear item protects, with its optical density and, where known, its EN 207 scale number. */
export const eyewearBand = pgTable(
  "eyewear_band",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    itemId: uuid("item_id")
      .notNull()
      .references(() => eyewearItem.id, { onDelete: "cascade" }),
    /** Order of the band within the item, from 0. */
    position: integer("position").notNull(),
    fromNm: doublePrecision("from_nm").notNull(),
    toNm: doublePrecision("to_nm").notNull(),
    opticalDensity: doublePrecision("optical_density").notNull(),
    /** EN 207 scale number (the n of LB n), 1–10; null when not marked. */
    en207ScaleNumber: integer("en207_scale_number"),
  },
  (t) => [uniqueIndex("eyewear_band_item_position_idx").on(t.itemId, t.position)],
);

/**
 * Attempts at a secret (sign-in, the signing step-up) counted per account and per client address, in
 * the database so every app server sees the same count. A row is written before the password is
 * checked and removed when it was right; what stays are failures and attempts still running.
 */
export const authAttempt = pgTable(
  "auth_attempt",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    /** "sign-in" or "step-up". */
    scope: text("scope").notNull(),
    /** "account:<e-mail or user id>" or "address:<client address>". */
    subject: text("subject").notNull(),
    attemptedAt: timestamp("attempted_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("auth_attempt_subject_idx").on(t.scope, t.subject, t.attemptedAt)],
);
