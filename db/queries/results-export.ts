import { and, asc, eq, gte, lte } from "drizzle-orm";
import { db } from "@/db/client";
import { analyses, metricValues, qaTests, scans, users } from "@/db/schema";

/** One row per current result × metric of a scanner in a date range, oldest first (for CSV export and reports). */
export async function listResultRows(scannerId: number, range: { from?: Date; to?: Date }) {
  const to = range.to ? new Date(range.to.getTime() + 86_399_999) : undefined;
  return db()
    .select({
      scanId: metricValues.scanId,
      measuredAt: metricValues.measuredAt,
      testName: qaTests.name,
      method: analyses.method,
      metric: metricValues.metric,
      value: metricValues.value,
      status: metricValues.status,
      analysisRevision: analyses.revision,
      analysisVersion: analyses.analysisVersion,
      fileName: scans.fileName,
      signedOffAt: scans.signedOffAt,
      signedOffBy: users.name,
    })
    .from(metricValues)
    .innerJoin(analyses, eq(metricValues.analysisId, analyses.id))
    .innerJoin(scans, eq(metricValues.scanId, scans.id))
    .leftJoin(qaTests, eq(metricValues.testId, qaTests.id))
    .leftJoin(users, eq(scans.signedOffById, users.id))
    .where(and(eq(metricValues.scannerId, scannerId), eq(metricValues.isCurrent, true), range.from ? gte(metricValues.measuredAt, range.from) : undefined, to ? lte(metricValues.measuredAt, to) : undefined))
    .orderBy(asc(metricValues.measuredAt), asc(metricValues.scanId), asc(metricValues.metric));
}
