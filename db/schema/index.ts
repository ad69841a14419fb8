/**
 * Halfmax database schema (MariaDB via Drizzle). One file for the whole schema so relations stay visible.
 * Migrations are generated from this file with `npm run db:generate` and committed in drizzle/.
 */
import { relations } from "drizzle-orm";
import {
  bigint,
  boolean,
  datetime,
  double,
  index,
  int,
  json,
  mysqlEnum,
  mysqlTable,
  primaryKey,
  text,
  uniqueIndex,
  varchar,
} from "drizzle-orm/mysql-core";

const id = () => bigint("id", { mode: "number", unsigned: true }).autoincrement().primaryKey();
const ref = (name: string) => bigint(name, { mode: "number", unsigned: true });
const createdAt = () => datetime("created_at", { mode: "date", fsp: 3 }).notNull().$defaultFn(() => new Date());

export const ROLES = ["admin", "physicist", "lead", "engineer"] as const;
export const MODALITIES = ["CT", "PT", "NM", "DX", "MG", "CR", "RF", "US", "MR", "OT"] as const;
export const METHODS = ["point", "line", "edge", "disk"] as const;
export const FREQUENCIES = ["daily", "weekly", "monthly", "quarterly", "annual"] as const;
export const RESULT_STATUSES = ["pass", "warning", "action", "no-baseline"] as const;
export const ALERT_CAUSES = ["action", "warning", "overdue", "drift"] as const;
export const ALERT_STATES = ["open", "acknowledged", "resolved"] as const;
export const MAIL_PREFERENCES = ["immediate", "digest", "off"] as const;

export const users = mysqlTable("users", {
  id: id(),
  email: varchar("email", { length: 254 }).notNull().unique(),
  name: varchar("name", { length: 120 }).notNull(),
  role: mysqlEnum("role", ROLES).notNull(),
  passwordHash: varchar("password_hash", { length: 100 }),
  active: boolean("active").notNull().default(true),
  mailPreference: mysqlEnum("mail_preference", MAIL_PREFERENCES).notNull().default("immediate"),
  lastSignInAt: datetime("last_sign_in_at", { mode: "date", fsp: 3 }),
  createdAt: createdAt(),
});

export const userTokens = mysqlTable("user_tokens", {
  id: id(),
  userId: ref("user_id").notNull().references(() => users.id),
  kind: mysqlEnum("kind", ["invite", "reset"]).notNull(),
  tokenHash: varchar("token_hash", { length: 64 }).notNull().unique(),
  expiresAt: datetime("expires_at", { mode: "date", fsp: 3 }).notNull(),
  usedAt: datetime("used_at", { mode: "date", fsp: 3 }),
  createdAt: createdAt(),
});

export const apiTokens = mysqlTable(
  "api_tokens",
  {
    id: id(),
    userId: ref("user_id").notNull().references(() => users.id),
    name: varchar("name", { length: 80 }).notNull(),
    /** SHA-256 (hex) of the secret; the secret itself is shown once and never stored. */
    tokenHash: varchar("token_hash", { length: 64 }).notNull().unique(),
    /** First characters of the token, shown in the UI to tell tokens apart. */
    prefix: varchar("prefix", { length: 16 }).notNull(),
    lastUsedAt: datetime("last_used_at", { mode: "date", fsp: 3 }),
    revokedAt: datetime("revoked_at", { mode: "date", fsp: 3 }),
    createdAt: createdAt(),
  },
  (t) => [index("api_tokens_user_idx").on(t.userId)],
);

export const sites = mysqlTable("sites", {
  id: id(),
  name: varchar("name", { length: 120 }).notNull().unique(),
  city: varchar("city", { length: 120 }).notNull().default(""),
  createdAt: createdAt(),
});

export const scanners = mysqlTable(
  "scanners",
  {
    id: id(),
    siteId: ref("site_id").notNull().references(() => sites.id),
    name: varchar("name", { length: 120 }).notNull(),
    modality: mysqlEnum("modality", MODALITIES).notNull(),
    manufacturer: varchar("manufacturer", { length: 120 }).notNull().default(""),
    model: varchar("model", { length: 120 }).notNull().default(""),
    serialNumber: varchar("serial_number", { length: 64 }).notNull().default(""),
    location: varchar("location", { length: 120 }).notNull().default(""),
    responsiblePhysicistId: ref("responsible_physicist_id").references(() => users.id),
    /** Open an alert for warning-level results too (action-level results always open one). */
    alertOnWarning: boolean("alert_on_warning").notNull().default(false),
    active: boolean("active").notNull().default(true),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("scanners_site_name_uq").on(t.siteId, t.name)],
);

export const scannerEngineers = mysqlTable(
  "scanner_engineers",
  {
    scannerId: ref("scanner_id").notNull().references(() => scanners.id, { onDelete: "cascade" }),
    userId: ref("user_id").notNull().references(() => users.id),
  },
  (t) => [primaryKey({ columns: [t.scannerId, t.userId] })],
);

/** A routine test a scanner undergoes: method, phantom, protocol and frequency. */
export const qaTests = mysqlTable(
  "qa_tests",
  {
    id: id(),
    scannerId: ref("scanner_id").notNull().references(() => scanners.id, { onDelete: "cascade" }),
    name: varchar("name", { length: 120 }).notNull(),
    method: mysqlEnum("method", METHODS).notNull(),
    phantom: varchar("phantom", { length: 200 }).notNull().default(""),
    protocol: text("protocol").notNull(),
    frequency: mysqlEnum("frequency", FREQUENCIES).notNull(),
    active: boolean("active").notNull().default(true),
    createdAt: createdAt(),
  },
  (t) => [index("qa_tests_scanner_idx").on(t.scannerId)],
);

export const scans = mysqlTable(
  "scans",
  {
    id: id(),
    scannerId: ref("scanner_id").notNull().references(() => scanners.id),
    testId: ref("test_id").references(() => qaTests.id),
    uploadedById: ref("uploaded_by_id").notNull().references(() => users.id),
    fileSha256: varchar("file_sha256", { length: 64 }).notNull(),
    fileName: varchar("file_name", { length: 255 }).notNull(),
    fileSize: int("file_size", { unsigned: true }).notNull(),
    format: varchar("format", { length: 16 }).notNull(),
    storageKey: varchar("storage_key", { length: 255 }).notNull(),
    /** Test date: DICOM acquisition date/time when present, else upload time. */
    acquiredAt: datetime("acquired_at", { mode: "date", fsp: 3 }).notNull(),
    attributes: json("attributes").$type<Record<string, string | number | null>>().notNull(),
    note: text("note"),
    signedOffById: ref("signed_off_by_id").references(() => users.id),
    signedOffAt: datetime("signed_off_at", { mode: "date", fsp: 3 }),
    signOffNote: text("sign_off_note"),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("scans_scanner_sha_uq").on(t.scannerId, t.fileSha256),
    index("scans_scanner_acquired_idx").on(t.scannerId, t.acquiredAt),
    index("scans_test_acquired_idx").on(t.testId, t.acquiredAt),
  ],
);

export const analyses = mysqlTable(
  "analyses",
  {
    id: id(),
    scanId: ref("scan_id").notNull().references(() => scans.id, { onDelete: "cascade" }),
    /** 1, 2, … per scan; every re-run is kept and the latest is current. */
    revision: int("revision", { unsigned: true }).notNull(),
    isCurrent: boolean("is_current").notNull(),
    method: mysqlEnum("method", METHODS).notNull(),
    options: json("options").$type<Record<string, unknown>>().notNull(),
    result: json("result").$type<Record<string, unknown>>().notNull(),
    analysisVersion: varchar("analysis_version", { length: 64 }).notNull(),
    status: mysqlEnum("status", RESULT_STATUSES).notNull(),
    createdById: ref("created_by_id").notNull().references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("analyses_scan_revision_uq").on(t.scanId, t.revision)],
);

/** One row per analysis × metric: what trends, baselines and tolerances work on. */
export const metricValues = mysqlTable(
  "metric_values",
  {
    id: id(),
    analysisId: ref("analysis_id").notNull().references(() => analyses.id, { onDelete: "cascade" }),
    scanId: ref("scan_id").notNull().references(() => scans.id, { onDelete: "cascade" }),
    scannerId: ref("scanner_id").notNull().references(() => scanners.id),
    testId: ref("test_id").references(() => qaTests.id),
    metric: varchar("metric", { length: 32 }).notNull(),
    value: double("value"),
    status: mysqlEnum("status", RESULT_STATUSES).notNull(),
    isCurrent: boolean("is_current").notNull(),
    measuredAt: datetime("measured_at", { mode: "date", fsp: 3 }).notNull(),
  },
  (t) => [
    // Covers the fleet sparkline (value included) and serves the trend queries.
    index("metric_values_trend_value_idx").on(t.scannerId, t.metric, t.isCurrent, t.measuredAt, t.value),
    index("metric_values_analysis_idx").on(t.analysisId),
  ],
);

export const baselines = mysqlTable(
  "baselines",
  {
    id: id(),
    scannerId: ref("scanner_id").notNull().references(() => scanners.id, { onDelete: "cascade" }),
    testId: ref("test_id").notNull().references(() => qaTests.id, { onDelete: "cascade" }),
    metric: varchar("metric", { length: 32 }).notNull(),
    mean: double("mean").notNull(),
    sd: double("sd"),
    n: int("n", { unsigned: true }).notNull(),
    scanIds: json("scan_ids").$type<number[]>().notNull(),
    mtfCurve: json("mtf_curve").$type<{ frequencyCyclesPerMm: number[]; value: number[] } | null>(),
    reason: text("reason").notNull(),
    setById: ref("set_by_id").notNull().references(() => users.id),
    setAt: datetime("set_at", { mode: "date", fsp: 3 }).notNull(),
    /** Null while in force; set when a newer baseline replaces it (history is kept). */
    supersededAt: datetime("superseded_at", { mode: "date", fsp: 3 }),
  },
  (t) => [index("baselines_lookup_idx").on(t.scannerId, t.testId, t.metric, t.supersededAt)],
);

export const tolerances = mysqlTable(
  "tolerances",
  {
    id: id(),
    scannerId: ref("scanner_id").notNull().references(() => scanners.id, { onDelete: "cascade" }),
    testId: ref("test_id").notNull().references(() => qaTests.id, { onDelete: "cascade" }),
    metric: varchar("metric", { length: 32 }).notNull(),
    mode: mysqlEnum("mode", ["relative", "absolute"]).notNull(),
    warning: double("warning").notNull(),
    action: double("action").notNull(),
    source: varchar("source", { length: 255 }).notNull(),
    updatedById: ref("updated_by_id").references(() => users.id),
    updatedAt: datetime("updated_at", { mode: "date", fsp: 3 }).notNull(),
  },
  (t) => [uniqueIndex("tolerances_uq").on(t.scannerId, t.testId, t.metric)],
);

export const alerts = mysqlTable(
  "alerts",
  {
    id: id(),
    scannerId: ref("scanner_id").notNull().references(() => scanners.id, { onDelete: "cascade" }),
    testId: ref("test_id").references(() => qaTests.id, { onDelete: "cascade" }),
    cause: mysqlEnum("cause", ALERT_CAUSES).notNull(),
    state: mysqlEnum("state", ALERT_STATES).notNull(),
    /** scanner:test:cause while open or acknowledged, NULL once resolved: one open alert per key. */
    openKey: varchar("open_key", { length: 80 }).unique(),
    summary: text("summary").notNull(),
    occurrences: int("occurrences", { unsigned: true }).notNull().default(1),
    firstScanId: ref("first_scan_id").references(() => scans.id, { onDelete: "set null" }),
    latestScanId: ref("latest_scan_id").references(() => scans.id, { onDelete: "set null" }),
    openedAt: datetime("opened_at", { mode: "date", fsp: 3 }).notNull(),
    updatedAt: datetime("updated_at", { mode: "date", fsp: 3 }).notNull(),
    acknowledgedById: ref("acknowledged_by_id").references(() => users.id),
    acknowledgedAt: datetime("acknowledged_at", { mode: "date", fsp: 3 }),
    resolutionProposedAt: datetime("resolution_proposed_at", { mode: "date", fsp: 3 }),
    resolutionScanId: ref("resolution_scan_id").references(() => scans.id, { onDelete: "set null" }),
    resolvedById: ref("resolved_by_id").references(() => users.id),
    resolvedAt: datetime("resolved_at", { mode: "date", fsp: 3 }),
    resolutionNote: text("resolution_note"),
  },
  (t) => [index("alerts_scanner_state_idx").on(t.scannerId, t.state)],
);

export const serviceEvents = mysqlTable(
  "service_events",
  {
    id: id(),
    scannerId: ref("scanner_id").notNull().references(() => scanners.id, { onDelete: "cascade" }),
    alertId: ref("alert_id").references(() => alerts.id, { onDelete: "set null" }),
    engineerId: ref("engineer_id").notNull().references(() => users.id),
    performedAt: datetime("performed_at", { mode: "date", fsp: 3 }).notNull(),
    description: text("description").notNull(),
    parts: text("parts").notNull(),
    createdAt: createdAt(),
  },
  (t) => [index("service_events_scanner_idx").on(t.scannerId, t.performedAt)],
);

export const mailOutbox = mysqlTable(
  "mail_outbox",
  {
    id: id(),
    kind: varchar("kind", { length: 32 }).notNull(),
    /** Prevents the same message being queued twice (e.g. alert:12:opened:user:3). */
    dedupeKey: varchar("dedupe_key", { length: 160 }).unique(),
    toAddress: varchar("to_address", { length: 254 }).notNull(),
    subject: varchar("subject", { length: 255 }).notNull(),
    textBody: text("text_body").notNull(),
    htmlBody: text("html_body").notNull(),
    state: mysqlEnum("state", ["pending", "sent", "failed"]).notNull().default("pending"),
    attempts: int("attempts", { unsigned: true }).notNull().default(0),
    nextAttemptAt: datetime("next_attempt_at", { mode: "date", fsp: 3 }).notNull(),
    lockedUntil: datetime("locked_until", { mode: "date", fsp: 3 }),
    lastError: text("last_error"),
    sentAt: datetime("sent_at", { mode: "date", fsp: 3 }),
    createdAt: createdAt(),
  },
  (t) => [index("mail_outbox_due_idx").on(t.state, t.nextAttemptAt)],
);

export const auditEvents = mysqlTable(
  "audit_events",
  {
    id: id(),
    at: datetime("at", { mode: "date", fsp: 3 }).notNull(),
    actorUserId: ref("actor_user_id").references(() => users.id),
    action: varchar("action", { length: 64 }).notNull(),
    entityType: varchar("entity_type", { length: 32 }).notNull(),
    entityId: varchar("entity_id", { length: 64 }).notNull(),
    scannerId: ref("scanner_id"),
    details: json("details").$type<Record<string, unknown>>().notNull(),
  },
  (t) => [index("audit_events_scanner_idx").on(t.scannerId, t.at), index("audit_events_at_idx").on(t.at)],
);

export const usersRelations = relations(users, ({ many }) => ({ tokens: many(apiTokens) }));
export const sitesRelations = relations(sites, ({ many }) => ({ scanners: many(scanners) }));
export const scannersRelations = relations(scanners, ({ one, many }) => ({
  site: one(sites, { fields: [scanners.siteId], references: [sites.id] }),
  responsiblePhysicist: one(users, { fields: [scanners.responsiblePhysicistId], references: [users.id] }),
  engineers: many(scannerEngineers),
  tests: many(qaTests),
}));
export const scannerEngineersRelations = relations(scannerEngineers, ({ one }) => ({
  scanner: one(scanners, { fields: [scannerEngineers.scannerId], references: [scanners.id] }),
  user: one(users, { fields: [scannerEngineers.userId], references: [users.id] }),
}));
export const qaTestsRelations = relations(qaTests, ({ one }) => ({
  scanner: one(scanners, { fields: [qaTests.scannerId], references: [scanners.id] }),
}));

export type User = typeof users.$inferSelect;
export type Role = (typeof ROLES)[number];
export type Modality = (typeof MODALITIES)[number];
export type Site = typeof sites.$inferSelect;
export type Scanner = typeof scanners.$inferSelect;
export type NewScanner = typeof scanners.$inferInsert;
export type QaTest = typeof qaTests.$inferSelect;
export type Scan = typeof scans.$inferSelect;
export type Analysis = typeof analyses.$inferSelect;
export type Baseline = typeof baselines.$inferSelect;
export type ToleranceRow = typeof tolerances.$inferSelect;
export type Alert = typeof alerts.$inferSelect;
export type ServiceEvent = typeof serviceEvents.$inferSelect;
export type MailMessage = typeof mailOutbox.$inferSelect;
