// Route tests for /api/scanners and /api/scanners/{id} against the real test database.
import { randomBytes } from "node:crypto";
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { apiRequest, createTestSite, createTestUser, createUserWithRevokedToken, json, noParams, routeParams, unique, type ErrorJson, type TestUser } from "../helpers/api";
import { GET as listScanners, POST as createScanner } from "@/app/api/scanners/route";
import { DELETE as deleteScanner, GET as getScanner, PATCH as patchScanner } from "@/app/api/scanners/[id]/route";
import { db } from "@/db/client";
import { scannerEngineers, scanners, scans } from "@/db/schema";

vi.mock("next-auth", async (importOriginal) =>
  (await import("../helpers/api")).withAnonymousSession(await importOriginal<typeof import("next-auth")>()),
);

interface ScannerJson {
  id: number;
  name: string;
  siteId: number;
  siteName: string;
  modality: string;
  manufacturer: string;
  model: string;
  serialNumber: string;
  location: string;
  responsiblePhysicistId: number | null;
  responsiblePhysicistName: string | null;
  alertOnWarning: boolean;
  active: boolean;
  engineers: { id: number; name: string; email: string }[];
}

let admin: TestUser;
let physicist: TestUser;
let engineer: TestUser;
let site: { id: number; name: string };

beforeAll(async () => {
  admin = await createTestUser("admin");
  physicist = await createTestUser("physicist");
  engineer = await createTestUser("engineer");
  site = await createTestSite();
});

const scannerBody = (overrides: Record<string, unknown> = {}) => ({
  name: unique("CT"),
  siteId: site.id,
  modality: "CT",
  manufacturer: "Testwerk",
  model: "T-64",
  serialNumber: "SN-0001",
  location: "Room 4",
  ...overrides,
});

async function create(body: Record<string, unknown>, token = admin.token): Promise<Response> {
  return createScanner(apiRequest("/api/scanners", { method: "POST", token, body }), noParams);
}

async function createOk(overrides: Record<string, unknown> = {}): Promise<number> {
  const res = await create(scannerBody(overrides));
  expect(res.status).toBe(201);
  return (await json<{ id: number }>(res)).id;
}

async function list(token: string, includeInactive = false): Promise<ScannerJson[]> {
  const res = await listScanners(apiRequest(`/api/scanners${includeInactive ? "?includeInactive=1" : ""}`, { token }), noParams);
  expect(res.status).toBe(200);
  return (await json<{ scanners: ScannerJson[] }>(res)).scanners;
}

describe("GET /api/scanners", () => {
  it("GET /api/scanners without credentials answers 401", async () => {
    expect((await listScanners(apiRequest("/api/scanners"), noParams)).status).toBe(401);
  });

  it("GET /api/scanners with a revoked token answers 401", async () => {
    const revoked = await createUserWithRevokedToken("physicist");
    expect((await listScanners(apiRequest("/api/scanners", { token: revoked.token }), noParams)).status).toBe(401);
  });

  it("GET /api/scanners for an engineer lists only the scanners assigned to them", async () => {
    const assigned = await createOk({ engineerIds: [engineer.id] });
    const other = await createOk();
    const ids = (await list(engineer.token, true)).map((s) => s.id);
    expect(ids).toContain(assigned);
    expect(ids).not.toContain(other);
    // Physicists see the whole fleet.
    const all = (await list(physicist.token)).map((s) => s.id);
    expect(all).toEqual(expect.arrayContaining([assigned, other]));
  });

  it("GET /api/scanners/{id} of a scanner not assigned to the engineer answers 404", async () => {
    const other = await createOk();
    const res = await getScanner(apiRequest(`/api/scanners/${other}`, { token: engineer.token }), routeParams(other));
    expect(res.status).toBe(404);
  });
});

describe("POST /api/scanners", () => {
  it("POST /api/scanners as a physicist answers 403 and creates nothing", async () => {
    const body = scannerBody();
    const res = await create(body, physicist.token);
    expect(res.status).toBe(403);
    expect((await list(admin.token, true)).some((s) => s.name === body.name)).toBe(false);
  });

  it("POST /api/scanners with an unknown modality answers 422 naming the field", async () => {
    const res = await create(scannerBody({ modality: "XR" }));
    expect(res.status).toBe(422);
    const body = await json<ErrorJson>(res);
    expect(body.error).toContain("modality");
    expect(body.issues?.map((i) => i.path)).toEqual(["modality"]);
  });

  it("POST /api/scanners without a name or site answers 422 naming both fields", async () => {
    const res = await create(scannerBody({ name: "", siteId: "" }));
    expect(res.status).toBe(422);
    const issues = (await json<ErrorJson>(res)).issues ?? [];
    expect(issues).toEqual(
      expect.arrayContaining([
        { path: "name", message: "Give the scanner a name" },
        { path: "siteId", message: "Choose a site" },
      ]),
    );
  });

  it("POST /api/scanners with a site that does not exist answers 422", async () => {
    const res = await create(scannerBody({ siteId: 999999999 }));
    expect(res.status).toBe(422);
    expect((await json<ErrorJson>(res)).error).toMatch(/Site 999999999 does not exist/);
  });

  it("POST /api/scanners with an engineer as responsible physicist answers 422", async () => {
    const res = await create(scannerBody({ responsiblePhysicistId: engineer.id }));
    expect(res.status).toBe(422);
    expect((await json<ErrorJson>(res)).error).toMatch(/physicist role/);
  });

  it("POST /api/scanners with a name already used at the same site answers 409", async () => {
    const name = unique("MR");
    await createOk({ name, modality: "MR" });
    const res = await create(scannerBody({ name, modality: "MR" }));
    expect(res.status).toBe(409);
    expect((await json<ErrorJson>(res)).error).toContain(name);
    // The same name at another site is fine.
    const otherSite = await createTestSite();
    expect((await create(scannerBody({ name, siteId: otherSite.id }))).status).toBe(201);
  });

  it("POST /api/scanners creates a scanner with physicist and engineers that the list then shows", async () => {
    const body = scannerBody({ modality: "NM", responsiblePhysicistId: physicist.id, engineerIds: [engineer.id], alertOnWarning: true });
    const id = await createOk(body);
    const listed = (await list(admin.token)).find((s) => s.id === id);
    expect(listed).toMatchObject({
      name: body.name,
      siteId: site.id,
      siteName: site.name,
      modality: "NM",
      manufacturer: "Testwerk",
      model: "T-64",
      serialNumber: "SN-0001",
      location: "Room 4",
      responsiblePhysicistId: physicist.id,
      responsiblePhysicistName: physicist.name,
      alertOnWarning: true,
      active: true,
    });
    expect(listed?.engineers.map((e) => e.id)).toEqual([engineer.id]);
  });
});

describe("PATCH and DELETE /api/scanners/{id}", () => {
  it("PATCH /api/scanners/{id} as an engineer answers 403, even for an assigned scanner", async () => {
    const id = await createOk({ engineerIds: [engineer.id] });
    const res = await patchScanner(apiRequest(`/api/scanners/${id}`, { method: "PATCH", token: engineer.token, body: { location: "Moved" } }), routeParams(id));
    expect(res.status).toBe(403);
  });

  it("PATCH /api/scanners/{id} with a serial number over 64 characters answers 422 naming the field", async () => {
    const id = await createOk();
    const res = await patchScanner(apiRequest(`/api/scanners/${id}`, { method: "PATCH", token: admin.token, body: { serialNumber: "9".repeat(65) } }), routeParams(id));
    expect(res.status).toBe(422);
    expect((await json<ErrorJson>(res)).issues?.map((i) => i.path)).toEqual(["serialNumber"]);
  });

  it("PATCH /api/scanners/{id} to the name of another scanner at the site answers 409", async () => {
    const taken = unique("DX");
    await createOk({ name: taken });
    const id = await createOk();
    const res = await patchScanner(apiRequest(`/api/scanners/${id}`, { method: "PATCH", token: admin.token, body: { name: taken } }), routeParams(id));
    expect(res.status).toBe(409);
  });

  it("GET, PATCH and DELETE /api/scanners/{id} of an unknown id answer 404", async () => {
    const missing = 999999999;
    expect((await getScanner(apiRequest(`/api/scanners/${missing}`, { token: admin.token }), routeParams(missing))).status).toBe(404);
    expect((await patchScanner(apiRequest(`/api/scanners/${missing}`, { method: "PATCH", token: admin.token, body: { location: "x" } }), routeParams(missing))).status).toBe(404);
    expect((await deleteScanner(apiRequest(`/api/scanners/${missing}`, { method: "DELETE", token: admin.token }), routeParams(missing))).status).toBe(404);
  });

  it("PATCH /api/scanners/{id} changes fields and replaces the engineer list", async () => {
    const second = await createTestUser("engineer");
    const id = await createOk({ engineerIds: [engineer.id] });
    const res = await patchScanner(
      apiRequest(`/api/scanners/${id}`, { method: "PATCH", token: admin.token, body: { location: "Room 9", engineerIds: [second.id], responsiblePhysicistId: physicist.id } }),
      routeParams(id),
    );
    expect(res.status).toBe(200);
    const { scanner } = await json<{ scanner: ScannerJson }>(res);
    expect(scanner).toMatchObject({ id, location: "Room 9", responsiblePhysicistId: physicist.id });
    expect(scanner.engineers.map((e) => e.id)).toEqual([second.id]);
    expect((await list(engineer.token, true)).some((s) => s.id === id)).toBe(false);
    expect((await list(second.token, true)).some((s) => s.id === id)).toBe(true);
  });

  it("PATCH /api/scanners/{id} with one field leaves the other fields and the engineer list unchanged", async () => {
    const id = await createOk({ engineerIds: [engineer.id], alertOnWarning: true });
    const res = await patchScanner(apiRequest(`/api/scanners/${id}`, { method: "PATCH", token: admin.token, body: { location: "Room 12" } }), routeParams(id));
    expect(res.status).toBe(200);
    const { scanner } = await json<{ scanner: ScannerJson }>(res);
    expect(scanner).toMatchObject({ location: "Room 12", manufacturer: "Testwerk", model: "T-64", serialNumber: "SN-0001", alertOnWarning: true });
    expect(scanner.engineers.map((e) => e.id)).toEqual([engineer.id]);
  });

  it("DELETE /api/scanners/{id} of a scanner without scans deletes it and its engineer links", async () => {
    const id = await createOk({ engineerIds: [engineer.id] });
    const res = await deleteScanner(apiRequest(`/api/scanners/${id}`, { method: "DELETE", token: admin.token }), routeParams(id));
    expect(res.status).toBe(200);
    expect(await json(res)).toEqual({ outcome: "deleted" });
    expect((await list(admin.token, true)).some((s) => s.id === id)).toBe(false);
    expect(await db().select().from(scannerEngineers).where(eq(scannerEngineers.scannerId, id))).toHaveLength(0);
  });

  it("DELETE /api/scanners/{id} of a scanner with scans retires it: hidden by default, listed with includeInactive", async () => {
    const id = await createOk();
    await db().insert(scans).values({
      scannerId: id,
      uploadedById: admin.id,
      fileSha256: randomBytes(32).toString("hex"),
      fileName: "edge.dcm",
      fileSize: 1024,
      format: "dicom",
      storageKey: `test/${id}/edge.dcm`,
      acquiredAt: new Date(),
      attributes: {},
    });
    const res = await deleteScanner(apiRequest(`/api/scanners/${id}`, { method: "DELETE", token: admin.token }), routeParams(id));
    expect(res.status).toBe(200);
    expect(await json(res)).toEqual({ outcome: "retired" });
    expect((await list(admin.token)).some((s) => s.id === id)).toBe(false);
    expect((await list(admin.token, true)).find((s) => s.id === id)?.active).toBe(false);
    const [row] = await db().select({ active: scanners.active }).from(scanners).where(eq(scanners.id, id));
    expect(row?.active).toBe(false);
  });
});
