// Alerts and e-mail end to end against the real test MariaDB and a real SMTP conversation: uploads through
// POST /api/scans open alerts and queue outbox rows in the same transaction; deliverDueMail sends them over SMTP
// (nodemailer) to the in-process sink (smtp-server) on a free port; the alert workflow runs over its routes.
import { createServer, type AddressInfo } from "node:net";
import { and, eq, inArray } from "drizzle-orm";
import type { Transporter } from "nodemailer";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { jitteredPointSourceDicom } from "../helpers/phantom-files";
import { apiRequest, createTestSite, createTestUser, json, noParams, routeParams, unique, type ErrorJson, type TestUser } from "../helpers/api";
import { POST as sendTestMail } from "@/app/api/admin/mail/test/route";
import { GET as listAlertsRoute } from "@/app/api/alerts/route";
import { GET as getAlertRoute } from "@/app/api/alerts/[id]/route";
import { POST as acknowledgeRoute } from "@/app/api/alerts/[id]/acknowledge/route";
import { POST as resolveRoute } from "@/app/api/alerts/[id]/resolve/route";
import { POST as serviceRoute } from "@/app/api/alerts/[id]/service/route";
import { PATCH as patchPreferences } from "@/app/api/me/preferences/route";
import { POST as createScannerRoute } from "@/app/api/scanners/route";
import { PUT as setBaselineRoute } from "@/app/api/scanners/[id]/baselines/route";
import { PUT as putTolerancesRoute } from "@/app/api/scanners/[id]/tolerances/route";
import { POST as uploadScanRoute } from "@/app/api/scans/route";
import { db } from "@/db/client";
import { alerts, auditEvents, mailOutbox, type MailMessage } from "@/db/schema";
import { deliverDueMail } from "@/lib/mail/outbox-sender";
import { startSmtpSink, type ReceivedMail } from "@/lib/mail/smtp-sink";
import { smtpTransport } from "@/lib/mail/transport";

vi.mock("next-auth", async (importOriginal) =>
  (await import("../helpers/api")).withAnonymousSession(await importOriginal<typeof import("next-auth")>()),
);

// ── phantoms ──────────────────────────────────────────────────────────────────────────────────────────────────
// Gaussian point source on 0.5 mm pixels (jitteredPointSourceDicom): FWHM = 2√(2 ln 2)·σ (closed form), so σ = 1.0 mm gives 2.35 mm (4.7 px)
// and σ = 1.6 mm gives 3.77 mm, 60 % wider — far beyond the 15 % action level set below.
const GOOD_SIGMA_MM = 1.0;
const BAD_SIGMA_MM = 1.6;

interface ScanJson {
  scan: { id: number; testId: number; scannerId: number };
  analysis: { status: string } | null;
}

/** POST /api/scans as multipart/form-data, the way a browser or script uploads. */
async function upload(token: string, scannerId: number, bytes: Uint8Array, fileName: string): Promise<Response> {
  const form = new FormData();
  form.set("file", new Blob([bytes as BlobPart], { type: "application/dicom" }), fileName);
  form.set("scannerId", String(scannerId));
  form.set("method", "point");
  return uploadScanRoute(new Request("http://test/api/scans", { method: "POST", headers: { authorization: `Bearer ${token}` }, body: form }), noParams);
}

async function uploadOk(token: string, scannerId: number, bytes: Uint8Array, fileName: string): Promise<ScanJson> {
  const res = await upload(token, scannerId, bytes, fileName);
  const body = await json<ScanJson & ErrorJson>(res);
  expect(res.status, body.error).toBe(201);
  return body;
}

/** tests/helpers/api.ts apiRequest has no PUT. */
function putRequest(path: string, token: string, body: unknown): Request {
  return new Request(`http://test${path}`, { method: "PUT", headers: { authorization: `Bearer ${token}`, "content-type": "application/json" }, body: JSON.stringify(body) });
}

// ── SMTP ──────────────────────────────────────────────────────────────────────────────────────────────────────
/** A TCP port nobody listens on right now (the OS picks it; we close it again at once). */
async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const { port } = server.address() as AddressInfo;
  await new Promise<void>((resolve) => server.close(() => resolve()));
  return port;
}

/**
 * Run the sender until nothing due at `now` is left. The outbox is shared by every suite of the test database, so
 * other suites' due messages go through here too; assertions below look only at this file's addresses.
 */
async function deliverAll(transport: Transporter, now = new Date()) {
  const total = { sent: 0, retried: 0, failed: 0 };
  for (let round = 0; round < 20; round++) {
    const r = await deliverDueMail({ now, transport, random: () => 0.5 });
    total.sent += r.sent;
    total.retried += r.retried;
    total.failed += r.failed;
    if (r.sent + r.retried + r.failed === 0) break;
  }
  return total;
}

/** The decoded text/plain part of a raw RFC 5322 message (multipart/alternative from nodemailer, QP or base64). */
function textBody(raw: string): string {
  const boundary = /boundary="?([^";\r\n]+)"?/i.exec(raw)?.[1];
  const parts = boundary ? raw.split(`--${boundary}`) : [raw];
  const part = parts.find((p) => /content-type:\s*text\/plain/i.test(p));
  if (!part) throw new Error("no text/plain part in the message");
  const split = part.search(/\r?\n\r?\n/);
  const headers = part.slice(0, split);
  const body = part.slice(split).trim();
  const encoding = /content-transfer-encoding:\s*([\w-]+)/i.exec(headers)?.[1]?.toLowerCase() ?? "7bit";
  if (encoding === "base64") return Buffer.from(body.replace(/\s+/g, ""), "base64").toString("utf8");
  if (encoding === "quoted-printable") {
    // RFC 2045 §6.7: "=" at a line end is a soft break; "=XX" is one octet.
    const bytes = body.replace(/=\r?\n/g, "").replace(/=([0-9A-F]{2})/gi, (_, hex: string) => String.fromCharCode(parseInt(hex, 16)));
    return Buffer.from(bytes, "latin1").toString("utf8");
  }
  return body;
}

/** The message the sender delivered for one outbox row (it stamps the row id in a header; nodemailer writes it as "…-ID"). */
const mailForRow = (received: ReceivedMail[], rowId: number) => received.find((m) => new RegExp(`^X-Halfmax-Message-Id: ${rowId}\\r?$`, "im").test(m.raw));

const mailTo = (received: ReceivedMail[], address: string) => received.filter((m) => m.to.includes(address));

async function outboxRowsTo(addresses: string[]): Promise<MailMessage[]> {
  return db().select().from(mailOutbox).where(inArray(mailOutbox.toAddress, addresses));
}

// ── fixture: one scanner with two recipients who want mail at once and two who do not ─────────────────────────
let admin: TestUser;
let physicist: TestUser;
let engineer: TestUser;
let engineerOff: TestUser;
let engineerDigest: TestUser;
let otherEngineer: TestUser;
let lead: TestUser;
let scannerId: number;
let scannerName: string;
let testId: number;
let sink: Awaited<ReturnType<typeof startSmtpSink>>;
let sinkTransport: Transporter;

beforeAll(async () => {
  const sinkPort = await freePort();
  sink = await startSmtpSink({ port: sinkPort });
  sinkTransport = smtpTransport(`smtp://127.0.0.1:${sinkPort}`);
  [admin, physicist, engineer, engineerOff, engineerDigest, otherEngineer, lead] = await Promise.all([
    createTestUser("admin"),
    createTestUser("physicist"),
    createTestUser("engineer"),
    createTestUser("engineer"),
    createTestUser("engineer"),
    createTestUser("engineer"),
    createTestUser("lead"),
  ]);
  for (const [user, mailPreference] of [[engineerOff, "off"], [engineerDigest, "digest"]] as const) {
    const res = await patchPreferences(apiRequest("/api/me/preferences", { method: "PATCH", token: user.token, body: { mailPreference } }), noParams);
    expect(res.status).toBe(200);
  }
  const site = await createTestSite();
  scannerName = unique("CT Alerts");
  const created = await createScannerRoute(
    apiRequest("/api/scanners", {
      method: "POST",
      token: admin.token,
      body: { name: scannerName, siteId: site.id, modality: "CT", responsiblePhysicistId: physicist.id, engineerIds: [engineer.id, engineerOff.id, engineerDigest.id] },
    }),
    noParams,
  );
  expect(created.status).toBe(201);
  scannerId = (await json<{ id: number }>(created)).id;

  // Baseline from three good results (different sub-pixel centres and noise), then explicit levels.
  const baselineScans: number[] = [];
  for (const seed of [101, 102, 103]) {
    const r = await uploadOk(physicist.token, scannerId, jitteredPointSourceDicom(GOOD_SIGMA_MM, seed), `baseline-${seed}.dcm`);
    expect(r.analysis?.status).toBe("no-baseline");
    baselineScans.push(r.scan.id);
    testId = r.scan.testId;
  }
  const baseline = await setBaselineRoute(
    putRequest(`/api/scanners/${scannerId}/baselines`, physicist.token, { testId, scanIds: baselineScans, reason: "Acceptance test" }),
    routeParams(scannerId),
  );
  expect(baseline.status).toBe(201);
  const levels = (metric: string) => ({ testId, metric, mode: "relative", warning: 10, action: 15, source: "local decision (test fixture)" });
  const tol = await putTolerancesRoute(
    putRequest(`/api/scanners/${scannerId}/tolerances`, physicist.token, { tolerances: [levels("fwhmMm"), levels("mtf50")] }),
    routeParams(scannerId),
  );
  expect(tol.status).toBe(200);
}, 120_000);

afterAll(async () => {
  await sink?.close();
});

const recipients = () => [engineer.email, physicist.email];
const nonRecipients = () => [engineerOff.email, engineerDigest.email, otherEngineer.email, lead.email, admin.email];

let failingScanId: number;
let failingFile: Uint8Array;
let actionAlertId: number;

describe("an action-level upload", () => {
  it("POST /api/scans of a much wider PSF opens an action alert and queues one e-mail per recipient who wants mail at once", async () => {
    failingFile = jitteredPointSourceDicom(BAD_SIGMA_MM, 201);
    const res = await uploadOk(physicist.token, scannerId, failingFile, "wide-psf.dcm");
    expect(res.analysis?.status).toBe("action");
    failingScanId = res.scan.id;

    const opened = await db().select().from(alerts).where(eq(alerts.scannerId, scannerId));
    const action = opened.filter((a) => a.cause === "action");
    expect(action).toHaveLength(1);
    expect(action[0]!.state).toBe("open");
    expect(action[0]!.firstScanId).toBe(failingScanId);
    actionAlertId = action[0]!.id;

    const queued = (await outboxRowsTo([...recipients(), ...nonRecipients()])).filter((m) => m.dedupeKey?.startsWith(`alert:${actionAlertId}:`));
    expect(queued.map((m) => m.toAddress).sort()).toEqual(recipients().sort());
    expect(queued.every((m) => m.kind === "alert-action")).toBe(true);
  });

  it("deliverDueMail sends them over SMTP: the engineer and the physicist each receive one, with the scanner and a link to the result", async () => {
    await deliverAll(sinkTransport);
    const rows = await outboxRowsTo(recipients());
    for (const address of recipients()) {
      const mine = mailTo(sink.received, address);
      // Exactly one e-mail per recipient for the action-level result: the drift advisory is not raised on top of an
      // action alert (lib/qa/alert-rules rule 4).
      const aboutAction = rows.filter((m) => m.toAddress === address && m.dedupeKey?.startsWith(`alert:${actionAlertId}:`));
      expect(aboutAction).toHaveLength(1);
      expect(aboutAction[0]!.state).toBe("sent");
      expect(rows.filter((m) => m.toAddress === address)).toHaveLength(1);
      expect(mine).toHaveLength(1);
      const actionMail = mailForRow(mine, aboutAction[0]!.id);
      expect(actionMail, `action alert e-mail to ${address}`).toBeDefined();
      const text = textBody(actionMail!.raw);
      expect(text).toContain(scannerName);
      expect(text).toContain(`${process.env.APP_URL}/scans/${failingScanId}`);
      expect(text).toContain("Action level reached");
    }
    for (const address of nonRecipients()) {
      expect(mailTo(sink.received, address)).toHaveLength(0);
    }
    expect(await outboxRowsTo(nonRecipients())).toHaveLength(0);
  });
});

describe("duplicates and repeats", () => {
  it("POST /api/scans of the same file again answers 409 and neither queues nor sends another e-mail", async () => {
    const before = (await outboxRowsTo(recipients())).length;
    const receivedBefore = sink.received.length;
    // The writer draws fresh UIDs on every call: the very same bytes are needed for a duplicate.
    const res = await upload(physicist.token, scannerId, failingFile, "wide-psf-again.dcm");
    expect(res.status).toBe(409);
    expect((await json<{ existingScanId: number }>(res)).existingScanId).toBe(failingScanId);
    expect(await outboxRowsTo(recipients())).toHaveLength(before);
    await deliverAll(sinkTransport);
    expect(recipients().flatMap((a) => mailTo(sink.received.slice(receivedBefore), a))).toHaveLength(0);
  });

  it("a second action-level result updates the open alert (occurrences 2) instead of opening another", async () => {
    const alertsBefore = await db().select({ id: alerts.id }).from(alerts).where(eq(alerts.scannerId, scannerId));
    const res = await uploadOk(physicist.token, scannerId, jitteredPointSourceDicom(BAD_SIGMA_MM, 202), "wide-psf-2.dcm");
    expect(res.analysis?.status).toBe("action");
    const after = await db().select().from(alerts).where(eq(alerts.scannerId, scannerId));
    expect(after.map((a) => a.id).sort()).toEqual(alertsBefore.map((a) => a.id).sort());
    const action = after.find((a) => a.id === actionAlertId)!;
    expect(action.occurrences).toBe(2);
    expect(action.latestScanId).toBe(res.scan.id);
    expect(action.firstScanId).toBe(failingScanId);
    // The repeat is reported once per recipient, as "again".
    const repeatRows = (await outboxRowsTo(recipients())).filter((m) => m.dedupeKey === `alert:${actionAlertId}:scan:${res.scan.id}:user:${engineer.id}` || m.dedupeKey === `alert:${actionAlertId}:scan:${res.scan.id}:user:${physicist.id}`);
    expect(repeatRows).toHaveLength(2);
    expect(repeatRows.every((m) => m.subject.includes("Again"))).toBe(true);
  });
});

describe("the alert workflow over the routes", () => {
  it("GET /api/alerts shows the alert to its assigned engineer and hides it from an engineer of other scanners", async () => {
    const mine = await listAlertsRoute(apiRequest(`/api/alerts?state=open&scannerId=${scannerId}`, { token: engineer.token }), noParams);
    expect(mine.status).toBe(200);
    const rows = (await json<{ alerts: { id: number; cause: string; scannerName: string; serviceCount: number }[] }>(mine)).alerts;
    const row = rows.find((a) => a.id === actionAlertId);
    expect(row).toMatchObject({ cause: "action", scannerName, serviceCount: 0 });
    const theirs = await listAlertsRoute(apiRequest(`/api/alerts?scannerId=${scannerId}`, { token: otherEngineer.token }), noParams);
    expect((await json<{ alerts: unknown[] }>(theirs)).alerts).toHaveLength(0);
    expect((await getAlertRoute(apiRequest(`/api/alerts/${actionAlertId}`, { token: otherEngineer.token }), routeParams(actionAlertId))).status).toBe(404);
    expect((await listAlertsRoute(apiRequest("/api/alerts?state=sleeping", { token: engineer.token }), noParams)).status).toBe(422);
  });

  it("POST /api/alerts/{id}/acknowledge: 401 anonymous, 403 for a lead, 200 for the engineer, then 409", async () => {
    const path = `/api/alerts/${actionAlertId}/acknowledge`;
    expect((await acknowledgeRoute(apiRequest(path, { method: "POST" }), routeParams(actionAlertId))).status).toBe(401);
    expect((await acknowledgeRoute(apiRequest(path, { method: "POST", token: lead.token }), routeParams(actionAlertId))).status).toBe(403);
    // The route reads the optional body only when Content-Length says there is one, as browsers send it.
    const withNote = apiRequest(path, { method: "POST", token: engineer.token, body: { note: "On site tomorrow morning" } });
    const sized = new Request(withNote, { headers: { ...Object.fromEntries(withNote.headers), "content-length": String(Buffer.byteLength(JSON.stringify({ note: "On site tomorrow morning" }))) } });
    const ok = await acknowledgeRoute(sized, routeParams(actionAlertId));
    expect(ok.status).toBe(200);
    const { alert } = await json<{ alert: { state: string; acknowledgedById: number; acknowledgedAt: string } }>(ok);
    expect(alert.state).toBe("acknowledged");
    expect(alert.acknowledgedById).toBe(engineer.id);
    const again = await acknowledgeRoute(apiRequest(path, { method: "POST", token: engineer.token }), routeParams(actionAlertId));
    expect(again.status).toBe(409);
  });

  it("POST /api/alerts/{id}/service logs the engineer's service action (422 without a description)", async () => {
    const path = `/api/alerts/${actionAlertId}/service`;
    const bad = await serviceRoute(apiRequest(path, { method: "POST", token: engineer.token, body: { performedAt: new Date().toISOString(), description: "", parts: "" } }), routeParams(actionAlertId));
    expect(bad.status).toBe(422);
    const performedAt = new Date(Date.now() - 3_600_000).toISOString();
    const res = await serviceRoute(
      apiRequest(path, { method: "POST", token: engineer.token, body: { performedAt, description: "Recalibrated the detector; focal spot checked", parts: "Collimator blade assembly" } }),
      routeParams(actionAlertId),
    );
    expect(res.status).toBe(201);
    const { alert } = await json<{ alert: { state: string; serviceEvents: { description: string; parts: string; engineer: string; performedAt: string }[] } }>(res);
    expect(alert.state).toBe("acknowledged");
    expect(alert.serviceEvents).toHaveLength(1);
    expect(alert.serviceEvents[0]).toMatchObject({ description: "Recalibrated the detector; focal spot checked", parts: "Collimator blade assembly", engineer: engineer.name });
    expect(new Date(alert.serviceEvents[0]!.performedAt).toISOString()).toBe(performedAt);
  });

  it("POST /api/alerts/{id}/resolve: 403 for the engineer, 409 for the physicist before a passing re-test", async () => {
    const path = `/api/alerts/${actionAlertId}/resolve`;
    const body = { note: "Re-test passed after service" };
    expect((await resolveRoute(apiRequest(path, { method: "POST", token: engineer.token, body }), routeParams(actionAlertId))).status).toBe(403);
    const early = await resolveRoute(apiRequest(path, { method: "POST", token: physicist.token, body }), routeParams(actionAlertId));
    expect(early.status).toBe(409);
    expect((await json<ErrorJson>(early)).error).toMatch(/re-test/i);
  });

  let retestScanId: number;
  it("a passing re-test proposes resolution; the physicist then resolves the alert (422 without a note)", async () => {
    const retest = await uploadOk(physicist.token, scannerId, jitteredPointSourceDicom(GOOD_SIGMA_MM, 301), "retest.dcm");
    expect(retest.analysis?.status).toBe("pass");
    retestScanId = retest.scan.id;
    const detail = await getAlertRoute(apiRequest(`/api/alerts/${actionAlertId}`, { token: physicist.token }), routeParams(actionAlertId));
    const { alert } = await json<{ alert: { resolutionProposedAt: string | null; resolutionScanId: number | null; state: string } }>(detail);
    expect(alert.resolutionProposedAt).not.toBeNull();
    expect(alert.resolutionScanId).toBe(retestScanId);
    expect(alert.state).toBe("acknowledged");

    const path = `/api/alerts/${actionAlertId}/resolve`;
    expect((await resolveRoute(apiRequest(path, { method: "POST", token: physicist.token, body: { note: "" } }), routeParams(actionAlertId))).status).toBe(422);
    const res = await resolveRoute(apiRequest(path, { method: "POST", token: physicist.token, body: { note: "Re-test passed after recalibration" } }), routeParams(actionAlertId));
    expect(res.status).toBe(200);
    const resolved = (await json<{ alert: { state: string; resolvedById: number; resolutionNote: string; openKey: string | null } }>(res)).alert;
    expect(resolved).toMatchObject({ state: "resolved", resolvedById: physicist.id, resolutionNote: "Re-test passed after recalibration", openKey: null });
    const listed = await listAlertsRoute(apiRequest(`/api/alerts?state=resolved&scannerId=${scannerId}`, { token: engineer.token }), noParams);
    const row = (await json<{ alerts: { id: number; resolvedByName: string; acknowledgedByName: string; serviceCount: number }[] }>(listed)).alerts.find((a) => a.id === actionAlertId);
    expect(row).toMatchObject({ resolvedByName: physicist.name, acknowledgedByName: engineer.name, serviceCount: 1 });
  });

  it("every step is in the audit trail with its actor", async () => {
    const events = await db()
      .select({ action: auditEvents.action, actor: auditEvents.actorUserId, details: auditEvents.details })
      .from(auditEvents)
      .where(and(eq(auditEvents.entityType, "alert"), eq(auditEvents.entityId, String(actionAlertId))));
    const byAction = (action: string) => events.filter((e) => e.action === action);
    expect(byAction("alert.open")).toEqual([expect.objectContaining({ actor: physicist.id, details: expect.objectContaining({ cause: "action", scanId: failingScanId }) })]);
    expect(byAction("alert.repeat")).toHaveLength(1);
    expect(byAction("alert.acknowledge")).toEqual([expect.objectContaining({ actor: engineer.id, details: { note: "On site tomorrow morning" } })]);
    expect(byAction("alert.resolution_proposed")).toEqual([expect.objectContaining({ details: expect.objectContaining({ scanId: retestScanId }) })]);
    expect(byAction("alert.resolve")).toEqual([expect.objectContaining({ actor: physicist.id, details: expect.objectContaining({ resolutionScanId: retestScanId }) })]);
    const service = await db()
      .select({ actor: auditEvents.actorUserId, details: auditEvents.details })
      .from(auditEvents)
      .where(and(eq(auditEvents.action, "service.log"), eq(auditEvents.scannerId, scannerId)));
    expect(service).toEqual([expect.objectContaining({ actor: engineer.id, details: expect.objectContaining({ alertId: actionAlertId, parts: "Collimator blade assembly" }) })]);
  });
});

describe("delivery with the SMTP server down", () => {
  it("deliverDueMail retries with back-off, then delivers exactly once after the server is back", async () => {
    const to = `retry-${Date.now()}@example.test`;
    const queued = await sendTestMail(apiRequest("/api/admin/mail/test", { method: "POST", token: admin.token, body: { to } }), noParams);
    expect(queued.status).toBe(202);
    const [row] = await db().select().from(mailOutbox).where(eq(mailOutbox.toAddress, to));
    expect(row).toMatchObject({ state: "pending", attempts: 0 });

    const down = smtpTransport(`smtp://127.0.0.1:${await freePort()}`);
    const t0 = new Date();
    await deliverAll(down, t0);
    const [failed] = await db().select().from(mailOutbox).where(eq(mailOutbox.id, row!.id));
    expect(failed!.state).toBe("pending");
    expect(failed!.attempts).toBe(1);
    expect(failed!.lastError).toBeTruthy();
    expect(failed!.nextAttemptAt.getTime()).toBeGreaterThan(t0.getTime());

    // Before nextAttemptAt the message is not due, even with the server back.
    await deliverAll(sinkTransport, new Date(failed!.nextAttemptAt.getTime() - 1_000));
    expect(mailTo(sink.received, to)).toHaveLength(0);

    const later = new Date(failed!.nextAttemptAt.getTime() + 1_000);
    await deliverAll(sinkTransport, later);
    expect(mailTo(sink.received, to)).toHaveLength(1);
    const [sent] = await db().select().from(mailOutbox).where(eq(mailOutbox.id, row!.id));
    expect(sent).toMatchObject({ state: "sent", attempts: 2, lastError: null });

    await deliverDueMail({ now: later, transport: sinkTransport, random: () => 0.5 });
    expect(mailTo(sink.received, to)).toHaveLength(1);
    const [still] = await db().select().from(mailOutbox).where(eq(mailOutbox.id, row!.id));
    expect(still).toMatchObject({ state: "sent", attempts: 2 });
    expect(still!.sentAt?.getTime()).toBe(sent!.sentAt?.getTime());
  });
});

describe("POST /api/admin/mail/test", () => {
  it("queues a message through the outbox that is delivered; 403 for a non-admin; 422 for a bad address; 401 anonymous", async () => {
    const to = `test-mail-${Date.now()}@example.test`;
    expect((await sendTestMail(apiRequest("/api/admin/mail/test", { method: "POST", body: { to } }), noParams)).status).toBe(401);
    expect((await sendTestMail(apiRequest("/api/admin/mail/test", { method: "POST", token: physicist.token, body: { to } }), noParams)).status).toBe(403);
    const bad = await sendTestMail(apiRequest("/api/admin/mail/test", { method: "POST", token: admin.token, body: { to: "not-an-address" } }), noParams);
    expect(bad.status).toBe(422);
    expect((await json<ErrorJson>(bad)).issues?.[0]?.path).toBe("to");

    const res = await sendTestMail(apiRequest("/api/admin/mail/test", { method: "POST", token: admin.token, body: { to } }), noParams);
    expect(res.status).toBe(202);
    const rows = await db().select().from(mailOutbox).where(and(eq(mailOutbox.toAddress, to), eq(mailOutbox.kind, "test")));
    expect(rows).toHaveLength(1);
    await deliverAll(sinkTransport);
    const received = mailTo(sink.received, to);
    expect(received).toHaveLength(1);
    expect(textBody(received[0]!.raw)).toContain("outgoing e-mail works");
    const audit = await db().select().from(auditEvents).where(and(eq(auditEvents.action, "mail.test"), eq(auditEvents.entityId, to)));
    expect(audit).toHaveLength(1);
  });
});
