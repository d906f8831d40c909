import { sql } from "drizzle-orm";
import type { FitWarning } from "~/analysis/exerciseFit";
import type { TakeAnalysis } from "~/analysis/types";
import {
  type AnySQLiteColumn,
  index,
  integer,
  primaryKey,
  real,
  sqliteTable,
  text,
  uniqueIndex,
} from "drizzle-orm/sqlite-core";

// Ids are random text (crypto.randomUUID) so that URLs never reveal how many
// students or takes a studio has.
const id = () =>
  text("id")
    .primaryKey()
    .$defaultFn(() => crypto.randomUUID());
const createdAt = () =>
  integer("created_at", { mode: "timestamp_ms" })
    .notNull()
    .$defaultFn(() => new Date());

export const users = sqliteTable("users", {
  id: id(),
  email: text("email").notNull().unique(),
  name: text("name").notNull(),
  passwordHash: text("password_hash").notNull(),
  emailVerifiedAt: integer("email_verified_at", { mode: "timestamp_ms" }),
  mailOnFeedback: integer("mail_on_feedback", { mode: "boolean" }).notNull().default(true),
  mailDigest: integer("mail_digest", { mode: "boolean" }).notNull().default(true),
  createdAt: createdAt(),
});

export const studios = sqliteTable("studios", {
  id: id(),
  name: text("name").notNull(),
  timeZone: text("time_zone").notNull().default("UTC"),
  createdAt: createdAt(),
});

export const MEMBERSHIP_ROLES = ["owner", "teacher", "student"] as const;
export type MembershipRole = (typeof MEMBERSHIP_ROLES)[number];

export const memberships = sqliteTable(
  "memberships",
  {
    id: id(),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    studioId: text("studio_id")
      .notNull()
      .references(() => studios.id, { onDelete: "cascade" }),
    role: text("role", { enum: MEMBERSHIP_ROLES }).notNull(),
    status: text("status", { enum: ["active", "removed"] })
      .notNull()
      .default("active"),
    createdAt: createdAt(),
    removedAt: integer("removed_at", { mode: "timestamp_ms" }),
  },
  (t) => [
    uniqueIndex("memberships_user_studio_unique").on(t.userId, t.studioId),
    index("memberships_studio_role_idx").on(t.studioId, t.role, t.status),
  ],
);

export const sessions = sqliteTable(
  "sessions",
  {
    id: id(),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    // The studio the person is working in; a student of several studios switches it.
    activeStudioId: text("active_studio_id").references(() => studios.id, {
      onDelete: "set null",
    }),
    expiresAt: integer("expires_at", { mode: "timestamp_ms" }).notNull(),
    createdAt: createdAt(),
  },
  (t) => [index("sessions_user_idx").on(t.userId)],
);

export const exercises = sqliteTable(
  "exercises",
  {
    id: id(),
    studioId: text("studio_id")
      .notNull()
      .references(() => studios.id, { onDelete: "cascade" }),
    createdById: text("created_by_id").references(() => users.id, { onDelete: "set null" }),
    title: text("title").notNull(),
    // JSON array of key names as teachers write them ("D", "Gm", …).
    keys: text("keys", { mode: "json" }).$type<string[]>().notNull(),
    progression: text("progression").notNull(),
    // JSON array of technique names from the analysis engine.
    focusTechniques: text("focus_techniques", { mode: "json" })
      .$type<string[]>()
      .notNull()
      .default(sql`'[]'`),
    tempo: integer("tempo"),
    dueDate: text("due_date"), // YYYY-MM-DD in the studio's time zone
    instructions: text("instructions").notNull().default(""),
    assignedTo: text("assigned_to", { enum: ["studio", "students"] })
      .notNull()
      .default("studio"),
    archivedAt: integer("archived_at", { mode: "timestamp_ms" }),
    // Model answer: the starting voicing the teacher picked (MIDI numbers) for the smoothest
    // path, and optionally the teacher's own recorded model take (stored like takes).
    modelStart: text("model_start", { mode: "json" }).$type<number[]>(),
    modelFileKey: text("model_file_key"),
    modelOriginalName: text("model_original_name"),
    createdAt: createdAt(),
  },
  (t) => [index("exercises_studio_idx").on(t.studioId, t.archivedAt, t.dueDate)],
);

// Students an exercise is assigned to when it is not for the whole studio.
export const exerciseAssignees = sqliteTable(
  "exercise_assignees",
  {
    exerciseId: text("exercise_id")
      .notNull()
      .references(() => exercises.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
  },
  (t) => [primaryKey({ columns: [t.exerciseId, t.userId] }), index("exercise_assignees_user_idx").on(t.userId)],
);

export const TAKE_STATUSES = ["pending", "analysed", "failed"] as const;

export const takes = sqliteTable(
  "takes",
  {
    id: id(),
    studentId: text("student_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    studioId: text("studio_id")
      .notNull()
      .references(() => studios.id, { onDelete: "cascade" }),
    exerciseId: text("exercise_id").references(() => exercises.id, { onDelete: "set null" }),
    key: text("key"),
    note: text("note").notNull().default(""),
    fileKey: text("file_key").notNull(),
    originalName: text("original_name").notNull(),
    size: integer("size").notNull(),
    contentHash: text("content_hash").notNull(),
    status: text("status", { enum: TAKE_STATUSES }).notNull().default("pending"),
    error: text("error"),
    recordedAt: integer("recorded_at", { mode: "timestamp_ms" }).notNull(),
    // ISO week in the studio's time zone, e.g. "2026-W48"; recomputed when the zone changes.
    weekKey: text("week_key").notNull(),
    durationSec: real("duration_sec").notNull().default(0),
    analysisVersion: integer("analysis_version"),
    // Set when the take was filed under an exercise it does not fit (another key, other
    // chords): the key it sounds in and the exercise it likely belongs to. Cleared by a move.
    exerciseFit: text("exercise_fit", { mode: "json" }).$type<FitWarning>(),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("takes_student_hash_unique").on(t.studentId, t.contentHash),
    index("takes_student_recorded_idx").on(t.studentId, t.recordedAt),
    index("takes_studio_week_idx").on(t.studioId, t.weekKey, t.studentId),
    index("takes_studio_created_idx").on(t.studioId, t.createdAt),
    index("takes_exercise_idx").on(t.exerciseId),
    index("takes_version_idx").on(t.analysisVersion),
  ],
);

// One row per analysed take: the figures the progress board aggregates.
export const takeMetrics = sqliteTable("take_metrics", {
  takeId: text("take_id")
    .primaryKey()
    .references(() => takes.id, { onDelete: "cascade" }),
  chordCount: integer("chord_count").notNull(),
  changeCount: integer("change_count").notNull(),
  melodyNoteCount: integer("melody_note_count").notNull().default(0),
  totalMotion: integer("total_motion").notNull(),
  bestTotalMotion: integer("best_total_motion").notNull(),
  smoothness: real("smoothness").notNull(),
  rootPositionLeaps: integer("root_position_leaps").notNull(),
  score: real("score").notNull(),
  accuracy: real("accuracy"),
  estimatedKey: text("estimated_key"),
  tempoSteadiness: real("tempo_steadiness"),
  flags: text("flags", { mode: "json" }).$type<Record<string, number>>().notNull(),
  techniques: text("techniques", { mode: "json" }).$type<Record<string, number>>().notNull(),
  topLine: text("top_line", { mode: "json" }).$type<number[]>().notNull(),
  mismatches: text("mismatches", { mode: "json" }).$type<unknown[]>(),
  // The engine's whole result as `npm run analyse -- --json` prints it, so the take page
  // and the API return exactly what the engine said; the columns above are for queries.
  analysis: text("analysis", { mode: "json" }).$type<TakeAnalysis>().notNull(),
});

export type User = typeof users.$inferSelect;
export type Studio = typeof studios.$inferSelect;
export type Membership = typeof memberships.$inferSelect;
export type Exercise = typeof exercises.$inferSelect;
export type Take = typeof takes.$inferSelect;

// --- Accounts: invitations, one-time tokens, sign-in throttling ---------------

export const INVITATION_ROLES = ["student", "teacher"] as const;
export type InvitationRole = (typeof INVITATION_ROLES)[number];

// Only a SHA-256 of each link's token is stored, so a copy of the database
// cannot be turned into working invitation links.
export const invitations = sqliteTable(
  "invitations",
  {
    id: id(),
    studioId: text("studio_id")
      .notNull()
      .references(() => studios.id, { onDelete: "cascade" }),
    email: text("email").notNull(),
    role: text("role", { enum: INVITATION_ROLES }).notNull(),
    tokenHash: text("token_hash").notNull().unique(),
    invitedById: text("invited_by_id").references(() => users.id, { onDelete: "set null" }),
    expiresAt: integer("expires_at", { mode: "timestamp_ms" }).notNull(),
    acceptedAt: integer("accepted_at", { mode: "timestamp_ms" }),
    acceptedById: text("accepted_by_id").references(() => users.id, { onDelete: "set null" }),
    revokedAt: integer("revoked_at", { mode: "timestamp_ms" }),
    sentCount: integer("sent_count").notNull().default(1),
    lastSentAt: integer("last_sent_at", { mode: "timestamp_ms" })
      .notNull()
      .$defaultFn(() => new Date()),
    createdAt: createdAt(),
  },
  (t) => [index("invitations_studio_idx").on(t.studioId, t.createdAt)],
);

// Every invitation mail sent (first send or resend), for the per-studio daily limit.
export const invitationSends = sqliteTable(
  "invitation_sends",
  {
    id: id(),
    studioId: text("studio_id")
      .notNull()
      .references(() => studios.id, { onDelete: "cascade" }),
    invitationId: text("invitation_id").references(() => invitations.id, { onDelete: "set null" }),
    sentAt: integer("sent_at", { mode: "timestamp_ms" })
      .notNull()
      .$defaultFn(() => new Date()),
  },
  (t) => [index("invitation_sends_studio_idx").on(t.studioId, t.sentAt)],
);

export const USER_TOKEN_PURPOSES = ["verify-email", "reset-password"] as const;
export type UserTokenPurpose = (typeof USER_TOKEN_PURPOSES)[number];

export const userTokens = sqliteTable(
  "user_tokens",
  {
    id: id(),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    purpose: text("purpose", { enum: USER_TOKEN_PURPOSES }).notNull(),
    tokenHash: text("token_hash").notNull().unique(),
    expiresAt: integer("expires_at", { mode: "timestamp_ms" }).notNull(),
    usedAt: integer("used_at", { mode: "timestamp_ms" }),
    createdAt: createdAt(),
  },
  (t) => [index("user_tokens_user_idx").on(t.userId, t.purpose)],
);

// Failed sign-ins, keyed by the e-mail typed and the client address. An attempt is written
// here before its password is checked, and removed again when it succeeds.
export const signInFailures = sqliteTable(
  "sign_in_failures",
  {
    id: id(),
    email: text("email").notNull(),
    address: text("address").notNull(),
    createdAt: createdAt(),
  },
  (t) => [index("sign_in_failures_key_idx").on(t.email, t.address, t.createdAt)],
);

// A studio sign-up waiting for its e-mail to be confirmed: nothing is created until the
// mailed link is opened, so the sign-up form never has to say whether an address is taken.
export const pendingSignups = sqliteTable(
  "pending_signups",
  {
    id: id(),
    email: text("email").notNull(),
    name: text("name").notNull(),
    passwordHash: text("password_hash").notNull(),
    studioName: text("studio_name").notNull(),
    tokenHash: text("token_hash").notNull().unique(),
    expiresAt: integer("expires_at", { mode: "timestamp_ms" }).notNull(),
    createdAt: createdAt(),
  },
  (t) => [index("pending_signups_email_idx").on(t.email)],
);

export const ACCOUNT_MAIL_KINDS = ["verify-email", "reset-password", "signup"] as const;
export type AccountMailKind = (typeof ACCOUNT_MAIL_KINDS)[number];

// Every account mail sent (confirmation and reset links, sign-up mail), for their rate limits.
// `key` is "user:<id>" for an account, "email:<address>" before there is one.
export const accountMailSends = sqliteTable(
  "account_mail_sends",
  {
    id: id(),
    kind: text("kind", { enum: ACCOUNT_MAIL_KINDS }).notNull(),
    key: text("key").notNull(),
    sentAt: integer("sent_at", { mode: "timestamp_ms" }).notNull(),
  },
  (t) => [index("account_mail_sends_key_idx").on(t.kind, t.key, t.sentAt)],
);

export type Invitation = typeof invitations.$inferSelect;

// --- Progress board: saved reports and practice reminders ---------------------

// A printable report the teacher wrote for one student and period, so it can be reopened.
export const progressReports = sqliteTable(
  "progress_reports",
  {
    id: id(),
    studioId: text("studio_id")
      .notNull()
      .references(() => studios.id, { onDelete: "cascade" }),
    studentId: text("student_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    fromDate: text("from_date").notNull(), // YYYY-MM-DD, studio's calendar
    toDate: text("to_date").notNull(),
    summary: text("summary").notNull(),
    createdById: text("created_by_id").references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [index("progress_reports_student_idx").on(t.studioId, t.studentId, t.createdAt)],
);

// One practice reminder per student per studio week, so a second click cannot flood anyone's inbox.
export const practiceReminders = sqliteTable(
  "practice_reminders",
  {
    id: id(),
    studioId: text("studio_id")
      .notNull()
      .references(() => studios.id, { onDelete: "cascade" }),
    studentId: text("student_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    weekKey: text("week_key").notNull(),
    sentById: text("sent_by_id").references(() => users.id, { onDelete: "set null" }),
    // Written just before the reminder mail is sent.
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("practice_reminders_week_unique").on(t.studioId, t.studentId, t.weekKey)],
);

export type ProgressReport = typeof progressReports.$inferSelect;

// --- Exercises and feedback: comments, reads, intended flags, reviews, sent mail ---

// A teacher's or student's comment on a take: on the whole take (changeIdx null) or pinned to one
// chord change; a reply names its parent (replies are one level deep).
export const comments = sqliteTable(
  "comments",
  {
    id: id(),
    takeId: text("take_id")
      .notNull()
      .references(() => takes.id, { onDelete: "cascade" }),
    authorId: text("author_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    changeIdx: integer("change_idx"),
    parentId: text("parent_id").references((): AnySQLiteColumn => comments.id, { onDelete: "cascade" }),
    body: text("body").notNull(),
    createdAt: createdAt(),
  },
  (t) => [index("comments_take_idx").on(t.takeId, t.createdAt)],
);

// When a person last read the comments of a take: anything newer by someone else is unread.
export const commentReads = sqliteTable(
  "comment_reads",
  {
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    takeId: text("take_id")
      .notNull()
      .references(() => takes.id, { onDelete: "cascade" }),
    readAt: integer("read_at", { mode: "timestamp_ms" }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.takeId] })],
);

// A flag the teacher asked for ("I asked for this"): left out of the take's score, reason shown.
export const intendedFlags = sqliteTable(
  "intended_flags",
  {
    id: id(),
    takeId: text("take_id")
      .notNull()
      .references(() => takes.id, { onDelete: "cascade" }),
    on: text("on", { enum: ["chord", "change"] }).notNull(),
    idx: integer("idx").notNull(),
    flag: text("flag").notNull(),
    reason: text("reason").notNull(),
    byId: text("by_id").references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("intended_flags_unique").on(t.takeId, t.on, t.idx, t.flag)],
);

// A take the teacher has marked reviewed; deleting the row is the undo.
export const takeReviews = sqliteTable("take_reviews", {
  takeId: text("take_id")
    .primaryKey()
    .references(() => takes.id, { onDelete: "cascade" }),
  reviewedById: text("reviewed_by_id").references(() => users.id, { onDelete: "set null" }),
  reviewedAt: integer("reviewed_at", { mode: "timestamp_ms" }).notNull(),
});

// Every automatic mail sent (digest, due-date reminder, feedback notice). The unique key is
// claimed before sending, so a restarted scheduler never sends the same mail twice.
export const sentMails = sqliteTable(
  "sent_mails",
  {
    id: id(),
    kind: text("kind", { enum: ["digest", "due-reminder", "feedback"] }).notNull(),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    key: text("key").notNull(),
    sentAt: integer("sent_at", { mode: "timestamp_ms" }).notNull(),
  },
  (t) => [
    uniqueIndex("sent_mails_user_key_unique").on(t.userId, t.key),
    index("sent_mails_kind_idx").on(t.kind, t.sentAt),
  ],
);

export type Comment = typeof comments.$inferSelect;

// When a teacher last opened their home page in a studio, so home can say what is
// new since. `sinceAt` is the visit before the current sitting (a reload within
// half an hour keeps it), null before the second visit.
export const studioVisits = sqliteTable(
  "studio_visits",
  {
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    studioId: text("studio_id")
      .notNull()
      .references(() => studios.id, { onDelete: "cascade" }),
    lastVisitAt: integer("last_visit_at", { mode: "timestamp_ms" }).notNull(),
    sinceAt: integer("since_at", { mode: "timestamp_ms" }),
  },
  (t) => [primaryKey({ columns: [t.userId, t.studioId] })],
);
