// `npm run --silent token -- <email>` prints a new personal API token, and that token authenticates API calls.
import { spawnSync } from "node:child_process";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { GET as listScanners } from "@/app/api/scanners/route";
import { apiRequest, createTestUser, noParams } from "../helpers/api";

const TSX = path.resolve("node_modules/.bin/tsx");

function token(...args: string[]) {
  return spawnSync(TSX, ["scripts/token.ts", ...args], { encoding: "utf8", env: process.env, timeout: 60_000 });
}

describe("scripts/token.ts", () => {
  it("prints only a token on stdout, and GET /api/scanners accepts it", async () => {
    const admin = await createTestUser("admin");
    const res = token(admin.email);
    expect(res.status, res.stderr).toBe(0);
    const printed = res.stdout.trim();
    expect(printed).toMatch(/^hmx_[A-Za-z0-9_-]{43}$/);
    const api = await listScanners(apiRequest("/api/scanners", { token: printed }), noParams);
    expect(api.status).toBe(200);
    expect(Array.isArray((await api.json()).scanners)).toBe(true);
  });

  it("exits 2 with one line on stderr for an unknown e-mail, printing nothing on stdout", () => {
    const res = token("nobody-here@example.test");
    expect(res.status).toBe(2);
    expect(res.stdout).toBe("");
    expect(res.stderr.trim().split("\n")).toHaveLength(1);
    expect(res.stderr).toMatch(/no active user/);
  });
});
