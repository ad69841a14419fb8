// Route tests for /api/users, /api/users/{id} and /api/me/preferences against the real test database.
import { randomUUID } from "node:crypto";
import { and, desc, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { apiRequest, createTestUser, createUserWithRevokedToken, getUserRow, json, noParams, routeParams, unique, type ErrorJson, type TestUser } from "../helpers/api";
import { GET as listUsers, POST as createUser } from "@/app/api/users/route";
import { PATCH as patchUser } from "@/app/api/users/[id]/route";
import { GET as getMe } from "@/app/api/me/route";
import { PATCH as patchPreferences } from "@/app/api/me/preferences/route";
import { db } from "@/db/client";
import { auditEvents, mailOutbox, userTokens } from "@/db/schema";

vi.mock("next-auth", async (importOriginal) =>
  (await import("../helpers/api")).withAnonymousSession(await importOriginal<typeof import("next-auth")>()),
);

interface UserJson {
  id: number;
  email: string;
  name: string;
  role: string;
  active: boolean;
  mailPreference: string;
  hasPassword: boolean;
  passwordHash?: unknown;
}

let admin: TestUser;
let physicist: TestUser;

beforeAll(async () => {
  admin = await createTestUser("admin");
  physicist = await createTestUser("physicist");
});

const newUserBody = (overrides: Record<string, unknown> = {}) => ({
  email: `new-${randomUUID()}@example.test`,
  name: unique("New user"),
  role: "lead",
  password: "long-enough-password",
  ...overrides,
});

describe("GET /api/users", () => {
  it("GET /api/users without credentials answers 401", async () => {
    const res = await listUsers(apiRequest("/api/users"), noParams);
    expect(res.status).toBe(401);
    expect((await json<ErrorJson>(res)).code).toBe("unauthorized");
  });

  it("GET /api/users with a revoked token answers 401", async () => {
    const revoked = await createUserWithRevokedToken("admin");
    const res = await listUsers(apiRequest("/api/users", { token: revoked.token }), noParams);
    expect(res.status).toBe(401);
    expect((await json<ErrorJson>(res)).error).toMatch(/revoked/);
  });

  it("GET /api/users with a malformed Authorization header answers 401", async () => {
    const req = new Request("http://test/api/users", { headers: { authorization: "Token abc" } });
    expect((await listUsers(req, noParams)).status).toBe(401);
  });

  it("GET /api/users as a physicist answers 403", async () => {
    const res = await listUsers(apiRequest("/api/users", { token: physicist.token }), noParams);
    expect(res.status).toBe(403);
    expect((await json<ErrorJson>(res)).code).toBe("forbidden");
  });

  it("GET /api/users as an admin lists users without password hashes", async () => {
    const res = await listUsers(apiRequest("/api/users", { token: admin.token }), noParams);
    expect(res.status).toBe(200);
    const { users } = await json<{ users: UserJson[] }>(res);
    const me = users.find((u) => u.id === admin.id);
    expect(me).toMatchObject({ email: admin.email, role: "admin", active: true, hasPassword: false });
    expect(users.every((u) => !("passwordHash" in u))).toBe(true);
  });
});

describe("POST /api/users", () => {
  it("POST /api/users as a lead answers 403 and creates nobody", async () => {
    const lead = await createTestUser("lead");
    const body = newUserBody();
    const res = await createUser(apiRequest("/api/users", { method: "POST", token: lead.token, body }), noParams);
    expect(res.status).toBe(403);
    const list = await json<{ users: UserJson[] }>(await listUsers(apiRequest("/api/users", { token: admin.token }), noParams));
    expect(list.users.some((u) => u.email === body.email)).toBe(false);
  });

  it("POST /api/users with an invalid e-mail answers 422 naming the field", async () => {
    const res = await createUser(apiRequest("/api/users", { method: "POST", token: admin.token, body: newUserBody({ email: "not-an-address" }) }), noParams);
    expect(res.status).toBe(422);
    const body = await json<ErrorJson>(res);
    expect(body.code).toBe("validation_failed");
    expect(body.error).toContain("email");
    expect(body.issues?.map((i) => i.path)).toContain("email");
  });

  it("POST /api/users with an unknown role or a short password answers 422 naming each field", async () => {
    const res = await createUser(
      apiRequest("/api/users", { method: "POST", token: admin.token, body: newUserBody({ role: "superuser", password: "short" }) }),
      noParams,
    );
    expect(res.status).toBe(422);
    const paths = (await json<ErrorJson>(res)).issues?.map((i) => i.path);
    expect(paths).toEqual(expect.arrayContaining(["role", "password"]));
  });

  it("POST /api/users with a body that is not JSON answers 400", async () => {
    const res = await createUser(apiRequest("/api/users", { method: "POST", token: admin.token, body: "{not json" }), noParams);
    expect(res.status).toBe(400);
  });

  it("POST /api/users with an e-mail already in use answers 409", async () => {
    const res = await createUser(
      apiRequest("/api/users", { method: "POST", token: admin.token, body: newUserBody({ email: physicist.email.toUpperCase() }) }),
      noParams,
    );
    expect(res.status).toBe(409);
    expect((await json<ErrorJson>(res)).error).toContain(physicist.email);
  });

  it("POST /api/users with a password creates an active user who is listed and not invited", async () => {
    const body = newUserBody();
    const res = await createUser(apiRequest("/api/users", { method: "POST", token: admin.token, body }), noParams);
    expect(res.status).toBe(201);
    const created = await json<{ id: number; invited: boolean }>(res);
    expect(created.invited).toBe(false);
    const list = await json<{ users: UserJson[] }>(await listUsers(apiRequest("/api/users", { token: admin.token }), noParams));
    expect(list.users.find((u) => u.id === created.id)).toMatchObject({ email: body.email, name: body.name, role: "lead", active: true, hasPassword: true });
    const stored = await getUserRow(created.id);
    expect(stored?.passwordHash).toMatch(/^\$2[aby]\$10\$/); // bcrypt, cost 10 (lib/auth/password.ts)
    expect(stored?.passwordHash).not.toContain(body.password);
  });

  it("POST /api/users with an empty password queues an invitation e-mail with a one-time link", async () => {
    const body = newUserBody({ password: "" });
    const res = await createUser(apiRequest("/api/users", { method: "POST", token: admin.token, body }), noParams);
    expect(res.status).toBe(201);
    const created = await json<{ id: number; invited: boolean }>(res);
    expect(created.invited).toBe(true);
    const mails = await db().select().from(mailOutbox).where(eq(mailOutbox.toAddress, body.email));
    expect(mails).toHaveLength(1);
    expect(mails[0]!.kind).toBe("invitation");
    expect(mails[0]!.textBody).toMatch(/\/set-password\?token=inv_/);
    const tokens = await db().select().from(userTokens).where(and(eq(userTokens.userId, created.id), eq(userTokens.kind, "invite")));
    expect(tokens).toHaveLength(1);
    expect((await getUserRow(created.id))?.passwordHash).toBeNull();
  });
});

describe("PATCH /api/users/{id}", () => {
  it("PATCH /api/users/{id} as a physicist answers 403 and changes nothing", async () => {
    const target = await createTestUser("lead");
    const res = await patchUser(apiRequest(`/api/users/${target.id}`, { method: "PATCH", token: physicist.token, body: { role: "admin" } }), routeParams(target.id));
    expect(res.status).toBe(403);
    expect((await getUserRow(target.id))?.role).toBe("lead");
  });

  it("PATCH /api/users/{id} for an unknown id answers 404", async () => {
    const res = await patchUser(apiRequest("/api/users/999999999", { method: "PATCH", token: admin.token, body: { role: "lead" } }), routeParams(999999999));
    expect(res.status).toBe(404);
    const bad = await patchUser(apiRequest("/api/users/abc", { method: "PATCH", token: admin.token, body: { role: "lead" } }), routeParams("abc"));
    expect(bad.status).toBe(404);
  });

  it("PATCH /api/users/{id} with an unknown role answers 422 naming the field", async () => {
    const target = await createTestUser("lead");
    const res = await patchUser(apiRequest(`/api/users/${target.id}`, { method: "PATCH", token: admin.token, body: { role: "owner" } }), routeParams(target.id));
    expect(res.status).toBe(422);
    expect((await json<ErrorJson>(res)).error).toContain("role");
  });

  it("PATCH /api/users/{id} changes the role, then deactivation locks the user's token out and reactivation lets it in", async () => {
    const target = await createTestUser("lead");
    const roleRes = await patchUser(apiRequest(`/api/users/${target.id}`, { method: "PATCH", token: admin.token, body: { role: "physicist" } }), routeParams(target.id));
    expect(roleRes.status).toBe(200);
    expect((await json<{ user: UserJson }>(roleRes)).user).toMatchObject({ id: target.id, role: "physicist", active: true });

    const off = await patchUser(apiRequest(`/api/users/${target.id}`, { method: "PATCH", token: admin.token, body: { active: false } }), routeParams(target.id));
    expect(off.status).toBe(200);
    expect((await json<{ user: UserJson }>(off)).user.active).toBe(false);
    expect((await getMe(apiRequest("/api/me", { token: target.token }), noParams)).status).toBe(401);

    const on = await patchUser(apiRequest(`/api/users/${target.id}`, { method: "PATCH", token: admin.token, body: { active: true } }), routeParams(target.id));
    expect(on.status).toBe(200);
    const me = await getMe(apiRequest("/api/me", { token: target.token }), noParams);
    expect(me.status).toBe(200);
    expect((await json<{ user: { role: string } }>(me)).user.role).toBe("physicist");

    const audit = await db()
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.entityType, "user"), eq(auditEvents.entityId, String(target.id)), eq(auditEvents.action, "user.update")));
    expect(audit).toHaveLength(3);
  });

  it("PATCH /api/users/{id} on the caller's own account refuses deactivation and role changes with 409", async () => {
    const self = await createTestUser("admin");
    const off = await patchUser(apiRequest(`/api/users/${self.id}`, { method: "PATCH", token: self.token, body: { active: false } }), routeParams(self.id));
    expect(off.status).toBe(409);
    const demote = await patchUser(apiRequest(`/api/users/${self.id}`, { method: "PATCH", token: self.token, body: { role: "lead" } }), routeParams(self.id));
    expect(demote.status).toBe(409);
    expect(await getUserRow(self.id)).toMatchObject({ role: "admin", active: true });
  });
});

describe("PATCH /api/me/preferences", () => {
  it("PATCH /api/me/preferences without credentials answers 401", async () => {
    const res = await patchPreferences(apiRequest("/api/me/preferences", { method: "PATCH", body: { mailPreference: "off" } }), noParams);
    expect(res.status).toBe(401);
  });

  it("PATCH /api/me/preferences with an unknown preference answers 422 naming the field", async () => {
    const user = await createTestUser("engineer");
    const res = await patchPreferences(apiRequest("/api/me/preferences", { method: "PATCH", token: user.token, body: { mailPreference: "weekly" } }), noParams);
    expect(res.status).toBe(422);
    expect((await json<ErrorJson>(res)).issues?.map((i) => i.path)).toEqual(["mailPreference"]);
    expect((await getUserRow(user.id))?.mailPreference).toBe("immediate");
  });

  it("PATCH /api/me/preferences changes only the caller's mail preference and records an audit event", async () => {
    const user = await createTestUser("engineer");
    const bystander = await createTestUser("engineer");
    const res = await patchPreferences(
      // Extra keys are ignored: a user cannot change their own role through this endpoint.
      apiRequest("/api/me/preferences", { method: "PATCH", token: user.token, body: { mailPreference: "digest", role: "admin" } }),
      noParams,
    );
    expect(res.status).toBe(200);
    expect(await json(res)).toEqual({ mailPreference: "digest" });
    expect(await getUserRow(user.id)).toMatchObject({ mailPreference: "digest", role: "engineer" });
    expect((await getUserRow(bystander.id))?.mailPreference).toBe("immediate");
    const [event] = await db()
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.entityType, "user"), eq(auditEvents.entityId, String(user.id))))
      .orderBy(desc(auditEvents.id))
      .limit(1);
    expect(event).toMatchObject({ actorUserId: user.id, action: "user.mail_preference", details: { from: "immediate", to: "digest" } });
  });
});
