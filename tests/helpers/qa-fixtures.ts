// Fixtures for QA-configuration route tests: a scanner with a routine test, and results (scan + current analysis +
// metric values) inserted straight into the test database, bypassing upload and analysis.
import { randomBytes } from "node:crypto";
import { db } from "@/db/client";
import { analyses, metricValues, qaTests, scannerEngineers, scanners, scans, type Modality } from "@/db/schema";
import type { MetricKey } from "@/lib/qa/metrics";
import { createTestSite, unique } from "./api";

export const DAY_MS = 86_400_000;

export type Method = "point" | "line" | "edge" | "disk";
export type Frequency = "daily" | "weekly" | "monthly" | "quarterly" | "annual";

export interface QaScanner {
  scannerId: number;
  testId: number;
  name: string;
  siteName: string;
}

/** A new active scanner at a new site with one active routine test; optionally assigned to engineers. */
export async function createQaScanner(opts: { modality?: Modality; method?: Method; frequency?: Frequency; engineerIds?: number[] } = {}): Promise<QaScanner> {
  const site = await createTestSite();
  const name = unique(opts.modality ?? "CT");
  const [s] = await db()
    .insert(scanners)
    .values({ siteId: site.id, name, modality: opts.modality ?? "CT", manufacturer: "Testwerk", model: "QA-1", serialNumber: "QA-0001", location: "Test room" })
    .$returningId();
  const scannerId = s!.id;
  for (const userId of opts.engineerIds ?? []) await db().insert(scannerEngineers).values({ scannerId, userId });
  const [t] = await db()
    .insert(qaTests)
    .values({ scannerId, name: "Edge MTF", method: opts.method ?? "edge", phantom: "Tungsten edge", protocol: "Fixed protocol", frequency: opts.frequency ?? "weekly" })
    .$returningId();
  return { scannerId, testId: t!.id, name, siteName: site.name };
}

/**
 * One result as the ingest path would store it: a scan, its current analysis (revision 1) whose JSON result holds the
 * values, and one metric_values row per metric. Status "no-baseline" everywhere, as for a scanner without a baseline.
 */
export async function insertResult(opts: {
  scannerId: number;
  testId: number;
  uploadedById: number;
  at: Date;
  values: Partial<Record<MetricKey, number | null>>;
  method?: Method;
}): Promise<{ scanId: number; analysisId: number }> {
  const method = opts.method ?? "edge";
  const [scan] = await db()
    .insert(scans)
    .values({
      scannerId: opts.scannerId,
      testId: opts.testId,
      uploadedById: opts.uploadedById,
      fileSha256: randomBytes(32).toString("hex"),
      fileName: `phantom-${opts.at.toISOString().slice(0, 10)}.dcm`,
      fileSize: 1024,
      format: "dicom",
      storageKey: "test/not-stored",
      acquiredAt: opts.at,
      attributes: {},
    })
    .$returningId();
  const scanId = scan!.id;
  const [analysis] = await db()
    .insert(analyses)
    .values({ scanId, revision: 1, isCurrent: true, method, options: {}, result: { method, ...opts.values }, analysisVersion: "test-fixture", status: "no-baseline", createdById: opts.uploadedById })
    .$returningId();
  const analysisId = analysis!.id;
  const rows = Object.entries(opts.values).map(([metric, value]) => ({
    analysisId,
    scanId,
    scannerId: opts.scannerId,
    testId: opts.testId,
    metric,
    value: value ?? null,
    status: "no-baseline" as const,
    isCurrent: true,
    measuredAt: opts.at,
  }));
  if (rows.length) await db().insert(metricValues).values(rows);
  return { scanId, analysisId };
}

/** A request to a route handler, any method (PUT included), with an optional Bearer token and JSON body. */
export function qaRequest(path: string, opts: { method?: "GET" | "PUT" | "POST"; token?: string; body?: unknown } = {}): Request {
  const headers = new Headers();
  if (opts.token) headers.set("authorization", `Bearer ${opts.token}`);
  let payload: string | undefined;
  if (opts.body !== undefined) {
    headers.set("content-type", "application/json");
    payload = typeof opts.body === "string" ? opts.body : JSON.stringify(opts.body);
  }
  return new Request(`http://test${path}`, { method: opts.method ?? "GET", headers, body: payload });
}

/** "YYYY-MM-DD" (UTC) of a date: the form the API's from/to parameters take. */
export const isoDay = (d: Date) => d.toISOString().slice(0, 10);
