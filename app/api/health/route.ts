import { sql } from "drizzle-orm";
import { db } from "@/db/client";
import { APP_VERSION, ANALYSIS_VERSION } from "@/lib/version";

export const dynamic = "force-dynamic";

// GET /api/health – app version and database status (200 when the database answers, 503 otherwise). No auth.
export async function GET(): Promise<Response> {
  const started = performance.now();
  let database: { status: "up" | "down"; latencyMs?: number; error?: string };
  try {
    await Promise.race([
      db().execute(sql`select 1`),
      new Promise((_, reject) => setTimeout(() => reject(new Error("timed out after 2 s")), 2_000)),
    ]);
    database = { status: "up", latencyMs: Math.round((performance.now() - started) * 10) / 10 };
  } catch (err) {
    database = { status: "down", error: err instanceof Error ? err.message : String(err) };
  }
  const ok = database.status === "up";
  return Response.json(
    { status: ok ? "ok" : "degraded", version: APP_VERSION, analysisVersion: ANALYSIS_VERSION, database },
    { status: ok ? 200 : 503, headers: { "cache-control": "no-store" } },
  );
}
