/**
 * Response schemas of the QA, alert and mail operations (shapes built in db/queries/qa.ts, trend.ts, fleet.ts,
 * alert-workflow.ts and outbox.ts), for the OpenAPI document only.
 */
import { ALERT_CAUSES, ALERT_STATES, FREQUENCIES, METHODS, RESULT_STATUSES } from "@/db/schema";
import { METRIC_KEYS } from "@/lib/qa/metrics";
import { z } from "./registry";

const dateTime = z.iso.datetime().openapi({ description: "ISO 8601 date-time, UTC" });
const id = z.number().int().positive();
const metric = z.enum(METRIC_KEYS as unknown as [string, ...string[]]).openapi({ description: "Metric key, as in the analysis result" });
const toleranceMode = z.enum(["relative", "absolute"]).openapi({ description: "relative: % of the baseline mean in the bad direction; absolute: in the metric's unit" });
const direction = z.enum(["higher-is-worse", "lower-is-worse"]);
/** A baseline's averaged MTF curve (note: the frequency key differs from the analysis result's `frequency`). */
const baselineMtfCurve = z.object({
  frequencyCyclesPerMm: z.array(z.number()).openapi({ description: "cycles/mm" }),
  value: z.array(z.number()),
});

export const qaTestSchema = z
  .object({
    id,
    scannerId: id,
    name: z.string(),
    method: z.enum(METHODS),
    phantom: z.string(),
    protocol: z.string(),
    frequency: z.enum(FREQUENCIES),
    active: z.boolean(),
    createdAt: dateTime,
    schedule: z
      .object({
        testId: id,
        name: z.string(),
        method: z.string(),
        frequency: z.enum(FREQUENCIES),
        lastTestAt: dateTime.nullable(),
        lastScanId: id.nullable(),
        status: z.enum(RESULT_STATUSES).nullable(),
        due: z.enum(["ok", "due", "overdue", "never-tested"]),
        dueAt: dateTime.nullable(),
        overdueByDays: z.number().int().nullable(),
      })
      .nullable()
      .openapi({ description: "Last result and due state; null for inactive tests" }),
  })
  .openapi("QaTest", { description: "A routine test of a scanner: method, phantom, protocol and frequency" });

export const baselineSchema = z
  .object({
    id,
    scannerId: id,
    testId: id,
    metric,
    mean: z.number().openapi({ description: "Mean of the chosen results, in the metric's unit" }),
    sd: z.number().nullable().openapi({ description: "Sample standard deviation; null for a single result" }),
    n: z.number().int().positive(),
    scanIds: z.array(id),
    mtfCurve: baselineMtfCurve.nullable().openapi({ description: "Averaged MTF of the chosen results" }),
    reason: z.string(),
    setById: id,
    setAt: dateTime,
    supersededAt: dateTime.nullable().openapi({ description: "Null while in force" }),
  })
  .openapi("Baseline");

export const toleranceSchema = z
  .object({
    testId: id,
    metric,
    mode: toleranceMode,
    warning: z.number(),
    action: z.number(),
    source: z.string().openapi({ description: "Where the levels come from: a citation, common practice, or a local decision" }),
    direction,
    isDefault: z.boolean().openapi({ description: "True for the modality default (nothing stored for this test and metric)" }),
    updatedAt: dateTime.nullable(),
  })
  .openapi("Tolerance");

export const trendSchema = z
  .object({
    scannerId: id,
    metric,
    label: z.string(),
    unit: z.enum(["mm", "cycles/mm", ""]),
    direction,
    test: z.object({ id, name: z.string(), method: z.enum(METHODS), frequency: z.enum(FREQUENCIES) }).nullable(),
    points: z.array(z.object({ scanId: id, at: dateTime, value: z.number().nullable(), status: z.enum(RESULT_STATUSES) })),
    baseline: z.object({ mean: z.number(), sd: z.number().nullable(), n: z.number().int(), setAt: dateTime }).nullable(),
    baselineHistory: z.array(
      z.object({ id, mean: z.number(), sd: z.number().nullable(), n: z.number().int(), setAt: dateTime, supersededAt: dateTime.nullable(), reason: z.string() }),
    ),
    tolerance: z.object({ mode: toleranceMode, warning: z.number(), action: z.number(), source: z.string(), isDefault: z.boolean() }).nullable(),
    band: z.object({ warningLimit: z.number(), actionLimit: z.number() }).nullable().openapi({ description: "Tolerance levels as values in the metric's unit" }),
    controlLimits: z
      .object({ mean: z.number(), sd: z.number(), lower2: z.number(), upper2: z.number(), lower3: z.number(), upper3: z.number() })
      .nullable()
      .openapi({ description: "Baseline mean ± 2σ and ± 3σ; null without a baseline SD" }),
    driftFlags: z.array(z.object({ rule: z.string(), description: z.string(), side: z.enum(["high", "low"]), scanIds: z.array(id) })),
    serviceEvents: z.array(z.object({ id, at: dateTime, description: z.string(), parts: z.string(), engineer: z.string(), alertId: id.nullable() })),
    alertEvents: z.array(z.object({ at: dateTime, action: z.string(), alertId: id })),
  })
  .openapi("Trend", { description: "One metric of one scanner × test over time, with what to draw around it" });

const alertFields = {
  id,
  scannerId: id,
  testId: id.nullable(),
  cause: z.enum(ALERT_CAUSES),
  state: z.enum(ALERT_STATES),
  openKey: z.string().nullable(),
  summary: z.string(),
  occurrences: z.number().int().positive().openapi({ description: "How many results or checks raised it while open" }),
  firstScanId: id.nullable(),
  latestScanId: id.nullable(),
  openedAt: dateTime,
  updatedAt: dateTime,
  acknowledgedById: id.nullable(),
  acknowledgedAt: dateTime.nullable(),
  resolutionProposedAt: dateTime.nullable().openapi({ description: "When a passing re-test made the alert ready to resolve" }),
  resolutionScanId: id.nullable(),
  resolvedById: id.nullable(),
  resolvedAt: dateTime.nullable(),
  resolutionNote: z.string().nullable(),
};

export const alertListItemSchema = z
  .object({
    ...alertFields,
    scannerName: z.string(),
    siteName: z.string(),
    testName: z.string().nullable(),
    acknowledgedByName: z.string().nullable(),
    resolvedByName: z.string().nullable(),
    serviceCount: z.number().int().min(0),
  })
  .openapi("AlertListItem");

export const alertSchema = z
  .object({
    ...alertFields,
    serviceEvents: z.array(z.object({ id, performedAt: dateTime, description: z.string(), parts: z.string(), engineer: z.string() })),
  })
  .openapi("Alert", { description: "One alert with the service actions logged against it" });

export const serviceEventSchema = z
  .object({ id, performedAt: dateTime, description: z.string(), parts: z.string(), alertId: id.nullable(), engineer: z.string() })
  .openapi("ServiceEvent");

export const outboxMessageSchema = z
  .object({
    id,
    kind: z.string(),
    dedupeKey: z.string().nullable(),
    toAddress: z.string(),
    subject: z.string(),
    textBody: z.string(),
    htmlBody: z.string(),
    state: z.enum(["pending", "sent", "failed"]),
    attempts: z.number().int().min(0),
    nextAttemptAt: dateTime,
    lockedUntil: dateTime.nullable(),
    lastError: z.string().nullable(),
    sentAt: dateTime.nullable(),
    createdAt: dateTime,
  })
  .openapi("OutboxMessage");

export const testMailQueuedSchema = z.object({ queued: z.literal(true), to: z.string(), message: z.string() }).openapi("TestMailQueued");
