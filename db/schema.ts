import { sql } from "drizzle-orm";
import {
  bigint,
  bigserial,
  boolean,
  customType,
  check,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  primaryKey,
  real,
  text,
  timestamp,
  uniqueIndex,
} from "drizzle-orm/pg-core";
import type { ThresholdPair, ThresholdValues } from "@/features/zones/lib/thresholds";

const createdAt = () => timestamp("created_at", { withTimezone: true }).notNull().defaultNow();
const updatedAt = () =>
  timestamp("updated_at", { withTimezone: true })
    .notNull()
    .defaultNow()
    .$onUpdate(() => new Date());

// ---------------------------------------------------------------------------------------------------------------------
// better-auth's core tables (read through its Drizzle adapter). Field names follow better-auth; columns are snake_case.
// ---------------------------------------------------------------------------------------------------------------------

export const user = pgTable(
  "user",
  {
    id: text("id").primaryKey(),
    name: text("name").notNull(),
    email: text("email").notNull().unique(),
    emailVerified: boolean("email_verified").notNull().default(false),
    image: text("image"),
    /** Site operator: manages users and squads; no special access to training data. */
    isAdmin: boolean("is_admin").notNull().default(false),
    /** The person's units: "metric" or "imperial" (platform/lib/units.ts); every number they read follows it. */
    units: text("units").notNull().default("metric"),
    /** How the person reads dates: "iso", "day-month" or "month-day" (platform/lib/date-format.ts). */
    dateStyle: text("date_style").notNull().default("iso"),
    /**
     * A profile a coach set up for an athlete who has no e-mail address yet (squads/server/managed.ts): it cannot sign
     * in and gets no e-mail until the coach sends it to a real address and the athlete chooses a password.
     */
    managed: boolean("managed").notNull().default(false),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [
    check("user_units", sql`${t.units} in ('metric', 'imperial')`),
    check("user_date_style", sql`${t.dateStyle} in ('iso', 'day-month', 'month-day')`),
  ],
);

export const session = pgTable(
  "session",
  {
    id: text("id").primaryKey(),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    token: text("token").notNull().unique(),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
    ipAddress: text("ip_address"),
    userAgent: text("user_agent"),
    userId: text("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
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
    createdAt: createdAt(),
    updatedAt: updatedAt(),
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
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index("verification_identifier_idx").on(t.identifier)],
);

/** better-auth's rate-limit counters, kept in PostgreSQL so that several app servers share them. */
export const rateLimit = pgTable("rate_limit", {
  id: text("id").primaryKey(),
  key: text("key").notNull().unique(),
  count: integer("count").notNull(),
  lastRequest: bigint("last_request", { mode: "number" }).notNull(),
});

/**
 * Failed sign-ins per account (lower-cased address, known or not, so the answer never tells which exist): after
 * SIGN_IN_FAILURES_BEFORE_PAUSE failures within the window, sign-in to that address pauses until `lockedUntil`.
 */
export const signInGuard = pgTable("sign_in_guard", {
  email: text("email").primaryKey(),
  failures: integer("failures").notNull().default(0),
  windowStartedAt: timestamp("window_started_at", { withTimezone: true }).notNull().defaultNow(),
  lockedUntil: timestamp("locked_until", { withTimezone: true }),
});

// ---------------------------------------------------------------------------------------------------------------------
// Squads, memberships, invitations
// ---------------------------------------------------------------------------------------------------------------------

export const squadRole = pgEnum("squad_role", ["head_coach", "coach", "athlete"]);
export type SquadRole = (typeof squadRole.enumValues)[number];

export const squad = pgTable("squad", {
  id: text("id").primaryKey(),
  name: text("name").notNull(),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
});

export const membership = pgTable(
  "membership",
  {
    squadId: text("squad_id")
      .notNull()
      .references(() => squad.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    role: squadRole("role").notNull(),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.squadId, t.userId] }), index("membership_user_idx").on(t.userId)],
);

export const invitation = pgTable(
  "invitation",
  {
    id: text("id").primaryKey(),
    squadId: text("squad_id")
      .notNull()
      .references(() => squad.id, { onDelete: "cascade" }),
    email: text("email").notNull(),
    role: squadRole("role").notNull(),
    /** SHA-256 of the token in the link; the token itself is never stored. */
    tokenHash: text("token_hash").notNull().unique(),
    invitedBy: text("invited_by")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    acceptedAt: timestamp("accepted_at", { withTimezone: true }),
    acceptedBy: text("accepted_by").references(() => user.id, { onDelete: "set null" }),
    revokedAt: timestamp("revoked_at", { withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [index("invitation_squad_idx").on(t.squadId)],
);

// ---------------------------------------------------------------------------------------------------------------------
// Athlete profiles (the athlete's id is the user's id)
// ---------------------------------------------------------------------------------------------------------------------

export const sex = pgEnum("sex", ["female", "male"]);
export const reminderTiming = pgEnum("reminder_timing", ["evening_before", "morning_of", "off"]);

export const athleteProfile = pgTable(
  "athlete_profile",
  {
    userId: text("user_id")
      .primaryKey()
      .references(() => user.id, { onDelete: "cascade" }),
    /** Edit counter: a change that names an older version is refused (409) instead of overwriting someone else's. */
    version: integer("version").notNull().default(1),
    /** The athlete's one TRIMP method, fixed at the first TRIMP computed ("banister" or "edwards"). */
    trimpMethod: text("trimp_method"),
    birthYear: integer("birth_year"),
    /** Sex as used by published sex-specific formulas (e.g. Banister's TRIMP). */
    sex: sex("sex"),
    bodyMassKg: real("body_mass_kg"),
    restingHrBpm: integer("resting_hr_bpm"),
    maxHrBpm: integer("max_hr_bpm"),
    sports: text("sports")
      .array()
      .notNull()
      .default(sql`'{}'::text[]`),
    timeZone: text("time_zone").notNull().default("UTC"),
    reminderTiming: reminderTiming("reminder_timing").notNull().default("evening_before"),
    /** Local time of day for reminders, "HH:MM". */
    reminderTime: text("reminder_time").notNull().default("19:00"),
    remindSessions: boolean("remind_sessions").notNull().default(true),
    remindRetests: boolean("remind_retests").notNull().default(true),
    /** Planning rules a coach sets (features/planning/lib/rules.ts): hard days a week, hard days back to back, and how
     * far a week's planned volume may stray from its target before it is flagged. */
    maxHardDays: integer("max_hard_days").notNull().default(3),
    hardDaysBackToBack: boolean("hard_days_back_to_back").notNull().default(false),
    volumeTolerancePct: integer("volume_tolerance_pct").notNull().default(15),
    updatedAt: updatedAt(),
  },
  (t) => [
    check("athlete_profile_hard_days", sql`${t.maxHardDays} between 1 and 7`),
    check("athlete_profile_volume_tolerance", sql`${t.volumeTolerancePct} between 5 and 50`),
    check("athlete_profile_mass", sql`${t.bodyMassKg} is null or (${t.bodyMassKg} > 20 and ${t.bodyMassKg} < 300)`),
    check(
      "athlete_profile_hr",
      sql`${t.restingHrBpm} is null or ${t.maxHrBpm} is null or ${t.restingHrBpm} < ${t.maxHrBpm}`,
    ),
  ],
);

// ---------------------------------------------------------------------------------------------------------------------
// Outbox: every outgoing message is written here first (the e-mail worker delivers it later).
// ---------------------------------------------------------------------------------------------------------------------

export const outbox = pgTable(
  "outbox",
  {
    id: text("id").primaryKey(),
    kind: text("kind").notNull(),
    to: text("to_address").notNull(),
    subject: text("subject").notNull(),
    text: text("text_body").notNull(),
    html: text("html_body").notNull(),
    meta: jsonb("meta").$type<Record<string, unknown>>().notNull().default({}),
    /** One message per kind, recipient and date: a second attempt to queue the same key writes nothing. */
    idempotencyKey: text("idempotency_key").unique(),
    /** The recipient's account, when there is one (reminders, digests). */
    userId: text("user_id").references(() => user.id, { onDelete: "set null" }),
    /** Extra headers, e.g. List-Unsubscribe. */
    headers: jsonb("headers").$type<Record<string, string>>().notNull().default({}),
    status: text("status").$type<"pending" | "sent" | "failed">().notNull().default("pending"),
    attempts: integer("attempts").notNull().default(0),
    nextAttemptAt: timestamp("next_attempt_at", { withTimezone: true }).notNull().defaultNow(),
    lastError: text("last_error"),
    providerId: text("provider_id"),
    sentAt: timestamp("sent_at", { withTimezone: true }),
    /** The batch a message was last sent in, with the batch's idempotency key: a retry sends the same batch again. */
    batchKey: text("batch_key"),
    createdAt: createdAt(),
  },
  (t) => [
    index("outbox_to_idx").on(t.to),
    index("outbox_pending_idx").on(t.status, t.nextAttemptAt),
    index("outbox_batch_idx").on(t.batchKey),
  ],
);

/** Per-account e-mail and feed settings that are not part of an athlete profile (coaches have no profile). */
export const notificationSetting = pgTable("notification_setting", {
  userId: text("user_id")
    .primaryKey()
    .references(() => user.id, { onDelete: "cascade" }),
  /** IANA time zone for coach messages (athletes use their profile's). */
  timeZone: text("time_zone").notNull().default("UTC"),
  coachDigest: boolean("coach_digest").notNull().default(true),
  /** Secret part of the private calendar-feed address; null when the feed is off. */
  calendarToken: text("calendar_token").unique(),
  /** An e-mail when someone writes on one of the person's session or log threads. */
  messageEmails: boolean("message_emails").notNull().default(true),
  updatedAt: updatedAt(),
});

// ---------------------------------------------------------------------------------------------------------------------
// Screening, tests, stored files and zone sets
// ---------------------------------------------------------------------------------------------------------------------

/** A readiness questionnaire answered before testing; each save is kept with its date. */
export const screening = pgTable(
  "screening",
  {
    id: text("id").primaryKey(),
    athleteId: text("athlete_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    answers: jsonb("answers").$type<Record<string, boolean>>().notNull(),
    anyYes: boolean("any_yes").notNull(),
    notes: text("notes"),
    recordedBy: text("recorded_by")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    createdAt: createdAt(),
  },
  (t) => [index("screening_athlete_idx").on(t.athleteId, t.createdAt)],
);

/**
 * A medical clearance after a screening answer that needs one, recorded by a coach as told: who cleared, their role as
 * typed, the date, a note. It counts for the screening answers given before it (features/athlete-tests/lib/readiness.ts).
 */
export const screeningClearance = pgTable(
  "screening_clearance",
  {
    id: text("id").primaryKey(),
    athleteId: text("athlete_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    clearedBy: text("cleared_by").notNull(),
    role: text("role").notNull(),
    clearedOn: text("cleared_on").notNull(),
    note: text("note"),
    recordedBy: text("recorded_by")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    createdAt: createdAt(),
  },
  (t) => [index("screening_clearance_athlete_idx").on(t.athleteId, t.createdAt)],
);

export const testKind = pgEnum("test_kind", ["gas_exchange", "talk", "submax", "manual"]);
export const testEnd = pgEnum("test_end", ["exhaustion", "plan", "stop_sign"]);

export const athleteTest = pgTable(
  "athlete_test",
  {
    id: text("id").primaryKey(),
    athleteId: text("athlete_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    kind: testKind("kind").notNull(),
    sport: text("sport").notNull(),
    protocol: text("protocol").notNull(),
    testDate: text("test_date").notNull(),
    endedBy: testEnd("ended_by").notNull(),
    stopSign: text("stop_sign"),
    bodyMassKg: real("body_mass_kg"),
    /** What was entered: talk-test stages, submaximal stages, the CSV column mapping. */
    input: jsonb("input").$type<Record<string, unknown>>().notNull(),
    /** The engine's full result (analysis points for the charts, peak, warnings). */
    result: jsonb("result").$type<Record<string, unknown>>().notNull(),
    /** Thresholds as detected, and as adjusted by a coach (null until adjusted). */
    detected: jsonb("detected").$type<ThresholdPair>().notNull(),
    adjusted: jsonb("adjusted").$type<ThresholdPair>(),
    adjustedBy: text("adjusted_by").references(() => user.id, { onDelete: "set null" }),
    adjustedAt: timestamp("adjusted_at", { withTimezone: true }),
    createdBy: text("created_by")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    createdAt: createdAt(),
  },
  (t) => [index("athlete_test_athlete_idx").on(t.athleteId, t.testDate)],
);

export type { ThresholdPair, ThresholdValues } from "@/features/zones/lib/thresholds";

const bytea = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => "bytea" });

/** The original uploaded file, kept in PostgreSQL. */
export const testFile = pgTable("test_file", {
  testId: text("test_id")
    .primaryKey()
    .references(() => athleteTest.id, { onDelete: "cascade" }),
  filename: text("filename").notNull(),
  contentType: text("content_type").notNull(),
  sizeBytes: integer("size_bytes").notNull(),
  data: bytea("data").notNull(),
  createdAt: createdAt(),
});

export const zoneSet = pgTable(
  "zone_set",
  {
    id: text("id").primaryKey(),
    athleteId: text("athlete_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    sport: text("sport").notNull(),
    testId: text("test_id").references(() => athleteTest.id, { onDelete: "set null" }),
    effectiveFrom: text("effective_from").notNull(),
    model: text("model").notNull().default("three"),
    vt1: jsonb("vt1").$type<ThresholdValues>().notNull(),
    vt2: jsonb("vt2").$type<ThresholdValues>().notNull(),
    source: text("source").notNull(),
    /** When a coach chose this set over another of the same sport and day; among such sets the latest chosen (else the
     * newest) is in force. */
    chosenAt: timestamp("chosen_at", { withTimezone: true }),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [
    index("zone_set_athlete_idx").on(t.athleteId, t.sport, t.effectiveFrom),
    uniqueIndex("zone_set_test_idx").on(t.testId),
  ],
);

// ---------------------------------------------------------------------------------------------------------------------
// Planning: session templates, seasons, planned sessions and their repeat series
// ---------------------------------------------------------------------------------------------------------------------

export const sessionTemplate = pgTable(
  "session_template",
  {
    id: text("id").primaryKey(),
    /** Edit counter: a change that names an older version is refused (409) instead of overwriting someone else's. */
    version: integer("version").notNull().default(1),
    squadId: text("squad_id")
      .notNull()
      .references(() => squad.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    sport: text("sport").notNull(),
    description: text("description").notNull().default(""),
    structure: jsonb("structure").$type<unknown[]>().notNull(),
    totalS: integer("total_s").notNull(),
    minutesByZone: jsonb("minutes_by_zone").$type<[number, number, number]>().notNull(),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index("session_template_squad_idx").on(t.squadId)],
);

export const season = pgTable(
  "season",
  {
    id: text("id").primaryKey(),
    /** Edit counter: a change that names an older version is refused (409) instead of overwriting someone else's. */
    version: integer("version").notNull().default(1),
    athleteId: text("athlete_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    sport: text("sport").notNull(),
    startDate: text("start_date").notNull(),
    events: jsonb("events").$type<{ date: string; name: string }[]>().notNull(),
    weeklyHours: real("weekly_hours").notNull(),
    level: text("level").notNull(),
    retestEveryWeeks: integer("retest_every_weeks").notNull(),
    /** The generated weeks (block, role, volume, budget preset, retest), editable by the coach. */
    weeks: jsonb("weeks").$type<Record<string, unknown>[]>().notNull(),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [index("season_athlete_idx").on(t.athleteId, t.startDate)],
);

export const sessionSeries = pgTable("session_series", {
  id: text("id").primaryKey(),
  athleteId: text("athlete_id")
    .notNull()
    .references(() => user.id, { onDelete: "cascade" }),
  rrule: text("rrule").notNull(),
  createdAt: createdAt(),
});

export const plannedSession = pgTable(
  "planned_session",
  {
    id: text("id").primaryKey(),
    /** Edit counter: a change that names an older version is refused (409) instead of overwriting someone else's. */
    version: integer("version").notNull().default(1),
    athleteId: text("athlete_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    /** Local calendar day in the athlete's time zone, YYYY-MM-DD. */
    date: text("date").notNull(),
    kind: text("kind").notNull().default("training"),
    sport: text("sport").notNull(),
    title: text("title").notNull(),
    templateId: text("template_id").references(() => sessionTemplate.id, { onDelete: "set null" }),
    /** A snapshot of the steps at planning time. */
    structure: jsonb("structure").$type<unknown[]>().notNull(),
    totalS: integer("total_s").notNull(),
    minutesByZone: jsonb("minutes_by_zone").$type<[number, number, number]>().notNull(),
    seriesId: text("series_id").references(() => sessionSeries.id, { onDelete: "set null" }),
    /** An occurrence edited on its own no longer follows its series. */
    detached: boolean("detached").notNull().default(false),
    notes: text("notes").notNull().default(""),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [
    index("planned_session_athlete_date_idx").on(t.athleteId, t.date),
    index("planned_session_series_idx").on(t.seriesId),
  ],
);

// ---------------------------------------------------------------------------------------------------------------------
// What was done: session logs (against a planned session or unplanned) and the activity files behind them
// ---------------------------------------------------------------------------------------------------------------------

export const logStatus = pgEnum("log_status", ["done", "partial", "skipped"]);

export const sessionLog = pgTable(
  "session_log",
  {
    id: text("id").primaryKey(),
    athleteId: text("athlete_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    /** The planned session this log answers; null for an unplanned session. One log per planned session. */
    plannedSessionId: text("planned_session_id").references(() => plannedSession.id, { onDelete: "set null" }),
    /** Local calendar day in the athlete's time zone, YYYY-MM-DD. */
    date: text("date").notNull(),
    sport: text("sport").notNull(),
    title: text("title").notNull(),
    status: logStatus("status").notNull(),
    durationMin: real("duration_min"),
    distanceKm: real("distance_km"),
    /** CR-10 rating of perceived exertion for the whole session (Foster et al. 2001). */
    rpe: real("rpe"),
    notes: text("notes").notNull().default(""),
    skipReason: text("skip_reason"),
    /** Measured minutes per zone from an activity file, with the measure used; null without a file. */
    measuredMinByZone: jsonb("measured_min_by_zone").$type<[number, number, number]>(),
    zoneMeasure: text("zone_measure"),
    zoneSetId: text("zone_set_id").references(() => zoneSet.id, { onDelete: "set null" }),
    hrAvgBpm: real("hr_avg_bpm"),
    powerAvgW: real("power_avg_w"),
    speedAvgKmh: real("speed_avg_kmh"),
    trimp: real("trimp"),
    /** How `trimp` was computed ("banister" or "edwards"): a week adds up only the athlete's own method. */
    trimpMethod: text("trimp_method"),
    /** A key chosen by the client for an unplanned log, so that a repeated submit does not log twice. */
    clientKey: text("client_key"),
    loggedBy: text("logged_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [
    index("session_log_athlete_date_idx").on(t.athleteId, t.date),
    uniqueIndex("session_log_planned_idx").on(t.plannedSessionId),
    uniqueIndex("session_log_client_key_idx").on(t.athleteId, t.clientKey),
    check("session_log_rpe_range", sql`${t.rpe} IS NULL OR (${t.rpe} >= 0 AND ${t.rpe} <= 10)`),
  ],
);

export const activityFile = pgTable(
  "activity_file",
  {
    id: text("id").primaryKey(),
    athleteId: text("athlete_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    logId: text("log_id")
      .notNull()
      .references(() => sessionLog.id, { onDelete: "cascade" }),
    filename: text("filename").notNull(),
    format: text("format").notNull(),
    sizeBytes: integer("size_bytes").notNull(),
    startTime: timestamp("start_time", { withTimezone: true }),
    summary: jsonb("summary").$type<Record<string, unknown>>().notNull(),
    data: bytea("data").notNull(),
    /** SHA-256 of the file's bytes (hex): the same file is imported once per athlete. */
    contentHash: text("content_hash"),
    uploadedBy: text("uploaded_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [
    index("activity_file_log_idx").on(t.logId),
    index("activity_file_athlete_idx").on(t.athleteId),
    uniqueIndex("activity_file_athlete_hash_idx").on(t.athleteId, t.contentHash),
  ],
);

/**
 * Each athlete's computed roster row, kept between requests so that a 300-athlete roster is one read. Database triggers
 * bump `generation` whenever a row the roster reads changes (plan, logs, tests, zone sets, seasons, profile, name); a
 * cached row counts only while its `computedGeneration` equals `generation` and it was computed for the athlete's
 * current local day.
 */
export const rosterCache = pgTable("roster_cache", {
  athleteId: text("athlete_id")
    .primaryKey()
    .references(() => user.id, { onDelete: "cascade" }),
  // A new row starts at its creation time in microseconds, so that a row deleted and created again never counts through
  // values its predecessor already had (an answer stored under one of them stays invalid).
  generation: bigint("generation", { mode: "number" })
    .notNull()
    .default(sql`(extract(epoch from clock_timestamp()) * 1000000)::bigint`),
  computedGeneration: bigint("computed_generation", { mode: "number" }),
  computedFor: text("computed_for"),
  row: jsonb("row").$type<Record<string, unknown>>(),
  computedAt: timestamp("computed_at", { withTimezone: true }),
});

// ---------------------------------------------------------------------------------------------------------------------
// The soak's floor (`npm run soak`): rows written one per request by POST /api/soak-floor, a bare insert in one
// transaction that the real writes are compared with. The route writes only when TIDEMARK_SOAK_FLOOR=1.
// ---------------------------------------------------------------------------------------------------------------------

export const soakFloor = pgTable("soak_floor", {
  id: bigserial("id", { mode: "number" }).primaryKey(),
  at: timestamp("at", { withTimezone: true }).notNull().defaultNow(),
});

// ---------------------------------------------------------------------------------------------------------------------
// Threads: a short conversation on a planned session or on a log, between the athlete and their coaches (the same access
// as the session or log itself).
// ---------------------------------------------------------------------------------------------------------------------

export const threadMessage = pgTable(
  "thread_message",
  {
    id: text("id").primaryKey(),
    /** The athlete whose session or log this is (who may read it is decided from them). */
    athleteId: text("athlete_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    plannedSessionId: text("planned_session_id").references(() => plannedSession.id, { onDelete: "cascade" }),
    logId: text("log_id").references(() => sessionLog.id, { onDelete: "cascade" }),
    authorId: text("author_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    body: text("body").notNull(),
    createdAt: createdAt(),
  },
  (t) => [
    check("thread_message_one_subject", sql`(${t.plannedSessionId} is null) <> (${t.logId} is null)`),
    check("thread_message_body", sql`char_length(${t.body}) between 1 and 1000`),
    index("thread_message_session_idx").on(t.plannedSessionId, t.createdAt),
    index("thread_message_log_idx").on(t.logId, t.createdAt),
    index("thread_message_athlete_idx").on(t.athleteId, t.createdAt),
  ],
);

/** How far each person has read each thread ("s:<session id>" or "l:<log id>"). */
export const threadRead = pgTable(
  "thread_read",
  {
    userId: text("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    threadKey: text("thread_key").notNull(),
    lastReadAt: timestamp("last_read_at", { withTimezone: true }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.threadKey] })],
);
