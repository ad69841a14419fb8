// GET /api/health answers 200 with the app version and the database status, without authentication.
import { describe, expect, it } from "vitest";
import { GET } from "@/app/api/health/route";
import pkg from "@/package.json";
import "../helpers/api";

describe("GET /api/health", () => {
  it("answers 200 with the package version and the database up", async () => {
    const res = await GET();
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body).toMatchObject({ status: "ok", version: pkg.version, database: { status: "up" } });
    expect(res.headers.get("cache-control")).toBe("no-store");
  });
});
