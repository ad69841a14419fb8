// Route tests for /api/tokens and /api/tokens/{id} (personal API tokens) against the real test database.
import { createHash } from "node:crypto";
import { eq } from "drizzle-orm";
import { describe, expect, it, vi } from "vitest";
import { apiRequest, createTestUser, createUserWithRevokedToken, json, noParams, routeParams, type ErrorJson } from "../helpers/api";
import { GET as listTokens, POST as createToken } from "@/app/api/tokens/route";
import { DELETE as revokeToken } from "@/app/api/tokens/[id]/route";
import { GET as getMe } from "@/app/api/me/route";
import { db } from "@/db/client";
import { apiTokens } from "@/db/schema";

vi.mock("next-auth", async (importOriginal) =>
  (await import("../helpers/api")).withAnonymousSession(await importOriginal<typeof import("next-auth")>()),
);

interface TokenJson {
  id: number;
  name: string;
  prefix: string;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

// SHA-256 computed with node:crypto here, independently of lib/auth/tokens.ts.
const sha256Hex = (s: string) => createHash("sha256").update(s, "utf8").digest("hex");

describe("GET /api/tokens", () => {
  it("GET /api/tokens without credentials answers 401", async () => {
    expect((await listTokens(apiRequest("/api/tokens"), noParams)).status).toBe(401);
  });

  it("GET /api/tokens with a revoked token answers 401", async () => {
    const revoked = await createUserWithRevokedToken("lead");
    const res = await listTokens(apiRequest("/api/tokens", { token: revoked.token }), noParams);
    expect(res.status).toBe(401);
    expect((await json<ErrorJson>(res)).error).toMatch(/invalid or revoked/);
  });

  it("GET /api/tokens with a token nobody issued answers 401", async () => {
    const res = await listTokens(apiRequest("/api/tokens", { token: "hmx_madeUpTokenThatWasNeverIssued0000000000000" }), noParams);
    expect(res.status).toBe(401);
  });

  it("GET /api/tokens lists only the caller's own tokens, never a secret or hash", async () => {
    const alice = await createTestUser("physicist");
    const bob = await createTestUser("physicist");
    const res = await listTokens(apiRequest("/api/tokens", { token: alice.token }), noParams);
    expect(res.status).toBe(200);
    const text = await res.text();
    expect(text).not.toContain(alice.token);
    expect(text).not.toContain(sha256Hex(alice.token));
    const { tokens } = JSON.parse(text) as { tokens: TokenJson[] };
    expect(tokens.map((t) => t.id)).toEqual([alice.tokenId]);
    expect(tokens[0]).toMatchObject({ name: "test", prefix: alice.token.slice(0, 10), revokedAt: null });
    expect(tokens[0]!.lastUsedAt).not.toBeNull(); // stamped by this very request
    expect(tokens.some((t) => t.id === bob.tokenId)).toBe(false);
  });
});

describe("POST /api/tokens", () => {
  it("POST /api/tokens with an empty name answers 422 naming the field", async () => {
    const user = await createTestUser("engineer");
    const res = await createToken(apiRequest("/api/tokens", { method: "POST", token: user.token, body: { name: " " } }), noParams);
    expect(res.status).toBe(422);
    const body = await json<ErrorJson>(res);
    expect(body.error).toContain("name");
    expect(body.issues?.map((i) => i.path)).toEqual(["name"]);
  });

  it("POST /api/tokens returns the secret once, stores only its SHA-256, and the new token authenticates", async () => {
    const user = await createTestUser("engineer");
    const res = await createToken(apiRequest("/api/tokens", { method: "POST", token: user.token, body: { name: "nightly upload script" } }), noParams);
    expect(res.status).toBe(201);
    const created = await json<{ id: number; token: string; prefix: string }>(res);
    expect(created.token).toMatch(/^hmx_[A-Za-z0-9_-]{43}$/); // 32 random bytes, base64url
    expect(created.prefix).toBe(created.token.slice(0, 10));

    const [row] = await db().select().from(apiTokens).where(eq(apiTokens.id, created.id));
    expect(row).toBeDefined();
    expect(row!.tokenHash).toBe(sha256Hex(created.token));
    expect(Object.values(row!).some((v) => typeof v === "string" && v.includes(created.token))).toBe(false);

    const listed = await json<{ tokens: TokenJson[] }>(await listTokens(apiRequest("/api/tokens", { token: user.token }), noParams));
    expect(listed.tokens.find((t) => t.id === created.id)).toMatchObject({ name: "nightly upload script", prefix: created.prefix, revokedAt: null });
    expect(JSON.stringify(listed)).not.toContain(created.token);

    const me = await getMe(apiRequest("/api/me", { token: created.token }), noParams);
    expect(me.status).toBe(200);
    expect((await json<{ user: { id: number } }>(me)).user.id).toBe(user.id);
  });
});

describe("DELETE /api/tokens/{id}", () => {
  it("DELETE /api/tokens/{id} revokes the token: it stops working and is listed as revoked", async () => {
    const user = await createTestUser("lead");
    const second = await json<{ id: number; token: string }>(
      await createToken(apiRequest("/api/tokens", { method: "POST", token: user.token, body: { name: "to revoke" } }), noParams),
    );
    const res = await revokeToken(apiRequest(`/api/tokens/${second.id}`, { method: "DELETE", token: user.token }), routeParams(second.id));
    expect(res.status).toBe(200);
    expect((await getMe(apiRequest("/api/me", { token: second.token }), noParams)).status).toBe(401);
    const listed = await json<{ tokens: TokenJson[] }>(await listTokens(apiRequest("/api/tokens", { token: user.token }), noParams));
    expect(listed.tokens.find((t) => t.id === second.id)?.revokedAt).not.toBeNull();
    // Revoking twice: there is no active token with that id any more.
    const again = await revokeToken(apiRequest(`/api/tokens/${second.id}`, { method: "DELETE", token: user.token }), routeParams(second.id));
    expect(again.status).toBe(404);
  });

  it("DELETE /api/tokens/{id} of another user's token answers 404 and leaves it working", async () => {
    const owner = await createTestUser("physicist");
    const intruder = await createTestUser("admin");
    const res = await revokeToken(apiRequest(`/api/tokens/${owner.tokenId}`, { method: "DELETE", token: intruder.token }), routeParams(owner.tokenId));
    expect(res.status).toBe(404);
    expect((await getMe(apiRequest("/api/me", { token: owner.token }), noParams)).status).toBe(200);
  });

  it("DELETE /api/tokens/{id} of an unknown or malformed id answers 404", async () => {
    const user = await createTestUser("lead");
    expect((await revokeToken(apiRequest("/api/tokens/999999999", { method: "DELETE", token: user.token }), routeParams(999999999))).status).toBe(404);
    expect((await revokeToken(apiRequest("/api/tokens/0", { method: "DELETE", token: user.token }), routeParams(0))).status).toBe(404);
  });

  it("DELETE /api/tokens/{id} without credentials answers 401", async () => {
    const user = await createTestUser("lead");
    const res = await revokeToken(apiRequest(`/api/tokens/${user.tokenId}`, { method: "DELETE" }), routeParams(user.tokenId));
    expect(res.status).toBe(401);
  });
});
