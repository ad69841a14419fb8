// Route tests for a scanner's QA configuration and its read-outs, against the real test database:
// GET/PUT /api/scanners/{id}/tests, /baselines, /tolerances; GET /trend, /results.csv; the status in GET /api/scanners.
// Results are inserted directly (tests/helpers/qa-fixtures.ts), not uploaded.
import { and, eq, inArray } from "drizzle-orm";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { createTestUser, json, noParams, routeParams, type ErrorJson, type TestUser } from "../helpers/api";
import { expectClose } from "../helpers/expect-close";
import { createQaScanner, DAY_MS, insertResult, isoDay, qaRequest, type QaScanner } from "../helpers/qa-fixtures";
import { GET as listScanners } from "@/app/api/scanners/route";
import { GET as getTests, PUT as putTests } from "@/app/api/scanners/[id]/tests/route";
import { GET as getBaselines, PUT as putBaselines } from "@/app/api/scanners/[id]/baselines/route";
import { GET as getTolerances, PUT as putTolerances } from "@/app/api/scanners/[id]/tolerances/route";
import { GET as getTrend } from "@/app/api/scanners/[id]/trend/route";
import { GET as getCsv } from "@/app/api/scanners/[id]/results.csv/route";
import { db } from "@/db/client";
import { analyses, metricValues } from "@/db/schema";

vi.mock("next-auth", async (importOriginal) =>
  (await import("../helpers/api")).withAnonymousSession(await importOriginal<typeof import("next-auth")>()),
);

let admin: TestUser;
let physicist: TestUser;
let lead: TestUser;
let engineer: TestUser;
let ct: QaScanner;
let overdue: QaScanner;
const now = new Date();
const daysAgo = (d: number) => new Date(now.getTime() - d * DAY_MS);

/** MTF50 (cycles/mm), FWHM (mm) and MTF10 (cycles/mm) of eight weekly-ish results, oldest first. */
const SERIES = [
  { days: 70, mtf50: 0.5, fwhmMm: 1.0, mtf10: 0.9 },
  { days: 63, mtf50: 0.51, fwhmMm: 1.02, mtf10: 0.9 },
  { days: 56, mtf50: 0.49, fwhmMm: 0.98, mtf10: 0.9 },
  { days: 49, mtf50: 0.5, fwhmMm: 1.0, mtf10: 0.9 },
  { days: 42, mtf50: 0.5, fwhmMm: 1.0, mtf10: 0.9 },
  { days: 35, mtf50: 0.495, fwhmMm: 1.01, mtf10: 0.9 },
  { days: 28, mtf50: 0.43, fwhmMm: 1.03, mtf10: 0.9 },
  { days: 2, mtf50: 0.46, fwhmMm: 1.0, mtf10: 0.9 },
];
let scanIds: number[] = [];
const BASELINE = [0, 1, 2, 3, 4]; // indices into SERIES: the first five results

const tolerancesUrl = () => `/api/scanners/${ct.scannerId}/tolerances`;
const baselinesUrl = () => `/api/scanners/${ct.scannerId}/baselines`;
const testsUrl = () => `/api/scanners/${ct.scannerId}/tests`;
const mtf50Tolerance = (overrides: Record<string, unknown> = {}) => ({
  testId: ct.testId,
  metric: "mtf50",
  mode: "relative",
  warning: 5,
  action: 10,
  source: "Local decision (test)",
  ...overrides,
});

beforeAll(async () => {
  [admin, physicist, lead, engineer] = await Promise.all([createTestUser("admin"), createTestUser("physicist"), createTestUser("lead"), createTestUser("engineer")]);
  ct = await createQaScanner({ modality: "CT", method: "edge", frequency: "weekly", engineerIds: [engineer.id] });
  overdue = await createQaScanner({ modality: "DX", method: "edge", frequency: "weekly" });
  scanIds = [];
  for (const r of SERIES) {
    const { scanId } = await insertResult({ scannerId: ct.scannerId, testId: ct.testId, uploadedById: physicist.id, at: daysAgo(r.days), values: { mtf50: r.mtf50, fwhmMm: r.fwhmMm, mtf10: r.mtf10 } });
    scanIds.push(scanId);
  }
  await insertResult({ scannerId: overdue.scannerId, testId: overdue.testId, uploadedById: physicist.id, at: new Date(now.getTime() - 20 * DAY_MS - 3_600_000), values: { mtf50: 2.5 } });
});

async function statusesOf(ids: number[]) {
  const rows = await db().select({ scanId: analyses.scanId, status: analyses.status }).from(analyses).where(and(inArray(analyses.scanId, ids), eq(analyses.isCurrent, true)));
  const map = new Map(rows.map((r) => [r.scanId, r.status]));
  return ids.map((id) => map.get(id));
}

async function expect422(res: Response, path: string) {
  expect(res.status).toBe(422);
  const body = await json<ErrorJson>(res);
  expect(body.code).toBe("validation_failed");
  expect(body.issues?.map((i) => i.path)).toContain(path);
  expect(body.error).toContain(path);
}

describe("gates: 401 without credentials, 403 for the wrong role, 404 outside an engineer's scanners", () => {
  it("every GET and PUT of the QA routes without credentials answers 401", async () => {
    const p = routeParams(ct.scannerId);
    const answers = await Promise.all([
      getTests(qaRequest(testsUrl()), p),
      putTests(qaRequest(testsUrl(), { method: "PUT", body: { tests: [] } }), p),
      getBaselines(qaRequest(baselinesUrl()), p),
      putBaselines(qaRequest(baselinesUrl(), { method: "PUT", body: {} }), p),
      getTolerances(qaRequest(tolerancesUrl()), p),
      putTolerances(qaRequest(tolerancesUrl(), { method: "PUT", body: {} }), p),
      getTrend(qaRequest(`/api/scanners/${ct.scannerId}/trend?metric=mtf50`), p),
      getCsv(qaRequest(`/api/scanners/${ct.scannerId}/results.csv`), p),
      listScanners(qaRequest("/api/scanners"), noParams),
    ]);
    expect(answers.map((r) => r.status)).toEqual(Array(answers.length).fill(401));
  });

  it("PUT /tolerances as a department lead answers 403 and stores nothing", async () => {
    const res = await putTolerances(qaRequest(tolerancesUrl(), { method: "PUT", token: lead.token, body: { tolerances: [mtf50Tolerance()] } }), routeParams(ct.scannerId));
    expect(res.status).toBe(403);
    expect((await json<ErrorJson>(res)).code).toBe("forbidden");
    const list = await json<{ tolerances: { metric: string; isDefault: boolean }[] }>(await getTolerances(qaRequest(tolerancesUrl(), { token: lead.token }), routeParams(ct.scannerId)));
    expect(list.tolerances.find((t) => t.metric === "mtf50")?.isDefault).toBe(true);
  });

  it("PUT /tolerances as a service engineer answers 403, though the engineer may read them", async () => {
    const p = routeParams(ct.scannerId);
    expect((await getTolerances(qaRequest(tolerancesUrl(), { token: engineer.token }), p)).status).toBe(200);
    expect((await putTolerances(qaRequest(tolerancesUrl(), { method: "PUT", token: engineer.token, body: { tolerances: [mtf50Tolerance()] } }), p)).status).toBe(403);
  });

  it("PUT /baselines as a lead or an administrator answers 403 (baselines are a physicist's decision)", async () => {
    const body = { testId: ct.testId, scanIds: [scanIds[0]], reason: "acceptance" };
    for (const who of [lead, admin]) {
      const res = await putBaselines(qaRequest(baselinesUrl(), { method: "PUT", token: who.token, body }), routeParams(ct.scannerId));
      expect(res.status).toBe(403);
    }
  });

  it("PUT /tests as a lead or an engineer answers 403", async () => {
    for (const who of [lead, engineer]) {
      const res = await putTests(qaRequest(testsUrl(), { method: "PUT", token: who.token, body: { tests: [] } }), routeParams(ct.scannerId));
      expect(res.status).toBe(403);
    }
  });

  it("GET /tests of a scanner not assigned to the engineer answers 404", async () => {
    expect((await getTests(qaRequest(`/api/scanners/${overdue.scannerId}/tests`, { token: engineer.token }), routeParams(overdue.scannerId))).status).toBe(404);
  });
});

describe("422: a bad body or query names the field", () => {
  it("PUT /tolerances with a relative action level below the warning level names tolerances.0.action", async () => {
    const res = await putTolerances(qaRequest(tolerancesUrl(), { method: "PUT", token: physicist.token, body: { tolerances: [mtf50Tolerance({ warning: 10, action: 5 })] } }), routeParams(ct.scannerId));
    await expect422(res, "tolerances.0.action");
  });

  it("PUT /tolerances without a source names tolerances.0.source", async () => {
    const res = await putTolerances(qaRequest(tolerancesUrl(), { method: "PUT", token: physicist.token, body: { tolerances: [mtf50Tolerance({ source: "" })] } }), routeParams(ct.scannerId));
    await expect422(res, "tolerances.0.source");
  });

  it("PUT /tolerances for a metric the test's method does not produce answers 422", async () => {
    const res = await putTolerances(qaRequest(tolerancesUrl(), { method: "PUT", token: physicist.token, body: { tolerances: [mtf50Tolerance({ metric: "fwhmXMm" })] } }), routeParams(ct.scannerId));
    expect(res.status).toBe(422);
    expect((await json<ErrorJson>(res)).error).toMatch(/does not produce fwhmXMm/);
  });

  it("PUT /tests with an unknown frequency names tests.0.frequency", async () => {
    const res = await putTests(qaRequest(testsUrl(), { method: "PUT", token: physicist.token, body: { tests: [{ name: "Edge", method: "edge", frequency: "fortnightly" }] } }), routeParams(ct.scannerId));
    await expect422(res, "tests.0.frequency");
  });

  it("PUT /baselines without a reason names reason; with no results ticked names scanIds", async () => {
    const p = routeParams(ct.scannerId);
    await expect422(await putBaselines(qaRequest(baselinesUrl(), { method: "PUT", token: physicist.token, body: { testId: ct.testId, scanIds: [scanIds[0]] } }), p), "reason");
    await expect422(await putBaselines(qaRequest(baselinesUrl(), { method: "PUT", token: physicist.token, body: { testId: ct.testId, scanIds: [], reason: "acceptance" } }), p), "scanIds");
  });

  it("PUT /baselines with a result of another scanner answers 422 and names the scan", async () => {
    const foreign = await insertResult({ scannerId: overdue.scannerId, testId: overdue.testId, uploadedById: physicist.id, at: daysAgo(60), values: { mtf50: 2.4 } });
    const res = await putBaselines(qaRequest(baselinesUrl(), { method: "PUT", token: physicist.token, body: { testId: ct.testId, scanIds: [scanIds[0], foreign.scanId], reason: "mixed" } }), routeParams(ct.scannerId));
    expect(res.status).toBe(422);
    expect((await json<ErrorJson>(res)).error).toContain(String(foreign.scanId));
  });

  it("GET /trend with an unknown metric names metric", async () => {
    await expect422(await getTrend(qaRequest(`/api/scanners/${ct.scannerId}/trend?metric=sharpness`, { token: lead.token }), routeParams(ct.scannerId)), "metric");
  });
});

describe("happy paths, in order: tolerances → baseline → statuses, trend, CSV, fleet status → new baseline → schedule", () => {
  it("GET /tolerances lists every metric of the edge test as the CT default until set", async () => {
    const res = await getTolerances(qaRequest(tolerancesUrl(), { token: lead.token }), routeParams(ct.scannerId));
    expect(res.status).toBe(200);
    const { tolerances } = await json<{ tolerances: { testId: number; metric: string; mode: string; warning: number; action: number; direction: string; isDefault: boolean }[] }>(res);
    // Edge results carry FWHM, FWTM, MTF50, MTF10 and MTF at Nyquist (lib/qa/metrics.ts METRICS[*].methods).
    expect(tolerances.map((t) => t.metric).sort()).toEqual(["fwhmMm", "fwtmMm", "mtf10", "mtf50", "mtfAtNyquist"]);
    const mtf50 = tolerances.find((t) => t.metric === "mtf50")!;
    expect(mtf50).toMatchObject({ testId: ct.testId, mode: "relative", warning: 10, action: 15, direction: "lower-is-worse", isDefault: true });
  });

  it("PUT /tolerances as the physicist stores the levels (no longer default) and leaves results unevaluated without a baseline", async () => {
    const res = await putTolerances(qaRequest(tolerancesUrl(), { method: "PUT", token: physicist.token, body: { tolerances: [mtf50Tolerance()] } }), routeParams(ct.scannerId));
    expect(res.status).toBe(200);
    const { tolerances } = await json<{ tolerances: { metric: string; warning: number; action: number; source: string; isDefault: boolean }[] }>(res);
    expect(tolerances.find((t) => t.metric === "mtf50")).toMatchObject({ warning: 5, action: 10, source: "Local decision (test)", isDefault: false });
    expect(await statusesOf(scanIds)).toEqual(SERIES.map(() => "no-baseline"));
  });

  it("PUT /baselines from five chosen results stores mean and sample SD per metric and re-evaluates every stored status", async () => {
    const chosen = BASELINE.map((i) => scanIds[i]!);
    const res = await putBaselines(qaRequest(baselinesUrl(), { method: "PUT", token: physicist.token, body: { testId: ct.testId, scanIds: chosen, reason: "Acceptance test" } }), routeParams(ct.scannerId));
    expect(res.status).toBe(201);
    const { baselines } = await json<{ baselines: { metric: string; mean: number; sd: number; n: number; reason: string; setById: number; setAt: string }[] }>(res);
    const b = baselines.find((x) => x.metric === "mtf50")!;
    // Sample mean and SD with the n − 1 divisor (NIST/SEMATECH e-Handbook of Statistical Methods, 1.3.5.6), worked by hand:
    // values 0.50, 0.51, 0.49, 0.50, 0.50 → mean 0.50, SD = sqrt((0.01² + 0.01²)/4) = 0.0070711.
    expectClose(b.mean, 0.5, { rel: 1e-12 });
    expectClose(b.sd, Math.sqrt(0.0002 / 4), { rel: 1e-9 });
    expect(b).toMatchObject({ n: 5, reason: "Acceptance test", setById: physicist.id });
    // Set at the last chosen result's date (42 days ago).
    expect(new Date(b.setAt).getTime()).toBe(daysAgo(42).getTime());
    expect(baselines.map((x) => x.metric).sort()).toEqual(["fwhmMm", "mtf10", "mtf50"]);

    // MTF50 relative levels 5 % / 10 % below a 0.50 baseline: 0.495 (−1 %) pass, 0.43 (−14 %) action, 0.46 (−8 %) warning.
    // FWHM keeps the CT default (10 % / 15 % wider) and MTF10 is constant, so MTF50 decides each result.
    expect(await statusesOf(scanIds)).toEqual(["pass", "pass", "pass", "pass", "pass", "pass", "action", "warning"]);
    const mv = await db()
      .select({ scanId: metricValues.scanId, status: metricValues.status })
      .from(metricValues)
      .where(and(eq(metricValues.metric, "mtf50"), inArray(metricValues.scanId, scanIds.slice(5))));
    expect(new Map(mv.map((r) => [r.scanId, r.status]))).toEqual(new Map([[scanIds[5]!, "pass"], [scanIds[6]!, "action"], [scanIds[7]!, "warning"]]));
  });

  it("GET /baselines lists the baselines in force with their reason", async () => {
    const res = await getBaselines(qaRequest(baselinesUrl(), { token: engineer.token }), routeParams(ct.scannerId));
    expect(res.status).toBe(200);
    const { baselines } = await json<{ baselines: { metric: string; n: number; supersededAt: string | null; scanIds: number[] }[] }>(res);
    expect(baselines).toHaveLength(3);
    expect(baselines.every((b) => b.n === 5 && b.supersededAt === null)).toBe(true);
    expect(baselines[0]!.scanIds.sort((a, b) => a - b)).toEqual(BASELINE.map((i) => scanIds[i]!).sort((a, b) => a - b));
  });

  it("GET /trend?metric=mtf50 returns the points with statuses, the band as absolute limits, control limits and a drift flag", async () => {
    const res = await getTrend(qaRequest(`/api/scanners/${ct.scannerId}/trend?metric=mtf50`, { token: lead.token }), routeParams(ct.scannerId));
    expect(res.status).toBe(200);
    const t = await json<{
      unit: string;
      direction: string;
      test: { id: number };
      points: { scanId: number; value: number; status: string }[];
      baseline: { mean: number; sd: number; n: number };
      tolerance: { mode: string; warning: number; action: number; isDefault: boolean };
      band: { warningLimit: number; actionLimit: number };
      controlLimits: { mean: number; sd: number; lower2: number; upper2: number; lower3: number; upper3: number };
      driftFlags: { rule: string; side: string; scanIds: number[] }[];
    }>(res);
    expect(t).toMatchObject({ unit: "cycles/mm", direction: "lower-is-worse", test: { id: ct.testId }, tolerance: { mode: "relative", warning: 5, action: 10, isDefault: false } });
    expect(t.points.map((p) => p.scanId)).toEqual(scanIds);
    expect(t.points.map((p) => p.value)).toEqual(SERIES.map((s) => s.mtf50));
    expect(t.points.map((p) => p.status)).toEqual(["pass", "pass", "pass", "pass", "pass", "pass", "action", "warning"]);
    // Lower is worse: limits 5 % and 10 % below the mean, 0.50 × 0.95 and 0.50 × 0.90 (by hand).
    expectClose(t.band.warningLimit, 0.475, { rel: 1e-12 });
    expectClose(t.band.actionLimit, 0.45, { rel: 1e-12 });
    // Shewhart limits mean ± 2σ and ± 3σ with σ the baseline SD (Montgomery, Introduction to Statistical Quality Control, ch. 6).
    const sd = Math.sqrt(0.0002 / 4);
    expectClose(t.controlLimits.sd, sd, { rel: 1e-9 });
    expectClose(t.controlLimits.lower2, 0.5 - 2 * sd, { rel: 1e-9 });
    expectClose(t.controlLimits.upper2, 0.5 + 2 * sd, { rel: 1e-9 });
    expectClose(t.controlLimits.lower3, 0.5 - 3 * sd, { rel: 1e-9 });
    expectClose(t.controlLimits.upper3, 0.5 + 3 * sd, { rel: 1e-9 });
    // 0.43 lies (0.43 − 0.50)/0.00707 ≈ −9.9σ: beyond 3σ on the bad (low) side (Western Electric rule 1).
    const flagged = t.driftFlags.filter((f) => f.side === "low" && f.scanIds.includes(scanIds[6]!));
    expect(flagged.length).toBeGreaterThan(0);
    expect(t.driftFlags.every((f) => f.side === "low")).toBe(true);
  });

  it("GET /trend with from and to keeps only results in the range", async () => {
    const res = await getTrend(qaRequest(`/api/scanners/${ct.scannerId}/trend?metric=fwhmMm&testId=${ct.testId}&from=${isoDay(daysAgo(31))}&to=${isoDay(daysAgo(20))}`, { token: lead.token }), routeParams(ct.scannerId));
    expect(res.status).toBe(200);
    const t = await json<{ unit: string; points: { scanId: number; value: number }[]; band: { warningLimit: number; actionLimit: number } }>(res);
    expect(t.unit).toBe("mm");
    expect(t.points.map((p) => p.scanId)).toEqual([scanIds[6]]);
    // FWHM baseline mean (1.00 + 1.02 + 0.98 + 1.00 + 1.00)/5 = 1.00 mm; CT default 10 % / 15 % wider (lib/qa/default-tolerances.ts).
    expectClose(t.band.warningLimit, 1.1, { rel: 1e-9 });
    expectClose(t.band.actionLimit, 1.15, { rel: 1e-9 });
  });

  it("GET /results.csv returns one row per result and metric, the value in the column of its unit", async () => {
    const res = await getCsv(qaRequest(`/api/scanners/${ct.scannerId}/results.csv`, { token: lead.token }), routeParams(ct.scannerId));
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/^text\/csv/);
    expect(res.headers.get("content-disposition")).toMatch(/^attachment; filename="halfmax-.*-results\.csv"$/);
    const lines = (await res.text()).trimEnd().split("\r\n");
    const header = lines[0]!.split(",");
    expect(header).toEqual(expect.arrayContaining(["scan_id", "metric", "value_mm", "value_cycles_per_mm", "status"]));
    const rows = lines.slice(1).map((l) => Object.fromEntries(l.split(",").map((v, i) => [header[i]!, v])));
    expect(rows).toHaveLength(SERIES.length * 3);
    const action = rows.find((r) => r.scan_id === String(scanIds[6]) && r.metric === "mtf50")!;
    expect(action).toMatchObject({ value_mm: "", value_cycles_per_mm: "0.43", status: "action" });
    const width = rows.find((r) => r.scan_id === String(scanIds[6]) && r.metric === "fwhmMm")!;
    expect(width).toMatchObject({ value_mm: "1.03", value_cycles_per_mm: "" });
  });

  it("GET /results.csv?from= keeps only results from that day on", async () => {
    const res = await getCsv(qaRequest(`/api/scanners/${ct.scannerId}/results.csv?from=${isoDay(daysAgo(30))}`, { token: physicist.token }), routeParams(ct.scannerId));
    expect(res.status).toBe(200);
    const lines = (await res.text()).trimEnd().split("\r\n");
    expect(lines).toHaveLength(1 + 2 * 3); // header + the results of 28 and 2 days ago, three metrics each
  });

  it("GET /api/scanners reports the latest status per test, the schedule state, and the MTF50 sparkline", async () => {
    const res = await listScanners(qaRequest("/api/scanners", { token: lead.token }), noParams);
    expect(res.status).toBe(200);
    type S = { id: number; status: { latestStatus: string | null; due: string; lastTestAt: string; openAlerts: number; sparkline: { value: number }[]; tests: { testId: number; status: string | null; lastScanId: number; due: string; dueAt: string; overdueByDays: number | null }[] } };
    const { scanners } = await json<{ scanners: S[] }>(res);
    const a = scanners.find((s) => s.id === ct.scannerId)!;
    expect(a.status.latestStatus).toBe("warning");
    expect(a.status.lastTestAt).toBe(daysAgo(2).toISOString());
    expect(a.status.tests).toEqual([expect.objectContaining({ testId: ct.testId, status: "warning", lastScanId: scanIds[7], due: "ok", overdueByDays: null })]);
    // Weekly: due 7 days after the last result (lib/qa/schedule.ts; UTC arithmetic).
    expect(a.status.tests[0]!.dueAt).toBe(new Date(daysAgo(2).getTime() + 7 * DAY_MS).toISOString());
    expect(a.status.sparkline.map((p) => p.value)).toEqual(SERIES.map((s) => s.mtf50));
    expect(a.status.openAlerts).toBe(0);

    const b = scanners.find((s) => s.id === overdue.scannerId)!;
    // Last weekly result 20 days and 1 hour ago: due 13 days ago, past the 1-day grace, so overdue by 13 whole days.
    expect(b.status).toMatchObject({ latestStatus: "no-baseline", due: "overdue" });
    expect(b.status.tests[0]).toMatchObject({ due: "overdue", overdueByDays: 13 });
  });

  it("a second baseline supersedes the first (kept in ?history=1) and moves the statuses with it", async () => {
    // Baseline from the results of 28 and 2 days ago: MTF50 mean (0.43 + 0.46)/2 = 0.445 cycles/mm, so every result is
    // within 5 % below it (0.43 is −3.4 %) or above it (better side): all pass, where two were action and warning.
    const chosen = [scanIds[6]!, scanIds[7]!];
    const res = await putBaselines(qaRequest(baselinesUrl(), { method: "PUT", token: physicist.token, body: { testId: ct.testId, scanIds: chosen, reason: "After detector replacement" } }), routeParams(ct.scannerId));
    expect(res.status).toBe(201);
    const hist = await json<{ baselines: { metric: string; n: number; mean: number; reason: string; supersededAt: string | null }[] }>(
      await getBaselines(qaRequest(`${baselinesUrl()}?history=1`, { token: lead.token }), routeParams(ct.scannerId)),
    );
    const mtf50 = hist.baselines.filter((b) => b.metric === "mtf50");
    expect(mtf50).toHaveLength(2);
    expect(mtf50.find((b) => b.supersededAt === null)).toMatchObject({ n: 2, reason: "After detector replacement" });
    expectClose(mtf50.find((b) => b.supersededAt === null)!.mean, 0.445, { rel: 1e-12 });
    expect(mtf50.find((b) => b.supersededAt !== null)).toMatchObject({ n: 5, reason: "Acceptance test" });
    expect(await statusesOf(scanIds)).toEqual(SERIES.map(() => "pass"));
    const current = await json<{ baselines: unknown[] }>(await getBaselines(qaRequest(baselinesUrl(), { token: lead.token }), routeParams(ct.scannerId)));
    expect(current.baselines).toHaveLength(3);
    const { scanners } = await json<{ scanners: { id: number; status: { latestStatus: string } }[] }>(await listScanners(qaRequest("/api/scanners", { token: lead.token }), noParams));
    expect(scanners.find((s) => s.id === ct.scannerId)!.status.latestStatus).toBe("pass");
  });

  it("PUT /tests as the physicist changes a frequency and adds a test; the new one is never tested", async () => {
    const res = await putTests(
      qaRequest(testsUrl(), {
        method: "PUT",
        token: physicist.token,
        body: {
          tests: [
            { id: ct.testId, name: "Edge MTF", method: "edge", phantom: "Tungsten edge", protocol: "Fixed protocol", frequency: "monthly", active: true },
            { name: "Wire LSF", method: "line", frequency: "quarterly" },
          ],
        },
      }),
      routeParams(ct.scannerId),
    );
    expect(res.status).toBe(200);
    const { tests } = await json<{ tests: { id: number; name: string; method: string; frequency: string; phantom: string; active: boolean; schedule: { due: string; dueAt: string | null } | null }[] }>(res);
    expect(tests).toHaveLength(2);
    expect(tests[0]).toMatchObject({ id: ct.testId, frequency: "monthly" });
    // Monthly: due one calendar month after the last result (lib/qa/schedule.ts addMonthsUtc).
    const last = daysAgo(2);
    const month = new Date(Date.UTC(last.getUTCFullYear(), last.getUTCMonth() + 1, Math.min(last.getUTCDate(), new Date(Date.UTC(last.getUTCFullYear(), last.getUTCMonth() + 2, 0)).getUTCDate()), last.getUTCHours(), last.getUTCMinutes(), last.getUTCSeconds(), last.getUTCMilliseconds()));
    expect(tests[0]!.schedule).toMatchObject({ due: "ok", dueAt: month.toISOString() });
    expect(tests[1]).toMatchObject({ name: "Wire LSF", method: "line", frequency: "quarterly", phantom: "", active: true, schedule: { due: "never-tested", dueAt: null } });
  });

  it("PUT /tests as an administrator is allowed too (schedules are shared with admins) and GET lists the tests", async () => {
    const before = await json<{ tests: { id: number; name: string; method: string; frequency: string; active: boolean }[] }>(await getTests(qaRequest(testsUrl(), { token: engineer.token }), routeParams(ct.scannerId)));
    const wire = before.tests.find((t) => t.name === "Wire LSF")!;
    const res = await putTests(qaRequest(testsUrl(), { method: "PUT", token: admin.token, body: { tests: [{ ...wire, active: false }] } }), routeParams(ct.scannerId));
    expect(res.status).toBe(200);
    const { tests } = await json<{ tests: { id: number; active: boolean }[] }>(res);
    expect(tests.find((t) => t.id === wire.id)?.active).toBe(false);
  });
});
