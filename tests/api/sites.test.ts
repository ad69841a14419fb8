// Route tests for /api/sites and /api/sites/{id} against the real test database.
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { apiRequest, createTestSite, createTestUser, createUserWithRevokedToken, json, noParams, routeParams, unique, type ErrorJson, type TestUser } from "../helpers/api";
import { GET as listSites, POST as createSite } from "@/app/api/sites/route";
import { DELETE as deleteSite, PATCH as patchSite } from "@/app/api/sites/[id]/route";
import { db } from "@/db/client";
import { auditEvents, scanners, sites } from "@/db/schema";

vi.mock("next-auth", async (importOriginal) =>
  (await import("../helpers/api")).withAnonymousSession(await importOriginal<typeof import("next-auth")>()),
);

interface SiteJson {
  id: number;
  name: string;
  city: string;
  scannerCount: number;
}

let admin: TestUser;
let physicist: TestUser;

beforeAll(async () => {
  admin = await createTestUser("admin");
  physicist = await createTestUser("physicist");
});

async function listAsAdmin(): Promise<SiteJson[]> {
  const res = await listSites(apiRequest("/api/sites", { token: admin.token }), noParams);
  expect(res.status).toBe(200);
  return (await json<{ sites: SiteJson[] }>(res)).sites;
}

describe("GET /api/sites", () => {
  it("GET /api/sites without credentials answers 401", async () => {
    expect((await listSites(apiRequest("/api/sites"), noParams)).status).toBe(401);
  });

  it("GET /api/sites with a revoked token answers 401", async () => {
    const revoked = await createUserWithRevokedToken("admin");
    expect((await listSites(apiRequest("/api/sites", { token: revoked.token }), noParams)).status).toBe(401);
  });

  it("GET /api/sites is open to every role and counts each site's scanners", async () => {
    const site = await createTestSite();
    await db().insert(scanners).values([
      { siteId: site.id, name: "Counted A", modality: "CT" },
      { siteId: site.id, name: "Counted B", modality: "DX", active: false },
    ]);
    const engineer = await createTestUser("engineer");
    const res = await listSites(apiRequest("/api/sites", { token: engineer.token }), noParams);
    expect(res.status).toBe(200);
    const listed = (await json<{ sites: SiteJson[] }>(res)).sites.find((s) => s.id === site.id);
    expect(listed).toMatchObject({ name: site.name, city: "Testham", scannerCount: 2 });
  });
});

describe("POST /api/sites", () => {
  it("POST /api/sites as a physicist answers 403", async () => {
    const name = unique("Forbidden site");
    const res = await createSite(apiRequest("/api/sites", { method: "POST", token: physicist.token, body: { name } }), noParams);
    expect(res.status).toBe(403);
    expect((await listAsAdmin()).some((s) => s.name === name)).toBe(false);
  });

  it("POST /api/sites with an empty name answers 422 naming the field", async () => {
    const res = await createSite(apiRequest("/api/sites", { method: "POST", token: admin.token, body: { name: "   ", city: "X" } }), noParams);
    expect(res.status).toBe(422);
    const body = await json<ErrorJson>(res);
    expect(body.error).toContain("name");
    expect(body.issues).toEqual([{ path: "name", message: "Give the site a name" }]);
  });

  it("POST /api/sites with a name already in use answers 409", async () => {
    const existing = await createTestSite();
    const res = await createSite(apiRequest("/api/sites", { method: "POST", token: admin.token, body: { name: existing.name } }), noParams);
    expect(res.status).toBe(409);
    expect((await json<ErrorJson>(res)).error).toContain(existing.name);
  });

  it("POST /api/sites creates a site, PATCH renames it, DELETE removes it", async () => {
    const name = unique("  Riverside Annex");
    const created = await createSite(apiRequest("/api/sites", { method: "POST", token: admin.token, body: { name, city: "Riverside" } }), noParams);
    expect(created.status).toBe(201);
    const { site } = await json<{ site: SiteJson }>(created);
    expect(site.name).toBe(name.trim()); // the schema trims
    expect((await listAsAdmin()).find((s) => s.id === site.id)).toMatchObject({ name: name.trim(), city: "Riverside", scannerCount: 0 });

    const newName = unique("Riverside Centre");
    const renamed = await patchSite(
      apiRequest(`/api/sites/${site.id}`, { method: "PATCH", token: admin.token, body: { name: newName, city: "Riverside East" } }),
      routeParams(site.id),
    );
    expect(renamed.status).toBe(200);
    expect((await listAsAdmin()).find((s) => s.id === site.id)).toMatchObject({ name: newName, city: "Riverside East" });

    const removed = await deleteSite(apiRequest(`/api/sites/${site.id}`, { method: "DELETE", token: admin.token }), routeParams(site.id));
    expect(removed.status).toBe(200);
    expect((await listAsAdmin()).some((s) => s.id === site.id)).toBe(false);

    const actions = await db()
      .select({ action: auditEvents.action })
      .from(auditEvents)
      .where(and(eq(auditEvents.entityType, "site"), eq(auditEvents.entityId, String(site.id))));
    expect(actions.map((a) => a.action).sort()).toEqual(["site.create", "site.delete", "site.update"]);
  });
});

describe("PATCH and DELETE /api/sites/{id}", () => {
  it("PATCH /api/sites/{id} as a lead answers 403 and keeps the name", async () => {
    const site = await createTestSite();
    const lead = await createTestUser("lead");
    const res = await patchSite(apiRequest(`/api/sites/${site.id}`, { method: "PATCH", token: lead.token, body: { name: unique("Renamed") } }), routeParams(site.id));
    expect(res.status).toBe(403);
    const [row] = await db().select().from(sites).where(eq(sites.id, site.id));
    expect(row?.name).toBe(site.name);
  });

  it("PATCH /api/sites/{id} with only a name keeps the city", async () => {
    const site = await createTestSite();
    const res = await patchSite(apiRequest(`/api/sites/${site.id}`, { method: "PATCH", token: admin.token, body: { name: unique("Renamed") } }), routeParams(site.id));
    expect(res.status).toBe(200);
    expect((await listAsAdmin()).find((s) => s.id === site.id)?.city).toBe("Testham");
  });

  it("PATCH /api/sites/{id} with a name longer than 120 characters answers 422 naming the field", async () => {
    const site = await createTestSite();
    const res = await patchSite(apiRequest(`/api/sites/${site.id}`, { method: "PATCH", token: admin.token, body: { name: "x".repeat(121) } }), routeParams(site.id));
    expect(res.status).toBe(422);
    expect((await json<ErrorJson>(res)).issues?.map((i) => i.path)).toEqual(["name"]);
  });

  it("PATCH /api/sites/{id} to another site's name answers 409", async () => {
    const a = await createTestSite();
    const b = await createTestSite();
    const res = await patchSite(apiRequest(`/api/sites/${a.id}`, { method: "PATCH", token: admin.token, body: { name: b.name } }), routeParams(a.id));
    expect(res.status).toBe(409);
  });

  it("PATCH and DELETE /api/sites/{id} of an unknown id answer 404", async () => {
    const patch = await patchSite(apiRequest("/api/sites/999999999", { method: "PATCH", token: admin.token, body: { name: unique("Nowhere") } }), routeParams(999999999));
    expect(patch.status).toBe(404);
    const del = await deleteSite(apiRequest("/api/sites/999999999", { method: "DELETE", token: admin.token }), routeParams(999999999));
    expect(del.status).toBe(404);
  });

  it("DELETE /api/sites/{id} of a site that still has scanners answers 409 and keeps it", async () => {
    const site = await createTestSite();
    await db().insert(scanners).values({ siteId: site.id, name: "Keeps the site", modality: "MR" });
    const res = await deleteSite(apiRequest(`/api/sites/${site.id}`, { method: "DELETE", token: admin.token }), routeParams(site.id));
    expect(res.status).toBe(409);
    expect((await json<ErrorJson>(res)).error).toMatch(/still has scanners/);
    expect((await listAsAdmin()).some((s) => s.id === site.id)).toBe(true);
  });
});
