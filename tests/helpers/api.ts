// Helpers for route-handler tests against the real test MariaDB: users with personal API tokens, requests, bodies.
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { afterAll } from "vitest";
import { closeDb, db } from "@/db/client";
import { createApiToken, revokeApiToken } from "@/db/queries/tokens";
import { sites, users, type Role } from "@/db/schema";

// One pool per test file; close it so vitest can exit.
afterAll(closeDb);

export interface TestUser {
  id: number;
  email: string;
  name: string;
  role: Role;
  /** Bearer secret of a fresh personal API token of this user. */
  token: string;
  tokenId: number;
}

/** A unique suffix for names that carry unique keys (e-mails, site names, scanner names). */
export const unique = (label: string) => `${label} ${randomUUID().slice(0, 8)}`;

/** Insert an active user with the given role (no password) and give them a personal API token. */
export async function createTestUser(role: Role, overrides: { active?: boolean; name?: string } = {}): Promise<TestUser> {
  const email = `${role}-${randomUUID()}@example.test`;
  const name = overrides.name ?? unique(`Test ${role}`);
  const [row] = await db()
    .insert(users)
    .values({ email, name, role, active: overrides.active ?? true })
    .$returningId();
  const { id: tokenId, token } = await createApiToken(row!.id, "test");
  return { id: row!.id, email, name, role, token, tokenId };
}

/** A user whose only token has been revoked: requests with it must be refused. */
export async function createUserWithRevokedToken(role: Role): Promise<TestUser> {
  const user = await createTestUser(role);
  await revokeApiToken(user.id, user.tokenId);
  return user;
}

/** Insert a site directly (for tests that need one without going through POST /api/sites). */
export async function createTestSite(): Promise<{ id: number; name: string }> {
  const name = unique("Test site");
  const [row] = await db().insert(sites).values({ name, city: "Testham" }).$returningId();
  return { id: row!.id, name };
}

export async function getUserRow(id: number) {
  const [row] = await db().select().from(users).where(eq(users.id, id));
  return row;
}

interface RequestOptions {
  method?: "GET" | "POST" | "PATCH" | "DELETE";
  /** Bearer token; omit for an anonymous request. */
  token?: string;
  /** JSON body (serialised here); pass a string to send it raw. */
  body?: unknown;
}

/** `new Request("http://test/api/…")` with an optional Bearer token and JSON body. */
export function apiRequest(path: string, { method = "GET", token, body }: RequestOptions = {}): Request {
  const headers = new Headers();
  if (token) headers.set("authorization", `Bearer ${token}`);
  let payload: string | undefined;
  if (body !== undefined) {
    headers.set("content-type", "application/json");
    payload = typeof body === "string" ? body : JSON.stringify(body);
  }
  return new Request(`http://test${path}`, { method, headers, body: payload });
}

/** The second argument of a route handler: `{ params: Promise<{ id }> }`. */
export const routeParams = (id: number | string) => ({ params: Promise.resolve({ id: String(id) }) });
/** Route context for handlers without dynamic segments. */
export const noParams = { params: Promise.resolve({}) };

export interface ErrorJson {
  error: string;
  code: string;
  issues?: { path: string; message: string }[];
}

/** Parse a response body as JSON, with the type the test expects. */
export async function json<T = Record<string, unknown>>(res: Response): Promise<T> {
  return (await res.json()) as T;
}

/**
 * Factory for `vi.mock("next-auth", …)`: getServerSession runs next-auth's real session handler on a request with
 * no cookies, as for a browser that is not signed in. Outside a Next.js request, next-auth's App Router form
 * (which reads next/headers) throws, so the route handlers could not answer "no credentials" at all.
 */
export function withAnonymousSession<M extends { getServerSession: (...args: never[]) => unknown }>(actual: M): M {
  const realGetServerSession = actual.getServerSession as unknown as (req: unknown, res: unknown, options: unknown) => Promise<unknown>;
  const noop = () => undefined;
  return {
    ...actual,
    getServerSession: (options: unknown) =>
      realGetServerSession({ headers: {}, cookies: {} }, { getHeader: noop, setCookie: noop, setHeader: noop }, options),
  };
}
